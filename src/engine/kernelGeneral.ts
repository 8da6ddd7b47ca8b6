/**
 * The general k-qubit kernel: vec(B) → S·vec(B) for every 2^k × 2^k target block B of ρ, S a
 * complex 4^k × 4^k superoperator in the column-stacking convention of ./superoperator.ts,
 * read from an arena (interleaved re/im, row-major). The fallback for maps the specialised
 * kernels do not cover (k ≥ 3, or a map that is not Hermiticity-preserving), and the kernel
 * of the unfused (--no-fuse) path. Layout: ./layout.ts.
 */
import { partStart } from './partition.js';
import { nextRest, targetMask, targetOffsets } from './targets.js';

// Preallocated for up to 4 targets (2·16^2 doubles): the optimised kernel then never reaches
// the growth branch (V8 would deoptimise at an allocation site it has no feedback for).
let scratch = new Float64Array(2 * 256);

/** vec(B) → S·vec(B) on `qubits` for S = arena[off …] (2·16^k doubles); only the rest rows of part `part` of `parts` (contiguous, ./partition.ts). */
export function applyGeneral(
  data: Float64Array,
  n: number,
  qubits: ArrayLike<number>,
  arena: Float64Array,
  off: number,
  part: number,
  parts: number,
): void {
  const D = 1 << n;
  const qs = Array.from(qubits);
  const k = qs.length;
  const d = 1 << k;
  const d2 = d * d;
  const offs = targetOffsets(n, qs);
  const tm = targetMask(n, qs);
  if (scratch.length < 2 * d2) scratch = new Float64Array(2 * d2);
  const v = scratch;
  const R = D >> k;
  const start = partStart(R, part, parts);
  const end = partStart(R, part + 1, parts);
  let idx = 0;
  for (let r = 0; r < D && idx < end; r = nextRest(r, tm), idx++) {
    if (idx < start) continue;
    for (let c = 0; c < D; c = nextRest(c, tm)) {
      for (let a = 0; a < d; a++) {
        const rowBase = (r + offs[a]!) * D + c;
        for (let b = 0; b < d; b++) {
          const src = 2 * (rowBase + offs[b]!);
          const dst = 2 * (a + b * d);
          v[dst] = data[src]!;
          v[dst + 1] = data[src + 1]!;
        }
      }
      for (let a = 0; a < d; a++) {
        const rowBase = (r + offs[a]!) * D + c;
        for (let b = 0; b < d; b++) {
          const row = off + 2 * (a + b * d) * d2;
          let sr = 0;
          let si = 0;
          for (let m = 0; m < d2; m++) {
            const xr = arena[row + 2 * m]!;
            const xi = arena[row + 2 * m + 1]!;
            const yr = v[2 * m]!;
            const yi = v[2 * m + 1]!;
            sr += xr * yr - xi * yi;
            si += xr * yi + xi * yr;
          }
          const dst = 2 * (rowBase + offs[b]!);
          data[dst] = sr;
          data[dst + 1] = si;
        }
      }
    }
  }
}
