import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { frameNoise, paulisCommute, twirlProbabilities } from '../../src/noise/twirl.js';
import { isClifford } from '../../src/transforms/twirl.js';
import { amplitudeDamping, pauliLabels, pauliMatrix } from '../../src/noise/channels.js';
import { BUILTIN_GATES } from '../../src/circuit/gates.js';
import { Channel } from '../../src/channels/channel.js';
import { averageGateFidelity } from '../../src/channels/metrics.js';
import { superoperatorToPtm } from '../../src/channels/ptm.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import type { PlacedChannel } from '../../src/noise/gateNoise.js';
import type { CMatrix } from '../../src/linalg/cmatrix.js';
import { toMath, fromMath } from '../helpers/mathjs.js';

const EXACT = 1e-12;
const gate = (name: string, angles: number[] = []): CMatrix => BUILTIN_GATES.get(name)!.matrix(angles);

/** A 2-qubit noise sequence with coherent and incoherent parts: rzz(0.13), then amplitude damping 0.04 on qubit 1, then rx(0.07) on qubit 0. */
const NOISE: PlacedChannel[] = [
  { targets: [0, 1], kraus: [gate('rzz', [0.13])], source: 'coherent' },
  { targets: [1], kraus: amplitudeDamping(0.04).kraus, source: 'amplitude_damping' },
  { targets: [0], kraus: [gate('rx', [0.07])], source: 'coherent' },
];

/** The superoperator of the sequence, built densely by mathjs from its definition (S = Σ conj(K) ⊗ K, column stacking; 1-qubit Kraus embedded by ⊗ I). */
function denseSuperoperator(channels: readonly PlacedChannel[]): math.Matrix {
  const I2 = math.identity(2) as math.Matrix;
  let s = math.identity(16) as math.Matrix;
  for (const c of channels) {
    const full = c.kraus.map((k) => (c.targets.length === 2 ? toMath(k) : c.targets[0] === 0 ? math.kron(toMath(k), I2) : math.kron(I2, toMath(k))));
    const sc = full.map((k) => math.kron(math.conj(k), k)).reduce((a, b) => math.add(a, b) as math.Matrix);
    s = math.multiply(sc, s) as math.Matrix;
  }
  return s;
}

describe('Pauli twirling of a gate\'s noise', () => {
  const twirled = frameNoise(NOISE, 2, { kind: 'twirl' })[0]!;

  it('equals the definition (1/16) Σ_P P N(P ρ P) P computed densely by mathjs (Wallman & Emerson 2016)', () => {
    const sN = denseSuperoperator(NOISE);
    let avg = math.zeros(16, 16) as math.Matrix;
    for (const label of pauliLabels(2)) {
      const P = toMath(pauliMatrix(label));
      const sP = math.kron(math.conj(P), P);
      avg = math.add(avg, math.multiply(sP, math.multiply(sN, sP))) as math.Matrix;
    }
    const expected = fromMath(math.divide(avg, 16) as math.Matrix);
    const got = krausToSuperoperator(twirled.kraus);
    for (let i = 0; i < got.data.length; i++) expect(Math.abs(got.data[i]! - expected.data[i]!)).toBeLessThan(EXACT);
  });

  it("its PTM is the diagonal of the original's, and it keeps the average gate fidelity (Wallman & Emerson 2016; Nielsen, Phys. Lett. A 303, 249 (2002))", () => {
    const rN = superoperatorToPtm(fromMath(denseSuperoperator(NOISE)));
    const rT = superoperatorToPtm(krausToSuperoperator(twirled.kraus));
    for (let i = 0; i < 16; i++) {
      for (let j = 0; j < 16; j++) {
        const want = i === j ? rN.data[2 * (i * 16 + i)]! : 0;
        expect(Math.abs(rT.data[2 * (i * 16 + j)]! - want)).toBeLessThan(EXACT);
      }
    }
    // F_pro = Tr R/d² for a map against the identity (the PTM form of the entanglement fidelity), F_avg = (d·F_pro + 1)/(d + 1) (Nielsen 2002)
    let trace = 0;
    for (let i = 0; i < 16; i++) trace += rN.data[2 * (i * 16 + i)]!;
    const fOriginal = ((4 * trace) / 16 + 1) / 5;
    expect(Math.abs(averageGateFidelity(Channel.fromKraus(twirled.kraus)) - fOriginal)).toBeLessThan(EXACT);
  });

  it('a coherent over-rotation becomes a Pauli channel: rzz(θ) → cos²(θ/2)·ρ + sin²(θ/2)·ZZ ρ ZZ (derived)', () => {
    const theta = 0.3;
    const p = twirlProbabilities([{ targets: [0, 1], kraus: [gate('rzz', [theta])], source: 'coherent' }], 2);
    const labels = pauliLabels(2);
    labels.forEach((l, i) => {
      const want = l === 'II' ? Math.cos(theta / 2) ** 2 : l === 'ZZ' ? Math.sin(theta / 2) ** 2 : 0;
      expect(Math.abs(p[i]! - want)).toBeLessThan(EXACT);
    });
  });

  it('commutation of Pauli strings and the Clifford test (common practice)', () => {
    expect(paulisCommute('XX', 'ZZ')).toBe(true);
    expect(paulisCommute('XI', 'ZI')).toBe(false);
    for (const g of ['cx', 'cz', 'swap', 'iswap', 'cy']) expect(isClifford(gate(g)), g).toBe(true);
    expect(isClifford(gate('cp', [0.4]))).toBe(false);
    expect(isClifford(gate('rzz', [Math.PI / 2]))).toBe(true);
    expect(isClifford(gate('rzz', [0.2]))).toBe(false);
  });
});
