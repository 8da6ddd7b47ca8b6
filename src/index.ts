/**
 * fray's library API. One easy call — `simulate(path)` — and the stages underneath for
 * those who need them: read (loadCircuit / parseCircuitText) → schedule (scheduleCircuit)
 * → program (buildProgram) → engine (runNoisy / runIdeal) → results (computeFigures).
 * Conventions (bit order, layouts, fidelity definitions) are stated in src/engine/layout.ts,
 * src/linalg/superoperator.ts and the README.
 */
export { simulate, simulateLoaded, scheduleCircuit, measuredQubits } from './api/simulate.js';
export type { Simulation, SimulateOptions, RunResult } from './api/simulate.js';
export { loadCircuit, parseCircuitText, parseProfileText } from './api/loadCircuit.js';
export type { LoadedCircuit, LoadOptions } from './api/loadCircuit.js';
export { InputError, ProblemList, formatProblem } from './format/problem.js';
export type { Problem, SourcePosition } from './format/problem.js';
export type { Circuit, Operation, Register } from './circuit/circuit.js';
export { BUILTIN_GATES } from './circuit/gates.js';
export type { NoiseProfile, QubitNoise, GateEntry, Coupling } from './noise/profile.js';
export type { Schedule, TimedOperation, IdleWindow } from './schedule/schedule.js';
export { buildTimeline } from './schedule/timeline.js';
export type { Timeline, TimelineEvent } from './schedule/timeline.js';
export { buildProgram, hasDrift } from './program/program.js';
export type { Program, Origin } from './program/program.js';
export { runNoisy, runIdeal } from './engine/run.js';
export type { IdealState } from './engine/run.js';
export type { DensityMatrix, StateVector } from './engine/layout.js';
export type { Instruction } from './engine/instruction.js';
export { computeFigures } from './results/report.js';
export type { Figures } from './results/report.js';
export { stateFidelity, classicalFidelity, totalVariationDistance, purity } from './results/fidelity.js';
export { pauliExpectation, blochVectors } from './results/observables.js';
export type { CMatrix } from './linalg/cmatrix.js';
export { Channel, checkPhysicality, channelMetrics, diamondDistance, nearestCptp, sequence, parallel } from './channels/index.js';
export type { Physicality, ChannelMetrics, DiamondDistance, CptpRepair, ChannelForm } from './channels/index.js';
export { runPage, timelineData, idleWindowCost } from './html/index.js';
export type { RunPageOptions } from './html/index.js';
export { renderSvg, timelineSpec, comparisonBarsSpec } from './plots/index.js';
export type { TimelineData, ComparisonChart } from './plots/index.js';
export { buildSchemas, schemaText, SCHEMA_KINDS } from './format/schema/index.js';
export type { SchemaKind, JsonSchema } from './format/schema/index.js';
