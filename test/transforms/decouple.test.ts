import { describe, expect, it } from 'vitest';
import { insertDecoupling } from '../../src/transforms/decouple.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { loadText } from '../helpers/load.js';
import type { LoadedCircuit } from '../../src/api/loadCircuit.js';

const EXACT = 1e-12;

function withDd(loaded: LoadedCircuit, sequence: 'xx' | 'xy4', qubits?: number[]) {
  const dd = insertDecoupling(loaded.circuit, loaded.profile, { sequence, minIdle: 100, ...(qubits ? { qubits } : {}) });
  return { dd, sim: simulateLoaded({ ...loaded, circuit: dd.circuit }) };
}

/** A Ramsey-type wait of `wait` on one qubit between two h gates, under the noise profile lines `noise`. */
const waitBetweenH = (noise: string, wait = '9us'): string => `qubits: 1\nnoise:\n${noise}steps:\n  - h: 0\n  - idle: 0\n    for: ${wait}\n  - h: 0\n`;

describe('dynamical decoupling', () => {
  // a static detuning only; pulses ideal (no duration, no noise)
  const ramsey = loadText(waitBetweenH('  qubits:\n    all: { detuning: 37kHz }\n'));

  it('xx restores a detuned idle qubit exactly (Hahn 1950: rz(a/4)·X·rz(a/2)·X·rz(a/4) = I)', () => {
    expect(simulateLoaded(ramsey).result.fidelity.state).toBeLessThan(0.9);
    const { dd, sim } = withDd(ramsey, 'xx');
    expect(dd.inserted).toEqual([{ qubit: 0, start: 0, end: 9000, pulses: ['x', 'x'] }]);
    expect(Math.abs(sim.result.fidelity.state - 1)).toBeLessThan(EXACT);
    expect(sim.schedule.duration).toBe(9000);
    // the user's idle step was replaced by the sequence's waits: 2250, 4500, 2250 ns
    expect(dd.circuit.operations.filter((o) => o.kind === 'idle').map((o) => (o.kind === 'idle' ? o.duration : 0))).toEqual([2250, 4500, 2250]);
  });

  it('xy4 pulses take their profile durations (the waits shrink by them) and still improve the run', () => {
    const timed = loadText(waitBetweenH('  qubits:\n    all: { detuning: 37kHz }\n  gates:\n    x: { duration: 40ns }\n    y: { duration: 40ns }\n'));
    const { dd, sim } = withDd(timed, 'xy4');
    expect(dd.inserted[0]!.pulses).toEqual(['x', 'y', 'x', 'y']);
    expect(sim.schedule.duration).toBe(9000);
    expect(dd.circuit.operations.filter((o) => o.kind === 'idle').map((o) => (o.kind === 'idle' ? o.duration : 0))).toEqual([(9000 - 160) / 8, (9000 - 160) / 4, (9000 - 160) / 4, (9000 - 160) / 4, (9000 - 160) / 8]);
    // each pulse applied at its start lets the drift of its 40 ns act after it (docs/format.md, timing model);
    // the symmetric spacing then leaves a residual rotation, not the full free precession
    expect(sim.result.fidelity.state).toBeGreaterThan(simulateLoaded(timed).result.fidelity.state);
  });

  it('xy4 on one qubit of an idle pair cancels their zz phase (derived: X and Y on a anticommute with Z_a Z_b, four flips leave exp(−iθZZ/2) refocused)', () => {
    const pair = loadText(`
qubits: 2
noise:
  couplings:
    "0 1": { zz: 150kHz }
steps:
  - h: [0, 1]
  - idle: [0, 1]
    for: 4us
  - h: [0, 1]
`);
    expect(simulateLoaded(pair).result.fidelity.state).toBeLessThan(0.8);
    const { dd, sim } = withDd(pair, 'xy4', [0]);
    expect(dd.inserted.map((i) => i.qubit)).toEqual([0]);
    expect(Math.abs(sim.result.fidelity.state - 1)).toBeLessThan(EXACT);
  });

  it('with T1 only, decoupling cannot help: the fidelity is no better (derived: amplitude damping is no unitary error to refocus)', () => {
    const t1 = loadText(waitBetweenH('  qubits:\n    all: { t1: 20us }\n', '8us'));
    const plain = simulateLoaded(t1).result.fidelity.state;
    for (const seq of ['xx', 'xy4'] as const) expect(withDd(t1, seq).sim.result.fidelity.state).toBeLessThanOrEqual(plain + EXACT);
  });

  it('leaves windows shorter than min-idle or too short for the pulses, and windows behind a barrier, and says so', () => {
    const mixed = loadText(`
qubits: 2
noise:
  gates:
    all: { duration: 50ns }
    cx: { duration: 400ns }
steps:
  - x: 0
  - cx: [0, 1]
  - idle: 1
    for: 150ns
  - x: 1
  - barrier: all
  - idle: 0
    for: 1us
  - x: 0
`);
    const dd = insertDecoupling(mixed.circuit, mixed.profile, { sequence: 'xy4', minIdle: 100 });
    // qubit 1 waits 50 ns at the start (below min-idle: not listed), 150 ns after the cx (too short for
    // 4 × 50 ns), and from its x (650 ns) to the end (1700 ns): filling that would push the barrier and
    // the last x on qubit 0. Qubit 0 waits from the cx's end (450 ns) through the barrier to its x (1650 ns).
    expect(dd.skipped).toEqual([
      { qubit: 1, start: 450, end: 600, reason: 'the 4 pulses take 200 ns, more than the window' },
      { qubit: 1, start: 650, end: 1700, reason: 'filling it would move other operations (a barrier or an aligned measurement inside the window)' },
    ]);
    expect(dd.inserted).toEqual([{ qubit: 0, start: 450, end: 1650, pulses: ['x', 'y', 'x', 'y'] }]);
    const before = simulateLoaded(mixed).schedule.duration;
    expect(simulateLoaded({ ...mixed, circuit: dd.circuit }).schedule.duration).toBe(before);
  });
});
