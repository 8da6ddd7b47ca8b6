/**
 * fray's library API. One easy call — `simulate(path)` — and the stages underneath for
 * those who need them: read (loadCircuit / parseCircuitText) → schedule (scheduleCircuit)
 * → program (buildProgram) → engine (runNoisy / runIdeal) → results (computeFigures); in
 * record mode (mid-circuit measurement) the engine step is runBranches / runIdealBranches and
 * the results step computeRecordFigures.
 * Conventions (bit order, layouts, fidelity definitions) are stated in src/engine/layout.ts,
 * src/linalg/superoperator.ts and the README.
 */
export { simulate, simulateLoaded, scheduleCircuit, measuredQubits } from './api/simulate.js';
export type { Simulation, SimulateOptions, RunResult } from './api/simulate.js';
export { loadCircuit, parseCircuitText, parseProfileText, readCircuitSource, instantiate } from './api/loadCircuit.js';
export type { LoadedCircuit, LoadOptions, CircuitSource } from './api/loadCircuit.js';
export type { Override } from './format/overrides.js';
export { scaleNoise } from './noise/scale.js';
// Studies (src/studies/): decisions between variants under a noise budget, each returning data.
export { compareVariants, planSweep, runSweep, checkSweep, mergeSweepFiles, findThreshold, noiseBudget } from './studies/index.js';
export { parseCondition, parseMetric, parseVary, parseInterval, meets, metricValue } from './studies/index.js';
export type {
  CompareOptions,
  CompareResult,
  ComparedVariant,
  Condition,
  Metric,
  SweepSpec,
  SweepPlan,
  SweepRow,
  SweepRunOptions,
  ThresholdOptions,
  ThresholdResult,
  BudgetOptions,
  BudgetResult,
  BudgetSource,
  Varied,
  Interval,
} from './studies/index.js';
// Plots (src/plots/): vega-lite specs rendered to SVG without a browser; the run's HTML report (src/html/).
export { renderSvg, plotCompare, plotSweep, plotBudget, timelineSpec, comparisonBarsSpec } from './plots/index.js';
export type { TimelineData, ComparisonChart } from './plots/index.js';
export { InputError, ProblemList, formatProblem } from './format/problem.js';
export type { Problem, SourcePosition } from './format/problem.js';
export type { Circuit, Operation, Register, GateDefinition, Condition as BitCondition, ConditionTerm } from './circuit/circuit.js';
export { readQasm, isQasmPath, writeQasm, loadQasmToolkit } from './format/qasm/index.js';
export type { QasmWriteOptions } from './format/qasm/index.js';
export { writeCircuitYaml } from './format/writeCircuit.js';
export { convertToYaml, exportQasm } from './api/convert.js';
export type { Converted } from './api/convert.js';
export { zyzAngles } from './circuit/zyz.js';
export { BUILTIN_GATES } from './circuit/gates.js';
export type { NoiseProfile, QubitNoise, GateEntry, Coupling } from './noise/profile.js';
export type { Schedule, TimedOperation, IdleWindow, Feed } from './schedule/schedule.js';
export { buildTimeline } from './schedule/timeline.js';
export type { Timeline, TimelineEvent } from './schedule/timeline.js';
export { buildProgram, hasDrift } from './program/program.js';
export type { Program, Origin } from './program/program.js';
export { runNoisy, runIdeal } from './engine/run.js';
export type { IdealState } from './engine/run.js';
export type { DensityMatrix, StateVector } from './engine/layout.js';
export type { Instruction } from './engine/instruction.js';
export { runBranches, runIdealBranches, referenceBranchEngine, fastBranchEngine } from './engine/branches.js';
export type { BranchEnsemble, IdealEnsemble, BranchEngine } from './engine/branches.js';
export type { RecordProgram, RecordInstruction, RecordCondition } from './engine/recordProgram.js';
export { computeRecordFigures } from './results/recordFigures.js';
export { computeFigures } from './results/report.js';
export type { Figures } from './results/report.js';
export { stateFidelity, classicalFidelity, totalVariationDistance, purity } from './results/fidelity.js';
export { pauliExpectation, blochVectors } from './results/observables.js';
export type { CMatrix } from './linalg/cmatrix.js';
export { Channel, checkPhysicality, channelMetrics, diamondDistance, nearestCptp, sequence, parallel } from './channels/index.js';
export type { Physicality, ChannelMetrics, DiamondDistance, CptpRepair, ChannelForm } from './channels/index.js';
export { runPage, timelineData, idleWindowCost } from './html/index.js';
export type { RunPageOptions } from './html/index.js';
export { buildSchemas, schemaText, SCHEMA_KINDS } from './format/schema/index.js';
export type { SchemaKind, JsonSchema } from './format/schema/index.js';
export { mitigate, recipeOptions, extrapolate, correctReadout, invertReadout, projectToSimplex, FIT_KINDS, READOUT_METHODS } from './mitigation/index.js';
export type { MitigateOptions, MitigationResult, ObservableMitigation, ReadoutMitigation, ZneRecipe, TwirlRecipe, Extrapolation, FitKind, ScalePoint, ReadoutMethod } from './mitigation/index.js';
export { foldCircuit, insertDecoupling, DECOUPLING_SEQUENCES, twirlFrames, twirlSampler, isClifford } from './transforms/index.js';
export type { TwirlFrames, TwirlMode, FoldOptions, FoldOrder, FoldResult, DecouplingOptions, DecouplingSequence, DecouplingInsertion, DecouplingSkip, DecouplingResult } from './transforms/index.js';
export type { PauliFrame } from './noise/twirl.js';
export type { MitigationSpec } from './format/mitigationBlock.js';
