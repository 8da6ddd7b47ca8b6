import { describe, expect, it } from 'vitest';
import { diag } from '../../src/linalg/cmatrix.js';
import { builtinGate } from '../../src/circuit/gates.js';
import { Channel } from '../../src/channels/channel.js';
import { amplitudeDampingChannel, depolarizingChannel, pauliChannel, unitaryChannel } from '../../src/channels/builtins.js';
import { diamondDistance, unitaryDiamondDistance } from '../../src/channels/diamond.js';
import { pauliErrorProbabilities } from '../../src/channels/metrics.js';
import { traceNorm } from '../../src/channels/norms.js';
import { sub } from '../../src/linalg/cmatrix.js';
import { mulberry32, randomKraus, randomUnitary } from './helpers.js';

const rz = (t: number) => builtinGate('rz')!.matrix([t]);
const id1 = Channel.identity(1);

describe('diamond distance of unitaries (Aharonov–Kitaev–Nisan 1998; J. Watrous, The Theory of Quantum Information (2018), §3.3; from memory)', () => {
  it('rz(θ) from the identity is 2|sin(θ/2)|, exactly', () => {
    for (const theta of [0.01, 0.3, 1, Math.PI / 2, 2.5, Math.PI, 4, 5.9]) {
      const r = diamondDistance(unitaryChannel(rz(theta)), id1);
      expect(r.exact).toBe(true);
      expect(r.method).toBe('unitaries');
      expect(r.value!).toBeCloseTo(2 * Math.abs(Math.sin(theta / 2)), 12);
    }
  });

  it('eigenvalues spread over more than a half circle give 2 (0 lies in their convex hull)', () => {
    const u = diag([1, [Math.cos(2.2), Math.sin(2.2)], [Math.cos(-2.2), Math.sin(-2.2)], 1]);
    expect(unitaryDiamondDistance(u, diag([1, 1, 1, 1]))).toBe(2);
  });

  it('does not depend on a global phase (e^{iφ}U is the same channel as U)', () => {
    const u = rz(0.7);
    const phased = diag([
      [Math.cos(1.1 - 0.35), Math.sin(1.1 - 0.35)],
      [Math.cos(1.1 + 0.35), Math.sin(1.1 + 0.35)],
    ]); // e^{1.1i}·rz(0.7)
    expect(unitaryDiamondDistance(u, phased)).toBeCloseTo(0, 12);
    const phasedId = diag([
      [Math.cos(1.1), Math.sin(1.1)],
      [Math.cos(1.1), Math.sin(1.1)],
    ]);
    expect(unitaryDiamondDistance(u, phasedId)).toBeCloseTo(2 * Math.sin(0.35), 12);
  });
});

describe('diamond distance of Pauli channels (Pauli-diagonal difference: Σ|p_i − q_i|, derived in src/channels/diamond.ts)', () => {
  it('a Pauli channel from the identity is 2(1 − p_I)', () => {
    for (const [x, y, z] of [
      [0.01, 0.02, 0.03],
      [0.2, 0, 0.1],
    ] as const) {
      const r = diamondDistance(pauliChannel(x, y, z), id1);
      expect(r.exact).toBe(true);
      expect(r.method).toBe('pauli');
      expect(r.value!).toBeCloseTo(2 * (x + y + z), 12);
    }
    const dep = diamondDistance(depolarizingChannel(2, 0.1), Channel.identity(2));
    expect(dep.value!).toBeCloseTo(2 * (0.1 - 0.1 / 16), 12);
  });

  it('two Pauli channels: Σ|p_i − q_i|', () => {
    const e = pauliChannel(0.05, 0.01, 0.02);
    const f = pauliChannel(0.01, 0.03, 0.02);
    const p = pauliErrorProbabilities(e).map((x) => x.probability);
    const q = pauliErrorProbabilities(f).map((x) => x.probability);
    const want = p.reduce((s, x, i) => s + Math.abs(x - q[i]!), 0);
    expect(diamondDistance(e, f).value!).toBeCloseTo(want, 12);
  });
});

describe('certified interval (lower: optimised entangled input; upper: ‖Tr_out|J_Δ|‖ ≤ ‖J_Δ‖₁, Watrous 2018)', () => {
  const cases: Array<[string, Channel, Channel, number]> = [
    ['rz(0.8) vs identity', unitaryChannel(rz(0.8)), id1, 2 * Math.sin(0.4)],
    ['rz(2.9) vs identity', unitaryChannel(rz(2.9)), id1, 2 * Math.sin(1.45)],
    ['Pauli channel vs identity', pauliChannel(0.03, 0.01, 0.05), id1, 2 * 0.09],
    ['2-qubit depolarizing vs identity', depolarizingChannel(2, 0.2), Channel.identity(2), 2 * (0.2 - 0.2 / 16)],
  ];
  for (const [name, e, f, exact] of cases) {
    it(`${name}: the interval contains the exact value`, () => {
      const r = diamondDistance(e, f, { boundsOnly: true });
      expect(r.lower).toBeLessThanOrEqual(exact + 1e-12);
      expect(r.upper).toBeGreaterThanOrEqual(exact - 1e-12);
    });
  }

  it('random pairs of 2-qubit unitaries: the interval contains the exact value (the search beats the maximally entangled input)', () => {
    const rng = mulberry32(41);
    for (let t = 0; t < 3; t++) {
      const u = unitaryChannel(randomUnitary(rng, 4));
      const v = unitaryChannel(randomUnitary(rng, 4));
      const exact = diamondDistance(u, v).value!;
      const r = diamondDistance(u, v, { boundsOnly: true });
      expect(r.lower).toBeLessThanOrEqual(exact + 1e-12);
      expect(r.upper).toBeGreaterThanOrEqual(exact - 1e-12);
      // the search reaches the optimum for unitaries (a pure-state problem)
      expect(r.lower).toBeCloseTo(exact, 8);
    }
  });

  it('random channels: maximally entangled bound ≤ lower ≤ upper ≤ min(2, ‖J_Δ‖₁)', () => {
    const rng = mulberry32(42);
    for (const d of [2, 4]) {
      const e = Channel.fromKraus(randomKraus(rng, d, 2));
      const f = Channel.fromKraus(randomKraus(rng, d, 3));
      const jn = traceNorm(sub(e.choi(), f.choi()));
      const r = diamondDistance(e, f);
      expect(r.method).toBe('bounds');
      expect(r.lower).toBeGreaterThanOrEqual(jn / d - 1e-12);
      expect(r.lower).toBeLessThanOrEqual(r.upper);
      expect(r.upper).toBeLessThanOrEqual(Math.min(2, jn) + 1e-12);
    }
  });

  it('amplitude damping vs identity: a non-Pauli case reported as an interval or exact when the bounds meet', () => {
    const r = diamondDistance(amplitudeDampingChannel(0.1), id1);
    expect(r.method).toBe('bounds');
    expect(r.lower).toBeGreaterThan(0);
    expect(r.upper - r.lower).toBeGreaterThanOrEqual(0);
    if (r.exact) expect(r.value!).toBeCloseTo(r.lower, 9);
  });
});
