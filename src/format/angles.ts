import { evaluateReal } from '../circuit/expression.js';
import type { ProblemList } from './problem.js';
import { offsetInto } from './read.js';
import { describe, type YNode } from './yamlTree.js';
import { PLAIN_NUMBER_RE } from './numberSyntax.js';

/** Literal numbers at least this large in magnitude as angles (radians) get a warning: a full turn, 2π. */
export const LITERAL_ANGLE_WARN_ABOVE = 2 * Math.PI;

/**
 * Evaluates an angle node (a number, or an expression string in radians) against named values.
 * A plain number written without a unit whose magnitude exceeds LITERAL_ANGLE_WARN_ABOVE
 * (`angle: 90`) is accepted with a warning suggesting degrees (`90deg`).
 */
export function readAngle(
  node: YNode,
  what: string,
  env: Readonly<Record<string, number>>,
  problems: ProblemList,
): number | undefined {
  if (node.kind === 'scalar' && typeof node.value === 'number') {
    if (Number.isFinite(node.value)) {
      warnIfDegreesMeant(node, node.value, what, problems);
      return node.value;
    }
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
  if (PLAIN_NUMBER_RE.test(node.value)) warnIfDegreesMeant(node, r.value, what, problems);
  return r.value;
}

function warnIfDegreesMeant(node: YNode, value: number, what: string, problems: ProblemList): void {
  if (!(Math.abs(value) > LITERAL_ANGLE_WARN_ABOVE)) return;
  problems.warn(node.at, 'angle-above-full-turn', `${what} is ${value} radians, more than a full turn (2π); angles are in radians unless marked, so if degrees were meant write ${value}deg`);
}
