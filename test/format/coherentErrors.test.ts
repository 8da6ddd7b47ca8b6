import { describe, expect, it } from 'vitest';
import { parseCircuitText } from '../../src/api/loadCircuit.js';
import { InputError, simulateLoaded } from '../../src/api/simulate.js';
import { ProblemList, formatProblem } from '../../src/format/problem.js';
import { loadText } from '../helpers/load.js';

/**
 * Input errors of format version 2, part A (frequencies, couplings, coherent errors, split
 * composites, simultaneous readout), each pinned in full with its exact FILE:LINE:COL.
 */
function problemsOf(text: string, device?: string): string[] {
  const problems = new ProblemList();
  parseCircuitText(text, 'c.yaml', problems, {
    readDevice: (path) => (path === 'dev.yaml' && device !== undefined ? { text: device, file: 'dev.yaml' } : undefined),
  });
  return problems.errors.map(formatProblem);
}

const H = 'steps:\n  - h: 0\n';
const cases: { name: string; text: string; device?: string; says: string }[] = [
  {
    name: 'bare-number detuning',
    text: `qubits: 1\nnoise:\n  qubits:\n    all: { detuning: 20 }\n${H}`,
    says: "c.yaml:4:22: 'detuning' of qubit entry 'all': frequency '20' has no unit; write it with Hz, kHz, MHz or GHz, e.g. '20kHz'",
  },
  {
    name: 'frequency unit in the wrong case',
    text: `qubits: 1\nnoise:\n  qubits:\n    0: { detuning: 20khz }\n${H}`,
    says: "c.yaml:4:20: 'detuning' of qubit entry '0': frequency '20khz': the unit is written 'kHz' (units are case-sensitive: Hz, kHz, MHz, GHz)",
  },
  {
    name: 'not a frequency',
    text: `qubits: 2\nnoise:\n  couplings:\n    "0 1": { zz: fast }\n${H}`,
    says: "c.yaml:4:18: 'zz' of coupling '0 1': 'fast' is not a frequency; expected a number with a unit Hz, kHz, MHz or GHz, e.g. 80kHz or -1.5MHz",
  },
  {
    name: 'misspelled detuning',
    text: `qubits: 1\nnoise:\n  qubits:\n    all: { detunning: 1kHz }\n${H}`,
    says: "c.yaml:4:12: unknown key 'detunning' in qubit entry 'all'; did you mean 'detuning'?",
  },
  {
    name: 'misspelled couplings section',
    text: `qubits: 2\nnoise:\n  coupling:\n    "0 1": {}\n${H}`,
    says: "c.yaml:3:3: unknown key 'coupling' in the circuit's 'noise'; did you mean 'couplings'?",
  },
  {
    name: 'misspelled zz of a coupling',
    text: `qubits: 2\nnoise:\n  couplings:\n    "0 1": { zzz: 1kHz }\n${H}`,
    says: "c.yaml:4:14: unknown key 'zzz' in coupling '0 1'; did you mean 'zz'?",
  },
  {
    name: 'unknown qubit in a pair',
    text: `qubits: [a, b]\nnoise:\n  couplings:\n    "a c": {}\nsteps:\n  - h: a\n`,
    says: "c.yaml:4:5: coupling 'a c': unknown qubit 'c'; did you mean 'a'?",
  },
  {
    name: 'a pair beyond an inline register',
    text: `qubits: 2\nnoise:\n  couplings:\n    "1 2": {}\n${H}`,
    says: "c.yaml:4:5: coupling '1 2': qubit 2 is out of range; this circuit has qubits 0 to 1",
  },
  {
    name: 'repeated pair in the other order',
    text: `qubits: 2\nnoise:\n  couplings:\n    "0 1": { zz: 1kHz }\n    "1 0": {}\n${H}`,
    says: "c.yaml:5:5: coupling '1 0' repeats the pair '0 1' (pairs are unordered); list each pair once",
  },
  {
    name: 'a qubit coupled to itself',
    text: `qubits: 2\nnoise:\n  couplings:\n    "1 1": {}\n${H}`,
    says: "c.yaml:4:5: coupling '1 1' names qubit 1 twice; a coupling joins two different qubits",
  },
  {
    name: 'a coupling of three qubits',
    text: `qubits: 3\nnoise:\n  couplings:\n    "0 1 2": {}\n${H}`,
    says: `c.yaml:4:5: coupling '0 1 2': a coupling names two qubits separated by a space, e.g. "0 1" or "q0 q1"`,
  },
  {
    name: 'zz on a 1-qubit gate entry',
    text: `qubits: 1\nnoise:\n  gates:\n    h: { coherent: { x: 0.01, zz: 0.1 } }\n${H}`,
    says: "c.yaml:4:31: gate entry 'h': 'zz' of 'coherent' is a 2-qubit rotation, and h acts on 1 qubit",
  },
  {
    name: 'zz in the all entry',
    text: `qubits: 1\nnoise:\n  gates:\n    all: { coherent: { zz: 0.1 } }\n${H}`,
    says: "c.yaml:4:24: gate entry 'all': 'zz' of 'coherent' is a 2-qubit rotation; give it in a 2-qubit gate's entry (e.g. cz) instead of 'all'",
  },
  {
    name: 'zz in a 3-qubit tuple entry',
    text: `qubits: 3\nnoise:\n  gates:\n    "ccx 0 1 2": { coherent: { zz: 0.1 } }\n${H}`,
    says: "c.yaml:4:32: gate entry 'ccx 0 1 2': 'zz' of 'coherent' is a 2-qubit rotation, and ccx acts on 3 qubits",
  },
  {
    name: 'zz in a standalone noise step on a flat list',
    text: `qubits: 2\nsteps:\n  - noise: { coherent: { zz: 0.1 } }\n    on: [0, 1]\n`,
    says: "c.yaml:3:26: step 1 (noise): 'zz' of 'coherent' acts on two qubits, but the application has 1; leave 'zz' out here (a flat list in on: gives 1-qubit applications; write [[a, b]] for a pair)",
  },
  {
    name: "zz in a 1-qubit gate's step noise",
    text: `qubits: 1\nsteps:\n  - x: 0\n    noise: { coherent: { zz: 0.1 } }\n`,
    says: "c.yaml:4:26: step 1 (x): 'zz' of 'coherent' acts on two qubits, but the application has 1; leave 'zz' out here",
  },
  {
    name: 'coherent in the reset entry',
    text: `qubits: 1\nnoise:\n  gates:\n    reset: { coherent: { x: 0.1 } }\n${H}`,
    says: "c.yaml:4:24: gate entry 'reset': 'coherent' needs a gate to follow; a reset has no unitary to over- or under-rotate",
  },
  {
    name: "coherent in a reset step's noise",
    text: `qubits: 1\nsteps:\n  - reset: 0\n    noise: { coherent: { x: 0.1 } }\n`,
    says: "c.yaml:4:24: step 1 (reset): 'coherent' needs a gate to follow; a reset has no unitary to over- or under-rotate",
  },
  {
    name: 'misspelled coherent field',
    text: `qubits: 1\nnoise:\n  gates:\n    x: { coherent: { xx: 0.1 } }\n${H}`,
    says: "c.yaml:4:22: unknown key 'xx' in 'coherent' in gate entry 'x'; did you mean 'x'?",
  },
  {
    name: 'bad angle expression in coherent',
    text: `qubits: 1\nnoise:\n  gates:\n    x: { coherent: { x: "2 deg + * 1" } }\n${H}`,
    says: "c.yaml:4:28: 'x' of 'coherent' in gate entry 'x': unexpected 'deg' after the end of the expression",
  },
  {
    name: 'coherent that is not a map',
    text: `qubits: 1\nnoise:\n  gates:\n    x: { coherent: 0.1 }\n${H}`,
    says: "c.yaml:4:20: 'coherent' in gate entry 'x' (angles in radians: x, y, z, zz) must be a map of keys, not the number 0.1",
  },
  {
    name: 'split on a gate that is not composite',
    text: `qubits: 2\nnoise:\n  gates:\n    cx: { split: true }\n${H}`,
    says: "c.yaml:4:18: gate entry 'cx': 'split' runs a composite gate (one defined by 'steps' under 'gates:') as its parts; cx is not one",
  },
  {
    name: 'split in the all entry',
    text: `qubits: 1\nnoise:\n  gates:\n    all: { split: true }\n${H}`,
    says: "c.yaml:4:19: gate entry 'all': 'split' belongs in the entry of a composite gate, by its name",
  },
  {
    name: 'simultaneous outside the measure entry',
    text: `qubits: 1\nnoise:\n  gates:\n    h: { simultaneous: true }\n${H}`,
    says: "c.yaml:4:24: gate entry 'h': 'simultaneous' belongs in the 'measure' entry",
  },
  {
    name: 'simultaneous that is not true or false',
    text: `qubits: 1\nnoise:\n  gates:\n    measure: { simultaneous: yes please }\n${H}`,
    says: "c.yaml:4:30: 'simultaneous' of gate entry 'measure' must be true or false, not 'yes please'",
  },
  {
    name: 'repeated pair in a device file',
    text: `qubits: 2\ndevice: dev.yaml\n${H}`,
    device: 'couplings:\n  "0 1": {}\n  "0  1": {}\n',
    says: "dev.yaml:3:3: coupling '0  1' repeats the pair '0 1' (pairs are unordered); list each pair once",
  },
];

describe('format version 2 input errors are located and say what is expected', () => {
  for (const c of cases) {
    it(c.name, () => {
      expect(problemsOf(c.text, c.device)).toEqual([c.says]);
    });
  }

  it('a device file may list pairs beyond the circuit: they are skipped', () => {
    expect(problemsOf(`qubits: 2\ndevice: dev.yaml\n${H}`, 'couplings:\n  "0 1": { zz: 5kHz }\n  "1 7": { zz: 5kHz }\n')).toEqual([]);
  });

  it("a step noise with zz on a split 2-qubit composite reaches its 1-qubit parts: located at the zz", () => {
    const loaded = loadText(`qubits: 2
gates:
  pair: { qubits: 2, steps: [ {h: 0}, {cx: [0, 1]} ] }
noise:
  gates: { pair: { split: true } }
steps:
  - pair: [0, 1]
    noise: { coherent: { zz: 0.1 } }
`);
    expect(() => simulateLoaded(loaded)).toThrow(InputError);
    try {
      simulateLoaded(loaded);
    } catch (e) {
      expect((e as InputError).problems.map(formatProblem)).toEqual([
        "test.yaml:8:26: step 1 (h on 0): 'zz' of 'coherent' is a 2-qubit rotation, and this application acts on 1 qubit",
      ]);
    }
  });
});
