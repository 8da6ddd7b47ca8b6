import { describe, expect, it } from 'vitest';
import { loadCircuit } from '../../src/api/loadCircuit.js';
import { scheduleCircuit } from '../../src/api/simulate.js';
import { ProblemList } from '../../src/format/problem.js';
import { gateNoise } from '../../src/noise/gateNoise.js';
import { buildProgram } from '../../src/program/program.js';

describe('noise channels built once per distinct noise (src/program/program.ts)', () => {
  it('every application of the same noise shares one Kraus list, equal entry for entry to a fresh gateNoise of that application', () => {
    // circuits/bench/layers10x20.yaml: each of its 100 cx applications is followed by depolarizing 0.01 on its pair
    const loaded = loadCircuit('circuits/bench/layers10x20.yaml');
    const program = buildProgram(loaded.circuit, loaded.profile, scheduleCircuit(loaded.circuit, loaded.profile), new ProblemList());
    const depolarizing = program.noisy.flatMap((ins, i) => (ins.op === 'channel' && program.origins[i]!.what === 'depolarizing' ? [ins.kraus] : []));
    expect(depolarizing).toHaveLength(100);
    expect(new Set(depolarizing).size).toBe(1);
    const fresh = gateNoise({ k: 2, duration: 20, thermal: false, decay: [], kinds: { depolarizing: 0.01 }, channels: new Map() }).channels[0]!.kraus;
    expect(depolarizing[0]!.map((m) => Array.from(m.data))).toEqual(fresh.map((m) => Array.from(m.data)));
  });
});
