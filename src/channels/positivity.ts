/**
 * Positivity (not complete positivity) of a Hermiticity-preserving map E: does E take every
 * positive semidefinite input to a positive semidefinite output? Equivalently, is
 * m(E) = min over unit vectors ψ, φ of ⟨φ|E(|ψ⟩⟨ψ|)|φ⟩ ≥ 0 (the minimum over pure inputs of
 * the smallest output eigenvalue; mixed inputs are convex combinations of pure ones).
 *
 * What is tested (a numerical search, documented as such): m(E) is minimised by the
 * alternating ("see-saw") iteration: for fixed ψ the best φ is the eigenvector of the smallest
 * eigenvalue of E(|ψ⟩⟨ψ|); for fixed φ the best ψ is that of E*(|φ⟩⟨φ|) (E* the adjoint map,
 * superoperator S†), since ⟨φ|E(ψψ†)|φ⟩ = ⟨ψ|E*(φφ†)|ψ⟩. Each half-step cannot increase the
 * value. For one qubit the starts are the best points of a 10° grid over the Bloch sphere of ψ
 * (so the search covers the whole input space); for more qubits they are the computational
 * basis states and seeded random pure states. A value below −PHYSICALITY_TOLERANCE comes with
 * its input state and PROVES the map not positive; a value above it means "positive on every
 * input the search reached", which is not a proof for more than one qubit.
 */
import { type CMatrix, adjoint, zeros } from '../linalg/cmatrix.js';
import { createRandom } from '../results/random.js';
import { hermitianEigen } from '../linalg/hermitianEigen.js';

/** Grid step of the one-qubit Bloch-sphere scan, in degrees. */
export const POSITIVITY_GRID_DEGREES = 10;
/** Best grid points (one qubit) or random states (more qubits) refined by the see-saw. */
export const POSITIVITY_STARTS = 6;
/** Random starting states added for maps on more than one qubit. */
export const POSITIVITY_RANDOM_STARTS = 24;
/** Most see-saw half-step pairs per start. */
export const POSITIVITY_MAX_ITERATIONS = 200;
/** The see-saw stops when one pair of half-steps lowers the value by less than this. */
export const POSITIVITY_CONVERGENCE = 1e-15;
/** Seed of the random starting states (fixed, so the check is reproducible). */
export const POSITIVITY_SEED = 20_250_101;

/** Result of the positivity search. */
export interface PositivitySearch {
  /** Smallest output eigenvalue found over pure inputs. */
  readonly minOutputEigenvalue: number;
  /** The input state vector (length-d interleaved complex) that reached it. */
  readonly input: Float64Array;
  /** What was searched, in words. */
  readonly method: string;
}

/** Y = S applied to |x⟩⟨y| for interleaved vectors x, y of length d: vec(Y) = S·vec(|x⟩⟨y|), Y returned as a d × d matrix. */
function applyToOuter(s: CMatrix, x: Float64Array, d: number): CMatrix {
  const D = d * d;
  const v = new Float64Array(2 * D);
  // vec(|x⟩⟨x|)[a + b·d] = x_a conj(x_b)
  for (let a = 0; a < d; a++) {
    for (let b = 0; b < d; b++) {
      v[2 * (a + b * d)] = x[2 * a]! * x[2 * b]! + x[2 * a + 1]! * x[2 * b + 1]!;
      v[2 * (a + b * d) + 1] = x[2 * a + 1]! * x[2 * b]! - x[2 * a]! * x[2 * b + 1]!;
    }
  }
  const out = zeros(d, d);
  const S = s.data;
  for (let r = 0; r < D; r++) {
    let re = 0;
    let im = 0;
    for (let c = 0; c < D; c++) {
      const sr = S[2 * (r * D + c)]!;
      const si = S[2 * (r * D + c) + 1]!;
      re += sr * v[2 * c]! - si * v[2 * c + 1]!;
      im += sr * v[2 * c + 1]! + si * v[2 * c]!;
    }
    const a = r % d;
    const b = (r - a) / d;
    out.data[2 * (a * d + b)] = re;
    out.data[2 * (a * d + b) + 1] = im;
  }
  return out;
}

/** Smallest eigenvalue of the Hermitian part of m and its eigenvector. */
function lowest(m: CMatrix): { value: number; vector: Float64Array } {
  const { values, vectors } = hermitianEigen(m);
  const n = m.rows;
  const vector = new Float64Array(2 * n);
  for (let r = 0; r < n; r++) {
    vector[2 * r] = vectors.data[2 * (r * n + n - 1)]!;
    vector[2 * r + 1] = vectors.data[2 * (r * n + n - 1) + 1]!;
  }
  return { value: values[n - 1]!, vector };
}

function seeSaw(s: CMatrix, sAdj: CMatrix, start: Float64Array, d: number): { value: number; input: Float64Array } {
  let psi = start;
  let best = lowest(applyToOuter(s, psi, d));
  for (let it = 0; it < POSITIVITY_MAX_ITERATIONS; it++) {
    const back = lowest(applyToOuter(sAdj, best.vector, d)); // min over ψ of ⟨φ|E(ψψ†)|φ⟩
    const next = lowest(applyToOuter(s, back.vector, d));
    const improved = best.value - next.value;
    if (next.value < best.value) {
      psi = back.vector;
      best = next;
    }
    if (!(improved > POSITIVITY_CONVERGENCE)) break;
  }
  return { value: best.value, input: psi };
}

/** Pure qubit state cos(θ/2)|0⟩ + e^{iφ} sin(θ/2)|1⟩ as an interleaved vector. */
function blochState(theta: number, phi: number): Float64Array {
  return Float64Array.from([Math.cos(theta / 2), 0, Math.sin(theta / 2) * Math.cos(phi), Math.sin(theta / 2) * Math.sin(phi)]);
}

/**
 * Searches the smallest output eigenvalue over pure inputs of the map with superoperator `s`
 * (Hermiticity preserving, d² × d²) by the see-saw described in the file comment.
 */
export function searchMinOutputEigenvalue(s: CMatrix): PositivitySearch {
  const d = Math.round(Math.sqrt(s.rows));
  const sAdj = adjoint(s);
  const starts: Float64Array[] = [];
  let method: string;
  if (d === 2) {
    const step = (POSITIVITY_GRID_DEGREES * Math.PI) / 180;
    const scored: Array<{ v: number; psi: Float64Array }> = [];
    for (let theta = 0; theta <= Math.PI + 1e-12; theta += step) {
      const phis = theta === 0 || theta >= Math.PI - 1e-12 ? 1 : Math.round((2 * Math.PI) / step);
      for (let p = 0; p < phis; p++) {
        const psi = blochState(theta, (2 * Math.PI * p) / phis);
        scored.push({ v: lowest(applyToOuter(s, psi, d)).value, psi });
      }
    }
    scored.sort((a, b) => a.v - b.v);
    for (let i = 0; i < Math.min(POSITIVITY_STARTS, scored.length); i++) starts.push(scored[i]!.psi);
    method = `see-saw minimisation of the smallest output eigenvalue from the best points of a ${POSITIVITY_GRID_DEGREES}° Bloch-sphere grid of pure inputs`;
  } else {
    for (let i = 0; i < d; i++) {
      const e = new Float64Array(2 * d);
      e[2 * i] = 1;
      starts.push(e);
    }
    const rng = createRandom(POSITIVITY_SEED);
    for (let t = 0; t < POSITIVITY_RANDOM_STARTS; t++) {
      const psi = new Float64Array(2 * d);
      let norm = 0;
      for (let i = 0; i < 2 * d; i++) {
        // Box–Muller normal deviates (common practice) make the state uniformly distributed.
        const u = 1 - rng.nextDouble();
        psi[i] = Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng.nextDouble());
        norm += psi[i]! ** 2;
      }
      for (let i = 0; i < 2 * d; i++) psi[i] /= Math.sqrt(norm);
      starts.push(psi);
    }
    method = `see-saw minimisation of the smallest output eigenvalue from ${d} basis states and ${POSITIVITY_RANDOM_STARTS} seeded random pure inputs (a search, not a proof of positivity)`;
  }
  let best = { value: Infinity, input: starts[0]! };
  for (const start of starts) {
    const r = seeSaw(s, sAdj, start, d);
    if (r.value < best.value) best = r;
  }
  return { minOutputEigenvalue: best.value, input: best.input, method };
}
