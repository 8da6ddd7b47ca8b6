import type { CMatrix } from '../linalg/cmatrix.js';
import type { Loc, NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import type { ProfileSpec } from '../format/profileSpec.js';
import type { SourcePosition } from '../format/problem.js';
import type { MitigationSpec } from '../format/mitigationBlock.js';

/**
 * The typed circuit: what a validated circuit file means, with every angle evaluated,
 * every gate turned into its exact unitary and every qubit reference turned into an
 * index (qubit 0 = most significant, see src/engine/layout.ts). Noise is still in the
 * form written (profile specs, step annotations); src/noise/profile.ts resolves it.
 */
export interface Circuit {
  /** The file the circuit was read from (as given on the command line). */
  readonly file: string;
  readonly name: string | null;
  readonly register: Register;
  /** Circuit parameters after `--set` overrides. */
  readonly params: Readonly<Record<string, number>>;
  /** Custom channels by name (Kraus operators on k qubits, trace preserving to 1e-9). */
  readonly channels: ReadonlyMap<string, CustomChannel>;
  /** Arity of every gate name usable in this circuit (built-in and custom), for profile keys. */
  readonly gateArity: ReadonlyMap<string, number>;
  /** The custom gates' definitions by name, in the order written (for writing the circuit out again). */
  readonly definitions?: ReadonlyMap<string, GateDefinition>;
  /** Names of the composite gates (custom gates defined by `steps`). */
  readonly compositeGates: ReadonlySet<string>;
  /** Pauli strings to report, qubit 0 leftmost. */
  readonly observe: readonly Loc<string>[];
  /** The `expect:` conditions as written (METRIC OP NUMBER, optionally `mitigated.`; parsed by src/mitigation/check.ts). */
  readonly expect?: readonly Loc<string>[];
  /** The `mitigation:` recipe (what `fray mitigate FILE` applies when no method is given on the command line). */
  readonly mitigation?: MitigationSpec;
  /** The `device:` path as written (relative to the circuit file), if any. */
  readonly device: Loc<string> | null;
  /** The inline `noise:` profile, merged over the device profile field by field. */
  readonly inlineNoise: ProfileSpec | null;
  /** One entry per application, in program order. */
  readonly operations: readonly Operation[];
  /** Where the `steps:` key is (for problems about the circuit as a whole). */
  readonly stepsAt: SourcePosition;
  /** Where the `qubits:` value is (for problems about the register's size). */
  readonly qubitsAt: SourcePosition;
  /**
   * The classical record's bit names in record order (character i of a record key is bit i),
   * or null for a circuit without `into` (version 1: every measurement terminal).
   */
  readonly bits: readonly string[] | null;
}

/** One term of a condition: the record's bit `bit` (index into Circuit.bits) must read `value`. */
export interface ConditionTerm {
  readonly bit: number;
  readonly value: 0 | 1;
}

/** An `if:` modifier: the application acts only in branches where every term holds. */
export interface Condition {
  readonly terms: readonly ConditionTerm[];
  readonly at: SourcePosition;
}

/** Qubit count and optional labels (labels[i] names qubit i). */
export interface Register {
  readonly n: number;
  readonly labels: readonly string[] | null;
}

/** A custom channel: Kraus operators on `qubits` qubits (first target = leftmost factor). */
export interface CustomChannel {
  readonly name: string;
  readonly qubits: number;
  readonly kraus: readonly CMatrix[];
  readonly at: SourcePosition;
}

/** What every operation shares: its 0-based step index, the step's position and label. */
export interface OperationBase {
  readonly step: number;
  readonly at: SourcePosition;
  readonly label?: string;
}

/** A step's own noise: replaces the profile's noise kinds for this application (`none` → empty). */
export interface NoiseOverride {
  readonly kinds: NoiseKindsSpec;
  readonly at: SourcePosition;
}

/** A custom matrix gate: its unitary on `qubits` qubits (first target = leftmost factor). */
export interface MatrixGateDefinition {
  readonly kind: 'matrix';
  readonly name: string;
  readonly qubits: number;
  readonly matrix: CMatrix;
}

/** One gate inside a composite: local target qubits 0..k−1 and angle expressions (src/circuit/expression.ts syntax) over the composite's params. */
export interface CompositeStep {
  readonly gate: string;
  readonly targets: readonly number[];
  readonly angles: readonly string[];
}

/** A composite gate: one gate for noise and scheduling whose unitary is its steps' product. */
export interface CompositeGateDefinition {
  readonly kind: 'composite';
  readonly name: string;
  readonly qubits: number;
  /** Angle parameter names (radians), in call order. */
  readonly params: readonly string[];
  readonly steps: readonly CompositeStep[];
}

/** A custom gate as written in the circuit (matrix or composite). */
export type GateDefinition = MatrixGateDefinition | CompositeGateDefinition;

/** One gate application: its exact unitary on `qubits` (first = leftmost factor). */
export interface GateOperation extends OperationBase {
  readonly kind: 'gate';
  readonly name: string;
  readonly qubits: readonly number[];
  readonly unitary: CMatrix;
  /** The evaluated angles (radians, in the gate's parameter order) when the gate takes any. */
  readonly angles?: readonly number[];
  readonly noise?: NoiseOverride;
  readonly condition?: Condition;
  /** Composite gates: the parts in order, on circuit qubits (used when the profile says `split: true`). */
  readonly parts?: readonly GatePart[];
}

/** One part of a composite application, on circuit qubits; itself composite when `parts` is present. */
export interface GatePart {
  readonly name: string;
  readonly qubits: readonly number[];
  readonly unitary: CMatrix;
  readonly parts?: readonly GatePart[];
}

/** An explicit wait of `duration` ns on one qubit (it decays as an idle qubit). */
export interface IdleOperation extends OperationBase {
  readonly kind: 'idle';
  readonly qubits: readonly number[];
  readonly duration: number;
}

/** A scheduling barrier across `qubits`. */
export interface BarrierOperation extends OperationBase {
  readonly kind: 'barrier';
  readonly qubits: readonly number[];
}

/**
 * The measurement of one qubit in the computational basis: terminal in version 1 (`bit`
 * absent); in record mode a mid-circuit measurement whose outcome goes to record bit `bit`.
 */
export interface MeasureOperation extends OperationBase {
  readonly kind: 'measure';
  readonly qubits: readonly number[];
  readonly bit?: number;
}

/** ρ → |0⟩⟨0|_q ⊗ Tr_q ρ on one qubit, then the reset entry's noise kinds. */
export interface ResetOperation extends OperationBase {
  readonly kind: 'reset';
  readonly qubits: readonly number[];
  readonly noise?: NoiseOverride;
  readonly condition?: Condition;
}

/** A standalone noise step on `qubits` (1-qubit kinds on each, depolarizing/channel on all). */
export interface ChannelOperation extends OperationBase {
  readonly kind: 'channel';
  readonly qubits: readonly number[];
  readonly noise: NoiseOverride;
  readonly condition?: Condition;
}

/** One application in program order. */
export type Operation =
  | GateOperation
  | IdleOperation
  | BarrierOperation
  | MeasureOperation
  | ResetOperation
  | ChannelOperation;
