/**
 * Test helpers for the noise folder: a seeded PRNG, random states and channels, small
 * density-matrix operations written directly on CMatrix, Bloch vectors, Choi matrices and
 * exact state 2-designs (stabilizer states).
 */
import {
  type CMatrix,
  add,
  adjoint,
  entry,
  fromRows,
  identity,
  kron,
  mul,
  scale,
  trace,
  zeros,
} from '../../src/linalg/cmatrix.js';
import { gaussian } from '../helpers/random.js';
export { mulberry32, gaussian } from '../helpers/random.js';

/** Trace-preservation tolerance of the contract (krausResidual). */
export const TP_TOL = 1e-12;
/** Tolerance for comparing closed-form physics values with computed ones. */
export const PHYS_TOL = 1e-12;



/** Random complex rows × cols matrix with i.i.d. Gaussian entries. */
export function randomComplex(rand: () => number, rows: number, cols: number): CMatrix {
  const m = zeros(rows, cols);
  for (let i = 0; i < m.data.length; i++) m.data[i] = gaussian(rand);
  return m;
}

/** Random full-rank density matrix G G† / Tr(G G†). */
export function randomDensity(rand: () => number, d: number): CMatrix {
  const g = randomComplex(rand, d, d);
  const r = mul(g, adjoint(g));
  return scale(r, 1 / trace(r)[0]);
}

/** Gram–Schmidt orthonormalisation of the columns of m (rows ≥ cols). */
function orthonormalColumns(m: CMatrix): CMatrix {
  const out = zeros(m.rows, m.cols);
  const R = m.rows;
  for (let c = 0; c < m.cols; c++) {
    const vr = new Float64Array(R);
    const vi = new Float64Array(R);
    for (let r = 0; r < R; r++) {
      vr[r] = m.data[2 * (r * m.cols + c)]!;
      vi[r] = m.data[2 * (r * m.cols + c) + 1]!;
    }
    for (let p = 0; p < c; p++) {
      // <u_p, v>
      let sr = 0;
      let si = 0;
      for (let r = 0; r < R; r++) {
        const ur = out.data[2 * (r * m.cols + p)]!;
        const ui = out.data[2 * (r * m.cols + p) + 1]!;
        sr += ur * vr[r]! + ui * vi[r]!;
        si += ur * vi[r]! - ui * vr[r]!;
      }
      for (let r = 0; r < R; r++) {
        const ur = out.data[2 * (r * m.cols + p)]!;
        const ui = out.data[2 * (r * m.cols + p) + 1]!;
        vr[r] -= sr * ur - si * ui;
        vi[r] -= sr * ui + si * ur;
      }
    }
    let n = 0;
    for (let r = 0; r < R; r++) n += vr[r]! * vr[r]! + vi[r]! * vi[r]!;
    n = Math.sqrt(n);
    for (let r = 0; r < R; r++) {
      out.data[2 * (r * m.cols + c)] = vr[r]! / n;
      out.data[2 * (r * m.cols + c) + 1] = vi[r]! / n;
    }
  }
  return out;
}

/** Random unitary d × d (Gram–Schmidt of a Gaussian matrix). */
export function randomUnitary(rand: () => number, d: number): CMatrix {
  return orthonormalColumns(randomComplex(rand, d, d));
}

/**
 * Random CPTP channel with `count` Kraus operators on dimension d: the blocks of a random
 * isometry V (count·d × d, V†V = I), so Σ K_k†K_k = I (Stinespring; N&C §8.2.3, common practice).
 */
export function randomKraus(rand: () => number, d: number, count: number): CMatrix[] {
  const v = orthonormalColumns(randomComplex(rand, count * d, d));
  const ops: CMatrix[] = [];
  for (let b = 0; b < count; b++) {
    const k = zeros(d, d);
    for (let i = 0; i < d; i++) {
      for (let j = 0; j < d; j++) {
        k.data[2 * (i * d + j)] = v.data[2 * ((b * d + i) * d + j)]!;
        k.data[2 * (i * d + j) + 1] = v.data[2 * ((b * d + i) * d + j) + 1]!;
      }
    }
    ops.push(k);
  }
  return ops;
}

/** Σ_k K_k ρ K_k† computed directly. */
export function applyKraus(kraus: readonly CMatrix[], rho: CMatrix): CMatrix {
  let out = zeros(rho.rows, rho.cols);
  for (const k of kraus) out = add(out, mul(mul(k, rho), adjoint(k)));
  return out;
}

/** U ρ U†. */
export function conjugate(u: CMatrix, rho: CMatrix): CMatrix {
  return mul(mul(u, rho), adjoint(u));
}

/** The operator op on local `targets` of a k-qubit register: kron with identities (single target or all targets in order). */
export function embedLocal(op: CMatrix, targets: readonly number[], k: number): CMatrix {
  if (targets.length === k) {
    targets.forEach((t, i) => {
      if (t !== i) throw new Error('embedLocal: only in-order full target lists');
    });
    return op;
  }
  if (targets.length !== 1) throw new Error('embedLocal: single target or all targets');
  const q = targets[0]!;
  return kron(kron(identity(1 << q), op), identity(1 << (k - q - 1)));
}

/** Bloch vector (Tr ρX, Tr ρY, Tr ρZ) of a 2 × 2 density matrix: r_x = 2 Re ρ01, r_y = −2 Im ρ01, r_z = ρ00 − ρ11. */
export function bloch(rho: CMatrix): [number, number, number] {
  const [r01, i01] = entry(rho, 0, 1);
  return [2 * r01, -2 * i01, entry(rho, 0, 0)[0] - entry(rho, 1, 1)[0]];
}

/** ρ = (I + r·σ)/2 from a Bloch vector. */
export function fromBloch(r: readonly [number, number, number]): CMatrix {
  const [x, y, z] = r;
  return fromRows([
    [(1 + z) / 2, [x / 2, -y / 2]],
    [[x / 2, y / 2], (1 - z) / 2],
  ]);
}

/** Choi matrix Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|) of a Kraus channel (unnormalised). */
export function choi(kraus: readonly CMatrix[]): CMatrix {
  const d = kraus[0]!.cols;
  let out = zeros(d * d, d * d);
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      const e = zeros(d, d);
      e.data[2 * (i * d + j)] = 1;
      out = add(out, kron(e, applyKraus(kraus, e)));
    }
  }
  return out;
}

/** A state vector as a d × 1 CMatrix. */
export type Ket = CMatrix;

/** |ψ⟩⟨ψ|. */
export function projector(psi: Ket): CMatrix {
  return mul(psi, adjoint(psi));
}

/** ⟨ψ|A|ψ⟩ (real part). */
export function expectation(psi: Ket, a: CMatrix): number {
  return entry(mul(adjoint(psi), mul(a, psi)), 0, 0)[0];
}

const INV_SQRT2 = Math.SQRT1_2;
const H = fromRows([
  [INV_SQRT2, INV_SQRT2],
  [INV_SQRT2, -INV_SQRT2],
]);
const S = fromRows([
  [1, 0],
  [0, [0, 1]],
]);

/** Hadamard gate. */
export const HADAMARD = H;

/** CX with control = qubit 0 (most significant) and target = qubit 1. */
export const CX = fromRows([
  [1, 0, 0, 0],
  [0, 1, 0, 0],
  [0, 0, 0, 1],
  [0, 0, 1, 0],
]);

function keyOf(psi: Ket): string {
  // fix the global phase by making the first non-negligible amplitude real positive
  let pr = 0;
  let pi = 0;
  for (let i = 0; i < psi.rows; i++) {
    const a = psi.data[2 * i]!;
    const b = psi.data[2 * i + 1]!;
    if (Math.hypot(a, b) > 1e-9) {
      const n = Math.hypot(a, b);
      pr = a / n;
      pi = -b / n;
      break;
    }
  }
  const parts: string[] = [];
  for (let i = 0; i < psi.rows; i++) {
    const a = psi.data[2 * i]!;
    const b = psi.data[2 * i + 1]!;
    const re = a * pr - b * pi;
    const im = a * pi + b * pr;
    parts.push(`${(Math.round(re * 1e6) / 1e6 + 0).toFixed(6)},${(Math.round(im * 1e6) / 1e6 + 0).toFixed(6)}`);
  }
  return parts.join(';');
}

/**
 * All n-qubit stabilizer states (up to global phase), generated as the orbit of |0…0⟩ under
 * the Clifford generators H_q, S_q and CZ between neighbouring qubits (Gottesman; common
 * practice). They form an exact state 2-design, as the orbit of the Clifford group, a
 * unitary 2-design (D. Gross, K. Audenaert, J. Eisert, J. Math. Phys. 48, 052104 (2007)).
 */
export function stabilizerStates(n: number): Ket[] {
  const d = 1 << n;
  const gens: CMatrix[] = [];
  for (let q = 0; q < n; q++) {
    const left = identity(1 << q);
    const right = identity(1 << (n - q - 1));
    gens.push(kron(kron(left, H), right));
    gens.push(kron(kron(left, S), right));
  }
  for (let q = 0; q + 1 < n; q++) {
    const cz = identity(4);
    cz.data[2 * 15] = -1;
    gens.push(kron(kron(identity(1 << q), cz), identity(1 << (n - q - 2))));
  }
  const start = zeros(d, 1);
  start.data[0] = 1;
  const seen = new Map<string, Ket>([[keyOf(start), start]]);
  const queue: Ket[] = [start];
  while (queue.length > 0) {
    const psi = queue.shift()!;
    for (const g of gens) {
      const next = mul(g, psi);
      const key = keyOf(next);
      if (!seen.has(key)) {
        seen.set(key, next);
        queue.push(next);
      }
    }
  }
  return [...seen.values()];
}

/**
 * Frame potential (1/N²) Σ_ij |⟨ψ_i|ψ_j⟩|⁴ of a set of unit vectors; it equals 2/(d(d + 1))
 * exactly for a state 2-design and exceeds it otherwise (Welch bound; J. M. Renes,
 * R. Blume-Kohout, A. J. Scott, C. M. Caves, J. Math. Phys. 45, 2171 (2004) (from memory)).
 */
export function framePotential(states: readonly Ket[]): number {
  let sum = 0;
  for (const a of states) {
    for (const b of states) {
      const [re, im] = entry(mul(adjoint(a), b), 0, 0);
      const o = re * re + im * im;
      sum += o * o;
    }
  }
  return sum / (states.length * states.length);
}

/**
 * Average gate fidelity of the gate channel ρ ↦ E(UρU†) against U, as the exact average of
 * ⟨ψ|U† E(UψU†) U|ψ⟩ over a state 2-design (Nielsen, Phys. Lett. A 303, 249 (2002): F_avg is
 * a quadratic function of ψ, so a 2-design average is exact). `noise` maps a density matrix.
 */
export function designAverageFidelity(
  design: readonly Ket[],
  u: CMatrix,
  noise: (rho: CMatrix) => CMatrix,
): number {
  let sum = 0;
  for (const psi of design) {
    const upsi = mul(u, psi);
    sum += expectation(upsi, noise(projector(upsi)));
  }
  return sum / design.length;
}
