import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { type CMatrix, entry, identity, kron, maxAbsDiff, mul } from '../../src/linalg/cmatrix.js';
import { depolarizing, pauliLabels, pauliMatrix, amplitudeDamping, thermalRelaxation } from '../../src/noise/channels.js';
import {
  averageGateFidelity,
  composeKraus,
  entanglementFidelity,
  krausAverageGateFidelity,
  processFidelityFromAverage,
  tensorKraus,
} from '../../src/noise/fidelity.js';
import {
  PHYS_TOL,
  applyKraus,
  designAverageFidelity,
  framePotential,
  mulberry32,
  randomDensity,
  randomKraus,
  randomUnitary,
  stabilizerStates,
} from './helpers.js';
import { toMath } from '../helpers/mathjs.js';

function re(x: unknown): number {
  return typeof x === 'number' ? x : (x as math.Complex).re;
}

/**
 * Trace of the Pauli transfer matrix R_ii = Tr(P_i E(P_i))/d, computed independently with
 * mathjs (PTM: common practice; Tr R / d² = F_e, Nielsen & Chuang §9.3 / Nielsen 2002).
 */
function ptmTraceMathjs(kraus: readonly CMatrix[], k: number): number {
  const d = 1 << k;
  const ks = kraus.map(toMath);
  let tr = 0;
  for (const label of pauliLabels(k)) {
    const p = toMath(pauliMatrix(label));
    let out = math.zeros(d, d) as math.Matrix;
    for (const K of ks) out = math.add(out, math.multiply(math.multiply(K, p), math.ctranspose(K))) as math.Matrix;
    tr += re(math.trace(math.multiply(p, out) as math.Matrix)) / d;
  }
  return tr;
}

describe('entanglementFidelity', () => {
  const rand = mulberry32(404);

  it('equals the Pauli-transfer-matrix trace / d² (mathjs, independent) for random channels', () => {
    for (const [k, count] of [
      [1, 1],
      [1, 3],
      [2, 2],
      [2, 5],
    ] as const) {
      const kraus = randomKraus(rand, 1 << k, count);
      const d2 = 1 << (2 * k);
      expect(Math.abs(entanglementFidelity(kraus) - ptmTraceMathjs(kraus, k) / d2)).toBeLessThan(PHYS_TOL);
    }
  });

  it('is 1 for the identity and for a unitary against itself, |Tr U|²/d² against the identity', () => {
    expect(entanglementFidelity([identity(4)])).toBe(1);
    const u = randomUnitary(rand, 4);
    expect(Math.abs(entanglementFidelity([u], u) - 1)).toBeLessThan(PHYS_TOL);
    const [tr, ti] = [0, 1, 2, 3].reduce<[number, number]>((acc, i) => [acc[0] + entry(u, i, i)[0], acc[1] + entry(u, i, i)[1]], [0, 0]);
    expect(Math.abs(entanglementFidelity([u]) - (tr * tr + ti * ti) / 16)).toBeLessThan(PHYS_TOL);
  });

  it('against U: the gate unitary cancels, F_e(E∘U, U) = F_e(E) (Tr(U†KU) = Tr K)', () => {
    for (let i = 0; i < 5; i++) {
      const u = randomUnitary(rand, 4);
      const e = randomKraus(rand, 4, 3);
      const gate = e.map((k) => mul(k, u));
      expect(Math.abs(entanglementFidelity(gate, u) - entanglementFidelity(e))).toBeLessThan(PHYS_TOL);
    }
  });

  it('rejects a target of the wrong size', () => {
    expect(() => entanglementFidelity([identity(2)], identity(4))).toThrow(RangeError);
  });
});

describe('averageGateFidelity', () => {
  const rand = mulberry32(99);

  it('(d·F_e + 1)/(d + 1) matches the exact 2-design average of ⟨ψ|U†E(UψU†)U|ψ⟩ (Nielsen, Phys. Lett. A 303, 249 (2002))', () => {
    for (const k of [1, 2]) {
      const d = 1 << k;
      const design = stabilizerStates(k);
      // The design is exact: frame potential at the Welch bound 2/(d(d+1)) (Renes et al. 2004 (from memory)).
      expect(Math.abs(framePotential(design) - 2 / (d * (d + 1)))).toBeLessThan(PHYS_TOL);
      for (let t = 0; t < 3; t++) {
        const u = randomUnitary(rand, d);
        const e = randomKraus(rand, d, 1 + t);
        const gate = e.map((op) => mul(op, u));
        const viaDesign = designAverageFidelity(design, u, (rho) => applyKraus(e, rho));
        expect(Math.abs(krausAverageGateFidelity(gate, u) - viaDesign)).toBeLessThan(PHYS_TOL);
        expect(Math.abs(averageGateFidelity(entanglementFidelity(e), d) - viaDesign)).toBeLessThan(PHYS_TOL);
      }
    }
  });

  it('depolarizing p has F_avg = 1 − p(d − 1)/d for d = 2, 4, 8 (Nielsen 2002 with F_e = 1 − p + p/d²)', () => {
    for (const k of [1, 2, 3]) {
      const d = 1 << k;
      for (const p of [0, 0.01, 0.3, 1]) {
        expect(Math.abs(krausAverageGateFidelity(depolarizing(k, p).kraus) - (1 - (p * (d - 1)) / d))).toBeLessThan(PHYS_TOL);
      }
    }
  });

  it('processFidelityFromAverage inverts averageGateFidelity', () => {
    for (const d of [2, 4, 8]) for (const f of [0, 0.3, 0.999]) expect(Math.abs(processFidelityFromAverage(averageGateFidelity(f, d), d) - f)).toBeLessThan(PHYS_TOL);
  });

  it('amplitude damping γ: F_e = (1 + √(1−γ))²/4, and F_avg matches the six-state design average', () => {
    // F_e from the N&C §8.3.5 Kraus operators (Tr K0 = 1 + √(1−γ), Tr K1 = 0); the 1-qubit
    // stabilizer states (six Pauli eigenstates) are an exact 2-design (Gross, Audenaert, Eisert 2007).
    const design = stabilizerStates(1);
    expect(design).toHaveLength(6);
    for (const g of [0.05, 0.5]) {
      const kraus = amplitudeDamping(g).kraus;
      expect(Math.abs(entanglementFidelity(kraus) - (1 + Math.sqrt(1 - g)) ** 2 / 4)).toBeLessThan(PHYS_TOL);
      const viaDesign = designAverageFidelity(design, identity(2), (rho) => applyKraus(kraus, rho));
      expect(Math.abs(krausAverageGateFidelity(kraus) - viaDesign)).toBeLessThan(PHYS_TOL);
    }
  });
});

describe('composeKraus and tensorKraus', () => {
  const rand = mulberry32(17);

  it('composeKraus(second, first) acts as first then second', () => {
    for (const d of [2, 4]) {
      const a = randomKraus(rand, d, 2);
      const b = randomKraus(rand, d, 3);
      const rho = randomDensity(rand, d);
      const composed = composeKraus(b, a);
      expect(composed).toHaveLength(6);
      expect(maxAbsDiff(applyKraus(composed, rho), applyKraus(b, applyKraus(a, rho)))).toBeLessThan(PHYS_TOL);
    }
  });

  it('tensorKraus(a, b) acts as a on the leftmost qubit and b on the rightmost (mathjs kron, independent)', () => {
    const a = thermalRelaxation({ t1: 1000, t2: 700, excited: 0.1, time: 300 }).kraus;
    const b = randomKraus(rand, 2, 2);
    const rho = randomDensity(rand, 4);
    const mathOps = (ks: readonly CMatrix[], left: boolean) =>
      ks.map((k) => (left ? math.kron(toMath(k), math.identity(2) as math.Matrix) : math.kron(math.identity(2) as math.Matrix, toMath(k))) as math.Matrix);
    let m = toMath(rho);
    for (const ops of [mathOps(a, true), mathOps(b, false)]) {
      let out = math.zeros(4, 4) as math.Matrix;
      for (const K of ops) out = math.add(out, math.multiply(math.multiply(K, m), math.ctranspose(K))) as math.Matrix;
      m = out;
    }
    const got = applyKraus(tensorKraus(a, b), rho);
    const arr = m.toArray() as unknown as (math.Complex | number)[][];
    let worst = 0;
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        const v = arr[i]![j]!;
        const [gr, gi] = entry(got, i, j);
        worst = Math.max(worst, Math.hypot(gr - re(v), gi - (typeof v === 'number' ? 0 : v.im)));
      }
    }
    expect(worst).toBeLessThan(PHYS_TOL);
  });

  it('F_e is multiplicative under tensor products and Kraus operators are kron products', () => {
    const a = randomKraus(rand, 2, 2);
    const b = randomKraus(rand, 2, 3);
    const t = tensorKraus(a, b);
    expect(t).toHaveLength(6);
    expect(maxAbsDiff(t[4]!, kron(a[1]!, b[1]!))).toBe(0);
    expect(Math.abs(entanglementFidelity(t) - entanglementFidelity(a) * entanglementFidelity(b))).toBeLessThan(PHYS_TOL);
  });
});
