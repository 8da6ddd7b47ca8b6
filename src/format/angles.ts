import { evaluateReal } from '../circuit/expression.js';
import type { ProblemList } from './problem.js';
import { offsetInto } from './read.js';
import { describe, type YNode } from './yamlTree.js';

/** Evaluates an angle node (a number, or an expression string in radians) against named values. */
export function readAngle(
  node: YNode,
  what: string,
  env: Readonly<Record<string, number>>,
  problems: ProblemList,
): number | undefined {
  if (node.kind === 'scalar' && typeof node.value === 'number') {
    if (Number.isFinite(node.value)) return node.value;
  }
  if (node.kind !== 'scalar' || typeof node.value !== 'string') {
    problems.error(node.at, 'bad-angle', `${what} must be a number or an expression such as "theta / 2" or "90deg", not ${describe(node)}`);
    return undefined;
  }
  const r = evaluateReal(node.value, env);
  if ('error' in r) {
    problems.error(offsetInto(node, r.error.offset), 'bad-angle', `${what}: ${r.error.message}`);
    return undefined;
  }
  return r.value;
}
