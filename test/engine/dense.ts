/**
 * Independent dense reference built with mathjs: full 2^n × 2^n matrices via math.kron and
 * permutation matrices, against which the in-place engine is compared.
 */
import { add, complex, ctranspose, index, kron, matrix, multiply, range, subset, type Complex, type Matrix } from 'mathjs';
import type { CMatrix } from '../../src/linalg/cmatrix.js';
import type { Instruction } from '../../src/engine/instruction.js';
import type { DensityMatrix, StateVector } from '../../src/engine/layout.js';
import { toMath } from '../helpers/mathjs.js';
export { toMath } from '../helpers/mathjs.js';

/** Agreement required between the engine and the dense mathjs reference. */
export const DENSE_AGREEMENT = 1e-12;

/** A register density matrix as a mathjs matrix. */
export function rhoToMath(rho: DensityMatrix): Matrix {
  return toMath({ rows: rho.dim, cols: rho.dim, data: rho.data });
}

/** A state vector as a mathjs column matrix. */
export function psiToMath(psi: StateVector): Matrix {
  return toMath({ rows: psi.dim, cols: 1, data: psi.data });
}

function parts(x: unknown): [number, number] {
  if (typeof x === 'number') return [x, 0];
  const c = x as Complex;
  return [c.re, c.im];
}

/** max_ij |a_ij − m_ij| between interleaved row-major data (rows × cols) and a mathjs matrix. */
export function maxDiffToMath(data: Float64Array, rows: number, cols: number, m: Matrix): number {
  const size = m.size();
  if (size[0] !== rows || (size[1] ?? 1) !== cols) return Infinity;
  let worst = 0;
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < cols; j++) {
      const [re, im] = parts(m.get([i, j]));
      const d = Math.hypot(data[2 * (i * cols + j)]! - re, data[2 * (i * cols + j) + 1]! - im);
      if (d > worst) worst = d;
    }
  }
  return worst;
}

/** max_ij |ρ_ij − m_ij| for a register density matrix. */
export function rhoDiff(rho: DensityMatrix, m: Matrix): number {
  return maxDiffToMath(rho.data, rho.dim, rho.dim, m);
}

function realMatrix(rows: number[][]): Matrix {
  return matrix(rows.map((r) => r.map((v) => complex(v, 0))));
}

/**
 * Permutation matrix P with P|i⟩ = |j⟩, where j lists the bits of i (qubit 0 = most significant)
 * in the order [targets…, remaining qubits ascending]; so Pᵀ (U ⊗ I) P applies U to the targets.
 */
export function permutationTargetsFirst(n: number, targets: readonly number[]): Matrix {
  const order = [...targets, ...Array.from({ length: n }, (_, q) => q).filter((q) => !targets.includes(q))];
  const dim = 1 << n;
  const p: number[][] = Array.from({ length: dim }, () => new Array<number>(dim).fill(0));
  for (let i = 0; i < dim; i++) {
    let j = 0;
    for (let pos = 0; pos < n; pos++) {
      const bit = (i >> (n - 1 - order[pos]!)) & 1;
      j |= bit << (n - 1 - pos);
    }
    p[j]![i] = 1;
  }
  return realMatrix(p);
}

function identityMath(d: number): Matrix {
  return realMatrix(Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => (i === j ? 1 : 0))));
}

/** The full 2^n × 2^n matrix of operator `op` on `targets` (first target = leftmost factor), via kron and a permutation. */
export function embed(n: number, targets: readonly number[], op: CMatrix): Matrix {
  const p = permutationTargetsFirst(n, targets);
  const rest = 1 << (n - targets.length);
  const big = kron(toMath(op), identityMath(rest));
  return multiply(multiply(ctranspose(p), big), p) as Matrix;
}

/** Dense Σ_k K_k ρ K_k† with each K_k embedded on `targets` (a unitary is the one-element set). */
export function denseChannel(n: number, targets: readonly number[], kraus: readonly CMatrix[], rho: Matrix): Matrix {
  let out: Matrix | undefined;
  for (const k of kraus) {
    const e = embed(n, targets, k);
    const term = multiply(multiply(e, rho), ctranspose(e)) as Matrix;
    out = out ? (add(out, term) as Matrix) : term;
  }
  return out!;
}

/** Dense reset of qubit q by its definition |0⟩⟨0|_q ⊗ Tr_q ρ (partial trace by sub-blocks after moving q to the front). */
export function denseReset(n: number, q: number, rho: Matrix): Matrix {
  const p = permutationTargetsFirst(n, [q]);
  const moved = multiply(multiply(p, rho), ctranspose(p)) as Matrix;
  const dim = 1 << n;
  const h = dim / 2;
  const top = subset(moved, index(range(0, h), range(0, h)));
  const bottom = subset(moved, index(range(h, dim), range(h, dim)));
  const reduced = add(top, bottom) as Matrix;
  const ket0bra0 = realMatrix([
    [1, 0],
    [0, 0],
  ]);
  const out = kron(ket0bra0, reduced);
  return multiply(multiply(ctranspose(p), out), p) as Matrix;
}

/** Dense run of an instruction list from |0…0⟩: ρ → U ρ U†, Σ K ρ K†, reset, all with mathjs. */
export function denseProgramRun(n: number, program: readonly Instruction[]): Matrix {
  const d = 1 << n;
  let rho = matrix(Array.from({ length: d }, (_, r) => Array.from({ length: d }, (_, c) => complex(r === 0 && c === 0 ? 1 : 0, 0))));
  for (const ins of program) {
    if (ins.op === 'unitary') {
      const u = embed(n, ins.qubits, ins.matrix);
      rho = multiply(multiply(u, rho), ctranspose(u)) as Matrix;
    } else if (ins.op === 'channel') rho = denseChannel(n, ins.qubits, ins.kraus, rho);
    else rho = denseReset(n, ins.qubit, rho);
  }
  return rho;
}
