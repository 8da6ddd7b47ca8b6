import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { BUILTIN_GATES, GATE_ALIASES, builtinGate } from '../../src/circuit/gates.js';
import { embed, sequenceUnitary } from '../../src/circuit/compose.js';
import {
  type CMatrix,
  adjoint,
  entry,
  fromRows,
  identity,
  kron,
  maxAbsDiff,
  mul,
  scale,
  unitarityResidual,
} from '../../src/linalg/cmatrix.js';
import { TIGHT, fromMath, mulberry32, randomAngle, toMath } from './helpers.js';

/** The matrix of a built-in gate at the given angles. */
const g = (name: string, ...angles: number[]): CMatrix => builtinGate(name)!.matrix(angles);
const I2 = identity(2);
const EXPECTED_NAMES = [
  'i', 'id', 'x', 'y', 'z', 'h', 's', 'sdg', 't', 'tdg', 'sx', 'sxdg', 'rx', 'ry', 'rz', 'p', 'u',
  'cx', 'cy', 'cz', 'ch', 'cp', 'crx', 'cry', 'crz', 'swap', 'iswap', 'rxx', 'ryy', 'rzz', 'ccx', 'cswap',
  // OpenQASM header names (test/format/qasm/standardGates.test.ts checks them against the published definitions)
  'u1', 'u2', 'u3', 'cu1', 'cu3', 'cu', 'csx', 'c3x', 'c4x',
];

describe('gate table', () => {
  it('holds exactly the listed gates, each with a matrix of its declared size', () => {
    expect([...BUILTIN_GATES.keys()].sort()).toEqual([...EXPECTED_NAMES].sort());
    for (const [name, def] of BUILTIN_GATES) {
      // An alias maps to its gate, named canonically (so one profile entry serves both names).
      expect(def.name).toBe(GATE_ALIASES.get(name) ?? name);
      const m = def.matrix(def.params.map(() => 0.3));
      expect(m.rows).toBe(1 << def.qubits);
      expect(m.cols).toBe(1 << def.qubits);
    }
    expect(builtinGate('u')!.params).toEqual(['theta', 'phi', 'lambda']);
    expect(builtinGate('CX')).toBeUndefined(); // names are case-sensitive
  });

  it('rejects a wrong number of angles', () => {
    expect(() => builtinGate('rx')!.matrix([])).toThrow(/takes 1 angle/);
    expect(() => builtinGate('h')!.matrix([1])).toThrow(/takes 0 angle/);
  });

  it('every gate is unitary for random angles (seeded)', () => {
    const rng = mulberry32(20240611);
    for (const def of BUILTIN_GATES.values()) {
      for (let trial = 0; trial < 20; trial++) {
        const m = def.matrix(def.params.map(() => randomAngle(rng)));
        expect(unitarityResidual(m), def.name).toBeLessThan(TIGHT);
      }
    }
  });

  it('returns a fresh matrix on every call', () => {
    const a = g('x');
    a.data[0] = 7;
    expect(g('x').data[0]).toBe(0);
  });
});

describe('textbook identities', () => {
  const X = g('x');
  const Y = g('y');
  const Z = g('z');
  const H = g('h');

  it('HXH = Z and HZH = X (Nielsen & Chuang §4.2, Exercise 4.13 (from memory))', () => {
    expect(maxAbsDiff(mul(H, mul(X, H)), Z)).toBeLessThan(TIGHT);
    expect(maxAbsDiff(mul(H, mul(Z, H)), X)).toBeLessThan(TIGHT);
  });

  it('S² = Z and T² = S (Nielsen & Chuang §4.2, Fig. 4.2 and the remark S = T² (from memory))', () => {
    expect(maxAbsDiff(mul(g('s'), g('s')), Z)).toBeLessThan(TIGHT);
    expect(maxAbsDiff(mul(g('t'), g('t')), g('s'))).toBeLessThan(TIGHT);
  });

  it('sdg, tdg, sxdg are the adjoints of s, t, sx (definition, common practice)', () => {
    expect(maxAbsDiff(g('sdg'), adjoint(g('s')))).toBe(0);
    expect(maxAbsDiff(g('tdg'), adjoint(g('t')))).toBe(0);
    expect(maxAbsDiff(g('sxdg'), adjoint(g('sx')))).toBe(0);
  });

  it('sx² = X (sx is the square root of X, common practice)', () => {
    expect(maxAbsDiff(mul(g('sx'), g('sx')), X)).toBeLessThan(TIGHT);
  });

  it('rx, ry, rz, rxx, ryy, rzz equal exp(−iθP/2) computed by mathjs.expm (N&C eq. 4.4–4.6 (from memory))', () => {
    const rng = mulberry32(7);
    const paulis: [string, CMatrix][] = [
      ['rx', X], ['ry', Y], ['rz', Z],
      ['rxx', kron(X, X)], ['ryy', kron(Y, Y)], ['rzz', kron(Z, Z)],
    ];
    for (const [name, P] of paulis) {
      for (let trial = 0; trial < 5; trial++) {
        const theta = randomAngle(rng);
        const reference = fromMath(math.expm(math.multiply(math.complex(0, -theta / 2), toMath(P)) as math.Matrix));
        expect(maxAbsDiff(g(name, theta), reference), name).toBeLessThan(TIGHT);
      }
    }
  });

  it('rx(π) = −iX (N&C eq. 4.4 at θ = π (from memory))', () => {
    expect(maxAbsDiff(g('rx', Math.PI), scale(X, 0, -1))).toBeLessThan(TIGHT);
  });

  it('rz(θ) = e^{−iθ/2} p(θ): equal up to a global phase (N&C eq. 4.6 (from memory); p as defined in the brief)', () => {
    const rng = mulberry32(11);
    for (let trial = 0; trial < 10; trial++) {
      const th = randomAngle(rng);
      expect(maxAbsDiff(g('rz', th), scale(g('p', th), Math.cos(-th / 2), Math.sin(-th / 2)))).toBeLessThan(TIGHT);
    }
  });

  it('u(θ, −π/2, π/2) = rx(θ) and u(θ, 0, 0) = ry(θ) (from the u definition and N&C eq. 4.4–4.5 (from memory))', () => {
    const rng = mulberry32(12);
    for (let trial = 0; trial < 10; trial++) {
      const th = randomAngle(rng);
      expect(maxAbsDiff(g('u', th, -Math.PI / 2, Math.PI / 2), g('rx', th))).toBeLessThan(TIGHT);
      expect(maxAbsDiff(g('u', th, 0, 0), g('ry', th))).toBeLessThan(TIGHT);
    }
  });

  it('u(0, 0, λ) = p(λ) and u(π/2, 0, π) = h (common practice)', () => {
    expect(maxAbsDiff(g('u', 0, 0, 0.7), g('p', 0.7))).toBeLessThan(TIGHT);
    expect(maxAbsDiff(g('u', Math.PI / 2, 0, Math.PI), H)).toBeLessThan(TIGHT);
  });

  it('controlled gates are |0⟩⟨0|⊗I + |1⟩⟨1|⊗U, built with mathjs.kron (N&C §4.3, controlled-U (from memory))', () => {
    const P0 = math.matrix([[1, 0], [0, 0]]);
    const P1 = math.matrix([[0, 0], [0, 1]]);
    const controlledRef = (u: CMatrix): CMatrix =>
      fromMath(math.add(math.kron(P0, math.identity(u.rows) as math.Matrix), math.kron(P1, toMath(u))) as math.Matrix);
    const pairs: [string, string][] = [['cx', 'x'], ['cy', 'y'], ['cz', 'z'], ['ch', 'h'], ['cp', 'p'], ['crx', 'rx'], ['cry', 'ry'], ['crz', 'rz']];
    const rng = mulberry32(13);
    for (const [c, base] of pairs) {
      const angles = builtinGate(base)!.params.map(() => randomAngle(rng));
      expect(maxAbsDiff(g(c, ...angles), controlledRef(g(base, ...angles))), c).toBeLessThan(TIGHT);
    }
    // ccx = controlled-cx and cswap = controlled-swap, same construction one level up.
    expect(maxAbsDiff(g('ccx'), controlledRef(g('cx')))).toBeLessThan(TIGHT);
    expect(maxAbsDiff(g('cswap'), controlledRef(g('swap')))).toBeLessThan(TIGHT);
  });

  it('cx = (I⊗H)·cz·(I⊗H): from HZH = X inside the controlled-U form (N&C §4.3 (from memory))', () => {
    const IH = kron(I2, H);
    expect(maxAbsDiff(mul(IH, mul(g('cz'), IH)), g('cx'))).toBeLessThan(TIGHT);
  });

  it('swap = cx₀₁·cx₁₀·cx₀₁ (N&C §1.3.4, Fig. 1.7 (from memory))', () => {
    const cx = g('cx');
    const three = sequenceUnitary(2, [
      { matrix: cx, targets: [0, 1] },
      { matrix: cx, targets: [1, 0] },
      { matrix: cx, targets: [0, 1] },
    ]);
    expect(maxAbsDiff(three, g('swap'))).toBe(0);
  });

  it('rzz(θ) = cx·(I⊗rz(θ))·cx (N&C §4.7.3, Fig. 4.19, the two-qubit case (from memory))', () => {
    const rng = mulberry32(14);
    for (let trial = 0; trial < 10; trial++) {
      const th = randomAngle(rng);
      const circuit = mul(g('cx'), mul(kron(I2, g('rz', th)), g('cx')));
      expect(maxAbsDiff(circuit, g('rzz', th))).toBeLessThan(TIGHT);
    }
  });

  it('iswap has eigenvalues 1, 1, i, −i (its |01⟩,|10⟩ block is iX, eigenvalues ±i; checked with mathjs.eigs)', () => {
    const values = (math.eigs(toMath(g('iswap'))).values as math.Matrix).toArray() as unknown as (number | math.Complex)[];
    const pairs = values.map((v) => (typeof v === 'number' ? [v, 0] : [v.re, v.im]) as [number, number]);
    pairs.sort((a, b) => a[1] - b[1] || a[0] - b[0]);
    const expected: [number, number][] = [[0, -1], [1, 0], [1, 0], [0, 1]];
    for (let k = 0; k < 4; k++) {
      expect(pairs[k]![0]).toBeCloseTo(expected[k]![0], 9);
      expect(pairs[k]![1]).toBeCloseTo(expected[k]![1], 9);
    }
  });

  it('cx maps |10⟩ to |11⟩ (index 2 → 3): the first listed qubit is the leftmost factor (N&C §1.3.2 CNOT (from memory); src/engine/layout.ts)', () => {
    const cx = g('cx');
    expect(entry(cx, 3, 2)).toEqual([1, 0]);
    expect(entry(cx, 2, 3)).toEqual([1, 0]);
    expect(entry(cx, 0, 0)).toEqual([1, 0]);
    expect(entry(cx, 1, 1)).toEqual([1, 0]);
    expect(entry(cx, 2, 2)).toEqual([0, 0]);
  });

  /** Checks that m is the permutation matrix of basis map f (column b has its 1 at row f(b)). */
  const expectPermutation = (m: CMatrix, f: (b: number) => number): void => {
    const expected = fromRows(
      Array.from({ length: m.rows }, (_, r) => Array.from({ length: m.cols }, (_, c) => (f(c) === r ? 1 : 0))),
    );
    expect(maxAbsDiff(m, expected)).toBe(0);
  };

  it('ccx flips qubit 2 exactly when qubits 0 and 1 are 1 (Toffoli truth table, N&C §1.4.1, Fig. 1.14 (from memory))', () => {
    expectPermutation(g('ccx'), (b) => ((b & 0b110) === 0b110 ? b ^ 0b001 : b));
  });

  it('cswap exchanges qubits 1 and 2 exactly when qubit 0 is 1 (Fredkin gate, N&C §3.2.5 (from memory))', () => {
    expectPermutation(g('cswap'), (b) => {
      if ((b & 0b100) === 0) return b;
      const q1 = (b >> 1) & 1;
      const q2 = b & 1;
      return 0b100 | (q2 << 1) | q1;
    });
  });

  it('embedding cx on [1, 0] equals (H⊗H)·cx·(H⊗H) (reversed CNOT, N&C §4.3, Exercise 4.20 (from memory))', () => {
    const HH = kron(H, H);
    expect(maxAbsDiff(embed(g('cx'), [1, 0], 2), mul(HH, mul(g('cx'), HH)))).toBeLessThan(TIGHT);
  });
});
