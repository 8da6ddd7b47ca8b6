import { describe, expect, it } from 'vitest';
import { twirlFrames, twirlSampler } from '../../src/transforms/twirl.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { mitigate } from '../../src/mitigation/mitigate.js';
import { pauliLabels } from '../../src/noise/channels.js';
import type { PauliFrame } from '../../src/noise/twirl.js';
import type { Operation } from '../../src/circuit/circuit.js';
import { loadText } from '../helpers/load.js';
import { maxDiff } from '../helpers/arrays.js';

const EXACT = 1e-12;

// one cx with a coherent zz error and relaxation during it, between two rotations; a cp that is not Clifford
const TEXT = `
qubits: 2
noise:
  qubits:
    all: { t1: 30us, t2: 25us }
  gates:
    cx: { duration: 300ns, coherent: { zz: 0.25, x: 0.05 } }
observe: [ZZ, XX, YZ]
steps:
  - ry: 0
    angle: 0.9
  - rx: 1
    angle: 0.4
  - cx: [0, 1]
  - cp: [0, 1]
    angle: 0.3
  - h: 0
`;


describe('Pauli twirling in a run', () => {
  const loaded = loadText(TEXT);

  it('the exact twirl equals the average of the 16 Pauli-framed runs of the single cx (derived from the twirl\'s definition)', () => {
    const exact = twirlFrames(loaded.circuit, loaded.profile, { kind: 'exact' });
    expect(exact.twirled).toBe(1);
    expect(exact.warnings).toEqual(['test.yaml:15:5: step 4 (cp on 0, 1) is not a Clifford gate; it is not twirled']);
    const rhoExact = simulateLoaded(loaded, { frames: exact.frames }).rho.data;
    const cx = loaded.circuit.operations.find((op) => op.kind === 'gate' && op.name === 'cx')!;
    const avg = new Float64Array(rhoExact.length);
    for (const label of pauliLabels(2)) {
      const frames = new Map<Operation, PauliFrame>([[cx, { kind: 'pauli', label }]]);
      const rho = simulateLoaded(loaded, { frames }).rho.data;
      for (let i = 0; i < avg.length; i++) avg[i] += rho[i]! / 16;
    }
    expect(maxDiff(avg, rhoExact)).toBeLessThan(EXACT);
    // and the twirl changed something: the coherent error is no longer coherent
    expect(maxDiff(simulateLoaded(loaded).rho.data, rhoExact)).toBeGreaterThan(1e-3);
  });

  it('sampled instances approach the exact twirl (fixed seed 5: error at 200 instances below a third of that at 4)', () => {
    const exact = mitigate(loaded, { twirl: {} }).observables;
    const err = (instances: number): number => {
      const s = mitigate(loaded, { twirl: { instances, seed: 5 } }).observables;
      return Math.max(...Object.keys(exact).map((p) => Math.abs(s[p]!.mitigated - exact[p]!.mitigated)));
    };
    const e4 = err(4);
    const e200 = err(200);
    expect(e4).toBeGreaterThan(1e-3);
    expect(e200).toBeLessThan(e4 / 3);
  });

  it('instances repeat for a seed', () => {
    const a = twirlFrames(loaded.circuit, loaded.profile, { kind: 'sample', next: twirlSampler(3) });
    const b = twirlFrames(loaded.circuit, loaded.profile, { kind: 'sample', next: twirlSampler(3) });
    expect([...a.frames.values()]).toEqual([...b.frames.values()]);
  });
});
