import * as math from 'mathjs';
import { describe, it, expect } from 'vitest';
import { fromMath } from '../helpers/mathjs.js';
import { type CMatrix, identity, krausResidual, maxAbsDiff } from '../../src/linalg/cmatrix.js';
import { type KrausChannel, amplitudeDamping, depolarizing, thermalRelaxation } from '../../src/noise/channels.js';
import { composeKraus, entanglementFidelity, averageGateFidelity, tensorKraus } from '../../src/noise/fidelity.js';
import {
  type GateNoiseInput,
  type PlacedChannel,
  type QubitDecay,
  CustomChannelError,
  ErrorSolveError,
  coherenceLimitedInfidelity,
  gateNoise,
  idleChannel,
} from '../../src/noise/gateNoise.js';
import {
  CX,
  HADAMARD,
  PHYS_TOL,
  applyKraus,
  choi,
  designAverageFidelity,
  embedLocal,
  framePotential,
  stabilizerStates,
} from './helpers.js';

const NONE: ReadonlyMap<string, KrausChannel> = new Map();
const IDEAL: QubitDecay = { t1: Infinity, t2: Infinity, excited: 0 };

function input(partial: Partial<GateNoiseInput> & { k: number }): GateNoiseInput {
  return { duration: 0, thermal: false, decay: [], kinds: {}, channels: NONE, ...partial };
}

/** Applies the placed channels in order to a k-qubit density matrix (test-side embedding with kron). */
function applyPlaced(placed: readonly PlacedChannel[], k: number, rho: CMatrix): CMatrix {
  let out = rho;
  for (const ch of placed) out = applyKraus(ch.kraus.map((op) => embedLocal(op, ch.targets, k)), out);
  return out;
}

/** The whole noise sequence as one Kraus set on k qubits, via tensorKraus/composeKraus (independent of the solver's superoperator route). */
function sequenceKraus(placed: readonly PlacedChannel[], k: number): CMatrix[] {
  let total: CMatrix[] = [identity(1 << k)];
  for (const ch of placed) {
    let ops: CMatrix[];
    if (ch.targets.length === k) ops = [...ch.kraus];
    else {
      const q = ch.targets[0]!;
      ops = tensorKraus(tensorKraus([identity(1 << q)], ch.kraus), [identity(1 << (k - q - 1))]);
    }
    total = composeKraus(ops, total);
  }
  return total;
}

describe('gateNoise: order and placement (the contract order)', () => {
  it('thermal → amplitude_damping … pauli on each qubit → channel → depolarizing on all', () => {
    const leak: KrausChannel = amplitudeDamping(0.2);
    const res = gateNoise(
      input({
        k: 2,
        duration: 100,
        thermal: true,
        decay: [
          { t1: 40_000, t2: 30_000, excited: 0 },
          { t1: 60_000, t2: 50_000, excited: 0.01 },
        ],
        kinds: {
          depolarizing: 0.01,
          pauli: { x: 0.001, y: 0.002, z: 0.003 },
          channel: 'leak',
          bit_phase_flip: 0.01,
          phase_flip: 0.01,
          bit_flip: 0.01,
          phase_damping: 0.01,
          amplitude_damping: 0.01,
        },
        channels: new Map([['leak', leak]]),
      }),
    );
    expect(res.channels.map((c) => c.source)).toEqual([
      'thermal',
      'thermal',
      'amplitude_damping',
      'amplitude_damping',
      'phase_damping',
      'phase_damping',
      'bit_flip',
      'bit_flip',
      'phase_flip',
      'phase_flip',
      'bit_phase_flip',
      'bit_phase_flip',
      'pauli',
      'pauli',
      'channel:leak',
      'channel:leak',
      'depolarizing',
    ]);
    const targets = res.channels.map((c) => c.targets.join(','));
    expect(targets.slice(0, 16)).toEqual(Array.from({ length: 16 }, (_, i) => String(i % 2)));
    expect(targets[16]).toBe('0,1');
    expect(res.solvedDepolarizing).toBeUndefined();
    expect(res.warning).toBeUndefined();
    for (const c of res.channels) expect(krausResidual(c.kraus)).toBeLessThan(1e-12);
    // the thermal channel of qubit 1 is the relaxation with qubit 1's constants
    expect(maxAbsDiff(choi(res.channels[1]!.kraus), choi(thermalRelaxation({ t1: 60_000, t2: 50_000, excited: 0.01, time: 100 }).kraus))).toBeLessThan(PHYS_TOL);
  });

  it('skips thermal when off, for ideal qubits, and kinds whose parameter is 0', () => {
    const decay = [{ t1: 40_000, t2: 30_000, excited: 0 }, IDEAL];
    expect(gateNoise(input({ k: 2, duration: 50, thermal: false, decay })).channels).toHaveLength(0);
    const res = gateNoise(input({ k: 2, duration: 50, thermal: true, decay, kinds: { bit_flip: 0, depolarizing: 0 } }));
    expect(res.channels.map((c) => [c.source, c.targets])).toEqual([['thermal', [0]]]);
  });

  it('places a k-qubit custom channel on all qubits and a 1-qubit one on each', () => {
    const two: KrausChannel = depolarizing(2, 0.1);
    const one: KrausChannel = amplitudeDamping(0.1);
    const channels = new Map([
      ['two', two],
      ['one', one],
      ['three', depolarizing(3, 0.1)],
    ]);
    expect(gateNoise(input({ k: 2, kinds: { channel: 'two' }, channels })).channels.map((c) => c.targets)).toEqual([[0, 1]]);
    expect(gateNoise(input({ k: 2, kinds: { channel: 'one' }, channels })).channels.map((c) => c.targets)).toEqual([[0], [1]]);
    expect(gateNoise(input({ k: 1, kinds: { channel: 'one' }, channels })).channels.map((c) => c.targets)).toEqual([[0]]);
    expect(() => gateNoise(input({ k: 2, kinds: { channel: 'three' }, channels }))).toThrow(CustomChannelError);
    expect(() => gateNoise(input({ k: 1, kinds: { channel: 'two' }, channels }))).toThrow(CustomChannelError);
    expect(() => gateNoise(input({ k: 1, kinds: { channel: 'missing' }, channels }))).toThrow(CustomChannelError);
  });
});

describe('gateNoise: the error solve', () => {
  it('k = 1 with relaxation and amplitude damping reaches F_avg = 1 − r (six-state 2-design average, Gross–Audenaert–Eisert 2007; Nielsen 2002)', () => {
    const design = stabilizerStates(1);
    expect(design).toHaveLength(6);
    for (const r of [1e-3, 5e-3, 0.2]) {
      const res = gateNoise(
        input({ k: 1, duration: 35, thermal: true, decay: [{ t1: 50_000, t2: 30_000, excited: 0.02 }], kinds: { error: r, amplitude_damping: 1e-4 } }),
      );
      expect(res.warning).toBeUndefined();
      expect(res.solvedDepolarizing).toBeGreaterThan(0);
      expect(res.channels.at(-1)!.source).toBe('error');
      const fAvg = designAverageFidelity(design, HADAMARD, (rho) => applyPlaced(res.channels, 1, rho));
      expect(Math.abs(1 - fAvg - r)).toBeLessThan(PHYS_TOL);
    }
  });

  it('k = 2 (CX) with relaxation reaches F_avg = 1 − r over the 60 two-qubit stabilizer states (exact 2-design, Gross–Audenaert–Eisert 2007)', () => {
    const design = stabilizerStates(2);
    // 2^n ∏_{j=1..n}(2^j + 1) = 60 stabilizer states for n = 2 (Aaronson & Gottesman, PRA 70, 052328 (2004) (from memory)).
    expect(design).toHaveLength(60);
    expect(Math.abs(framePotential(design) - 2 / (4 * 5))).toBeLessThan(PHYS_TOL); // Welch bound for d = 4
    const decay = [
      { t1: 40_000, t2: 25_000, excited: 0.01 },
      { t1: 80_000, t2: 90_000, excited: 0 },
    ];
    for (const r of [0.02, 0.05]) {
      const res = gateNoise(input({ k: 2, duration: 300, thermal: true, decay, kinds: { error: r, phase_flip: 2e-4 } }));
      expect(res.warning).toBeUndefined();
      expect(res.channels.map((c) => c.source)).toEqual(['thermal', 'thermal', 'phase_flip', 'phase_flip', 'error']);
      const fAvg = designAverageFidelity(design, CX, (rho) => applyPlaced(res.channels, 2, rho));
      expect(Math.abs(1 - fAvg - r)).toBeLessThan(PHYS_TOL);
    }
  });

  it('k = 3 reaches F_avg = 1 − r (Kraus composition via tensorKraus/composeKraus, Nielsen 2002)', () => {
    const decay = [
      { t1: 30_000, t2: 20_000, excited: 0.01 },
      { t1: 50_000, t2: 60_000, excited: 0 },
      { t1: 70_000, t2: 10_000, excited: 0.02 },
    ];
    const r = 0.08;
    const res = gateNoise(input({ k: 3, duration: 500, thermal: true, decay, kinds: { error: r, bit_flip: 1e-4 } }));
    expect(res.warning).toBeUndefined();
    expect(res.solvedDepolarizing).toBeGreaterThan(0);
    const kraus = sequenceKraus(res.channels, 3);
    expect(krausResidual(kraus)).toBeLessThan(1e-12);
    expect(Math.abs(1 - averageGateFidelity(entanglementFidelity(kraus), 8) - r)).toBeLessThan(PHYS_TOL);
  });

  it('without other noise, p = r·d/(d − 1) (inverse of F_avg = 1 − p(d − 1)/d for depolarizing)', () => {
    for (const k of [1, 2]) {
      const d = 1 << k;
      const res = gateNoise(input({ k, kinds: { error: 0.01 } }));
      expect(Math.abs(res.solvedDepolarizing! - (0.01 * d) / (d - 1))).toBeLessThan(PHYS_TOL);
      expect(res.channels).toHaveLength(1);
      expect(res.channels[0]!.targets).toEqual(Array.from({ length: k }, (_, i) => i));
    }
    const zero = gateNoise(input({ k: 2, kinds: { error: 0 } }));
    expect(zero.solvedDepolarizing).toBe(0);
    expect(zero.channels).toHaveLength(0);
    expect(zero.warning).toBeUndefined();
  });

  it('warns and adds nothing when relaxation alone already exceeds r (below the coherence limit)', () => {
    const decay = [{ t1: 20_000, t2: 15_000, excited: 0 }];
    const limit = coherenceLimitedInfidelity(1, 100, decay);
    const res = gateNoise(input({ k: 1, duration: 100, thermal: true, decay, kinds: { error: 1e-5 } }));
    expect(res.solvedDepolarizing).toBe(0);
    expect(res.channels.map((c) => c.source)).toEqual(['thermal']);
    expect(limit).toBeGreaterThan(1e-3);
    expect(res.warning).toBe(
      `calibrated error 0.00001 is below what relaxation during the gate already causes (the coherence limit) (${String(Number(limit.toPrecision(3)))}); no depolarizing added`,
    );
  });

  it('warns with the listed-noise cause: bit flip p alone has infidelity 2p/3 (F_e = 1 − p, Nielsen 2002)', () => {
    const res = gateNoise(input({ k: 1, kinds: { bit_flip: 0.01, error: 0.001 } }));
    expect(res.solvedDepolarizing).toBe(0);
    expect(res.warning).toBe('calibrated error 0.001 is below what the listed noise already causes (0.00667); no depolarizing added');
    const both = gateNoise(input({ k: 1, duration: 100, thermal: true, decay: [{ t1: 2e4, t2: 1e4, excited: 0 }], kinds: { bit_flip: 0.01, error: 0.001 } }));
    expect(both.warning).toMatch(/^calibrated error 0\.001 is below what relaxation and the listed noise already cause \(/);
  });

  it('throws ErrorSolveError when r needs p > 1 (k = 2, r = 0.9 ⇒ F_target = −1/8, p = 1.2; max reachable (d − 1)/d = 0.75)', () => {
    const run = () => gateNoise(input({ k: 2, kinds: { error: 0.9 } }));
    expect(run).toThrow(ErrorSolveError);
    expect(run).toThrow('error 0.9 needs a depolarizing probability 1.2 > 1; the largest reachable average gate infidelity for a 2-qubit gate here is 0.75');
    // r = (d − 1)/d is exactly reachable with p = 1 (complete depolarization, F_avg = 1/d)
    const edge = gateNoise(input({ k: 2, kinds: { error: 0.75 } }));
    expect(Math.abs(edge.solvedDepolarizing! - 1)).toBeLessThan(PHYS_TOL);
  });
});

describe('idle relaxation and the coherence limit', () => {
  it('idle F_avg = (3 + e^{−t/T1} + 2e^{−t/T2})/6 (Nielsen 2002 with PTM trace 1 + 2e^{−t/T2} + e^{−t/T1}), also as a six-state design average', () => {
    const design = stabilizerStates(1);
    for (const excited of [0, 0.1]) {
      for (const [t1, t2, t] of [
        [50_000, 30_000, 1_000],
        [10_000, 20_000, 25_000],
        [Infinity, 8_000, 3_000],
      ] as const) {
        const decay = { t1, t2, excited };
        const expected = (3 + Math.exp(-t / t1) + 2 * Math.exp(-t / t2)) / 6;
        expect(Math.abs(1 - coherenceLimitedInfidelity(1, t, [decay]) - expected)).toBeLessThan(PHYS_TOL);
        const ch = idleChannel(decay, t)!;
        const viaDesign = designAverageFidelity(design, identity(2), (rho) => applyKraus(ch.kraus, rho));
        expect(Math.abs(viaDesign - expected)).toBeLessThan(PHYS_TOL);
      }
    }
  });

  it('two qubits: the coherence limit matches the 60-state design average of the thermal part', () => {
    const design = stabilizerStates(2);
    const decay = [
      { t1: 40_000, t2: 25_000, excited: 0.01 },
      { t1: 80_000, t2: 90_000, excited: 0 },
    ];
    const res = gateNoise(input({ k: 2, duration: 400, thermal: true, decay }));
    const fAvg = designAverageFidelity(design, CX, (rho) => applyPlaced(res.channels, 2, rho));
    expect(Math.abs(1 - fAvg - coherenceLimitedInfidelity(2, 400, decay))).toBeLessThan(PHYS_TOL);
  });

  it('idleChannel is undefined when nothing happens, else the thermal relaxation', () => {
    expect(idleChannel(IDEAL, 1_000)).toBeUndefined();
    expect(idleChannel({ t1: 1e4, t2: 1e4, excited: 0 }, 0)).toBeUndefined();
    const ch = idleChannel({ t1: 1e4, t2: 1e4, excited: 0.05 }, 700)!;
    expect(maxAbsDiff(choi(ch.kraus), choi(thermalRelaxation({ t1: 1e4, t2: 1e4, excited: 0.05, time: 700 }).kraus))).toBeLessThan(PHYS_TOL);
    expect(coherenceLimitedInfidelity(2, 100, [IDEAL, IDEAL])).toBe(0);
  });

  it('rejects a decay list of the wrong length', () => {
    expect(() => coherenceLimitedInfidelity(2, 100, [IDEAL])).toThrow(RangeError);
    expect(() => gateNoise(input({ k: 2, thermal: true, duration: 10, decay: [IDEAL] }))).toThrow(RangeError);
  });
});

describe('gateNoise: coherent errors', () => {
  it('the coherent rotation comes first, right after U, as one unitary per qubit, then rzz on a pair', () => {
    const res = gateNoise(input({ k: 2, duration: 100, thermal: true, decay: [{ t1: 3e4, t2: 2e4, excited: 0 }, { t1: 3e4, t2: 2e4, excited: 0 }], kinds: { coherent: { x: 0.1, y: 0, z: 0.02, zz: 0.05 }, bit_flip: 0.01 } }));
    expect(res.channels.map((c) => c.source)).toEqual(['coherent', 'coherent', 'coherent', 'thermal', 'thermal', 'bit_flip', 'bit_flip']);
    expect(res.channels.map((c) => c.targets)).toEqual([[0], [1], [0, 1], [0], [1], [0], [1]]);
    // exp(−i(x·X + z·Z)/2) (Nielsen & Chuang Exercise 4.6) equals the dense mathjs matrix exponential
    const u = res.channels[0]!.kraus[0]!;
    const gen = math.multiply(math.complex(0, -0.5), math.add(math.multiply(0.1, math.matrix([[0, 1], [1, 0]])), math.multiply(0.02, math.matrix([[1, 0], [0, -1]])))) as math.Matrix;
    expect(maxAbsDiff(u, fromMath(math.expm(gen)))).toBeLessThan(PHYS_TOL);
  });

  it('error: r with a coherent part reaches F_avg = 1 − r over an exact 2-design (k = 1: six states; k = 2: 60 stabilizer states; Nielsen 2002)', () => {
    const decay = { t1: 40_000, t2: 30_000, excited: 0.01 };
    for (const [k, u, design] of [
      [1, HADAMARD, stabilizerStates(1)],
      [2, CX, stabilizerStates(2)],
    ] as const) {
      for (const r of [0.01, 0.04]) {
        const coherent = { x: 0.05, y: -0.03, z: 0.02, zz: k === 2 ? 0.08 : 0 };
        const res = gateNoise(input({ k, duration: 60, thermal: true, decay: Array.from({ length: k }, () => decay), kinds: { error: r, coherent } }));
        expect(res.warning).toBeUndefined();
        expect(res.channels[0]!.source).toBe('coherent');
        expect(res.channels.at(-1)!.source).toBe('error');
        const fAvg = designAverageFidelity(design, u, (rho) => applyPlaced(res.channels, k, rho));
        expect(Math.abs(1 - fAvg - r)).toBeLessThan(PHYS_TOL);
      }
    }
  });

  it('a coherent error alone above r gives the warning and no depolarizing', () => {
    const res = gateNoise(input({ k: 1, kinds: { error: 1e-4, coherent: { x: 0.2, y: 0, z: 0, zz: 0 } } }));
    expect(res.solvedDepolarizing).toBe(0);
    // r of rx(ε): 2·sin²(ε/2)/3 (F_e = cos²(ε/2), F_avg = (2F_e + 1)/3), derived
    expect(res.warning).toBe(`calibrated error 0.0001 is below what the listed noise already causes (${String(Number(((2 * Math.sin(0.1) ** 2) / 3).toPrecision(3)))}); no depolarizing added`);
  });
});
