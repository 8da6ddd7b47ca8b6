/** Error mitigation: zero-noise extrapolation, readout correction, and the run that applies them and compares with the ideal answer. */
export { mitigate } from './mitigate.js';
export { recipeOptions } from './recipe.js';
export type { MitigateOptions, MitigationResult, ObservableMitigation, ReadoutMitigation, ZneRecipe, TwirlRecipe } from './mitigate.js';
export { extrapolate, fitProblem, FIT_KINDS } from './extrapolate.js';
export type { Extrapolation, FitKind, ScalePoint } from './extrapolate.js';
export { correctReadout, invertReadout, projectToSimplex, READOUT_METHODS } from './readoutCorrection.js';
export type { ReadoutMethod } from './readoutCorrection.js';
