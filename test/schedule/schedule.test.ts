import { describe, expect, it } from 'vitest';
import { scheduleCircuit } from '../../src/api/simulate.js';
import { loadText } from '../helpers/load.js';

// Scheduling rules are the contract's own (ASAP/ALAP as defined there; common practice in
// circuit scheduling). Expected times are worked out by hand from the durations in each case.

const profile = (schedule: 'asap' | 'alap') => `
noise:
  schedule: ${schedule}
  gates:
    all: { duration: 10ns }
    cx: { duration: 100ns }
    measure: { duration: 500ns }
    reset: { duration: 50ns }
`;

describe('ASAP', () => {
  it('starts each application when its qubits are free and sums the critical path', () => {
    const { circuit, profile: p } = loadText(`qubits: 3\n${profile('asap')}\nsteps:\n  - h: 0\n  - cx: [0, 1]\n  - x: 2\n  - cx: [1, 2]\n  - measure: all\n`);
    const s = scheduleCircuit(circuit, p);
    const t = s.items.map((i) => [i.op.kind === 'gate' ? i.op.name : i.op.kind, i.start, i.end]);
    expect(t).toEqual([
      ['h', 0, 10],
      ['cx', 10, 110],
      ['x', 0, 10],
      ['cx', 110, 210],
      ['measure', 110, 610],
      ['measure', 210, 710],
      ['measure', 210, 710],
    ]);
    expect(s.duration).toBe(710);
    expect(s.measureStart).toEqual([110, 210, 210]);
  });

  it('barrier aligns its qubits; idle occupies its qubit and counts as idle time', () => {
    const { circuit, profile: p } = loadText(`qubits: 2\n${profile('asap')}\nsteps:\n  - h: 0\n  - idle: 1\n    for: 40ns\n  - barrier: all\n  - x: [0, 1]\n`);
    const s = scheduleCircuit(circuit, p);
    const xs = s.items.filter((i) => i.op.kind === 'gate' && i.op.name === 'x');
    expect(xs.map((i) => i.start)).toEqual([40, 40]);
    expect(s.duration).toBe(50);
    // qubit 1 idles from 0 to 40 (the idle step is idle time); qubit 0 from 10 to 40.
    expect(s.idleWindows).toEqual([
      { qubit: 0, start: 10, end: 40 },
      { qubit: 1, start: 0, end: 40 },
    ]);
  });

  it('two applications in one step that share a qubit run one after the other', () => {
    const { circuit, profile: p } = loadText(`qubits: 3\n${profile('asap')}\nsteps:\n  - cx: [[0, 1], [1, 2]]\n`);
    const s = scheduleCircuit(circuit, p);
    expect(s.items.map((i) => [i.start, i.end])).toEqual([
      [0, 100],
      [100, 200],
    ]);
  });

  it('a standalone noise step takes no time at its qubits\u2019 free time', () => {
    const { circuit, profile: p } = loadText(`qubits: 1\n${profile('asap')}\nsteps:\n  - h: 0\n  - noise: { bit_flip: 0.1 }\n    on: 0\n  - x: 0\n`);
    const s = scheduleCircuit(circuit, p);
    expect(s.items.map((i) => [i.op.kind, i.start, i.end])).toEqual([
      ['gate', 0, 10],
      ['channel', 10, 10],
      ['gate', 10, 20],
    ]);
  });
});

describe('ALAP', () => {
  it('is the mirror image with the same total duration, and measurements end together', () => {
    const text = (pol: 'asap' | 'alap') => `qubits: 3\n${profile(pol)}\nsteps:\n  - h: [0, 1, 2]\n  - cx: [0, 1]\n  - cx: [1, 2]\n  - measure: all\n`;
    const a = loadText(text('asap'));
    const l = loadText(text('alap'));
    const sa = scheduleCircuit(a.circuit, a.profile);
    const sl = scheduleCircuit(l.circuit, l.profile);
    expect(sl.duration).toBe(sa.duration);
    // h on qubit 2 waits in ALAP until just before cx[1,2] (which starts at 110).
    const h2 = sl.items.find((i) => i.op.kind === 'gate' && i.op.name === 'h' && i.op.qubits[0] === 2)!;
    expect([h2.start, h2.end]).toEqual([100, 110]);
    // ALAP measurement windows all end at the circuit's end.
    for (const m of sl.items.filter((i) => i.op.kind === 'measure')) expect(m.end).toBe(sl.duration);
  });

  it('leaves every qubit’s operations in program order without overlap (property, seeded)', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    for (let trial = 0; trial < 30; trial++) {
      const steps: string[] = [];
      for (let s = 0; s < 12; s++) {
        const a = Math.floor(rnd() * 4);
        const b = (a + 1 + Math.floor(rnd() * 3)) % 4;
        const kind = rnd();
        if (kind < 0.4) steps.push(`  - cx: [${a}, ${b}]`);
        else if (kind < 0.7) steps.push(`  - h: ${a}`);
        else if (kind < 0.85) steps.push(`  - idle: ${a}\n    for: ${Math.floor(rnd() * 300)}ns`);
        else steps.push(`  - barrier: [${a}, ${b}]`);
      }
      for (const pol of ['asap', 'alap'] as const) {
        const { circuit, profile: p } = loadText(`qubits: 4\n${profile(pol)}\nsteps:\n${steps.join('\n')}\n`);
        const s = scheduleCircuit(circuit, p);
        const free = [0, 0, 0, 0];
        for (const it of s.items) {
          for (const q of it.op.qubits) {
            if (it.op.kind !== 'barrier') expect(it.start).toBeGreaterThanOrEqual(free[q]! - 1e-9);
            free[q] = Math.max(free[q]!, it.end);
          }
          expect(it.end).toBeLessThanOrEqual(s.duration + 1e-9);
        }
      }
    }
  });
});

describe('classical dependencies (record mode)', () => {
  // The rules, times worked out by hand: measure 500 ns, latency 200 ns, gates 10 ns.
  const record = (schedule: 'asap' | 'alap', steps: string) =>
    loadText(`qubits: 3
noise:
  schedule: ${schedule}
  gates:
    all: { duration: 10ns }
    measure: { duration: 500ns, latency: 200ns }
steps:
${steps}`);
  const times = (steps: string, policy: 'asap' | 'alap') => {
    const { circuit, profile: p } = record(policy, steps);
    const s = scheduleCircuit(circuit, p);
    return { s, t: s.items.map((i) => [i.op.kind === 'gate' ? i.op.name : i.op.kind, i.start, i.end]) };
  };
  const feedForward = `  - h: 0
  - measure: 0
    into: m
  - x: 1
    if: m
  - measure: 1
    into: m
  - h: 2
`;

  it('ASAP: a conditioned step waits for the measurement end + latency; a rewrite waits for the earlier read', () => {
    const { s, t } = times(feedForward, 'asap');
    expect(t).toEqual([
      ['h', 0, 10],
      ['measure', 10, 510],
      ['x', 710, 720], // 510 + 200 latency, although qubit 1 is free from 0
      ['measure', 720, 1220], // after x on qubit 1 (and no earlier than x's start, which reads m)
      ['h', 0, 10],
    ]);
    expect(s.feeds).toEqual([{ measure: 1, to: 2, bit: 0, latency: 200 }]);
    // no measurement is terminal: qubit 0 idles after its measurement until the end
    expect(s.trailingIdle).toContainEqual({ qubit: 0, start: 510, end: 1220 });
    expect(s.measureStart).toEqual([null, null, null]);
  });

  it('ALAP mirrors the constraints: same critical path, slack moves late, dependencies still hold', () => {
    const { s, t } = times(feedForward + '  - h: 0\n', 'alap');
    expect(t).toEqual([
      ['h', 0, 10],
      ['measure', 10, 510],
      ['x', 710, 720],
      ['measure', 720, 1220],
      ['h', 1210, 1220],
      ['h', 1210, 1220],
    ]);
    expect(s.duration).toBe(1220);
  });

  it('ALAP keeps a conditioned step latency after its measurement when the slack would allow less', () => {
    // reversed: x and the last h at 0; the measurement must start ≥ x's end + 200 in mirrored time
    const { t } = times(`  - h: 0
  - measure: 0
    into: m
  - x: 1
    if: m
  - h: 0
`, 'alap');
    expect(t).toEqual([
      ['h', 0, 10],
      ['measure', 10, 510],
      ['x', 710, 720],
      ['h', 710, 720],
    ]);
  });

  it('a measurement that rewrites a bit starts no earlier than a read of it on another qubit', () => {
    // x on qubit 1 reads a at 700 (500 + latency); the rewrite of a on qubit 2 (free at 0) starts at 700, not 0
    const { t } = times(`  - measure: 0
    into: a
  - x: 1
    if: a
  - measure: 2
    into: a
`, 'asap');
    expect(t).toEqual([
      ['measure', 0, 500],
      ['x', 700, 710],
      ['measure', 700, 1200],
    ]);
  });
});

describe('classical dependencies with simultaneous readout', () => {
  it('the feeds name the right items after the readout barriers are taken out', () => {
    const { circuit, profile: p } = loadText(`qubits: 3
noise:
  gates:
    all: { duration: 10ns }
    measure: { duration: 500ns, latency: 200ns, simultaneous: true }
steps:
  - h: 0
  - measure: [0, 1]
    into: [a, b]
  - x: 2
    if: b
`);
    const s = scheduleCircuit(circuit, p);
    expect(s.feeds).toHaveLength(1);
    const f = s.feeds[0]!;
    const from = s.items[f.measure]!;
    const to = s.items[f.to]!;
    expect(from.op.kind === 'measure' && from.op.qubits[0]).toBe(1);
    expect(to.op.kind === 'gate' && to.op.name).toBe('x');
    // both measurements start together at 10 (after h on qubit 0); x waits for 10 + 500 + 200
    expect(from.start).toBe(10);
    expect(to.start).toBe(710);
  });
});
