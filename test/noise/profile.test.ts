import { describe, expect, it } from 'vitest';
import { plainKinds } from '../../src/format/noiseKindsSpec.js';
import { loadText } from '../helpers/load.js';

// The precedence rules are the contract's: tuple entry > gate-name entry > `all`, merged field by
// field; `error` and `depolarizing` replace each other; inline noise wins over the device per field.

const DEVICE = `name: test device
qubits:
  all: { t1: 100us, t2: 80us, readout: 0.02 }
  1: { t1: 40us }
gates:
  all: { duration: 30ns, error: 0.001 }
  cx: { duration: 250ns, error: 0.01 }
  "cx 1 2": { depolarizing: 0.05 }
  measure: { duration: 700ns }
  reset: { duration: 300ns, bit_flip: 0.01 }
`;

const load = (extra = '') => loadText(`qubits: 3\ndevice: dev.yaml\n${extra}\nsteps:\n  - h: 0\n`, { 'dev.yaml': DEVICE });

describe('noise profile precedence', () => {
  it('merges tuple > name > all field by field', () => {
    const { profile } = load();
    expect(profile.gateEntry('h', [0])).toMatchObject({ duration: 30, thermal: true });
    expect(plainKinds(profile.gateEntry('h', [0]).kinds)).toEqual({ error: 0.001 });
    expect(profile.gateEntry('cx', [0, 1]).duration).toBe(250);
    expect(plainKinds(profile.gateEntry('cx', [0, 1]).kinds)).toEqual({ error: 0.01 });
    // The tuple's depolarizing replaces the name entry's error; the duration comes from `cx`.
    expect(profile.gateEntry('cx', [1, 2]).duration).toBe(250);
    expect(plainKinds(profile.gateEntry('cx', [1, 2]).kinds)).toEqual({ depolarizing: 0.05 });
    // The tuple is ordered: cx 2 1 is not cx 1 2.
    expect(plainKinds(profile.gateEntry('cx', [2, 1]).kinds)).toEqual({ error: 0.01 });
  });

  it('resolves qubits: per-qubit fields over all, t2 defaults to 2·t1 only when t2 is missing everywhere', () => {
    const { profile } = load();
    expect(profile.qubits[0]).toMatchObject({ t1: 100_000, t2: 80_000, readout: { zeroAsOne: 0.02, oneAsZero: 0.02 } });
    // qubit 1 overrides t1 only; t2 = 80 µs from `all` (≤ 2·40 µs) stands.
    expect(profile.qubits[1]).toMatchObject({ t1: 40_000, t2: 80_000 });
  });

  it('keeps measure and reset apart from all', () => {
    const { profile } = load();
    expect(profile.measureDuration).toBe(700);
    expect(profile.reset.duration).toBe(300);
    expect(plainKinds(profile.reset.kinds)).toEqual({ bit_flip: 0.01 });
    expect(profile.reset.thermal).toBe(false);
  });

  it('lets inline noise win over the device per field', () => {
    const { profile } = load(`noise:
  name: inline tweak
  qubits: { all: { t2: 50us } }
  gates: { cx: { depolarizing: 0.02 } }
  schedule: alap`);
    expect(profile.name).toBe('inline tweak');
    expect(profile.schedule).toBe('alap');
    expect(profile.qubits[0]).toMatchObject({ t1: 100_000, t2: 50_000 });
    // Inline depolarizing replaces the device's error for cx; the device's duration stays.
    expect(profile.gateEntry('cx', [0, 1]).duration).toBe(250);
    expect(plainKinds(profile.gateEntry('cx', [0, 1]).kinds)).toEqual({ depolarizing: 0.02 });
  });

  it('a step’s noise replaces the noise kinds but not the duration; noise: none removes them', () => {
    const loaded = loadText(
      `qubits: 2\ndevice: dev.yaml\nsteps:\n  - cx: [0, 1]\n    noise: { phase_flip: 0.1 }\n  - cx: [0, 1]\n    noise: none\n`,
      { 'dev.yaml': DEVICE },
    );
    const ops = loaded.circuit.operations;
    expect(ops[0]!.kind === 'gate' && plainKinds(ops[0]!.noise!.kinds)).toEqual({ phase_flip: 0.1 });
    expect(ops[1]!.kind === 'gate' && plainKinds(ops[1]!.noise!.kinds)).toEqual({});
  });

  it('labels work as profile keys, and are matched before indices', () => {
    const { profile } = loadText(
      `qubits: ["1", "0"]\nnoise:\n  qubits:\n    "1": { t1: 10us }\n  gates:\n    "cx 0 1": { error: 0.03 }\nsteps:\n  - cx: ["1", "0"]\n`,
    );
    // Label "1" is qubit index 0.
    expect(profile.qubits[0]!.t1).toBe(10_000);
    expect(profile.qubits[1]!.t1).toBe(Infinity);
    // "cx 0 1" names labels 0 and 1, i.e. indices [1, 0].
    expect(plainKinds(profile.gateEntry('cx', [1, 0]).kinds)).toEqual({ error: 0.03 });
  });
});

describe('a device describes a chip, a circuit may use part of it', () => {
  it('skips a device’s entries for qubits beyond the register', () => {
    const { profile } = loadText(`qubits: 3\ndevice: dev5.yaml\nsteps:\n  - h: 0\n`, {
      'dev5.yaml': 'qubits:\n  4: { t1: 10us }\ngates:\n  "cx 3 4": { error: 0.02 }\n  "cx 1 2": { error: 0.03 }\n',
    });
    expect(profile.qubits).toHaveLength(3);
    expect(plainKinds(profile.gateEntry('cx', [1, 2]).kinds)).toEqual({ error: 0.03 });
  });

  it('refuses the same in a circuit’s inline noise', () => {
    expect(() => loadText(`qubits: 3\nnoise:\n  qubits:\n    4: { t1: 10us }\nsteps:\n  - h: 0\n`)).toThrow(/test\.yaml:4:5: qubit entry '4': qubit 4 is out of range/);
  });
});

describe('gate aliases', () => {
  it('id and i are one gate: a profile entry under either name applies to both', () => {
    const { circuit, profile } = loadText(`qubits: 1\nnoise:\n  gates:\n    id: { duration: 40ns }\nsteps:\n  - i: 0\n  - id: 0\n`);
    expect(circuit.operations.map((o) => (o.kind === 'gate' ? o.name : ''))).toEqual(['i', 'i']);
    expect(profile.gateEntry('i', [0]).duration).toBe(40);
  });
});
