import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { blochVectors, pauliExpectation } from '../../src/results/observables.js';
import { diagonalDensity, mulberry32, projector, randomDensity, randomState, re, stateFrom, toMath } from './helpers.js';

/** The Pauli matrices I, X, Y, Z (Nielsen & Chuang §2.1.3, from memory) as mathjs matrices. */
const PAULI: Record<string, math.Matrix> = {
  I: math.matrix([
    [1, 0],
    [0, 1],
  ]),
  X: math.matrix([
    [0, 1],
    [1, 0],
  ]),
  Y: math.matrix([
    [0, math.complex(0, -1)],
    [math.complex(0, 1), 0],
  ]) as math.Matrix,
  Z: math.matrix([
    [1, 0],
    [0, -1],
  ]),
};

/** Dense P = P_0 ⊗ P_1 ⊗ … with the letter of qubit 0 as leftmost factor (layout.ts). */
function densePauli(s: string): math.Matrix {
  let m: math.Matrix = math.matrix([[1]]);
  for (const c of s) m = math.kron(m, PAULI[c]!);
  return m;
}

function randomPauli(n: number, rand: () => number): string {
  let s = '';
  for (let q = 0; q < n; q++) s += 'IXYZ'[Math.floor(4 * rand())];
  return s;
}

describe('pauliExpectation', () => {
  it('matches the dense mathjs Tr(Pρ) on random states and strings up to 4 qubits', () => {
    const rand = mulberry32(31);
    for (let n = 1; n <= 4; n++) {
      for (let t = 0; t < 12; t++) {
        const rho = randomDensity(n, rand);
        const s = randomPauli(n, rand);
        const expected = re(math.trace(math.multiply(densePauli(s), toMath(rho.data, rho.dim)) as math.Matrix));
        expect(Math.abs(pauliExpectation(rho, s) - expected)).toBeLessThan(1e-13);
      }
    }
  });

  it('matches the dense mathjs ⟨ψ|P|ψ⟩ for pure states, and the density-matrix path on |ψ⟩⟨ψ|', () => {
    const rand = mulberry32(32);
    for (let n = 1; n <= 4; n++) {
      for (let t = 0; t < 12; t++) {
        const psi = randomState(n, rand);
        const s = randomPauli(n, rand);
        const col = toMath(psi.data, psi.dim, 1);
        const bra = math.transpose(math.conj(col));
        const value = math.multiply(math.multiply(bra, densePauli(s)), col) as math.Matrix;
        const expected = re(value.get([0, 0]));
        expect(Math.abs(pauliExpectation(psi, s) - expected)).toBeLessThan(1e-13);
        expect(Math.abs(pauliExpectation(projector(psi), s) - expected)).toBeLessThan(1e-13);
      }
    }
  });

  it('hand values: Bell state (|00⟩ + |11⟩)/√2 has ⟨XX⟩ = 1, ⟨YY⟩ = −1, ⟨ZZ⟩ = 1, ⟨ZI⟩ = 0 (common practice: it is the +1 eigenstate of XX and ZZ, so YY = −XX·ZZ gives −1)', () => {
    const s = Math.SQRT1_2;
    const bell = stateFrom([s, 0, 0, s]);
    expect(pauliExpectation(bell, 'XX')).toBeCloseTo(1, 15);
    expect(pauliExpectation(bell, 'YY')).toBeCloseTo(-1, 15);
    expect(pauliExpectation(bell, 'ZZ')).toBeCloseTo(1, 15);
    expect(pauliExpectation(bell, 'ZI')).toBeCloseTo(0, 15);
    expect(pauliExpectation(projector(bell), 'YY')).toBeCloseTo(-1, 15);
    // Qubit 0 is leftmost: on |01⟩, ⟨ZI⟩ = +1 and ⟨IZ⟩ = −1.
    const ket01 = stateFrom([0, 1, 0, 0]);
    expect(pauliExpectation(ket01, 'ZI')).toBe(1);
    expect(pauliExpectation(ket01, 'IZ')).toBe(-1);
  });

  it('throws on an invalid string', () => {
    const rho = diagonalDensity([1, 0]);
    expect(() => pauliExpectation(rho, 'ZZ')).toThrow(RangeError);
    expect(() => pauliExpectation(rho, 'z')).toThrow(/uppercase/);
  });
});


describe('blochVectors', () => {
  const s = Math.SQRT1_2;

  it('known single-qubit states: |+⟩ → (1,0,0), |+i⟩ → (0,1,0), |0⟩ → (0,0,1), |1⟩ → (0,0,−1) (Nielsen & Chuang §1.2 / Exercise 2.72, from memory)', () => {
    const cases: Array<[ReturnType<typeof stateFrom>, [number, number, number]]> = [
      [stateFrom([s, s]), [1, 0, 0]],
      [stateFrom([s, [0, s]]), [0, 1, 0]],
      [stateFrom([1, 0]), [0, 0, 1]],
      [stateFrom([0, 1]), [0, 0, -1]],
      [stateFrom([s, -s]), [-1, 0, 0]],
    ];
    for (const [psi, v] of cases) {
      for (const state of [psi, projector(psi)]) {
        const [b] = blochVectors(state);
        for (let k = 0; k < 3; k++) expect(b![k]).toBeCloseTo(v[k]!, 15);
      }
    }
  });

  it('product state |+⟩ ⊗ |1⟩ ⊗ |+i⟩ gives each qubit its own vector, qubit 0 first', () => {
    // Amplitudes of |+⟩|1⟩|+i⟩ = ½ Σ_{a,c} i^c |a 1 c⟩.
    const amps: Array<number | [number, number]> = new Array(8).fill(0);
    amps[0b010] = 0.5;
    amps[0b011] = [0, 0.5];
    amps[0b110] = 0.5;
    amps[0b111] = [0, 0.5];
    const psi = stateFrom(amps);
    for (const state of [psi, projector(psi)]) {
      const b = blochVectors(state);
      const expected = [
        [1, 0, 0],
        [0, 0, -1],
        [0, 1, 0],
      ];
      for (let q = 0; q < 3; q++) for (let k = 0; k < 3; k++) expect(b[q]![k]).toBeCloseTo(expected[q]![k]!, 15);
    }
  });

  it('each qubit of a Bell pair, and of the maximally mixed state, is at the origin (reduced state I/2, Nielsen & Chuang §2.4.3, from memory)', () => {
    const bell = stateFrom([s, 0, 0, s]);
    for (const b of [...blochVectors(bell), ...blochVectors(diagonalDensity([0.25, 0.25, 0.25, 0.25]))]) {
      for (const x of b) expect(Math.abs(x)).toBeLessThan(1e-15);
    }
  });

  it('has length ≤ 1 on random mixed states (positivity of the reduced state)', () => {
    const rand = mulberry32(33);
    for (const b of blochVectors(randomDensity(3, rand))) {
      expect(Math.hypot(b[0], b[1], b[2])).toBeLessThanOrEqual(1 + 1e-12);
    }
  });
});
