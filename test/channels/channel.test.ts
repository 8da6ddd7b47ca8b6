/**
 * Round trips among the five representations (Kraus, Choi, superoperator, PTM, Stinespring)
 * on random CPTP channels (random isometries from QR of complex Gaussian matrices, fixed
 * seeds), and a cross-check of every conversion against an independent dense computation
 * with mathjs straight from the definitions in src/channels/conventions.ts.
 */
import { describe, expect, it } from 'vitest';
import { add as madd, conj as mconj, kron as mkron, multiply, trace as mtrace, zeros as mzeros, ctranspose, type Matrix, type Complex as MComplex } from 'mathjs';
import type { CMatrix } from '../../src/linalg/cmatrix.js';
import { Channel } from '../../src/channels/channel.js';
import { CHANNEL_FORMS } from '../../src/channels/conventions.js';
import { pauliLabels, pauliMatrix } from '../../src/noise/channels.js';
import { maxDiff, mulberry32, randomKraus, randomUnitary, ROUND_TRIP } from './helpers.js';
import { toMath } from '../helpers/mathjs.js';

function diffToMath(a: CMatrix, m: Matrix): number {
  const [r, c] = m.size();
  if (r !== a.rows || c !== a.cols) return Infinity;
  let w = 0;
  for (let i = 0; i < r!; i++) {
    for (let j = 0; j < c!; j++) {
      const x = m.get([i, j]) as MComplex | number;
      const [re, im] = typeof x === 'number' ? [x, 0] : [x.re, x.im];
      w = Math.max(w, Math.hypot(a.data[2 * (i * a.cols + j)]! - re, a.data[2 * (i * a.cols + j) + 1]! - im));
    }
  }
  return w;
}

function unitM(d: number, i: number, j: number): Matrix {
  const m = mzeros(d, d) as Matrix;
  m.set([i, j], 1);
  return m;
}

/** mathjs: E(X) = Σ K X K†. */
function applyM(kraus: Matrix[], x: Matrix): Matrix {
  let out = mzeros(x.size()[0]!, x.size()[1]!) as Matrix;
  for (const k of kraus) out = madd(out, multiply(multiply(k, x), ctranspose(k))) as Matrix;
  return out;
}

describe('round trips among the five forms (random CPTP channels, 1e-12)', () => {
  for (const [k, seed] of [
    [1, 101],
    [1, 102],
    [2, 201],
    [2, 202],
  ] as const) {
    it(`${k} qubit(s), seed ${seed}: every form → Channel → every other form agrees with the Kraus-built one`, () => {
      const rng = mulberry32(seed);
      const d = 1 << k;
      const ref = Channel.fromKraus(randomKraus(rng, d, 3));
      const choi = ref.choi();
      const sup = ref.superoperator();
      const ptm = ref.ptm();
      const stine = ref.stinespring();
      const built = [
        Channel.fromChoi(choi),
        Channel.fromSuperoperator(sup),
        Channel.fromPtm(ptm),
        Channel.fromStinespring(stine),
        Channel.fromKraus(ref.minimalKraus()),
      ];
      for (const c of built) {
        expect(maxDiff(c.choi(), choi)).toBeLessThan(ROUND_TRIP);
        expect(maxDiff(c.superoperator(), sup)).toBeLessThan(ROUND_TRIP);
        expect(maxDiff(c.ptm(), ptm)).toBeLessThan(ROUND_TRIP);
        // The Kraus form of a channel is fixed only up to a unitary mixing (N&C Theorem 8.2), so
        // compare the minimal Kraus sets through the map they define, and their count.
        expect(c.minimalKraus().length).toBe(3);
        expect(maxDiff(Channel.fromKraus(c.minimalKraus()).choi(), choi)).toBeLessThan(ROUND_TRIP);
        expect(maxDiff(Channel.fromStinespring(c.stinespring()).choi(), choi)).toBeLessThan(ROUND_TRIP);
      }
    });
  }

  it('the PTM of a CPTP map is real and its first row is (1, 0, …, 0) (trace preservation)', () => {
    const rng = mulberry32(301);
    const r = Channel.fromKraus(randomKraus(rng, 4, 2)).ptm();
    for (let i = 0; i < 16; i++) {
      for (let j = 0; j < 16; j++) expect(Math.abs(r.data[2 * (i * 16 + j) + 1]!)).toBeLessThan(ROUND_TRIP);
      expect(r.data[2 * i]!).toBeCloseTo(i === 0 ? 1 : 0, 12); // row 0, column i
    }
  });

  it('a unitary channel converts to every form and back', () => {
    const rng = mulberry32(302);
    const u = randomUnitary(rng, 4);
    const c = Channel.fromUnitary(u);
    for (const form of CHANNEL_FORMS) expect(c.form(form)).toBeDefined();
    expect(maxDiff(c.unitary()!, u)).toBe(0);
    const back = Channel.fromPtm(c.ptm()).unitary();
    expect(back).toBeDefined();
    // equal up to a global phase: |Tr(U†V)| = d
    let re = 0;
    let im = 0;
    for (let i = 0; i < 32; i += 2) {
      re += u.data[i]! * back!.data[i]! + u.data[i + 1]! * back!.data[i + 1]!;
      im += u.data[i]! * back!.data[i + 1]! - u.data[i + 1]! * back!.data[i]!;
    }
    expect(Math.hypot(re, im)).toBeCloseTo(4, 12);
  });
});

describe('conversions vs an independent dense mathjs computation from the definitions', () => {
  for (const [k, seed] of [
    [1, 401],
    [2, 402],
  ] as const) {
    it(`${k} qubit(s): Choi, superoperator, PTM and Stinespring`, () => {
      const rng = mulberry32(seed);
      const d = 1 << k;
      const kraus = randomKraus(rng, d, 2);
      const c = Channel.fromKraus(kraus);
      const km = kraus.map(toMath);
      // Choi: Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|)
      let choi = mzeros(d * d, d * d) as Matrix;
      for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) choi = madd(choi, mkron(unitM(d, i, j), applyM(km, unitM(d, i, j)))) as Matrix;
      expect(diffToMath(c.choi(), choi)).toBeLessThan(ROUND_TRIP);
      // Superoperator: Σ conj(K) ⊗ K
      let sup = mzeros(d * d, d * d) as Matrix;
      for (const m of km) sup = madd(sup, mkron(mconj(m), m)) as Matrix;
      expect(diffToMath(c.superoperator(), sup)).toBeLessThan(ROUND_TRIP);
      // PTM: R_ij = Tr(P_i E(P_j))/d
      const paulis = pauliLabels(k).map((l) => toMath(pauliMatrix(l)));
      const ptm = mzeros(d * d, d * d) as Matrix;
      paulis.forEach((pj, j) => {
        const out = applyM(km, pj);
        paulis.forEach((pi, i) => ptm.set([i, j], multiply(mtrace(multiply(pi, out)), 1 / d)));
      });
      expect(diffToMath(c.ptm(), ptm)).toBeLessThan(ROUND_TRIP);
      // Stinespring: Σ_k K_k ⊗ |k⟩ (environment last)
      let v = mzeros(d * km.length, d) as Matrix;
      km.forEach((m, idx) => {
        const ket = mzeros(km.length, 1) as Matrix;
        ket.set([idx, 0], 1);
        v = madd(v, mkron(m, ket)) as Matrix;
      });
      expect(diffToMath(c.stinespring(), v)).toBeLessThan(ROUND_TRIP);
    });
  }
});
