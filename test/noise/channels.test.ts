import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import {
  type CMatrix,
  entry,
  fromRows,
  identity,
  krausResidual,
  maxAbsDiff,
  mul,
  scale,
  add,
  unitarityResidual,
  adjoint,
} from '../../src/linalg/cmatrix.js';
import {
  amplitudeDamping,
  bitFlip,
  bitPhaseFlip,
  depolarizing,
  generalizedAmplitudeDamping,
  pauliChannel,
  pauliLabels,
  pauliMatrix,
  phaseDamping,
  phaseFlip,
  simplifyKraus,
  thermalRelaxation,
} from '../../src/noise/channels.js';
import { composeKraus } from '../../src/noise/fidelity.js';
import {
  PHYS_TOL,
  TP_TOL,
  HADAMARD,
  applyKraus,
  bloch,
  choi,
  conjugate,
  fromBloch,
  mulberry32,
  randomDensity,
} from './helpers.js';

/** A random Bloch vector strictly inside the ball. */
function randomBloch(rand: () => number): [number, number, number] {
  const v: [number, number, number] = [rand() * 2 - 1, rand() * 2 - 1, rand() * 2 - 1];
  const n = Math.hypot(...v);
  const s = (0.95 * rand()) / n;
  return [v[0] * s, v[1] * s, v[2] * s];
}

function expectVec(a: readonly number[], b: readonly number[], tol = PHYS_TOL): void {
  for (let i = 0; i < 3; i++) expect(Math.abs(a[i]! - b[i]!)).toBeLessThan(tol);
}

function mathDiff(a: CMatrix, b: math.Matrix): number {
  const arr = b.toArray() as unknown as (math.Complex | number)[][];
  let worst = 0;
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < a.cols; j++) {
      const v = arr[i]![j]!;
      const re = typeof v === 'number' ? v : v.re;
      const im = typeof v === 'number' ? 0 : v.im;
      const [ar, ai] = entry(a, i, j);
      worst = Math.max(worst, Math.hypot(ar - re, ai - im));
    }
  }
  return worst;
}

describe('pauliMatrix', () => {
  it('builds Pauli strings with the leftmost character as the most significant factor (checked against mathjs kron)', () => {
    // Pauli matrices as in Nielsen & Chuang §2.1.3 (eq. 2.40–2.43 (from memory)); kron via mathjs (independent).
    const X = math.matrix([
      [0, 1],
      [1, 0],
    ]);
    const Y = math.matrix([
      [0, math.complex(0, -1)],
      [math.complex(0, 1), 0],
    ]);
    const Z = math.matrix([
      [1, 0],
      [0, -1],
    ]);
    expect(mathDiff(pauliMatrix('XZ'), math.kron(X, Z) as math.Matrix)).toBe(0);
    expect(mathDiff(pauliMatrix('ZX'), math.kron(Z, X) as math.Matrix)).toBe(0);
    expect(mathDiff(pauliMatrix('YIX'), math.kron(math.kron(Y, math.identity(2) as math.Matrix), X) as math.Matrix)).toBe(0);
    expect(mathDiff(pauliMatrix('y'), Y)).toBe(0);
  });

  it('gives Hermitian unitaries squaring to the identity with XY = iZ (Pauli algebra, N&C §2.1.3)', () => {
    for (const l of pauliLabels(2)) {
      const p = pauliMatrix(l);
      expect(unitarityResidual(p)).toBe(0);
      expect(maxAbsDiff(p, adjoint(p))).toBe(0);
      expect(maxAbsDiff(mul(p, p), identity(4))).toBe(0);
    }
    expect(maxAbsDiff(mul(pauliMatrix('X'), pauliMatrix('Y')), scale(pauliMatrix('Z'), 0, 1))).toBe(0);
  });

  it('rejects characters other than I, X, Y, Z', () => {
    expect(() => pauliMatrix('XA')).toThrow(RangeError);
    expect(() => pauliMatrix('')).toThrow(RangeError);
  });

  it('lists the 4^k Pauli labels', () => {
    expect(pauliLabels(1)).toEqual(['I', 'X', 'Y', 'Z']);
    expect(pauliLabels(3)).toHaveLength(64);
    expect(new Set(pauliLabels(3)).size).toBe(64);
  });
});

describe('trace preservation of every kind', () => {
  // A channel is trace preserving iff Σ K†K = I (Nielsen & Chuang §8.2.3, eq. 8.11 (from memory)).
  const params = [0, 0.013, 0.37, 0.5, 1];
  it.each(params)('all constructors at parameter %s', (p) => {
    const sets = [
      depolarizing(1, p).kraus,
      depolarizing(2, p).kraus,
      depolarizing(3, p).kraus,
      amplitudeDamping(p).kraus,
      phaseDamping(p).kraus,
      bitFlip(p).kraus,
      phaseFlip(p).kraus,
      bitPhaseFlip(p).kraus,
      pauliChannel(p / 3, p / 4, p / 5).kraus,
      generalizedAmplitudeDamping(p, 0.2).kraus,
    ];
    for (const ks of sets) expect(krausResidual(ks)).toBeLessThan(TP_TOL);
  });

  it('thermal relaxation for random parameters', () => {
    const rand = mulberry32(11);
    for (let i = 0; i < 40; i++) {
      const t1 = 1000 + 100000 * rand();
      const t2 = 2 * t1 * rand() + 1;
      const ch = thermalRelaxation({ t1, t2, excited: 0.3 * rand(), time: 5000 * rand() });
      expect(krausResidual(ch.kraus)).toBeLessThan(TP_TOL);
      expect(ch.qubits).toBe(1);
    }
  });

  it('rejects probabilities outside [0, 1]', () => {
    expect(() => bitFlip(1.5)).toThrow(RangeError);
    expect(() => amplitudeDamping(-0.1)).toThrow(RangeError);
    expect(() => depolarizing(1, Number.NaN)).toThrow(RangeError);
    expect(() => pauliChannel(0.5, 0.4, 0.2)).toThrow(RangeError);
    expect(() => depolarizing(0, 0.1)).toThrow(RangeError);
  });
});

describe('Bloch-sphere action (Nielsen & Chuang §8.3)', () => {
  const rand = mulberry32(2024);
  const cases = Array.from({ length: 12 }, () => ({ r: randomBloch(rand), p: rand() }));

  it('depolarizing shrinks the Bloch vector by (1 − p) (N&C §8.3.4, eq. 8.100–8.101 (from memory))', () => {
    for (const { r, p } of cases) {
      const out = bloch(applyKraus(depolarizing(1, p).kraus, fromBloch(r)));
      expectVec(out, [r[0] * (1 - p), r[1] * (1 - p), r[2] * (1 - p)]);
    }
  });

  it('k-qubit depolarizing is (1 − p)ρ + p·I/d on random states (the contract definition; N&C §8.3.4)', () => {
    for (const k of [2, 3]) {
      const d = 1 << k;
      for (let t = 0; t < 3; t++) {
        const rho = randomDensity(rand, d);
        const p = rand();
        const expected = add(scale(rho, 1 - p), scale(identity(d), p / d));
        expect(maxAbsDiff(applyKraus(depolarizing(k, p).kraus, rho), expected)).toBeLessThan(PHYS_TOL);
      }
    }
  });

  it('amplitude damping maps (x, y, z) → (x√(1−γ), y√(1−γ), γ + z(1−γ)) (N&C §8.3.5, Bloch form of eq. 8.107–8.108 (from memory))', () => {
    for (const { r, p: g } of cases) {
      const out = bloch(applyKraus(amplitudeDamping(g).kraus, fromBloch(r)));
      const s = Math.sqrt(1 - g);
      expectVec(out, [r[0] * s, r[1] * s, g + r[2] * (1 - g)]);
    }
  });

  it('phase damping scales x, y by √(1−λ) and keeps z (N&C §8.3.6 (from memory))', () => {
    for (const { r, p: l } of cases) {
      const out = bloch(applyKraus(phaseDamping(l).kraus, fromBloch(r)));
      const s = Math.sqrt(1 - l);
      expectVec(out, [r[0] * s, r[1] * s, r[2]]);
    }
  });

  it('bit flip keeps x and shrinks y, z by (1 − 2p) (N&C §8.3.3, Fig. 8.8 (from memory))', () => {
    for (const { r, p } of cases) {
      const out = bloch(applyKraus(bitFlip(p).kraus, fromBloch(r)));
      expectVec(out, [r[0], r[1] * (1 - 2 * p), r[2] * (1 - 2 * p)]);
    }
  });

  it('phase flip keeps z and shrinks x, y by (1 − 2p) (N&C §8.3.3, Fig. 8.9 (from memory))', () => {
    for (const { r, p } of cases) {
      const out = bloch(applyKraus(phaseFlip(p).kraus, fromBloch(r)));
      expectVec(out, [r[0] * (1 - 2 * p), r[1] * (1 - 2 * p), r[2]]);
    }
  });

  it('bit-phase flip keeps y and shrinks x, z by (1 − 2p) (N&C §8.3.3, Fig. 8.10 (from memory))', () => {
    for (const { r, p } of cases) {
      const out = bloch(applyKraus(bitPhaseFlip(p).kraus, fromBloch(r)));
      expectVec(out, [r[0] * (1 - 2 * p), r[1], r[2] * (1 - 2 * p)]);
    }
  });

  it('the Pauli channel scales x by 1 − 2y − 2z, y by 1 − 2x − 2z, z by 1 − 2x − 2y', () => {
    // Each Pauli σ_a commutes with itself and anticommutes with the other two (Pauli algebra,
    // N&C §2.1.3), so σ_x → (1 − x − y − z) + x − y − z = 1 − 2y − 2z times σ_x, etc.
    for (const { r, p } of cases) {
      const x = p / 2;
      const y = p / 3;
      const z = p / 7;
      const out = bloch(applyKraus(pauliChannel(x, y, z).kraus, fromBloch(r)));
      expectVec(out, [r[0] * (1 - 2 * y - 2 * z), r[1] * (1 - 2 * x - 2 * z), r[2] * (1 - 2 * x - 2 * y)]);
    }
  });

  it('generalized amplitude damping has diag(1 − pe, pe) as its fixed point (N&C §8.3.5, stationary state ρ∞ (from memory))', () => {
    for (const pe of [0, 0.1, 0.5, 0.9]) {
      const fixed = fromRows([
        [1 - pe, 0],
        [0, pe],
      ]);
      expect(maxAbsDiff(applyKraus(generalizedAmplitudeDamping(0.37, pe).kraus, fixed), fixed)).toBeLessThan(PHYS_TOL);
    }
  });
});

describe('Kraus set hygiene', () => {
  it('a zero parameter gives the identity channel with one Kraus operator', () => {
    for (const ch of [depolarizing(2, 0), amplitudeDamping(0), phaseDamping(0), bitFlip(0), pauliChannel(0, 0, 0)]) {
      expect(ch.kraus).toHaveLength(1);
      expect(maxAbsDiff(ch.kraus[0]!, identity(1 << ch.qubits))).toBe(0);
    }
  });

  it('depolarizing with 0 < p has all d² Kraus operators', () => {
    expect(depolarizing(1, 0.1).kraus).toHaveLength(4);
    expect(depolarizing(2, 0.1).kraus).toHaveLength(16);
  });

  it('simplifyKraus keeps the channel (same Choi matrix) while merging parallel operators', () => {
    const a = fromRows([
      [0.3, [0.1, 0.2]],
      [0, 0.4],
    ]);
    const ops = [a, scale(a, 0.5, -0.25), fromRows([[0, 0], [0, 0]]), fromRows([[0, 0.2], [0.1, 0]])];
    const merged = simplifyKraus(ops);
    expect(merged).toHaveLength(2);
    expect(maxAbsDiff(choi(merged), choi(ops))).toBeLessThan(PHYS_TOL);
  });
});

describe('thermal relaxation', () => {
  const t1 = 50_000;
  const t2 = 30_000;

  it('|1⟩ decays with P(1) = e^{−τ/T1} at zero temperature (definition of T1, common practice)', () => {
    const one = fromRows([
      [0, 0],
      [0, 1],
    ]);
    for (const tau of [0, 100, 7_000, 50_000, 200_000]) {
      const out = applyKraus(thermalRelaxation({ t1, t2, excited: 0, time: tau }).kraus, one);
      expect(Math.abs(entry(out, 1, 1)[0] - Math.exp(-tau / t1))).toBeLessThan(PHYS_TOL);
    }
  });

  it('Ramsey H · idle τ · H gives P(0) = (1 + e^{−τ/T2})/2 (definition of T2, common practice)', () => {
    const zero = fromRows([
      [1, 0],
      [0, 0],
    ]);
    for (const excited of [0, 0.2]) {
      for (const tau of [0, 1_000, 25_000, 80_000]) {
        const ch = thermalRelaxation({ t1, t2, excited, time: tau });
        const out = conjugate(HADAMARD, applyKraus(ch.kraus, conjugate(HADAMARD, zero)));
        expect(Math.abs(entry(out, 0, 0)[0] - (1 + Math.exp(-tau / t2)) / 2)).toBeLessThan(PHYS_TOL);
      }
    }
  });

  it('populations relax toward pe at rate 1/T1 and coherences decay as e^{−τ/T2} on random states (the contract definition)', () => {
    const rand = mulberry32(77);
    for (let i = 0; i < 10; i++) {
      const rho = randomDensity(rand, 2);
      const a = 1_000 + 90_000 * rand();
      const b = 2 * a * rand() + 10;
      const pe = 0.4 * rand();
      const tau = 40_000 * rand();
      const out = applyKraus(thermalRelaxation({ t1: a, t2: b, excited: pe, time: tau }).kraus, rho);
      const e1 = Math.exp(-tau / a);
      const e2 = Math.exp(-tau / b);
      const p1 = entry(rho, 1, 1)[0];
      expect(Math.abs(entry(out, 1, 1)[0] - (p1 * e1 + pe * (1 - e1)))).toBeLessThan(PHYS_TOL);
      const [cr, ci] = entry(rho, 0, 1);
      const [or, oi] = entry(out, 0, 1);
      expect(Math.hypot(or - cr * e2, oi - ci * e2)).toBeLessThan(PHYS_TOL);
    }
  });

  it('the equilibrium diag(1 − pe, pe) is the fixed point, and long times reach it from any state', () => {
    const rand = mulberry32(3);
    for (const pe of [0, 0.05, 0.3]) {
      const eq = fromRows([
        [1 - pe, 0],
        [0, pe],
      ]);
      const ch = thermalRelaxation({ t1, t2, excited: pe, time: 12_345 });
      expect(maxAbsDiff(applyKraus(ch.kraus, eq), eq)).toBeLessThan(PHYS_TOL);
      const late = thermalRelaxation({ t1, t2, excited: pe, time: 60 * t1 });
      expect(maxAbsDiff(applyKraus(late.kraus, randomDensity(rand, 2)), eq)).toBeLessThan(1e-12);
    }
  });

  it('is a semigroup: T(a)∘T(b) = T(a + b) (Markovian relaxation, common practice)', () => {
    const rand = mulberry32(9);
    for (let i = 0; i < 8; i++) {
      const pe = 0.3 * rand();
      const a = 30_000 * rand();
      const b = 30_000 * rand();
      const p = { t1, t2, excited: pe };
      const composed = composeKraus(thermalRelaxation({ ...p, time: a }).kraus, thermalRelaxation({ ...p, time: b }).kraus);
      const direct = thermalRelaxation({ ...p, time: a + b }).kraus;
      expect(maxAbsDiff(choi(composed), choi(direct))).toBeLessThan(PHYS_TOL);
    }
  });

  it('uses at most 5 Kraus operators and none is zero', () => {
    const ch = thermalRelaxation({ t1, t2, excited: 0.1, time: 5_000 });
    expect(ch.kraus.length).toBeLessThanOrEqual(5);
    for (const k of ch.kraus) expect(maxAbsDiff(k, scale(k, 0))).toBeGreaterThan(0);
    // zero temperature: GAD has 2 operators, phase damping 2, one product vanishes, two are parallel
    expect(thermalRelaxation({ t1, t2, excited: 0, time: 5_000 }).kraus.length).toBeLessThanOrEqual(3);
  });

  it('returns the identity (one operator) when nothing happens', () => {
    for (const ch of [
      thermalRelaxation({ t1, t2, excited: 0.1, time: 0 }),
      thermalRelaxation({ t1: Infinity, t2: Infinity, excited: 0, time: 1_000 }),
    ]) {
      expect(ch.kraus).toHaveLength(1);
      expect(maxAbsDiff(ch.kraus[0]!, identity(2))).toBe(0);
    }
  });

  it('T1 = ∞ with finite T2 is pure dephasing: populations fixed, coherence e^{−τ/T2}', () => {
    const rho = fromBloch([0.6, -0.2, 0.5]);
    const tau = 9_000;
    const out = applyKraus(thermalRelaxation({ t1: Infinity, t2, excited: 0, time: tau }).kraus, rho);
    expect(Math.abs(entry(out, 0, 0)[0] - entry(rho, 0, 0)[0])).toBeLessThan(PHYS_TOL);
    const e2 = Math.exp(-tau / t2);
    expectVec(bloch(out), [0.6 * e2, -0.2 * e2, 0.5]);
  });

  it('T2 = 2·T1 is amplitude damping alone (coherence e^{−τ/(2T1)})', () => {
    const tau = 20_000;
    const ch = thermalRelaxation({ t1, t2: 2 * t1, excited: 0, time: tau });
    const g = 1 - Math.exp(-tau / t1);
    expect(maxAbsDiff(choi(ch.kraus), choi(amplitudeDamping(g).kraus))).toBeLessThan(PHYS_TOL);
  });

  it('rejects T2 > 2·T1 and non-positive times', () => {
    expect(() => thermalRelaxation({ t1: 100, t2: 201, excited: 0, time: 1 })).toThrow(RangeError);
    expect(() => thermalRelaxation({ t1: 100, t2: Infinity, excited: 0, time: 1 })).toThrow(RangeError);
    expect(() => thermalRelaxation({ t1: 0, t2: 0, excited: 0, time: 1 })).toThrow(RangeError);
    expect(() => thermalRelaxation({ t1: 100, t2: 100, excited: 0, time: -1 })).toThrow(RangeError);
  });
});
