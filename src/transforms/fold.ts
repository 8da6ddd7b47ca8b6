/**
 * Unitary folding, the noise amplification a real device can run: each folded gate
 * application G becomes G (G† G)^k, which is G in the ideal run and 2k + 1 noisy
 * applications on a device. Fractional scales fold a chosen subset of the gates once more
 * (T. Giurgica-Tiron, Y. Hindy, R. LaRose, A. Mari, W. J. Zeng, IEEE QCE 2020, from memory):
 * with d gate applications and a requested scale λ ≥ 1, n = round((λ − 1)·d/2) extra
 * G† G pairs are spread as k = ⌊n/d⌋ on every gate and one more on s = n − k·d gates, chosen
 * from the end of the circuit or at random with a seed. The scale achieved is 1 + 2n/d.
 *
 * G† keeps G's name, so it takes G's profile entry: the same duration and the same noise
 * (including its coherent error and a step's own `noise:`). A composite gate's G† has its
 * parts daggered in reverse order, so a `split: true` entry splits the fold as well.
 * Measurements, resets, idles, barriers and noise steps are not folded.
 */
import type { Circuit, GateOperation, GatePart, Operation } from '../circuit/circuit.js';
import { adjoint } from '../linalg/cmatrix.js';
import { createRandom } from '../results/random.js';

/** Which gates take the extra fold of a fractional scale. */
export type FoldOrder = 'end' | 'random';

/** How to fold: the requested scale λ ≥ 1, and for fractional scales which gates and the seed of `random`. */
export interface FoldOptions {
  readonly scale: number;
  readonly order?: FoldOrder;
  readonly seed?: number;
}

/** The folded circuit and what was done: the scale achieved and G†G pairs per gate application (program order). */
export interface FoldResult {
  readonly circuit: Circuit;
  /** 1 + 2n/d: the factor by which the number of noisy gate applications grew (1 when there are no gates). */
  readonly scale: number;
  /** For each gate application of the input, in order, the number k of G†G pairs after it. */
  readonly folds: readonly number[];
}

/** Largest noise scale folding is asked for (`--zne`, `mitigation.zne.scales`): each unit adds two applications per gate, and beyond this the run is mostly noise. */
export const MAX_FOLD_SCALE = 99;

/** Default seed of random folding, so that runs repeat. */
export const DEFAULT_FOLD_SEED = 1;

/** Folds every gate application of `circuit` to the requested scale (see the module comment). */
export function foldCircuit(circuit: Circuit, options: FoldOptions): FoldResult {
  const { scale } = options;
  if (!(Number.isFinite(scale) && scale >= 1)) throw new RangeError(`foldCircuit: scale must be a number ≥ 1, not ${scale}`);
  const gateIndices: number[] = [];
  circuit.operations.forEach((op, i) => {
    if (op.kind === 'gate') gateIndices.push(i);
  });
  const d = gateIndices.length;
  if (d === 0) return { circuit, scale: 1, folds: [] };
  const n = Math.round(((scale - 1) * d) / 2);
  const k = Math.floor(n / d);
  const s = n - k * d;
  const folds = new Array<number>(d).fill(k);
  for (const g of chooseExtra(d, s, options.order ?? 'end', options.seed ?? DEFAULT_FOLD_SEED)) folds[g]! += 1;
  const ops: Operation[] = [];
  let g = 0;
  for (const op of circuit.operations) {
    ops.push(op);
    if (op.kind !== 'gate') continue;
    const pairs = folds[g++]!;
    if (pairs === 0) continue;
    const inverse = daggerOperation(op);
    for (let r = 0; r < pairs; r++) ops.push(inverse, op);
  }
  return { circuit: { ...circuit, operations: ops }, scale: 1 + (2 * n) / d, folds };
}

/** Indices (0..d−1) of the s gates that take one more fold: the last s, or s drawn without replacement. */
function chooseExtra(d: number, s: number, order: FoldOrder, seed: number): number[] {
  if (order === 'end') return Array.from({ length: s }, (_, i) => d - 1 - i);
  // a partial Fisher–Yates shuffle on the seeded generator
  const rng = createRandom(seed);
  const idx = Array.from({ length: d }, (_, i) => i);
  for (let i = 0; i < s; i++) {
    const j = i + Math.floor(rng.nextDouble() * (d - i));
    [idx[i], idx[j]] = [idx[j]!, idx[i]!];
  }
  return idx.slice(0, s);
}

/** G† as an application of the same gate name on the same qubits (parts daggered in reverse order). */
function daggerOperation(op: GateOperation): GateOperation {
  return { ...op, unitary: adjoint(op.unitary), ...(op.parts !== undefined ? { parts: daggerParts(op.parts) } : {}) };
}

function daggerParts(parts: readonly GatePart[]): GatePart[] {
  return [...parts].reverse().map((p) => ({ ...p, unitary: adjoint(p.unitary), ...(p.parts !== undefined ? { parts: daggerParts(p.parts) } : {}) }));
}
