import { describe, expect, it } from 'vitest';
import { parseCircuitText } from '../../src/api/loadCircuit.js';
import { ProblemList, formatProblem } from '../../src/format/problem.js';
import { loadText } from '../helpers/load.js';

/** Input errors of the `mitigation:` block, each pinned in full with its exact FILE:LINE:COL. */
function problemsOf(text: string): string[] {
  const problems = new ProblemList();
  parseCircuitText(text, 'c.yaml', problems, { readDevice: () => undefined });
  return problems.errors.map(formatProblem);
}

const HEAD = 'qubits: 2\nobserve: [ZZ]\nsteps:\n  - cx: [0, 1]\nmitigation:\n';
const cases: { name: string; block: string; says: string }[] = [
  { name: 'misspelled key', block: '  zen: { scales: [1, 3] }\n', says: "c.yaml:6:3: unknown key 'zen' in 'mitigation'; did you mean 'zne'?" },
  { name: 'unknown fit', block: '  zne: { scales: [1, 3], fit: cubic }\n', says: "c.yaml:6:31: 'mitigation.zne.fit' must be one of 'linear', 'richardson', 'exponential', not 'cubic'" },
  { name: 'scale below 1', block: '  zne: { scales: [0.5, 3] }\n', says: "c.yaml:6:19: a noise scale in 'mitigation.zne.scales' must be at least 1, not 0.5" },
  { name: 'one scale', block: '  zne: { scales: [2] }\n', says: "c.yaml:6:18: 'mitigation.zne.scales' needs at least 2 noise scales, got 1" },
  { name: 'repeated scale', block: '  zne: { scales: [1, 3, 3] }\n', says: "c.yaml:6:25: noise scale 3 is listed twice in 'mitigation.zne.scales'" },
  { name: 'no scales', block: '  zne: { fit: linear }\n', says: "c.yaml:6:8: 'mitigation.zne' needs 'scales:' (a list of noise scales such as [1, 3, 5])" },
  { name: 'misspelled sequence', block: '  dd: { sequence: xy8 }\n', says: "c.yaml:6:19: 'mitigation.dd.sequence' must be one of 'xx', 'xy4', not 'xy8'; did you mean 'xy4'?" },
  { name: 'bare min_idle', block: '  dd: { sequence: xx, min_idle: 200 }\n', says: "c.yaml:6:33: 'mitigation.dd.min_idle': duration '200' has no unit; write it with ns, us (µs), ms or s, e.g. '200ns'" },
  { name: 'unknown amplification', block: '  zne: { scales: [1, 3], amplify: fould }\n', says: "c.yaml:6:35: 'mitigation.zne.amplify' must be one of 'scale', 'fold', not 'fould'; did you mean 'fold'?" },
  { name: 'readout method', block: '  readout: exact\n', says: "c.yaml:6:12: 'mitigation.readout' must be one of 'inverse', 'bounded', not 'exact'" },
  { name: 'twirl instances', block: '  twirl: { instances: 0 }\n', says: "c.yaml:6:23: 'mitigation.twirl.instances' must be at least 1, not 0" },
];

describe('mitigation: block errors', () => {
  for (const c of cases) {
    it(c.name, () => {
      expect(problemsOf(HEAD + c.block)).toEqual([c.says]);
    });
  }

  it('a full recipe reads', () => {
    const loaded = loadText(`${HEAD}  dd: { sequence: xy4, min_idle: 200ns }\n  twirl: { instances: 8, seed: 3 }\n  zne: { scales: [1, 2, 3], fit: linear, fold: random, seed: 4 }\n  readout: bounded\n`);
    const { at: _at, ...spec } = loaded.circuit.mitigation!;
    expect(spec).toEqual({
      dd: { sequence: 'xy4', minIdle: 200 },
      twirl: { instances: 8, seed: 3 },
      zne: { scales: [1, 2, 3], fit: 'linear', amplify: 'scale', order: 'random', seed: 4 },
      readout: 'bounded',
    });
  });
});
