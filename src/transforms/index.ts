/** Circuit-to-circuit transforms: each takes a typed circuit and returns a new one with a record of what it did. */
export { foldCircuit, DEFAULT_FOLD_SEED } from './fold.js';
export type { FoldOptions, FoldOrder, FoldResult } from './fold.js';
export { insertDecoupling, DECOUPLING_SEQUENCES } from './decouple.js';
export type { DecouplingOptions, DecouplingSequence, DecouplingInsertion, DecouplingSkip, DecouplingResult } from './decouple.js';
export { twirlFrames, twirlSampler, isClifford } from './twirl.js';
export type { TwirlFrames, TwirlMode } from './twirl.js';
