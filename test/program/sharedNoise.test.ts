import { describe, expect, it } from 'vitest';
import { loadCircuit } from '../../src/api/loadCircuit.js';
import { scheduleCircuit } from '../../src/api/simulate.js';
import { ProblemList } from '../../src/format/problem.js';
import { BUILTIN_GATES } from '../../src/circuit/gates.js';
import { gateNoise } from '../../src/noise/gateNoise.js';
import { buildProgram } from '../../src/program/program.js';

describe('matrices and channels built once per distinct gate or noise', () => {
  it('every application of one built-in gate with the same angles shares one unitary (src/format/gateLibrary.ts), equal entry for entry to a fresh one', () => {
    // circuits/bench/layers10x20.yaml: 100 cx applications, and ry on all ten qubits in ten layers, each layer its own angle
    const { circuit } = loadCircuit('circuits/bench/layers10x20.yaml');
    const gates = circuit.operations.flatMap((op) => (op.kind === 'gate' ? [op] : []));
    const cx = gates.filter((op) => op.name === 'cx');
    expect(cx).toHaveLength(100);
    expect(new Set(cx.map((op) => op.unitary)).size).toBe(1);
    expect(Array.from(cx[0]!.unitary.data)).toEqual(Array.from(BUILTIN_GATES.get('cx')!.matrix([]).data));
    const ry = gates.filter((op) => op.name === 'ry');
    // ten angles, ten qubits each: one matrix per angle
    expect(ry).toHaveLength(100);
    expect(new Set(ry.map((op) => op.angles![0])).size).toBe(10);
    expect(new Set(ry.map((op) => op.unitary)).size).toBe(10);
    expect(Array.from(ry[0]!.unitary.data)).toEqual(Array.from(BUILTIN_GATES.get('ry')!.matrix(ry[0]!.angles!).data));
  });


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
