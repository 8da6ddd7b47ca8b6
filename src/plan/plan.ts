import type { RecordCondition } from '../engine/recordProgram.js';
import type { Origin } from '../program/program.js';
/**
 * The plan: what the fast engine runs for a noisy instruction list — a list of kernel calls,
 * each standing for one or more instructions fused into a single pass over ρ.
 */
import type { KernelName } from '../engine/kernelCall.js';

/** One kernel call of a plan. */
export interface PlanStep {
  /**
   * real1: 1-qubit real-form kernel (real1tp: its variant for trace-preserving maps);
   * real2: 2-qubit real-form kernel with the mirrored half;
   * diagonal: single-pass product of diagonal maps; general: complex k-qubit superoperator.
   */
  readonly kernel: KernelName;
  /** Qubits the call acts on (first = most significant local bit); for a diagonal batch, bin A then bin B. */
  readonly qubits: readonly number[];
  /** Indices into the instruction list (Program.noisy) this call applies, ascending. */
  readonly sources: readonly number[];
  /**
   * The kernel's numbers: the real-form matrix M' of src/engine/realForm.ts (real1, real1tp, real2), the
   * complex superoperator, interleaved (general), or table A (diagonal).
   */
  readonly numbers: Float64Array;
  /** Diagonal batch only: the qubits of table A and of table B, and table B (see src/plan/diagonalBatch.ts). */
  readonly binA?: readonly number[];
  readonly binB?: readonly number[];
  readonly tableB?: Float64Array;
}

/** The kernel calls of one noisy run on n qubits, in application order. */
export interface Plan {
  readonly n: number;
  /** False for the one-call-per-instruction plan (--no-fuse). */
  readonly fused: boolean;
  /** Number of instructions the plan applies. */
  readonly instructionCount: number;
  readonly steps: readonly PlanStep[];
}

/** One segment of a record-mode plan: a measurement, or a run of instructions with its plan on the branches it selects. */
export type PlannedSegment =
  | { readonly kind: 'measure'; readonly qubit: number; readonly bit: number }
  | { readonly kind: 'apply'; readonly when?: { readonly condition: RecordCondition; readonly holds: boolean }; readonly plan: Plan; readonly origins: readonly Origin[] };
