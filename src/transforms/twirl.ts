/**
 * Pauli twirling of 2-qubit Clifford gates, chosen per gate application: the exact twirl
 * (every eligible application's noise replaced by its Pauli twirl, src/noise/twirl.ts) or one
 * sampled instance (each eligible application's noise conjugated by a Pauli pair drawn from a
 * seeded generator). A 2-qubit gate is eligible when it is Clifford (it maps every Pauli to ±
 * a Pauli, so the frame P_a = G P_b G† is a Pauli a device can run) and is not split into
 * parts by its profile entry; other 2-qubit gates are left alone with a warning.
 */
import type { Circuit, GateOperation, Operation } from '../circuit/circuit.js';
import { adjoint, mul, type CMatrix } from '../linalg/cmatrix.js';
import { pauliLabels, pauliMatrix } from '../noise/channels.js';
import type { NoiseProfile } from '../noise/profile.js';
import type { PauliFrame } from '../noise/twirl.js';
import { createRandom } from '../results/random.js';

/** Largest number of sampled twirl instances asked for (`--twirl N`, `mitigation.twirl.instances`); each is a full run per noise scale. */
export const MAX_TWIRL_INSTANCES = 10000;

/** Largest deviation of |Tr(Q†·U P U†)|/d from 1 for U P U† to count as the Pauli Q up to a phase. */
export const CLIFFORD_TOLERANCE = 1e-9;

/** Which frames: the exact twirl, or one sampled instance drawn from `next` (uniform in [0, 1)). */
export type TwirlMode = { readonly kind: 'exact' } | { readonly kind: 'sample'; readonly next: () => number };

/** The frames of one run and the located warnings for 2-qubit gates left alone. */
export interface TwirlFrames {
  readonly frames: ReadonlyMap<Operation, PauliFrame>;
  readonly twirled: number;
  readonly warnings: readonly string[];
}

/** Whether a 2^k × 2^k unitary maps each single-qubit X and Z to a Pauli string up to a phase (the Clifford test on generators). */
export function isClifford(u: CMatrix): boolean {
  const k = Math.log2(u.rows);
  const labels = pauliLabels(k);
  const generators = Array.from({ length: k }, (_, q) => ['X', 'Z'].map((p) => 'I'.repeat(q) + p + 'I'.repeat(k - 1 - q))).flat();
  return generators.every((g) => {
    const m = mul(mul(u, pauliMatrix(g)), adjoint(u));
    return labels.some((q) => Math.abs(overlap(pauliMatrix(q), m) - 1) < CLIFFORD_TOLERANCE);
  });
}

/** |Tr(Q†M)|/d. */
function overlap(q: CMatrix, m: CMatrix): number {
  const d = q.rows;
  let re = 0;
  let im = 0;
  for (let i = 0; i < d * d; i++) {
    const a = q.data[2 * i]!;
    const b = -q.data[2 * i + 1]!;
    const c = m.data[2 * i]!;
    const e = m.data[2 * i + 1]!;
    re += a * c - b * e;
    im += a * e + b * c;
  }
  return Math.hypot(re, im) / d;
}

/** The Pauli frames of every eligible 2-qubit gate application of `circuit` (see the module comment). */
export function twirlFrames(circuit: Circuit, profile: NoiseProfile, mode: TwirlMode): TwirlFrames {
  const frames = new Map<Operation, PauliFrame>();
  const warnings: string[] = [];
  const warned = new Set<string>();
  const pairs = pauliLabels(2);
  const clifford = new Map<CMatrix, boolean>();
  for (const op of circuit.operations) {
    if (op.kind !== 'gate' || op.qubits.length !== 2) continue;
    if (op.parts !== undefined && profile.gateEntry(op.name, op.qubits).split) continue;
    let ok = clifford.get(op.unitary);
    if (ok === undefined) clifford.set(op.unitary, (ok = isClifford(op.unitary)));
    if (!ok) {
      // the same form as a run's warnings (RunResult.warnings)
      const message = `${op.at.file}:${op.at.line}:${op.at.col}: ${describe(op)} is not a Clifford gate; it is not twirled`;
      if (!warned.has(message)) warnings.push(message);
      warned.add(message);
      continue;
    }
    frames.set(op, mode.kind === 'exact' ? { kind: 'twirl' } : { kind: 'pauli', label: pairs[Math.floor(mode.next() * pairs.length)]! });
  }
  return { frames, twirled: frames.size, warnings };
}

function describe(op: GateOperation): string {
  return `step ${op.step + 1} (${op.name} on ${op.qubits.join(', ')})`;
}

/** A uniform generator in [0, 1) for sampled instances, seeded (src/results/random.ts). */
export function twirlSampler(seed: number): () => number {
  const rng = createRandom(seed);
  return () => rng.nextDouble();
}
