import { parseCircuitText, type LoadedCircuit } from '../../src/api/loadCircuit.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';

/** Parses circuit text (and optional device texts by path) or fails the test with the problems. */
export function loadText(text: string, devices: Record<string, string> = {}, set?: Record<string, string>): LoadedCircuit {
  const problems = new ProblemList();
  const loaded = parseCircuitText(text, 'test.yaml', problems, {
    ...(set ? { set } : {}),
    readDevice: (path) => (devices[path] !== undefined ? { text: devices[path]!, file: path } : undefined),
  });
  if (loaded === undefined) throw new Error(`circuit did not load:\n${problems.items.map(formatProblem).join('\n')}`);
  return loaded;
}
