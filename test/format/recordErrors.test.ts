import { describe, expect, it } from 'vitest';
import { parseCircuitText } from '../../src/api/loadCircuit.js';
import { ProblemList, formatProblem } from '../../src/format/problem.js';

/**
 * Every input error of record mode (format version 2, part B: `into`, `if`, `bits:`, the
 * measure entry's `latency`) with its exact position and message, pinned in full so that a
 * change of wording is deliberate. Positions were checked by hand against the text.
 */
function problemsOf(text: string): string[] {
  const problems = new ProblemList();
  parseCircuitText(text, 'c.yaml', problems, { readDevice: () => undefined });
  return problems.errors.map(formatProblem);
}

const cases: { name: string; text: string; errors: string[] }[] = [
  {
    name: "'into' names fewer bits than targets",
    text: 'qubits: 2\nsteps:\n  - measure: [0, 1]\n    into: m\n',
    errors: ["c.yaml:4:11: step 1 (measure): 'into' names 1 bit for 2 measured qubits; give one bit per target, in order"],
  },
  {
    name: "'into' bit name that is not a word",
    text: 'qubits: 1\nsteps:\n  - measure: 0\n    into: 3x\n',
    errors: ["c.yaml:4:11: 'into' of step 1 (measure): '3x' is not a bit name; expected a word or a word with an index, e.g. m1 or c[3]"],
  },
  {
    name: "'into' given a map",
    text: 'qubits: 1\nsteps:\n  - measure: 0\n    into: { a: 1 }\n',
    errors: ["c.yaml:4:11: 'into' of step 1 (measure): expected a bit name such as m1 or c[3], not a map"],
  },
  {
    name: "a measure without 'into' in record mode names both steps",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n  - h: 1\n  - measure: 1\n    into: m\n',
    errors: ["c.yaml:3:5: step 1 (measure) has no 'into', but step 3 (line 6) records into bits; once any measurement records, every 'measure' needs 'into'"],
  },
  {
    name: "'if' on a misspelled bit, with suggestion",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: flag\n  - x: 1\n    if: flga\n',
    errors: ["c.yaml:6:9: step 2 (x): 'if' reads bit 'flga', which no earlier step writes; did you mean 'flag'?"],
  },
  {
    name: "'if' on a bit written only later",
    text: 'qubits: 2\nsteps:\n  - x: 1\n    if: m\n  - measure: 0\n    into: m\n',
    errors: ["c.yaml:4:9: step 1 (x): 'if' reads bit 'm', which is first written by step 2 (line 6), after this step; a condition reads only bits that earlier steps wrote"],
  },
  {
    name: "'if' map with one bit written only later",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: a\n  - x: 1\n    if: { a: 1, b: 0 }\n  - measure: 1\n    into: b\n',
    errors: ["c.yaml:6:17: step 2 (x): 'if' reads bit 'b', which is first written by step 3 (line 8), after this step; a condition reads only bits that earlier steps wrote"],
  },
  {
    name: "'if' value other than 0 or 1",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: a\n  - x: 1\n    if: { a: 2 }\n',
    errors: ["c.yaml:6:14: step 2 (x): bit 'a' in 'if' must be 0 or 1, not the number 2"],
  },
  {
    name: "'if' given a list",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: a\n  - x: 1\n    if: [a]\n',
    errors: ["c.yaml:6:9: step 2 (x): 'if' must be a bit name or a map of bits to 0 or 1, not a list"],
  },
  {
    name: "'if' given an empty map",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: a\n  - x: 1\n    if: {}\n',
    errors: ["c.yaml:6:9: step 2 (x): 'if' is an empty map; give a bit name, or a map of bits to 0 or 1"],
  },
  {
    name: "'if' on a measure step",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: a\n  - measure: 1\n    into: b\n    if: a\n',
    errors: ["c.yaml:7:5: step 2 (measure): 'if' does not apply to measure (it takes: label, into)"],
  },
  {
    name: "'if' on an idle step",
    text: 'qubits: 2\nsteps:\n  - measure: 0\n    into: a\n  - idle: 1\n    for: 1us\n    if: a\n',
    errors: ["c.yaml:7:5: step 2 (idle): 'if' does not apply to idle (it takes: for, label)"],
  },
  {
    name: "'into' on a gate step",
    text: 'qubits: 1\nsteps:\n  - x: 0\n    into: a\n',
    errors: ["c.yaml:4:5: step 1 (x): 'into' does not apply to gate x (it takes: angle, angles, noise, label, if)"],
  },
  {
    name: "a written bit missing from 'bits:'",
    text: 'qubits: 2\nbits: [alpha]\nsteps:\n  - measure: [0, 1]\n    into: [alpha, beta]\n',
    errors: ["c.yaml:5:19: bit 'beta' is not declared in 'bits:' (line 2); add it to 'bits:'"],
  },
  {
    name: "a written bit missing from 'bits:', with suggestion",
    text: 'qubits: 1\nbits: [flag]\nsteps:\n  - measure: 0\n    into: flg\n',
    errors: ["c.yaml:5:11: bit 'flg' is not declared in 'bits:' (line 2); did you mean 'flag'?", "c.yaml:2:8: bit 'flag' is declared in 'bits:' but no step measures into it; every declared bit must be written"],
  },
  {
    name: "a declared bit that nothing writes",
    text: 'qubits: 1\nbits: [a, b]\nsteps:\n  - measure: 0\n    into: a\n',
    errors: ["c.yaml:2:11: bit 'b' is declared in 'bits:' but no step measures into it; every declared bit must be written"],
  },
  {
    name: "a bit declared twice",
    text: 'qubits: 1\nbits: [a, a]\nsteps:\n  - measure: 0\n    into: a\n',
    errors: ["c.yaml:2:11: 'bits' lists 'a' twice (first on line 2); each bit has one place in the record"],
  },
  {
    name: "'bits' not a list",
    text: 'qubits: 1\nbits: a\nsteps:\n  - measure: 0\n    into: a\n',
    errors: ["c.yaml:2:7: 'bits' must be a list of bit names (the record's order), not 'a'"],
  },
  {
    name: "'bits' without any 'into'",
    text: 'qubits: 1\nbits: [a]\nsteps:\n  - measure: 0\n',
    errors: ["c.yaml:2:8: bit 'a' is declared in 'bits:' but no step measures into it; every declared bit must be written"],
  },
  {
    name: "'if' in a circuit without record",
    text: 'qubits: 1\nsteps:\n  - x: 0\n    if: m\n',
    errors: ["c.yaml:4:9: step 1 (x): 'if' reads bit 'm', which no earlier step writes; no earlier step measures into a bit"],
  },
  {
    name: "'latency' on a gate entry",
    text: 'qubits: 1\nnoise:\n  gates:\n    x: { latency: 20ns }\nsteps:\n  - x: 0\n',
    errors: ["c.yaml:4:19: gate entry 'x': 'latency' belongs to the 'measure' entry (the classical delay before a step conditioned on a measured bit)"],
  },
  {
    name: "'latency' without a unit",
    text: 'qubits: 1\nnoise:\n  gates:\n    measure: { latency: 20 }\nsteps:\n  - x: 0\n',
    errors: ["c.yaml:4:25: 'latency' of gate entry 'measure': duration '20' has no unit; write it with ns, us (µs), ms or s, e.g. '20ns'"],
  },
  {
    name: "indexed bit name with a leading zero",
    text: 'qubits: 1\nsteps:\n  - measure: 0\n    into: "c[01]"\n',
    errors: ["c.yaml:4:11: 'into' of step 1 (measure): 'c[01]' is not a bit name; expected a word or a word with an index, e.g. m1 or c[3]"],
  },
];

describe('record-mode input errors are located and say what is expected', () => {
  for (const c of cases) {
    it(c.name, () => {
      expect(problemsOf(c.text)).toEqual(c.errors);
    });
  }

  it('indexed bit names are accepted (quoted inside flow lists)', () => {
    expect(problemsOf('qubits: 2\nsteps:\n  - measure: [0, 1]\n    into: ["c[0]", "c[1]"]\n  - x: 0\n    if: { "c[1]": 1 }\n')).toEqual([]);
  });
});
