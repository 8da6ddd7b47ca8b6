/**
 * Noise channels of fray as Kraus sets: ρ → Σ_k K_k ρ K_k†, each K_k a 2^k × 2^k CMatrix
 * in the register convention of src/engine/layout.ts (first target = leftmost factor).
 *
 * Basis convention (as in Nielsen & Chuang): |0⟩ is the ground state, |1⟩ the excited
 * state; the Bloch vector of ρ = (I + r·σ)/2 has r_z = +1 for |0⟩.
 *
 * Every constructor drops Kraus operators that are exactly zero (they do not change the
 * channel), so a parameter of 0 gives the identity channel with a single Kraus operator.
 */
import { type CMatrix, fromRows, identity, kron, mul, scale } from '../linalg/cmatrix.js';

/** A CPTP map on `qubits` qubits given by its Kraus operators (each 2^qubits × 2^qubits). */
export interface KrausChannel {
  readonly qubits: number;
  readonly kraus: readonly CMatrix[];
}

/** Tolerance when checking that a probability or a sum of probabilities lies in [0, 1]. */
export const PROBABILITY_TOLERANCE = 1e-12;

/**
 * Relative tolerance under which two Kraus operators count as parallel (K_b = c·K_a) and
 * are merged into one, √(1 + |c|²)·K_a, which leaves the channel unchanged.
 */
export const KRAUS_PARALLEL_TOLERANCE = 1e-14;

const PAULI_1Q: Record<string, CMatrix> = {
  I: identity(2),
  X: fromRows([
    [0, 1],
    [1, 0],
  ]),
  Y: fromRows([
    [0, [0, -1]],
    [[0, 1], 0],
  ]),
  Z: fromRows([
    [1, 0],
    [0, -1],
  ]),
};

/**
 * The Pauli string `label` (characters I, X, Y, Z, case-insensitive) as a 2^k × 2^k matrix;
 * the leftmost character is the most significant (leftmost) tensor factor, so 'XZ' = X ⊗ Z.
 */
export function pauliMatrix(label: string): CMatrix {
  if (label.length === 0) throw new RangeError('pauliMatrix: empty Pauli string');
  let out: CMatrix | undefined;
  for (const ch of label.toUpperCase()) {
    const p = PAULI_1Q[ch];
    if (p === undefined) throw new RangeError(`pauliMatrix: '${ch}' is not one of I, X, Y, Z in '${label}'`);
    out = out === undefined ? p : kron(out, p);
  }
  return out!;
}

/** All 4^k Pauli strings on k qubits in lexicographic order over I, X, Y, Z ('II', 'IX', …). */
export function pauliLabels(k: number): string[] {
  let labels = [''];
  for (let q = 0; q < k; q++) {
    const next: string[] = [];
    for (const l of labels) for (const c of 'IXYZ') next.push(l + c);
    labels = next;
  }
  return labels;
}

function checkProbability(name: string, p: number): void {
  if (!Number.isFinite(p) || p < -PROBABILITY_TOLERANCE || p > 1 + PROBABILITY_TOLERANCE) {
    throw new RangeError(`${name}: probability ${p} is outside [0, 1]`);
  }
}

function clamp01(p: number): number {
  return p < 0 ? 0 : p > 1 ? 1 : p;
}

function isZero(m: CMatrix): boolean {
  for (let i = 0; i < m.data.length; i++) if (m.data[i] !== 0) return false;
  return true;
}

/** If b = c·a (within KRAUS_PARALLEL_TOLERANCE relative to a's largest entry) returns c, else undefined. */
function parallelFactor(a: CMatrix, b: CMatrix): readonly [number, number] | undefined {
  const A = a.data;
  const B = b.data;
  let best = 0;
  let bi = -1;
  for (let i = 0; i < A.length; i += 2) {
    const m = A[i]! * A[i]! + A[i + 1]! * A[i + 1]!;
    if (m > best) {
      best = m;
      bi = i;
    }
  }
  if (bi < 0) return undefined;
  // c = b[bi] / a[bi]
  const ar = A[bi]!;
  const ai = A[bi + 1]!;
  const cr = (B[bi]! * ar + B[bi + 1]! * ai) / best;
  const ci = (B[bi + 1]! * ar - B[bi]! * ai) / best;
  const scaleA = Math.sqrt(best);
  const scaleB = Math.hypot(cr, ci) * scaleA;
  const tol = KRAUS_PARALLEL_TOLERANCE * Math.max(scaleA, scaleB);
  for (let i = 0; i < A.length; i += 2) {
    const er = B[i]! - (cr * A[i]! - ci * A[i + 1]!);
    const ei = B[i + 1]! - (cr * A[i + 1]! + ci * A[i]!);
    if (Math.hypot(er, ei) > tol) return undefined;
  }
  return [cr, ci];
}

/**
 * The same channel with fewer Kraus operators: exactly-zero operators are dropped and
 * parallel operators (K_b = c·K_a) are merged into √(1 + |c|²)·K_a, since
 * K_a ρ K_a† + K_b ρ K_b† = (1 + |c|²) K_a ρ K_a†.
 */
export function simplifyKraus(ops: readonly CMatrix[]): CMatrix[] {
  const out: CMatrix[] = [];
  for (const op of ops) {
    if (isZero(op)) continue;
    let merged = false;
    for (let j = 0; j < out.length; j++) {
      const c = parallelFactor(out[j]!, op);
      if (c === undefined) continue;
      out[j] = scale(out[j]!, Math.sqrt(1 + c[0] * c[0] + c[1] * c[1]));
      merged = true;
      break;
    }
    if (!merged) out.push(op);
  }
  if (out.length === 0) throw new RangeError('simplifyKraus: every Kraus operator is zero');
  return out;
}

/** A channel from weighted unitaries Σ_i w_i U_i ρ U_i† (weights ≥ 0), zero weights dropped. */
function mixedUnitary(qubits: number, terms: ReadonlyArray<readonly [number, CMatrix]>): KrausChannel {
  const kraus: CMatrix[] = [];
  for (const [w, u] of terms) if (w > 0) kraus.push(scale(u, Math.sqrt(w)));
  if (kraus.length === 0) kraus.push(identity(1 << qubits));
  return { qubits, kraus };
}

/**
 * k-qubit depolarizing channel ρ → (1 − p)ρ + p·I/d, d = 2^k, p ∈ [0, 1]
 * (Nielsen & Chuang §8.3.4, eq. 8.100 for one qubit (from memory)). Kraus operators
 * √(1 − p + p/d²)·I and √(p/d²)·P for the d² − 1 non-identity Pauli strings P, using
 * Σ_P P ρ P = d·Tr(ρ)·I over all d² Pauli strings.
 */
export function depolarizing(k: number, p: number): KrausChannel {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`depolarizing: arity ${k} must be a positive integer`);
  checkProbability('depolarizing', p);
  p = clamp01(p);
  const d2 = Math.pow(4, k);
  const terms: Array<readonly [number, CMatrix]> = [];
  for (const label of pauliLabels(k)) {
    const isId = !/[XYZ]/.test(label);
    terms.push([isId ? 1 - p + p / d2 : p / d2, pauliMatrix(label)]);
  }
  return mixedUnitary(k, terms);
}

/**
 * Amplitude damping with decay probability γ ∈ [0, 1] (energy loss |1⟩ → |0⟩):
 * K0 = [[1, 0], [0, √(1−γ)]], K1 = [[0, √γ], [0, 0]]
 * (Nielsen & Chuang §8.3.5, eq. 8.107–8.108 (from memory)).
 */
export function amplitudeDamping(g: number): KrausChannel {
  checkProbability('amplitude_damping', g);
  g = clamp01(g);
  return { qubits: 1, kraus: simplifyKraus(amplitudeDampingOps(g)) };
}

function amplitudeDampingOps(g: number): CMatrix[] {
  return [
    fromRows([
      [1, 0],
      [0, Math.sqrt(1 - g)],
    ]),
    fromRows([
      [0, Math.sqrt(g)],
      [0, 0],
    ]),
  ];
}

/**
 * Phase damping with parameter λ ∈ [0, 1] (loss of coherence without energy loss; the
 * off-diagonal ρ01 scales by √(1−λ)): K0 = [[1, 0], [0, √(1−λ)]], K1 = [[0, 0], [0, √λ]]
 * (Nielsen & Chuang §8.3.6, eq. 8.127–8.128 (from memory)).
 */
export function phaseDamping(l: number): KrausChannel {
  checkProbability('phase_damping', l);
  l = clamp01(l);
  return { qubits: 1, kraus: simplifyKraus(phaseDampingOps(l)) };
}

function phaseDampingOps(l: number): CMatrix[] {
  return [
    fromRows([
      [1, 0],
      [0, Math.sqrt(1 - l)],
    ]),
    fromRows([
      [0, 0],
      [0, Math.sqrt(l)],
    ]),
  ];
}

/**
 * Bit flip ρ → (1 − p)ρ + p·XρX, p = flip probability (Nielsen & Chuang §8.3.3, eq. 8.84–8.85
 * (from memory); note N&C's p is the probability of NO flip, ours is the flip probability).
 */
export function bitFlip(p: number): KrausChannel {
  checkProbability('bit_flip', p);
  p = clamp01(p);
  return mixedUnitary(1, [
    [1 - p, PAULI_1Q.I!],
    [p, PAULI_1Q.X!],
  ]);
}

/**
 * Phase flip ρ → (1 − p)ρ + p·ZρZ, p = flip probability (Nielsen & Chuang §8.3.3, eq. 8.86–8.87
 * (from memory); N&C's p is the probability of no flip).
 */
export function phaseFlip(p: number): KrausChannel {
  checkProbability('phase_flip', p);
  p = clamp01(p);
  return mixedUnitary(1, [
    [1 - p, PAULI_1Q.I!],
    [p, PAULI_1Q.Z!],
  ]);
}

/**
 * Bit-phase flip ρ → (1 − p)ρ + p·YρY, p = flip probability (Nielsen & Chuang §8.3.3,
 * eq. 8.88–8.89 (from memory); N&C's p is the probability of no flip).
 */
export function bitPhaseFlip(p: number): KrausChannel {
  checkProbability('bit_phase_flip', p);
  p = clamp01(p);
  return mixedUnitary(1, [
    [1 - p, PAULI_1Q.I!],
    [p, PAULI_1Q.Y!],
  ]);
}

/**
 * Single-qubit Pauli channel ρ → (1 − x − y − z)ρ + x·XρX + y·YρY + z·ZρZ with x, y, z ≥ 0 and
 * x + y + z ≤ 1 (the mixed-unitary form of Nielsen & Chuang §8.3.3–8.3.4; common practice).
 */
export function pauliChannel(x: number, y: number, z: number): KrausChannel {
  checkProbability('pauli x', x);
  checkProbability('pauli y', y);
  checkProbability('pauli z', z);
  const s = x + y + z;
  if (s > 1 + PROBABILITY_TOLERANCE) throw new RangeError(`pauli: x + y + z = ${s} exceeds 1`);
  x = clamp01(x);
  y = clamp01(y);
  z = clamp01(z);
  return mixedUnitary(1, [
    [Math.max(0, 1 - x - y - z), PAULI_1Q.I!],
    [x, PAULI_1Q.X!],
    [y, PAULI_1Q.Y!],
    [z, PAULI_1Q.Z!],
  ]);
}

/**
 * Generalized amplitude damping with decay probability γ and excited (equilibrium)
 * population pe: exchange with a bath at finite temperature whose fixed point is
 * diag(1 − pe, pe). Kraus operators (Nielsen & Chuang §8.3.5, eq. 8.108–8.111 (from memory),
 * written there with p = 1 − pe): √(1−pe)·[[1,0],[0,√(1−γ)]], √(1−pe)·[[0,√γ],[0,0]],
 * √pe·[[√(1−γ),0],[0,1]], √pe·[[0,0],[√γ,0]].
 */
export function generalizedAmplitudeDamping(g: number, excited: number): KrausChannel {
  checkProbability('generalized amplitude damping γ', g);
  checkProbability('generalized amplitude damping excited population', excited);
  return { qubits: 1, kraus: simplifyKraus(generalizedAmplitudeDampingOps(clamp01(g), clamp01(excited))) };
}

function generalizedAmplitudeDampingOps(g: number, pe: number): CMatrix[] {
  const a = Math.sqrt(1 - pe);
  const b = Math.sqrt(pe);
  const s = Math.sqrt(1 - g);
  const r = Math.sqrt(g);
  return [
    fromRows([
      [a, 0],
      [0, a * s],
    ]),
    fromRows([
      [0, a * r],
      [0, 0],
    ]),
    fromRows([
      [b * s, 0],
      [0, b],
    ]),
    fromRows([
      [0, 0],
      [b * r, 0],
    ]),
  ];
}

/**
 * Relative slack on the physical limit T2 ≤ 2·T1, so that a t2 written as exactly 2·t1 in
 * other units (2015ns and 4.03us: 4030.0000000000005 ns after conversion) is accepted. The one
 * place this tolerance lives: the kernel below, device profiles and `thermal:` channel
 * definitions all ask t2WithinLimit.
 */
export const T2_LIMIT_TOLERANCE = 1e-12;

/** True when T2 ≤ 2·T1 up to T2_LIMIT_TOLERANCE (relative); times in ns, Infinity allowed. */
export function t2WithinLimit(t1: number, t2: number): boolean {
  return t2 <= 2 * t1 * (1 + T2_LIMIT_TOLERANCE);
}

/** Parameters of thermal relaxation of one qubit: times in ns (Infinity = no such process). */
export interface ThermalRelaxationParams {
  /** Energy relaxation time T1 in ns; Infinity means no relaxation. */
  readonly t1: number;
  /** Coherence (dephasing) time T2 in ns; Infinity means no dephasing beyond T1; needs t2 ≤ 2·t1. */
  readonly t2: number;
  /** Equilibrium excited-state population pe ∈ [0, 1] (0 at zero temperature). */
  readonly excited: number;
  /** Duration τ in ns. */
  readonly time: number;
}

/**
 * Thermal relaxation of one qubit for time τ: populations relax as
 * p1(τ) = p1·e^{−τ/T1} + pe·(1 − e^{−τ/T1}) and the coherence ρ01 scales by e^{−τ/T2}
 * (definitions of T1 and T2: common practice). Built as generalized amplitude damping
 * (γ = 1 − e^{−τ/T1}, excited pe; Nielsen & Chuang §8.3.5), which already scales ρ01 by
 * √(1−γ) = e^{−τ/(2T1)}, followed by phase damping (§8.3.6) with
 * √(1−λ) = e^{−τ/T2}/e^{−τ/(2T1)}, i.e. λ = 1 − e^{−τ(2/T2 − 1/T1)} (needs T2 ≤ 2·T1).
 * Exactly-zero and parallel Kraus operators are removed; returns the identity channel
 * (one Kraus operator) when nothing happens. A T2 above 2·T1 by at most T2_LIMIT_TOLERANCE
 * acts as T2 = 2·T1.
 */
export function thermalRelaxation(params: ThermalRelaxationParams): KrausChannel {
  const { t1, t2, excited, time } = params;
  if (!(t1 > 0) || !(t2 > 0)) throw new RangeError(`thermal relaxation: T1 = ${t1} and T2 = ${t2} must be > 0`);
  if (!(time >= 0) || !Number.isFinite(time)) throw new RangeError(`thermal relaxation: time ${time} must be finite and ≥ 0`);
  if (!t2WithinLimit(t1, t2)) throw new RangeError(`thermal relaxation: T2 = ${t2} exceeds 2·T1 = ${2 * t1}`);
  checkProbability('thermal relaxation excited population', excited);
  const pe = clamp01(excited);
  if (time === 0) return { qubits: 1, kraus: [identity(2)] };
  const g = -Math.expm1(-time / t1); // 1 − e^{−τ/T1}, 0 when T1 = ∞
  // The exponent τ(2/T2 − 1/T1) is ≥ 0 since T2 ≤ 2·T1 (the max clamps rounding and the
  // T2_LIMIT_TOLERANCE slack). With subnormal times 2/T2 or 1/T1 overflows; then it is taken as
  // 2(τ/T2) − τ/T1, finite whenever τ is comparable to the times, and NaN only where
  // τ/T1 = τ/T2 = ∞, where g = 1 has removed every coherence already.
  const rate = 2 / t2 - 1 / t1;
  const x = Number.isFinite(rate) ? time * Math.max(0, rate) : Math.max(0, 2 * (time / t2) - time / t1);
  const l = Number.isNaN(x) ? 0 : -Math.expm1(-x); // 1 − e^{−τ(2/T2 − 1/T1)}
  if (g === 0 && l === 0) return { qubits: 1, kraus: [identity(2)] };
  const gad = g === 0 ? [identity(2)] : generalizedAmplitudeDampingOps(g, pe);
  const pd = l === 0 ? [identity(2)] : phaseDampingOps(l);
  const ops: CMatrix[] = [];
  for (const b of pd) for (const a of gad) ops.push(mul(b, a));
  return { qubits: 1, kraus: simplifyKraus(ops) };
}
