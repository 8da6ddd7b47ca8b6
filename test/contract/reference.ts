/**
 * An independent, deliberately plain implementation of fray's circuit contract (issue 2,
 * "The contract (circuit and noise-profile format, results)"), written from the contract
 * text only, used as a test oracle. Clarity over speed: dense complex matrices held as two
 * Float64Arrays (re, im), every channel applied to the whole register by its definition.
 *
 * It supports the subset of the contract that `generator.ts` emits: every built-in gate with
 * numeric angles, custom matrix gates, composite gates without parameters, custom Kraus
 * channels, idle with durations, barrier, reset, terminal measure, standalone noise steps,
 * per-step `noise:` replace and `noise: none`, inline and device profiles, qubit labels,
 * every noise kind, thermal relaxation, readout confusion, the three-level precedence,
 * ASAP / ALAP, and `idle: thermal | none`. It validates almost nothing: the inputs are
 * generated valid.
 *
 * Conventions (from the contract): qubit 0 is the most significant bit of a basis index;
 * for a k-qubit matrix the first listed target is the most significant tensor factor;
 * bitstrings put the first measured qubit leftmost; durations are kept in nanoseconds.
 */
import YAML from 'yaml';

// ---------------------------------------------------------------------------------------
// Complex dense matrices
// ---------------------------------------------------------------------------------------

/** A dense complex d×d matrix, row-major, real and imaginary parts in separate arrays. */
export interface Mat {
  readonly d: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/** A complex number as [re, im]. */
export type Cx = readonly [number, number];

/** The d×d zero matrix. */
export function zeros(d: number): Mat {
  return { d, re: new Float64Array(d * d), im: new Float64Array(d * d) };
}

/** A matrix from its rows of complex entries. */
export function fromRows(rows: readonly (readonly Cx[])[]): Mat {
  const d = rows.length;
  const m = zeros(d);
  for (let r = 0; r < d; r++) {
    if (rows[r]!.length !== d) throw new Error('matrix is not square');
    for (let c = 0; c < d; c++) {
      m.re[r * d + c] = rows[r]![c]![0];
      m.im[r * d + c] = rows[r]![c]![1];
    }
  }
  return m;
}

/** The d×d identity. */
export function identity(d: number): Mat {
  const m = zeros(d);
  for (let i = 0; i < d; i++) m.re[i * d + i] = 1;
  return m;
}

/** The product a·b. */
export function matmul(a: Mat, b: Mat): Mat {
  const d = a.d;
  const out = zeros(d);
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      const ar = a.re[i * d + k]!;
      const ai = a.im[i * d + k]!;
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < d; j++) {
        const br = b.re[k * d + j]!;
        const bi = b.im[k * d + j]!;
        out.re[i * d + j] += ar * br - ai * bi;
        out.im[i * d + j] += ar * bi + ai * br;
      }
    }
  }
  return out;
}

/** The conjugate transpose a†. */
export function adjoint(a: Mat): Mat {
  const d = a.d;
  const out = zeros(d);
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      out.re[j * d + i] = a.re[i * d + j]!;
      out.im[j * d + i] = -a.im[i * d + j]!;
    }
  }
  return out;
}

/** The Kronecker product a ⊗ b (a the more significant factor). */
export function kron(a: Mat, b: Mat): Mat {
  const d = a.d * b.d;
  const out = zeros(d);
  for (let i = 0; i < a.d; i++) {
    for (let j = 0; j < a.d; j++) {
      const ar = a.re[i * a.d + j]!;
      const ai = a.im[i * a.d + j]!;
      for (let k = 0; k < b.d; k++) {
        for (let l = 0; l < b.d; l++) {
          const br = b.re[k * b.d + l]!;
          const bi = b.im[k * b.d + l]!;
          const idx = (i * b.d + k) * d + (j * b.d + l);
          out.re[idx] = ar * br - ai * bi;
          out.im[idx] = ar * bi + ai * br;
        }
      }
    }
  }
  return out;
}

/** s·a for a real s. */
export function scale(a: Mat, s: number): Mat {
  const out = zeros(a.d);
  for (let i = 0; i < a.re.length; i++) {
    out.re[i] = a.re[i]! * s;
    out.im[i] = a.im[i]! * s;
  }
  return out;
}

/** e^{iφ}. */
export function expi(phi: number): Cx {
  return [Math.cos(phi), Math.sin(phi)];
}

function cmul(a: Cx, b: Cx): Cx {
  return [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
}

// ---------------------------------------------------------------------------------------
// Built-in gates (contract: "Built-in gates (trade-standard names and matrices)")
// ---------------------------------------------------------------------------------------

/** The complex numbers 1 and 0. */
export const ONE: Cx = [1, 0];
export const ZERO: Cx = [0, 0];
const I_: Cx = [0, 1];
const MI: Cx = [0, -1];
const R2 = Math.SQRT1_2;

/** The Pauli matrices and the 2×2 identity (Nielsen & Chuang eq. 2.29–2.32). */
export const PAULI_X = fromRows([[ZERO, ONE], [ONE, ZERO]]);
export const PAULI_Y = fromRows([[ZERO, MI], [I_, ZERO]]);
export const PAULI_Z = fromRows([[ONE, ZERO], [ZERO, [-1, 0]]]);
export const ID2 = identity(2);

/** Block-diagonal controlled-U, control = the first (most significant) qubit. */
function controlled(u: Mat): Mat {
  const d = 2 * u.d;
  const out = zeros(d);
  for (let i = 0; i < u.d; i++) out.re[i * d + i] = 1;
  for (let i = 0; i < u.d; i++) {
    for (let j = 0; j < u.d; j++) {
      out.re[(u.d + i) * d + (u.d + j)] = u.re[i * u.d + j]!;
      out.im[(u.d + i) * d + (u.d + j)] = u.im[i * u.d + j]!;
    }
  }
  return out;
}

function rx(t: number): Mat {
  const c = Math.cos(t / 2);
  const s = Math.sin(t / 2);
  return fromRows([[[c, 0], [0, -s]], [[0, -s], [c, 0]]]);
}
function ry(t: number): Mat {
  const c = Math.cos(t / 2);
  const s = Math.sin(t / 2);
  return fromRows([[[c, 0], [-s, 0]], [[s, 0], [c, 0]]]);
}
function rz(t: number): Mat {
  return fromRows([[expi(-t / 2), ZERO], [ZERO, expi(t / 2)]]);
}
function phase(l: number): Mat {
  return fromRows([[ONE, ZERO], [ZERO, expi(l)]]);
}
/** exp(−iθ P⊗P/2) = cos(θ/2)·I − i·sin(θ/2)·P⊗P. */
function twoPauliRotation(p: Mat, t: number): Mat {
  const pp = kron(p, p);
  const out = scale(identity(4), Math.cos(t / 2));
  const s = Math.sin(t / 2);
  for (let i = 0; i < 16; i++) {
    // −i·s·(a + ib) = s·b − i·s·a
    out.re[i] += s * pp.im[i]!;
    out.im[i] += -s * pp.re[i]!;
  }
  return out;
}

const SWAP = fromRows([
  [ONE, ZERO, ZERO, ZERO],
  [ZERO, ZERO, ONE, ZERO],
  [ZERO, ONE, ZERO, ZERO],
  [ZERO, ZERO, ZERO, ONE],
]);

/** A built-in gate: number of qubits, number of angles, matrix from the angles. */
export interface BuiltinGate {
  readonly k: number;
  readonly angles: number;
  readonly matrix: (a: readonly number[]) => Mat;
}

const fixed = (k: number, m: Mat): BuiltinGate => ({ k, angles: 0, matrix: () => m });
const oneAngle = (k: number, f: (t: number) => Mat): BuiltinGate => ({ k, angles: 1, matrix: (a) => f(a[0]!) });

const H = fromRows([[[R2, 0], [R2, 0]], [[R2, 0], [-R2, 0]]]);
const SX = fromRows([[[0.5, 0.5], [0.5, -0.5]], [[0.5, -0.5], [0.5, 0.5]]]);

/** The contract's built-in gate table. */
export const BUILTIN_GATES: Readonly<Record<string, BuiltinGate>> = {
  i: fixed(1, ID2),
  id: fixed(1, ID2),
  x: fixed(1, PAULI_X),
  y: fixed(1, PAULI_Y),
  z: fixed(1, PAULI_Z),
  h: fixed(1, H),
  s: fixed(1, fromRows([[ONE, ZERO], [ZERO, I_]])),
  sdg: fixed(1, fromRows([[ONE, ZERO], [ZERO, MI]])),
  t: fixed(1, fromRows([[ONE, ZERO], [ZERO, expi(Math.PI / 4)]])),
  tdg: fixed(1, fromRows([[ONE, ZERO], [ZERO, expi(-Math.PI / 4)]])),
  sx: fixed(1, SX),
  sxdg: fixed(1, adjoint(SX)),
  rx: oneAngle(1, rx),
  ry: oneAngle(1, ry),
  rz: oneAngle(1, rz),
  p: oneAngle(1, phase),
  u: {
    k: 1,
    angles: 3,
    matrix: ([th, ph, la]) => {
      const c = Math.cos(th! / 2);
      const s = Math.sin(th! / 2);
      return fromRows([
        [[c, 0], cmul([-s, 0], expi(la!))],
        [cmul([s, 0], expi(ph!)), cmul([c, 0], expi(ph! + la!))],
      ]);
    },
  },
  cx: fixed(2, controlled(PAULI_X)),
  cy: fixed(2, controlled(PAULI_Y)),
  cz: fixed(2, controlled(PAULI_Z)),
  ch: fixed(2, controlled(H)),
  cp: oneAngle(2, (t) => controlled(phase(t))),
  crx: oneAngle(2, (t) => controlled(rx(t))),
  cry: oneAngle(2, (t) => controlled(ry(t))),
  crz: oneAngle(2, (t) => controlled(rz(t))),
  swap: fixed(2, SWAP),
  iswap: fixed(
    2,
    fromRows([
      [ONE, ZERO, ZERO, ZERO],
      [ZERO, ZERO, I_, ZERO],
      [ZERO, I_, ZERO, ZERO],
      [ZERO, ZERO, ZERO, ONE],
    ]),
  ),
  rxx: oneAngle(2, (t) => twoPauliRotation(PAULI_X, t)),
  ryy: oneAngle(2, (t) => twoPauliRotation(PAULI_Y, t)),
  rzz: oneAngle(2, (t) => twoPauliRotation(PAULI_Z, t)),
  ccx: fixed(3, controlled(controlled(PAULI_X))),
  cswap: fixed(3, controlled(SWAP)),
};

// ---------------------------------------------------------------------------------------
// Register operations (whole-register, by definition)
// ---------------------------------------------------------------------------------------

/** Bit of qubit q in basis index idx of an n-qubit register (qubit 0 = most significant). */
export function bit(idx: number, q: number, n: number): number {
  return (idx >> (n - 1 - q)) & 1;
}

/** Sub-index of the target qubits in idx (first target most significant). */
export function subIndex(idx: number, targets: readonly number[], n: number): number {
  let s = 0;
  for (const q of targets) s = (s << 1) | bit(idx, q, n);
  return s;
}

/** idx with the target bits replaced by the bits of sub-index s. */
export function withSub(idx: number, targets: readonly number[], s: number, n: number): number {
  const k = targets.length;
  let out = idx;
  for (let j = 0; j < k; j++) {
    const b = (s >> (k - 1 - j)) & 1;
    const mask = 1 << (n - 1 - targets[j]!);
    out = b ? out | mask : out & ~mask;
  }
  return out;
}

/** The operator K (on `targets`) ⊗ identity (elsewhere), as a sparse list of rows. */
export function embed(k: Mat, targets: readonly number[], n: number): { c: number; re: number; im: number }[][] {
  const D = 1 << n;
  const rows: { c: number; re: number; im: number }[][] = [];
  for (let r = 0; r < D; r++) {
    const a = subIndex(r, targets, n);
    const row: { c: number; re: number; im: number }[] = [];
    for (let b = 0; b < k.d; b++) {
      const re = k.re[a * k.d + b]!;
      const im = k.im[a * k.d + b]!;
      if (re === 0 && im === 0) continue;
      row.push({ c: withSub(r, targets, b, n), re, im });
    }
    rows.push(row);
  }
  return rows;
}

/** Σ_j K_j ρ K_j† with every K_j embedded on `targets` (a linear map on any matrix ρ). */
export function applyKraus(rho: Mat, kraus: readonly Mat[], targets: readonly number[], n: number): Mat {
  const D = rho.d;
  const out = zeros(D);
  for (const k of kraus) {
    const f = embed(k, targets, n);
    // tmp = F ρ
    const tr = new Float64Array(D * D);
    const ti = new Float64Array(D * D);
    for (let r = 0; r < D; r++) {
      for (const e of f[r]!) {
        for (let j = 0; j < D; j++) {
          const pr = rho.re[e.c * D + j]!;
          const pi = rho.im[e.c * D + j]!;
          tr[r * D + j] += e.re * pr - e.im * pi;
          ti[r * D + j] += e.re * pi + e.im * pr;
        }
      }
    }
    // out += tmp F†,  (F†)[c][r] = conj(F[r][c])
    for (let i = 0; i < D; i++) {
      for (let r = 0; r < D; r++) {
        for (const e of f[r]!) {
          const ar = tr[i * D + e.c]!;
          const ai = ti[i * D + e.c]!;
          out.re[i * D + r] += ar * e.re + ai * e.im;
          out.im[i * D + r] += ai * e.re - ar * e.im;
        }
      }
    }
  }
  return out;
}

/**
 * k-qubit depolarizing by its definition ρ → (1 − p)ρ + p·(I/d) ⊗ Tr_targets ρ, d = 2^k
 * (contract "Channel definitions"; on a subsystem, Nielsen & Chuang §8.3.4, eq. 8.102).
 */
export function applyDepolarizing(rho: Mat, p: number, targets: readonly number[], n: number): Mat {
  const D = rho.d;
  const d = 1 << targets.length;
  const out = scale(rho, 1 - p);
  for (let r = 0; r < D; r++) {
    for (let c = 0; c < D; c++) {
      if (subIndex(r, targets, n) !== subIndex(c, targets, n)) continue;
      let sr = 0;
      let si = 0;
      for (let s = 0; s < d; s++) {
        const rr = withSub(r, targets, s, n);
        const cc = withSub(c, targets, s, n);
        sr += rho.re[rr * D + cc]!;
        si += rho.im[rr * D + cc]!;
      }
      out.re[r * D + c] += (p / d) * sr;
      out.im[r * D + c] += (p / d) * si;
    }
  }
  return out;
}

/** Thermal relaxation parameters of one qubit (times in ns). */
export interface Thermal {
  readonly t1: number;
  readonly t2: number;
  readonly excited: number;
}

/**
 * Thermal relaxation for τ ns on qubit q, straight from the contract's definition:
 * p1(τ) = p1·e^{−τ/t1} + pe·(1 − e^{−τ/t1}), coherences × e^{−τ/t2}. Written on the 2×2
 * blocks ρ_ab of ρ = Σ |a⟩⟨b| ⊗ ρ_ab (linear extension to the rest of the register).
 */
export function applyThermal(rho: Mat, q: number, th: Thermal, tau: number, n: number): Mat {
  const D = rho.d;
  const e1 = Math.exp(-tau / th.t1);
  const e2 = Math.exp(-tau / th.t2);
  const pe = th.excited;
  const out = zeros(D);
  const mask = 1 << (n - 1 - q);
  for (let r = 0; r < D; r++) {
    for (let c = 0; c < D; c++) {
      const a = bit(r, q, n);
      const b = bit(c, q, n);
      const idx = r * D + c;
      if (a !== b) {
        out.re[idx] = rho.re[idx]! * e2;
        out.im[idx] = rho.im[idx]! * e2;
      } else if (a === 0) {
        // r, c both have qubit q = 0: ρ'_00 = ρ_00 + ρ_11 − ρ'_11
        const i11 = (r | mask) * D + (c | mask);
        const p11r = rho.re[i11]! * e1 + pe * (1 - e1) * (rho.re[idx]! + rho.re[i11]!);
        const p11i = rho.im[i11]! * e1 + pe * (1 - e1) * (rho.im[idx]! + rho.im[i11]!);
        out.re[idx] = rho.re[idx]! + rho.re[i11]! - p11r;
        out.im[idx] = rho.im[idx]! + rho.im[i11]! - p11i;
      } else {
        const i00 = (r & ~mask) * D + (c & ~mask);
        out.re[idx] = rho.re[idx]! * e1 + pe * (1 - e1) * (rho.re[i00]! + rho.re[idx]!);
        out.im[idx] = rho.im[idx]! * e1 + pe * (1 - e1) * (rho.im[i00]! + rho.im[idx]!);
      }
    }
  }
  return out;
}

/** Reset of qubit q by the contract's definition ρ → |0⟩⟨0| ⊗ Tr_q ρ. */
export function applyReset(rho: Mat, q: number, n: number): Mat {
  const D = rho.d;
  const out = zeros(D);
  const mask = 1 << (n - 1 - q);
  for (let r = 0; r < D; r++) {
    for (let c = 0; c < D; c++) {
      if (r & mask || c & mask) continue;
      const i0 = r * D + c;
      const i1 = (r | mask) * D + (c | mask);
      out.re[i0] = rho.re[i0]! + rho.re[i1]!;
      out.im[i0] = rho.im[i0]! + rho.im[i1]!;
    }
  }
  return out;
}

/** One step of a channel (Kraus set, k-qubit depolarizing, thermal relaxation for τ ns, or reset), in the qubit numbering of the register it acts on. */
export type Op =
  | { readonly type: 'kraus'; readonly kraus: readonly Mat[]; readonly targets: readonly number[] }
  | { readonly type: 'depolarizing'; readonly p: number; readonly targets: readonly number[] }
  | { readonly type: 'thermal'; readonly q: number; readonly th: Thermal; readonly tau: number }
  | { readonly type: 'reset'; readonly q: number };

/** One channel step applied to an n-qubit matrix. */
export function applyOp(rho: Mat, op: Op, n: number): Mat {
  switch (op.type) {
    case 'kraus':
      return applyKraus(rho, op.kraus, op.targets, n);
    case 'depolarizing':
      return applyDepolarizing(rho, op.p, op.targets, n);
    case 'thermal':
      return applyThermal(rho, op.q, op.th, op.tau, n);
    case 'reset':
      return applyReset(rho, op.q, n);
  }
}

/** The op with its local qubit numbers replaced through `map` (local → register). */
export function remapOp(op: Op, map: readonly number[]): Op {
  switch (op.type) {
    case 'kraus':
    case 'depolarizing':
      return { ...op, targets: op.targets.map((t) => map[t]!) };
    case 'thermal':
    case 'reset':
      return { ...op, q: map[op.q]! };
  }
}

// ---------------------------------------------------------------------------------------
// Average gate fidelity via the Choi state, and the `error:` solve by bisection
// ---------------------------------------------------------------------------------------

/**
 * Average gate fidelity of the channel `ops` (on k qubits) to the unitary U. The process
 * (entanglement) fidelity is the Choi-state overlap
 *   F_pro = ⟨Φ|(id ⊗ U†∘E)(|Φ⟩⟨Φ|)|Φ⟩ = (1/d²) Σ_ij ⟨i| U† E(|i⟩⟨j|) U |j⟩,
 * probed on the matrix units; then F_avg = (d·F_pro + 1)/(d + 1)
 * (M. Horodecki, P. Horodecki, R. Horodecki, Phys. Rev. A 60, 1888 (1999);
 *  M. A. Nielsen, Phys. Lett. A 303, 249 (2002)).
 */
export function averageGateFidelity(u: Mat, ops: readonly Op[], k: number): number {
  const d = 1 << k;
  const ud = adjoint(u);
  let fpro = 0;
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      let x = zeros(d);
      x.re[i * d + j] = 1;
      for (const op of ops) x = applyOp(x, op, k);
      const y = matmul(matmul(ud, x), u);
      fpro += y.re[i * d + j]!;
    }
  }
  fpro /= d * d;
  return (d * fpro + 1) / (d + 1);
}

/** Iterations of the bisection on p (2^-200 is far below double precision). */
const BISECTION_STEPS = 200;

/**
 * Solves `error: r`: the k-qubit depolarizing p ∈ [0, 1] such that the whole gate channel
 * (U, then `ops`, then depolarizing p) has average gate infidelity r to U. Bisection on p.
 * Returns p = 0 and `limited` when the channel without it already exceeds r.
 */
export function solveErrorByBisection(u: Mat, ops: readonly Op[], k: number, r: number): { p: number; limited: boolean } {
  const targets = Array.from({ length: k }, (_, i) => i);
  const chain = (p: number): Op[] => [{ type: 'kraus', kraus: [u], targets }, ...ops, { type: 'depolarizing', p, targets }];
  const infid = (p: number): number => 1 - averageGateFidelity(u, chain(p), k);
  if (infid(0) >= r) return { p: 0, limited: infid(0) > r };
  if (infid(1) < r) throw new Error(`error ${r} needs p > 1`);
  let lo = 0;
  let hi = 1;
  for (let it = 0; it < BISECTION_STEPS; it++) {
    const mid = (lo + hi) / 2;
    if (mid === lo || mid === hi) break;
    if (infid(mid) < r) lo = mid;
    else hi = mid;
  }
  return { p: (lo + hi) / 2, limited: false };
}

// ---------------------------------------------------------------------------------------
// Eigenvalues of a Hermitian matrix (cyclic Jacobi on the real symmetric embedding)
// ---------------------------------------------------------------------------------------

/**
 * Eigenvalues of a Hermitian matrix A + iB through the real symmetric matrix
 * [[A, −B], [B, A]] (each eigenvalue appears twice there), by cyclic Jacobi rotations
 * (G. H. Golub, C. F. Van Loan, Matrix Computations, §8.5; from memory).
 */
export function hermitianEigenvalues(h: Mat): number[] {
  const m = h.d;
  const n = 2 * m;
  const a: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      const re = (h.re[i * m + j]! + h.re[j * m + i]!) / 2;
      const im = (h.im[i * m + j]! - h.im[j * m + i]!) / 2;
      a[i]![j] = re;
      a[i + m]![j + m] = re;
      a[i]![j + m] = -im;
      a[i + m]![j] = im;
    }
  }
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    let total = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        total += a[i]![j]! ** 2;
        if (i !== j) off += a[i]![j]! ** 2;
      }
    }
    if (off <= 1e-34 * Math.max(total, 1e-300)) break;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p]![q]!;
        if (apq === 0) continue;
        const theta = (a[q]![q]! - a[p]![p]!) / (2 * apq);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k]![p]!;
          const akq = a[k]![q]!;
          a[k]![p] = c * akp - s * akq;
          a[k]![q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p]![k]!;
          const aqk = a[q]![k]!;
          a[p]![k] = c * apk - s * aqk;
          a[q]![k] = s * apk + c * aqk;
        }
      }
    }
  }
  const ev = a.map((row, i) => row[i]!).sort((x, y) => x - y);
  // every eigenvalue appears twice: take every other one
  return ev.filter((_, i) => i % 2 === 0);
}

// ---------------------------------------------------------------------------------------
// Parsing helpers
// ---------------------------------------------------------------------------------------

const UNIT_NS: Readonly<Record<string, number>> = { ns: 1, us: 1e3, µs: 1e3, ms: 1e6, s: 1e9 };

/** A contract duration string (`35ns`, `1.2us`, `1.2µs`, `3ms`, `1s`) in nanoseconds. */
export function durationNs(text: unknown): number {
  if (typeof text !== 'string') throw new Error(`duration must be a string with a unit: ${String(text)}`);
  const m = /^\s*([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)\s*(ns|us|µs|ms|s)\s*$/.exec(text);
  if (!m) throw new Error(`bad duration ${text}`);
  return Number(m[1]) * UNIT_NS[m[2]!]!;
}

const FUNCTIONS: Readonly<Record<string, (x: number) => number>> = {
  sqrt: Math.sqrt,
  sin: Math.sin,
  cos: Math.cos,
  tan: Math.tan,
  exp: Math.exp,
  ln: Math.log,
};

/**
 * An angle in radians: a number, or an expression string with + − * / ^, parentheses, unary
 * minus, `pi`, `e`, the functions of docs/format.md, params from `scope`, and a `deg` suffix on
 * a number. Recursive descent; `^` binds tighter than unary minus on its left operand.
 */
export function angleValue(v: unknown, scope: Readonly<Record<string, number>>): number {
  if (typeof v === 'number') return v;
  if (typeof v !== 'string') throw new Error(`unsupported angle ${JSON.stringify(v)}`);
  const tokens = v.match(/\s*([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?(?:deg)?|[A-Za-z_][A-Za-z0-9_]*|[-+*/^()])/g);
  if (!tokens || tokens.join('').replace(/\s/g, '') !== v.replace(/\s/g, '')) throw new Error(`bad angle ${v}`);
  const ts = tokens.map((t) => t.trim());
  let i = 0;
  const peek = (): string | undefined => ts[i];
  const take = (): string => ts[i++]!;
  const expr = (): number => {
    let x = term();
    while (peek() === '+' || peek() === '-') x = take() === '+' ? x + term() : x - term();
    return x;
  };
  const term = (): number => {
    let x = unary();
    while (peek() === '*' || peek() === '/') x = take() === '*' ? x * unary() : x / unary();
    return x;
  };
  const unary = (): number => (peek() === '-' ? (take(), -unary()) : peek() === '+' ? (take(), unary()) : power());
  const power = (): number => {
    const b = atom();
    if (peek() === '^') {
      take();
      return b ** unary();
    }
    return b;
  };
  const atom = (): number => {
    const t = take();
    if (t === '(') {
      const x = expr();
      if (take() !== ')') throw new Error(`bad angle ${v}`);
      return x;
    }
    if (/^[0-9.]/.test(t)) return t.endsWith('deg') ? (Number(t.slice(0, -3)) * Math.PI) / 180 : Number(t);
    if (FUNCTIONS[t] && peek() === '(') {
      take();
      const x = expr();
      if (take() !== ')') throw new Error(`bad angle ${v}`);
      return FUNCTIONS[t]!(x);
    }
    if (scope[t] !== undefined) return scope[t]!;
    if (t === 'pi') return Math.PI;
    if (t === 'e') return Math.E;
    throw new Error(`unknown name ${t} in angle ${v}`);
  };
  const x = expr();
  if (i !== ts.length) throw new Error(`bad angle ${v}`);
  return x;
}

/** A matrix entry: a number, or a complex string of the forms the generator emits. */
function parseEntry(v: unknown): Cx {
  if (typeof v === 'number') return [v, 0];
  if (typeof v === 'string') {
    const m = /^\s*([+-]?[0-9]*\.?[0-9]+)\s*([+-])\s*([0-9]*\.?[0-9]+)i\s*$/.exec(v);
    if (m) return [Number(m[1]), (m[2] === '-' ? -1 : 1) * Number(m[3])];
    const im = /^\s*([+-]?[0-9]*\.?[0-9]+)i\s*$/.exec(v);
    if (im) return [0, Number(im[1])];
    const re = /^\s*([+-]?[0-9]*\.?[0-9]+)\s*$/.exec(v);
    if (re) return [Number(re[1]), 0];
  }
  throw new Error(`unsupported matrix entry ${JSON.stringify(v)}`);
}

/** A matrix from the file's rows of matrix entries. */
export function parseMatrix(rows: unknown): Mat {
  return fromRows((rows as unknown[][]).map((row) => row.map(parseEntry)));
}

/** log2 of a power of two (the number of qubits of a dimension). */
export function log2int(d: number): number {
  const k = Math.round(Math.log2(d));
  if (1 << k !== d) throw new Error(`dimension ${d} is not a power of two`);
  return k;
}

/** A parsed YAML map. */
export type Dict = Record<string, unknown>;

/** The noise kinds in the contract's order of application. */
export const NOISE_ORDER = [
  'amplitude_damping',
  'phase_damping',
  'bit_flip',
  'phase_flip',
  'bit_phase_flip',
  'pauli',
  'channel',
  'depolarizing',
] as const;
/** Every noise-kind key of a version-1 gate entry. */
export const NOISE_KEYS = new Set<string>([...NOISE_ORDER, 'error']);

/** Merge of gate-entry maps, field by field, `error` and `depolarizing` replacing each other. */
export function mergeEntry(base: Dict | undefined, over: Dict | undefined): Dict {
  const out: Dict = { ...(base ?? {}) };
  for (const [k, v] of Object.entries(over ?? {})) {
    if (k === 'error') delete out.depolarizing;
    if (k === 'depolarizing') delete out.error;
    out[k] = v;
  }
  return out;
}

/** Inline profile merged over the device profile, the inline one winning per field. */
function mergeProfiles(device: Dict | undefined, inline: Dict | undefined): Dict {
  const d = device ?? {};
  const i = inline ?? {};
  const out: Dict = { ...d, ...i };
  const dq = (d.qubits ?? {}) as Dict;
  const iq = (i.qubits ?? {}) as Dict;
  const qubits: Dict = {};
  for (const k of new Set([...Object.keys(dq), ...Object.keys(iq)])) {
    qubits[k] = { ...((dq[k] as Dict | undefined) ?? {}), ...((iq[k] as Dict | undefined) ?? {}) };
  }
  out.qubits = qubits;
  const dg = (d.gates ?? {}) as Dict;
  const ig = (i.gates ?? {}) as Dict;
  const gates: Dict = {};
  for (const k of new Set([...Object.keys(dg), ...Object.keys(ig)])) {
    gates[k] = mergeEntry(dg[k] as Dict | undefined, ig[k] as Dict | undefined);
  }
  out.gates = gates;
  return out;
}

// ---------------------------------------------------------------------------------------
// The run
// ---------------------------------------------------------------------------------------

/** One scheduled application (times in ns). */
export interface RefApplication {
  readonly kind: 'gate' | 'idle' | 'barrier' | 'measure' | 'reset' | 'noise';
  readonly name: string;
  readonly qubits: readonly number[];
  readonly duration: number;
  /** Unitary of a gate application (on `qubits`, first most significant). */
  readonly unitary?: Mat;
  /** Noise channel ops after the unitary (local qubit numbering 0..k−1), gate/reset/noise. */
  ops?: Op[];
  start: number;
  end: number;
}

/** The oracle's result, named after the keys of `fray run --json`. */
export interface ReferenceResult {
  readonly name: string | null;
  readonly qubits: number;
  readonly measured: number[];
  readonly measured_labels?: string[];
  readonly schedule: 'asap' | 'alap';
  readonly duration_ns: number;
  readonly probabilities: { ideal: Record<string, number>; noisy: Record<string, number>; measured: Record<string, number> };
  readonly fidelity: { state: number; classical: number };
  readonly tvd: number;
  readonly purity: number;
  readonly observables?: Record<string, { ideal: number; noisy: number }>;
  /** Gates whose `error:` was already exceeded by the rest of their channel (p = 0). */
  readonly warnings: string[];
  /** The depolarizing p solved for every `error:` application, in program order. */
  readonly solvedErrors: number[];
  readonly applications: readonly RefApplication[];
}

/** A composite gate's part: built-in gate name, local targets (first most significant) and matrix. */
export interface CompositePart {
  readonly name: string;
  readonly targets: readonly number[];
  readonly u: Mat;
}

/** A custom gate: its qubit count, parameter count, unitary from the angles, and (composites) its parts. */
export interface CustomGate {
  readonly k: number;
  readonly params: number;
  readonly unitary: (a: readonly number[]) => Mat;
  readonly parts?: (a: readonly number[]) => CompositePart[];
}

/** Everything read from a circuit and its profile before the steps: register, merged profile, per-qubit properties, gate entries, custom gates, channels, noise kinds. */
export function circuitSetup(circuitText: string, deviceText?: string) {
  const doc = YAML.parse(circuitText) as Dict;
  const labels: string[] | undefined = Array.isArray(doc.qubits) ? (doc.qubits as unknown[]).map(String) : undefined;
  const n = labels ? labels.length : (doc.qubits as number);
  const D = 1 << n;

  // "Labels are matched before indices" (so a label "0" wins over index 0)
  const ref = (r: unknown): number => {
    if (labels && (typeof r === 'string' || typeof r === 'number') && labels.includes(String(r))) return labels.indexOf(String(r));
    if (typeof r === 'number' && Number.isInteger(r) && r >= 0 && r < n) return r;
    if (typeof r === 'string' && /^[0-9]+$/.test(r) && Number(r) < n) return Number(r);
    throw new Error(`unknown qubit ${String(r)}`);
  };
  const keyQubit = (k: string): number | undefined => {
    if (labels && labels.includes(k)) return labels.indexOf(k);
    if (/^[0-9]+$/.test(k)) return Number(k);
    return undefined;
  };

  // --- profile
  if (doc.device !== undefined && deviceText === undefined) throw new Error('device profile text missing');
  const device = doc.device !== undefined ? (YAML.parse(deviceText!) as Dict) : undefined;
  const profile = mergeProfiles(device, doc.noise as Dict | undefined);
  const schedulePolicy = (profile.schedule as 'asap' | 'alap' | undefined) ?? 'asap';
  const idlePolicy = (profile.idle as 'thermal' | 'none' | undefined) ?? 'thermal';
  const pq = (profile.qubits ?? {}) as Dict;
  const pg = (profile.gates ?? {}) as Dict;

  const thermal: (Thermal | undefined)[] = [];
  const readout: { z1: number; o0: number }[] = [];
  const qubitProps: Dict[] = [];
  for (let q = 0; q < n; q++) {
    let props: Dict = { ...((pq.all as Dict | undefined) ?? {}) };
    for (const [k, v] of Object.entries(pq)) {
      if (k !== 'all' && keyQubit(k) === q) props = { ...props, ...(v as Dict) };
    }
    qubitProps.push(props);
    if (props.t1 !== undefined || props.t2 !== undefined) {
      // reading of "missing t1 means no relaxation": t1 = ∞ (no population decay); a given t2
      // still dephases (fray reads it the same way; see the report)
      const t1 = props.t1 !== undefined ? durationNs(props.t1) : Infinity;
      const t2 = props.t2 !== undefined ? durationNs(props.t2) : 2 * t1;
      if (t2 > 2 * t1) throw new Error(`qubit ${q}: t2 > 2 t1`);
      thermal.push({ t1, t2, excited: (props.excited as number | undefined) ?? 0 });
    } else {
      thermal.push(undefined);
    }
    const ro = props.readout;
    if (typeof ro === 'number') readout.push({ z1: ro, o0: ro });
    else if (ro && typeof ro === 'object') {
      const r = ro as Dict;
      readout.push({ z1: (r.zero_as_one as number | undefined) ?? 0, o0: (r.one_as_zero as number | undefined) ?? 0 });
    } else readout.push({ z1: 0, o0: 0 });
  }

  /** The profile entry of gate `name` on `qubits`: all < name < "name q1 q2", field by field. */
  // `id` is an alias of `i` (contract: "i (alias id)"): one gate, so one profile entry
  const canon = (g: string): string => (g === 'id' ? 'i' : g);
  const entryFor = (name: string, qubits: readonly number[]): Dict => {
    let e: Dict = {};
    if (name !== 'measure' && name !== 'reset') e = mergeEntry(e, pg.all as Dict | undefined);
    for (const [key, v] of Object.entries(pg)) if (canon(key) === canon(name)) e = mergeEntry(e, v as Dict);
    for (const [key, v] of Object.entries(pg)) {
      const tokens = key.trim().split(/\s+/);
      if (tokens.length < 2 || canon(tokens[0]!) !== canon(name)) continue;
      const qs = tokens.slice(1).map((t) => keyQubit(t));
      if (qs.length === qubits.length && qs.every((x, i) => x === qubits[i])) e = mergeEntry(e, v as Dict);
    }
    return e;
  };

  // --- angles: numbers or expressions; params evaluated in order, each may use the earlier ones
  const circuitParams: Record<string, number> = {};
  for (const [k, v] of Object.entries((doc.params ?? {}) as Dict)) circuitParams[k] = angleValue(v, circuitParams);
  const stepAngles = (st: Dict, count: number, scope: Record<string, number>): number[] => {
    if (count === 0) return [];
    const raw = st.angles !== undefined ? (st.angles as unknown[]) : [st.angle];
    if (raw.length !== count) throw new Error(`expected ${count} angles`);
    return raw.map((v) => angleValue(v, scope));
  };

  // --- custom gates: matrix gates, and composite gates (product of their steps; their own
  // params, bound at the call site in order, shadow the circuit's)
  const customGates = new Map<string, CustomGate>();
  for (const [name, def] of Object.entries((doc.gates ?? {}) as Dict)) {
    const g = def as Dict;
    if (g.matrix !== undefined) {
      const u = parseMatrix(g.matrix);
      customGates.set(name, { k: log2int(u.d), params: 0, unitary: () => u });
    } else {
      const k = g.qubits as number;
      const pnames = (g.params ?? []) as string[];
      const parts = (a: readonly number[]): CompositePart[] => {
        const scope: Record<string, number> = { ...circuitParams };
        pnames.forEach((pn, i) => (scope[pn] = a[i]!));
        return (g.steps as Dict[]).map((st) => {
          const gname = Object.keys(st).find((x) => x !== 'angle' && x !== 'angles' && x !== 'label')!;
          const bg = BUILTIN_GATES[gname]!;
          const targets = Array.isArray(st[gname]) ? (st[gname] as number[]) : [st[gname] as number];
          return { name: gname, targets, u: bg.matrix(stepAngles(st, bg.angles, scope)) };
        });
      };
      // later steps multiply from the left
      const unitary = (a: readonly number[]): Mat => parts(a).reduce((u, p) => matmul(embedFull(p.u, p.targets, k), u), identity(1 << k));
      customGates.set(name, { k, params: pnames.length, unitary, parts });
    }
  }
  const channels = new Map<string, { k: number; kraus: Mat[] }>();
  for (const [name, def] of Object.entries((doc.channels ?? {}) as Dict)) {
    const kraus = ((def as Dict).kraus as unknown[]).map(parseMatrix);
    channels.set(name, { k: log2int(kraus[0]!.d), kraus });
  }

  /** Channel ops of a set of noise kinds applied to k local qubits 0..k−1 (contract order). */
  const kindOps = (kinds: Dict, k: number, allowError: boolean): { ops: Op[]; error?: number } => {
    const ops: Op[] = [];
    const each = (kraus: Mat[]): void => {
      for (let q = 0; q < k; q++) ops.push({ type: 'kraus', kraus, targets: [q] });
    };
    const all = Array.from({ length: k }, (_, i) => i);
    for (const kind of NOISE_ORDER) {
      const v = kinds[kind];
      if (v === undefined) continue;
      switch (kind) {
        case 'amplitude_damping': {
          const g = v as number;
          each([fromRows([[ONE, ZERO], [ZERO, [Math.sqrt(1 - g), 0]]]), fromRows([[ZERO, [Math.sqrt(g), 0]], [ZERO, ZERO]])]);
          break;
        }
        case 'phase_damping': {
          const l = v as number;
          each([fromRows([[ONE, ZERO], [ZERO, [Math.sqrt(1 - l), 0]]]), fromRows([[ZERO, ZERO], [ZERO, [Math.sqrt(l), 0]]])]);
          break;
        }
        case 'bit_flip':
          each([scale(ID2, Math.sqrt(1 - (v as number))), scale(PAULI_X, Math.sqrt(v as number))]);
          break;
        case 'phase_flip':
          each([scale(ID2, Math.sqrt(1 - (v as number))), scale(PAULI_Z, Math.sqrt(v as number))]);
          break;
        case 'bit_phase_flip':
          each([scale(ID2, Math.sqrt(1 - (v as number))), scale(PAULI_Y, Math.sqrt(v as number))]);
          break;
        case 'pauli': {
          const pv = v as Dict;
          const x = (pv.x as number | undefined) ?? 0;
          const y = (pv.y as number | undefined) ?? 0;
          const z = (pv.z as number | undefined) ?? 0;
          each([
            scale(ID2, Math.sqrt(Math.max(0, 1 - x - y - z))),
            scale(PAULI_X, Math.sqrt(x)),
            scale(PAULI_Y, Math.sqrt(y)),
            scale(PAULI_Z, Math.sqrt(z)),
          ]);
          break;
        }
        case 'channel': {
          const ch = channels.get(v as string);
          if (!ch) throw new Error(`unknown channel ${String(v)}`);
          if (ch.k === 1) each(ch.kraus);
          else if (ch.k === k) ops.push({ type: 'kraus', kraus: ch.kraus, targets: all });
          else throw new Error(`channel ${String(v)} has ${ch.k} qubits, application has ${k}`);
          break;
        }
        case 'depolarizing':
          ops.push({ type: 'depolarizing', p: v as number, targets: all });
          break;
      }
    }
    if (kinds.error !== undefined) {
      if (!allowError) throw new Error('error on a non-gate');
      return { ops, error: kinds.error as number };
    }
    return { ops };
  };

  const listOf = (t: unknown): unknown[] => (t === 'all' ? Array.from({ length: n }, (_, i) => i) : Array.isArray(t) ? t : [t]);
  return { doc, labels, n, D, ref, keyQubit, device, profile, schedulePolicy, idlePolicy, thermal, readout, qubitProps, entryFor, circuitParams, stepAngles, customGates, channels, kindOps, listOf };
}

/** Runs a circuit file text (and its device profile text, if it names one) by the contract. */
export function referenceRun(circuitText: string, deviceText?: string): ReferenceResult {
  const { doc, labels, n, D, ref, schedulePolicy, idlePolicy, thermal, readout, entryFor, circuitParams, stepAngles, customGates, kindOps, listOf } = circuitSetup(circuitText, deviceText);

  // --- steps → applications
  const apps: RefApplication[] = [];
  const measuredSet = new Set<number>();
  const warnings: string[] = [];
  const solvedErrors: number[] = [];
  let anyMeasure = false;
  const MODIFIERS = new Set(['angle', 'angles', 'noise', 'for', 'on', 'label']);

  for (const step of doc.steps as Dict[]) {
    const action = Object.keys(step).find((k) => !MODIFIERS.has(k));
    if (action === undefined) {
      // standalone noise step
      const kinds = step.noise as Dict;
      const on = listOf(step.on);
      const groups: number[][] = on.some(Array.isArray)
        ? on.map((g) => (g as unknown[]).map(ref))
        : on.map((q) => [ref(q)]);
      for (const g of groups) {
        const { ops } = kindOps(kinds, g.length, false);
        apps.push({ kind: 'noise', name: 'noise', qubits: g, duration: 0, ops, start: 0, end: 0 });
      }
      continue;
    }
    const target = step[action];
    if (action === 'barrier') {
      apps.push({ kind: 'barrier', name: 'barrier', qubits: listOf(target).map(ref), duration: 0, start: 0, end: 0 });
      continue;
    }
    if (action === 'idle') {
      const dur = durationNs(step.for);
      for (const q of listOf(target).map(ref)) apps.push({ kind: 'idle', name: 'idle', qubits: [q], duration: dur, start: 0, end: 0 });
      continue;
    }
    if (action === 'measure') {
      anyMeasure = true;
      const e = entryFor('measure', []);
      const dur = e.duration !== undefined ? durationNs(e.duration) : 0;
      for (const q of listOf(target).map(ref)) {
        measuredSet.add(q);
        apps.push({ kind: 'measure', name: 'measure', qubits: [q], duration: dur, start: 0, end: 0 });
      }
      continue;
    }
    if (action === 'reset') {
      for (const q of listOf(target).map(ref)) {
        const e = entryFor('reset', [q]);
        const dur = e.duration !== undefined ? durationNs(e.duration) : 0;
        const kinds = step.noise === 'none' ? {} : step.noise !== undefined ? (step.noise as Dict) : pickKinds(e);
        const { ops } = kindOps(kinds, 1, false);
        apps.push({ kind: 'reset', name: 'reset', qubits: [q], duration: dur, ops, start: 0, end: 0 });
      }
      continue;
    }
    // a gate
    let k: number;
    let u: Mat;
    const bg = BUILTIN_GATES[action];
    if (bg) {
      k = bg.k;
      u = bg.matrix(stepAngles(step, bg.angles, circuitParams));
    } else {
      const cg = customGates.get(action);
      if (!cg) throw new Error(`unknown gate ${action}`);
      k = cg.k;
      u = cg.unitary(stepAngles(step, cg.params, circuitParams));
    }
    let groups: number[][];
    if (k === 1) groups = listOf(target).map((q) => [ref(q)]);
    else {
      const t = target as unknown[];
      groups = t.some(Array.isArray) ? t.map((g) => (g as unknown[]).map(ref)) : [t.map(ref)];
    }
    for (const g of groups) {
      if (g.length !== k) throw new Error(`${action} needs ${k} qubits`);
      const e = entryFor(action, g);
      const dur = e.duration !== undefined ? durationNs(e.duration) : 0;
      const ops: Op[] = [];
      if (e.thermal !== false) {
        g.forEach((q, local) => {
          const th = thermal[q];
          if (th && dur > 0) ops.push({ type: 'thermal', q: local, th, tau: dur });
        });
      }
      const kinds = step.noise === 'none' ? {} : step.noise !== undefined ? (step.noise as Dict) : pickKinds(e);
      const kn = kindOps(kinds, k, true);
      ops.push(...kn.ops);
      if (kn.error !== undefined) {
        const { p, limited } = solveErrorByBisection(u, ops, k, kn.error);
        solvedErrors.push(p);
        if (limited) warnings.push(`${action} ${g.join(' ')}: error ${kn.error} below the rest of its channel`);
        if (p > 0) ops.push({ type: 'depolarizing', p, targets: Array.from({ length: k }, (_, i) => i) });
      }
      apps.push({ kind: 'gate', name: action, qubits: g, duration: dur, unitary: u, ops, start: 0, end: 0 });
    }
  }

  // --- schedule
  const scheduleAsap = (list: RefApplication[]): { s: number[]; e: number[]; T: number } => {
    const free = new Array<number>(n).fill(0);
    const s: number[] = [];
    const e: number[] = [];
    for (const a of list) {
      const t0 = Math.max(0, ...a.qubits.map((q) => free[q]!));
      if (a.kind === 'barrier') {
        for (const q of a.qubits) free[q] = t0;
        s.push(t0);
        e.push(t0);
        continue;
      }
      s.push(t0);
      e.push(t0 + a.duration);
      for (const q of a.qubits) free[q] = t0 + a.duration;
    }
    return { s, e, T: Math.max(0, ...free) };
  };
  let T: number;
  if (schedulePolicy === 'asap') {
    const r = scheduleAsap(apps);
    apps.forEach((a, i) => {
      a.start = r.s[i]!;
      a.end = r.e[i]!;
    });
    T = r.T;
  } else {
    const rev = [...apps].reverse();
    const r = scheduleAsap(rev);
    T = r.T;
    rev.forEach((a, i) => {
      a.start = T - r.e[i]!;
      a.end = T - r.s[i]!;
    });
  }

  // --- noisy run
  let rho = zeros(D);
  rho.re[0] = 1;
  const lastEnd = new Array<number>(n).fill(0);
  const frozen = new Array<boolean>(n).fill(false);
  const relax = (q: number, until: number): void => {
    const tau = until - lastEnd[q]!;
    const th = thermal[q];
    if (idlePolicy === 'thermal' && th && tau > 0) rho = applyThermal(rho, q, th, tau, n);
    lastEnd[q] = until;
  };
  for (const a of apps) {
    if (a.kind === 'barrier' || a.kind === 'idle') continue; // an idle step is an idle window
    for (const q of a.qubits) relax(q, a.start);
    if (a.kind === 'measure') {
      frozen[a.qubits[0]!] = true;
      continue;
    }
    if (a.kind === 'gate') rho = applyKraus(rho, [a.unitary!], a.qubits, n);
    if (a.kind === 'reset') rho = applyReset(rho, a.qubits[0]!, n);
    for (const op of a.ops ?? []) rho = applyOp(rho, remapOp(op, a.qubits), n);
    for (const q of a.qubits) lastEnd[q] = a.end;
  }
  for (let q = 0; q < n; q++) if (!frozen[q]) relax(q, T);

  // --- ideal run: an ensemble of unnormalised pure states (reset splits each member in two)
  let ensemble: { re: Float64Array; im: Float64Array }[] = [{ re: new Float64Array(D), im: new Float64Array(D) }];
  ensemble[0]!.re[0] = 1;
  for (const a of apps) {
    if (a.kind === 'gate') {
      ensemble = applyUnitaryToVectors(ensemble, a.unitary!, a.qubits, n);
    } else if (a.kind === 'reset') {
      const mask = 1 << (n - 1 - a.qubits[0]!);
      const next: { re: Float64Array; im: Float64Array }[] = [];
      for (const v of ensemble) {
        const v0 = { re: new Float64Array(D), im: new Float64Array(D) };
        const v1 = { re: new Float64Array(D), im: new Float64Array(D) };
        for (let i = 0; i < D; i++) {
          if (i & mask) {
            v1.re[i & ~mask] = v.re[i]!;
            v1.im[i & ~mask] = v.im[i]!;
          } else {
            v0.re[i] = v.re[i]!;
            v0.im[i] = v.im[i]!;
          }
        }
        for (const w of [v0, v1]) {
          let nrm = 0;
          for (let i = 0; i < D; i++) nrm += w.re[i]! ** 2 + w.im[i]! ** 2;
          if (nrm > 1e-30) next.push(w);
        }
      }
      ensemble = next;
    }
  }

  // --- results
  const measured = anyMeasure ? [...measuredSet].sort((x, y) => x - y) : Array.from({ length: n }, (_, i) => i);
  const { probabilities, classical, tvd } = terminalDistributions(measured, n, ensemble, rho, readout);

  let purity = 0;
  for (let i = 0; i < D * D; i++) purity += rho.re[i]! ** 2 + rho.im[i]! ** 2;

  const fstate = ensembleFidelity(ensemble, rho);

  const observables = observablesOf(doc.observe, rho, ensemble);

  return {
    name: (doc.name as string | undefined) ?? null,
    qubits: n,
    measured,
    ...(labels ? { measured_labels: measured.map((q) => labels[q]!) } : {}),
    schedule: schedulePolicy,
    duration_ns: T,
    probabilities,
    fidelity: { state: fstate, classical },
    tvd,
    purity,
    ...(observables ? { observables } : {}),
    warnings,
    solvedErrors,
    applications: apps,
  };
}

/** Relative residual below which a Gram–Schmidt vector counts as already in the span. */
export const RANK_TOLERANCE = 1e-10;

/** ⟨a|M|b⟩ for complex vectors and a complex matrix. */
function sandwich(a: Vec, m: Mat, b: Vec): Cx {
  const D = a.re.length;
  let sr = 0;
  let si = 0;
  for (let i = 0; i < D; i++) {
    let rr = 0;
    let ri = 0;
    for (let j = 0; j < D; j++) {
      rr += m.re[i * D + j]! * b.re[j]! - m.im[i * D + j]! * b.im[j]!;
      ri += m.re[i * D + j]! * b.im[j]! + m.im[i * D + j]! * b.re[j]!;
    }
    sr += a.re[i]! * rr + a.im[i]! * ri;
    si += a.re[i]! * ri - a.im[i]! * rr;
  }
  return [sr, si];
}

/** ⟨a|b⟩. */
export function inner(a: Vec, b: Vec): Cx {
  let sr = 0;
  let si = 0;
  for (let i = 0; i < a.re.length; i++) {
    sr += a.re[i]! * b.re[i]! + a.im[i]! * b.im[i]!;
    si += a.re[i]! * b.im[i]! - a.im[i]! * b.re[i]!;
  }
  return [sr, si];
}

/** A complex vector. */
export interface Vec {
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/**
 * Uhlmann–Jozsa fidelity (Tr √(√σ ρ √σ))² (R. Jozsa, J. Mod. Opt. 41, 2315 (1994)) of
 * σ = Σ_a |v_a⟩⟨v_a| (an unnormalised pure-state ensemble) and ρ, computed in the span of
 * the v_a so that σ is full rank there: Q = orthonormal basis of span{v_a} (Gram–Schmidt,
 * twice), S = Q†σQ = L L† (Cholesky), X = Q†ρQ. L†XL is unitarily similar to √S X √S
 * (√S⁻¹L is unitary), so the fidelity is (Σ √eig(L†XL))². For one vector it is ⟨v|ρ|v⟩.
 */
export function ensembleFidelity(ensemble: readonly Vec[], rho: Mat): number {
  const D = rho.d;
  const basis: Vec[] = [];
  for (const v of ensemble) {
    const w = { re: Float64Array.from(v.re), im: Float64Array.from(v.im) };
    const norm0 = Math.sqrt(inner(v, v)[0]);
    for (let pass = 0; pass < 2; pass++) {
      for (const q of basis) {
        const [cr, ci] = inner(q, w);
        for (let i = 0; i < D; i++) {
          const qr = q.re[i]!;
          const qi = q.im[i]!;
          w.re[i] -= cr * qr - ci * qi;
          w.im[i] -= cr * qi + ci * qr;
        }
      }
    }
    const nw = Math.sqrt(inner(w, w)[0]);
    if (nw <= RANK_TOLERANCE * norm0) continue;
    for (let i = 0; i < D; i++) {
      w.re[i] /= nw;
      w.im[i] /= nw;
    }
    basis.push(w);
  }
  const r = basis.length;
  // S = Σ_a (Q†v_a)(Q†v_a)†, X = Q†ρQ
  const S = zeros(r);
  const coords = ensemble.map((v) => basis.map((q) => inner(q, v)));
  for (const c of coords) {
    for (let i = 0; i < r; i++) {
      for (let j = 0; j < r; j++) {
        const [ar, ai] = c[i]!;
        const [br, bi] = c[j]!;
        S.re[i * r + j] += ar * br + ai * bi;
        S.im[i * r + j] += ai * br - ar * bi;
      }
    }
  }
  const X = zeros(r);
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < r; j++) {
      const [xr, xi] = sandwich(basis[i]!, rho, basis[j]!);
      X.re[i * r + j] = xr;
      X.im[i * r + j] = xi;
    }
  }
  // Cholesky S = L L† (S is positive definite on the span)
  const L = zeros(r);
  for (let j = 0; j < r; j++) {
    let d = S.re[j * r + j]!;
    for (let k = 0; k < j; k++) d -= L.re[j * r + k]! ** 2 + L.im[j * r + k]! ** 2;
    const ljj = Math.sqrt(d);
    L.re[j * r + j] = ljj;
    for (let i = j + 1; i < r; i++) {
      let sr = S.re[i * r + j]!;
      let si = S.im[i * r + j]!;
      for (let k = 0; k < j; k++) {
        // L_ik · conj(L_jk)
        const ar = L.re[i * r + k]!;
        const ai = L.im[i * r + k]!;
        const br = L.re[j * r + k]!;
        const bi = L.im[j * r + k]!;
        sr -= ar * br + ai * bi;
        si -= ai * br - ar * bi;
      }
      L.re[i * r + j] = sr / ljj;
      L.im[i * r + j] = si / ljj;
    }
  }
  const M = matmul(matmul(adjoint(L), X), L);
  if (r === 1) return M.re[0]!;
  const s = hermitianEigenvalues(M).reduce((acc, l) => acc + Math.sqrt(Math.max(0, l)), 0);
  return s * s;
}

/** The noise-kind fields of a profile entry. */
export function pickKinds(e: Dict): Dict {
  const out: Dict = {};
  for (const [k, v] of Object.entries(e)) if (NOISE_KEYS.has(k)) out[k] = v;
  return out;
}

/** A k-qubit gate embedded as a full matrix on a `k`-qubit register (first target most significant). */
export function embedFull(g: Mat, targets: readonly number[], n: number): Mat {
  const D = 1 << n;
  const out = zeros(D);
  const rows = embed(g, targets, n);
  for (let r = 0; r < D; r++) {
    for (const e of rows[r]!) {
      out.re[r * D + e.c] = e.re;
      out.im[r * D + e.c] = e.im;
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------
// Results shared by the version-1 and version-2 oracles
// ---------------------------------------------------------------------------------------

/** ψ → (U on `qubits`)·ψ for every member of a pure-state ensemble. */
export function applyUnitaryToVectors(ensemble: readonly Vec[], u: Mat, qubits: readonly number[], n: number): Vec[] {
  const D = 1 << n;
  const f = embed(u, qubits, n);
  return ensemble.map((v) => {
    const re = new Float64Array(D);
    const im = new Float64Array(D);
    for (let r = 0; r < D; r++) {
      for (const e of f[r]!) {
        re[r] += e.re * v.re[e.c]! - e.im * v.im[e.c]!;
        im[r] += e.re * v.im[e.c]! + e.im * v.re[e.c]!;
      }
    }
    return { re, im };
  });
}

/**
 * The distributions over the measured qubits (bitstring character j = measured[j]): ideal from
 * the ensemble Σ|v⟩⟨v|, noisy from ρ's diagonal, measured = noisy after each qubit's readout
 * confusion; with fidelity.classical = (Σ√(p_ideal·p_measured))² and tvd = ½Σ|p_ideal − p_measured|.
 */
export function terminalDistributions(
  measured: readonly number[],
  n: number,
  ensemble: readonly Vec[],
  rho: Mat,
  readout: readonly { z1: number; o0: number }[],
): { probabilities: { ideal: Record<string, number>; noisy: Record<string, number>; measured: Record<string, number> }; classical: number; tvd: number } {
  const D = 1 << n;
  const m = measured.length;
  const marg = (diag: (i: number) => number): Float64Array => {
    const out = new Float64Array(1 << m);
    for (let i = 0; i < D; i++) {
      let s = 0;
      for (const q of measured) s = (s << 1) | bit(i, q, n);
      out[s] += diag(i);
    }
    return out;
  };
  const pIdeal = marg((i) => ensemble.reduce((acc, v) => acc + v.re[i]! ** 2 + v.im[i]! ** 2, 0));
  const pNoisy = marg((i) => rho.re[i * D + i]!);
  // readout confusion on each measured qubit: P(read 1 | 0) = zero_as_one, P(read 0 | 1) = one_as_zero
  let pMeas = Float64Array.from(pNoisy);
  measured.forEach((q, j) => {
    const { z1, o0 } = readout[q]!;
    const next = new Float64Array(1 << m);
    const bm = 1 << (m - 1 - j);
    for (let s = 0; s < 1 << m; s++) {
      const b = s & bm ? 1 : 0;
      const s0 = s & ~bm;
      const s1 = s | bm;
      // P(read b) = Σ_a P(b | a) p(a)
      next[s] = b === 0 ? (1 - z1) * pMeas[s0]! + o0 * pMeas[s1]! : z1 * pMeas[s0]! + (1 - o0) * pMeas[s1]!;
    }
    pMeas = next;
  });
  const probabilities = { ideal: {} as Record<string, number>, noisy: {} as Record<string, number>, measured: {} as Record<string, number> };
  let fc = 0;
  let tvd = 0;
  for (let s = 0; s < 1 << m; s++) {
    const ks = measured.length === 0 ? '' : Array.from({ length: m }, (_, j) => String((s >> (m - 1 - j)) & 1)).join('');
    probabilities.ideal[ks] = pIdeal[s]!;
    probabilities.noisy[ks] = pNoisy[s]!;
    probabilities.measured[ks] = pMeas[s]!;
    fc += Math.sqrt(Math.max(0, pIdeal[s]!) * Math.max(0, pMeas[s]!));
    tvd += 0.5 * Math.abs(pIdeal[s]! - pMeas[s]!);
  }

  return { probabilities, classical: fc * fc, tvd };
}

/** ⟨P⟩ = Tr(Pρ) (noisy) and Σ_v ⟨v|P|v⟩ (ideal) for each Pauli string of `observe` (qubit 0 leftmost). */
export function observablesOf(observe: unknown, rho: Mat, ensemble: readonly Vec[]): Record<string, { ideal: number; noisy: number }> | undefined {
  const D = rho.d;
  let observables: Record<string, { ideal: number; noisy: number }> | undefined;
  if (Array.isArray(observe)) {
    observables = {};
    for (const ps of observe as string[]) {
      let P = identity(1);
      for (const ch of ps) P = kron(P, ch === 'X' ? PAULI_X : ch === 'Y' ? PAULI_Y : ch === 'Z' ? PAULI_Z : ID2);
      let noisy = 0;
      for (let i = 0; i < D; i++) for (let j = 0; j < D; j++) noisy += P.re[i * D + j]! * rho.re[j * D + i]! - P.im[i * D + j]! * rho.im[j * D + i]!;
      let ideal = 0;
      for (const v of ensemble) ideal += sandwich(v, P, v)[0];
      observables[ps] = { ideal, noisy };
    }
  }

  return observables;
}
