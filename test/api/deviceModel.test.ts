/**
 * The device-model additions of issue 7: the coupling-map warning, the warning for gates that fall
 * back to the `all` entry, composite gates run as their parts (`split`), and what the report shows.
 */
import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../src/api/simulate.js';
import { renderRunReport } from '../../src/cli/runReport.js';
import { makeStyle } from '../../src/cli/style.js';
import { onCouplingMap } from '../../src/noise/couplingMap.js';
import { loadText } from '../helpers/load.js';

const EXACT = 1e-12;
const sim = (text: string) => simulateLoaded(loadText(text));

describe('the coupling map', () => {
  it('two qubits need their pair listed; k qubits need the listed pairs among them to join them all', () => {
    const line = [{ a: 0, b: 1, zz: 0 }, { a: 1, b: 2, zz: 0 }];
    expect(onCouplingMap([0], line)).toBe(true);
    expect(onCouplingMap([1, 0], line)).toBe(true);
    expect(onCouplingMap([0, 2], line)).toBe(false); // connected only through qubit 1, which the gate does not touch
    expect(onCouplingMap([2, 0, 1], line)).toBe(true);
    expect(onCouplingMap([0, 2, 3], line)).toBe(false);
  });

  it('one warning per off-map application, naming the gate, its qubits and the step; JSON and report carry them', () => {
    const s = sim(`qubits: [q0, q1, q2]
noise:
  couplings: { "q0 q1": {}, "q1 q2": { zz: 10kHz } }
steps:
  - cx: [[q0, q1], [q0, q2]]
  - cz: [q2, q0]
  - ccx: [q0, q1, q2]
`);
    expect(s.result.warnings).toEqual([
      "test.yaml:5:5: step 1: cx on q0, q2: the pair q0, q2 is not in the device's couplings",
      "test.yaml:6:5: step 2: cz on q2, q0: the pair q2, q0 is not in the device's couplings",
    ]);
    const text = renderRunReport(s, { top: 4, showState: false, showSchedule: false }, makeStyle(false));
    expect(text).toContain('couplings 2 pairs (1 with zz); 2 gate applications off the map (see Warnings)');
  });

  it('without a couplings section nothing is checked', () => {
    expect(sim(`qubits: 3\nsteps:\n  - cx: [0, 2]\n`).result.warnings).toEqual([]);
  });

  it('inline couplings merge over the device per pair and per field', () => {
    const loaded = loadText(`qubits: 3
device: dev.yaml
noise:
  couplings: { "1 0": { zz: -5kHz }, "1 2": {} }
steps:
  - h: 0
`, { 'dev.yaml': 'couplings:\n  "0 1": { zz: 7kHz }\n  "1 2": { zz: 3kHz }\n  "2 9": { zz: 1kHz }\n' });
    expect(loaded.profile.couplings).toEqual([
      { a: 0, b: 1, zz: -5000 },
      { a: 1, b: 2, zz: 3000 },
    ]);
  });
});

describe('a gate without an entry of its own', () => {
  it("warns once per gate name, naming the values it took from 'all'", () => {
    const s = sim(`qubits: 3
gates:
  pair: { qubits: 2, steps: [ {h: 0}, {cx: [0, 1]} ] }
noise:
  gates:
    all: { duration: 32ns, error: 0.0005 }
    cx: { duration: 200ns }
steps:
  - swap: [0, 1]
  - swap: [1, 2]
  - pair: [0, 1]
  - cx: [0, 1]
  - h: 2
`);
    expect(s.result.warnings).toEqual([
      "test.yaml:9:5: 2-qubit gate swap has no entry in the profile's 'gates', so it takes the 'all' entry (duration 32 ns, error 0.0005); give it an entry of its own",
      "test.yaml:11:5: composite gate pair has no entry in the profile's 'gates', so it takes the 'all' entry (duration 32 ns, error 0.0005); give it an entry of its own",
    ]);
  });

  it("says nothing when 'all' gives nothing, or when a tuple entry covers the application", () => {
    expect(sim(`qubits: 2\nsteps:\n  - swap: [0, 1]\n`).result.warnings).toEqual([]);
    const s = sim(`qubits: 2\nnoise:\n  gates:\n    all: { duration: 30ns }\n    "swap 0 1": { duration: 90ns }\nsteps:\n  - swap: [0, 1]\n`);
    expect(s.result.warnings).toEqual([]);
  });
});

describe('split: a composite gate run as its parts', () => {
  const circuit = (split: string) => `qubits: 2
gates:
  bell: { qubits: 2, params: [a], steps: [ {ry: 0, angle: a}, {cx: [0, 1]} ] }
noise:
  qubits: { all: { t1: 20us, t2: 15us } }
  gates:
    ry: { duration: 40ns }
    cx: { duration: 300ns }
    bell: { duration: 100ns${split} }
steps:
  - bell: [1, 0]
    angle: 1.1
  - h: 1
`;
  it('each part is scheduled under its own entry; the whole runs as one calibrated gate by default', () => {
    const whole = sim(circuit(''));
    const parts = sim(circuit(', split: true'));
    expect(whole.schedule.items.map((it) => [it.op.kind === 'gate' ? it.op.name : it.op.kind, it.start, it.end])).toEqual([
      ['bell', 0, 100],
      ['h', 100, 100],
    ]);
    expect(parts.schedule.items.map((it) => [it.op.kind === 'gate' ? it.op.name : it.op.kind, it.op.qubits, it.start, it.end])).toEqual([
      ['ry', [1], 0, 40],
      ['cx', [1, 0], 40, 340],
      ['h', [1], 340, 340],
    ]);
    // the ideal answers agree (the parts multiply to the composite's unitary)
    for (const [k, p] of Object.entries(whole.result.probabilities.ideal)) expect(Math.abs(parts.result.probabilities.ideal[k]! - p)).toBeLessThan(EXACT);
    // relaxation follows the longer run of the parts
    expect(parts.result.fidelity.state).toBeLessThan(whole.result.fidelity.state);
  });
});

describe('the report', () => {
  it('--schedule lists drift per qubit and pair with the time it acts; the header names readout timing and drift', () => {
    const s = sim(`qubits: 3
noise:
  qubits: { all: { detuning: 20kHz }, 2: { detuning: -1.5MHz } }
  couplings: { "0 1": { zz: 80kHz }, "1 2": {} }
  gates: { h: { duration: 100ns }, measure: { duration: 1us, simultaneous: true } }
steps:
  - h: 0
  - measure: [0, 1]
`);
    const text = renderRunReport(s, { top: 4, showState: false, showSchedule: true }, makeStyle(false));
    expect(text).toContain('  readout   simultaneous: each measure step starts all its measurements together\n');
    expect(text).toContain('  drift     detuning on 3 qubits, zz on 1 pair; the ideal run has none (--schedule lists them)\n');
    expect(text).toContain(
      [
        '  qubit 0       detuning       20 kHz   acts 0 → 100 ns',
        '  qubit 1       detuning       20 kHz   acts 0 → 100 ns',
        '  qubit 2       detuning     -1.5 MHz   acts 0 → 1100 ns',
        '  pair  0 1     zz             80 kHz   acts 0 → 100 ns',
        '  pair  1 2     coupled, no zz',
      ].join('\n'),
    );
  });
});
