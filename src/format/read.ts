import { suggest } from '../circuit/suggest.js';
import { evaluateReal } from '../circuit/expression.js';
import { DURATION_UNITS, parseDuration } from './duration.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { describe, type YEntry, type YMap, type YNode, type YScalar } from './yamlTree.js';

/**
 * Small typed readers over the located YAML tree. Each returns the value, or records a
 * problem at the node's position and returns undefined, so validation goes on and
 * reports every problem of a file in one run.
 */

/** The node as a map, or a problem saying what `what` should be. */
export function asMap(node: YNode, what: string, problems: ProblemList): YMap | undefined {
  if (node.kind === 'map') return node;
  problems.error(node.at, 'expected-map', `${what} must be a map of keys, not ${describe(node)}`);
  return undefined;
}

/** Reports every key of `map` that is not in `allowed`, with a did-you-mean suggestion. */
export function checkKeys(map: YMap, allowed: readonly string[], where: string, problems: ProblemList): void {
  for (const e of map.entries) {
    if (!allowed.includes(e.key)) unknownKey(e, allowed, where, problems);
  }
}

/** Records an 'unknown key' problem for entry e. */
export function unknownKey(e: YEntry, allowed: readonly string[], where: string, problems: ProblemList): void {
  const near = suggest(e.key, allowed);
  const hint = near !== undefined ? `did you mean '${near}'?` : `expected one of: ${allowed.join(', ')}`;
  problems.error(e.keyAt, 'unknown-key', `unknown key '${e.key}' in ${where}; ${hint}`);
}

/** The entry for `key`, if present. */
export function entryOf(map: YMap, key: string): YEntry | undefined {
  return map.entries.find((e) => e.key === key);
}

/** A finite number within [min, max]; `integer` demands a whole number. */
export function readNumber(
  node: YNode,
  what: string,
  problems: ProblemList,
  opts: { min?: number; max?: number; integer?: boolean } = {},
): number | undefined {
  if (node.kind !== 'scalar' || typeof node.value !== 'number' || !Number.isFinite(node.value)) {
    problems.error(node.at, 'expected-number', `${what} must be a ${opts.integer ? 'whole number' : 'number'}, not ${describe(node)}`);
    return undefined;
  }
  const v = node.value;
  if (opts.integer && !Number.isInteger(v)) {
    problems.error(node.at, 'expected-integer', `${what} must be a whole number, not ${v}`);
    return undefined;
  }
  if (opts.min !== undefined && v < opts.min) {
    problems.error(node.at, 'out-of-range', `${what} must be at least ${opts.min}, not ${v}`);
    return undefined;
  }
  if (opts.max !== undefined && v > opts.max) {
    problems.error(node.at, 'out-of-range', `${what} must be at most ${opts.max}, not ${v}`);
    return undefined;
  }
  return v;
}

/** Parameter values an expression in a number's place may use (the circuit's params). */
export type NumberEnv = Readonly<Record<string, number>>;

/** A plain decimal number written as text (never evaluated as an expression). */
const PLAIN_NUMBER_RE = /^\s*[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?\s*$/i;

/**
 * Evaluates `text` (an expression of the circuit's params) when params are in scope and the
 * text is not a plain number; undefined means "not an expression here", `{ failed }` that
 * a located problem was recorded.
 */
function evaluateIn(node: YScalar, text: string, env: NumberEnv | undefined, what: string, code: string, problems: ProblemList): { value: number } | { failed: true } | undefined {
  if (env === undefined || PLAIN_NUMBER_RE.test(text) || !/[A-Za-z_(]/.test(text)) return undefined;
  const r = evaluateReal(text, env);
  if ('error' in r) {
    problems.error(offsetInto(node, r.error.offset), code, `${what}: ${r.error.message}`);
    return { failed: true };
  }
  return { value: r.value };
}

/** How a value computed from an expression is shown in a range error (naming the expression). */
function shown(v: number, expr: string | undefined): string {
  return expr === undefined ? String(v) : `${v} (the value of '${expr.trim()}')`;
}

/** A probability in [0, 1]; with `env`, also an expression of the circuit's params (`"p/2"`). */
export function readProbability(node: YNode, what: string, problems: ProblemList, env?: NumberEnv): number | undefined {
  let value: number | undefined;
  let expr: string | undefined;
  if (node.kind === 'scalar' && typeof node.value === 'string') {
    const r = evaluateIn(node, node.value, env, what, 'bad-expression', problems);
    if (r !== undefined && 'failed' in r) return undefined;
    if (r !== undefined) {
      value = r.value;
      expr = node.value;
    }
  }
  if (value === undefined) {
    if (node.kind !== 'scalar' || typeof node.value !== 'number' || !Number.isFinite(node.value)) {
      const hint = env !== undefined ? ' (or an expression of the params)' : '';
      problems.error(node.at, 'expected-probability', `${what} must be a probability between 0 and 1${hint}, not ${describe(node)}`);
      return undefined;
    }
    value = node.value;
  }
  if (!(value >= 0 && value <= 1)) {
    problems.error(node.at, 'out-of-range', `${what} must be a probability between 0 and 1, not ${shown(value, expr)}`);
    return undefined;
  }
  return value;
}

/** `EXPRESSION UNIT`: an expression, whitespace, then a duration unit that scales the whole expression. */
const DURATION_EXPRESSION_RE = /^\s*(.*?\S)\s+(ns|us|µs|μs|ms|s)\s*$/;

/**
 * A duration with a unit, in nanoseconds. With `env` the number may be an expression of
 * the circuit's params, the unit last after a space, scaling the whole expression:
 * `tau us` and `(2*tau + 1) us` are tau and 2·tau + 1 microseconds.
 */
export function readDuration(node: YNode, what: string, problems: ProblemList, env?: NumberEnv): number | undefined {
  if (node.kind !== 'scalar' || node.value === null || typeof node.value === 'boolean') {
    problems.error(node.at, 'bad-duration', `${what} must be a duration with a unit such as 35ns or 1.2us, not ${describe(node)}`);
    return undefined;
  }
  const text = String(node.value);
  if (env !== undefined && typeof node.value === 'string') {
    const m = DURATION_EXPRESSION_RE.exec(text);
    const r = m !== null ? evaluateIn(node, m[1]!, env, what, 'bad-duration', problems) : undefined;
    if (r !== undefined && 'failed' in r) return undefined;
    if (r !== undefined) {
      const ns = r.value * DURATION_UNITS[m![2]!]!;
      if (!(ns >= 0 && Number.isFinite(ns))) {
        problems.error(node.at, 'out-of-range', `${what} must be a duration of zero or more, not ${shown(r.value, m![1])} ${m![2]}`);
        return undefined;
      }
      return ns;
    }
    if (m === null && !PLAIN_NUMBER_RE.test(text) && !('error' in evaluateReal(text, env))) {
      problems.error(node.at, 'bad-duration', `${what}: '${text}' has no unit; write the unit last after a space, e.g. '${text.trim()} ns' or '${text.trim()} us'`);
      return undefined;
    }
  }
  const r = parseDuration(text);
  if ('error' in r) {
    problems.error(node.at, 'bad-duration', `${what}: ${r.error}`);
    return undefined;
  }
  return r.ns;
}

/** True for the word `none`, which switches a profile field off. */
export function isNone(node: YNode): boolean {
  return node.kind === 'scalar' && node.value === 'none';
}

/** true or false. */
export function readBoolean(node: YNode, what: string, problems: ProblemList): boolean | undefined {
  if (node.kind === 'scalar' && typeof node.value === 'boolean') return node.value;
  problems.error(node.at, 'expected-boolean', `${what} must be true or false, not ${describe(node)}`);
  return undefined;
}

/** A string (numbers are accepted and turned into their text when `numbersOk`). */
export function readString(node: YNode, what: string, problems: ProblemList, numbersOk = false): string | undefined {
  if (node.kind === 'scalar' && typeof node.value === 'string') return node.value;
  if (numbersOk && node.kind === 'scalar' && typeof node.value === 'number') return String(node.value);
  problems.error(node.at, 'expected-string', `${what} must be text, not ${describe(node)}`);
  return undefined;
}

/** One of the given words. */
export function readChoice<T extends string>(node: YNode, what: string, choices: readonly T[], problems: ProblemList): T | undefined {
  if (node.kind === 'scalar' && typeof node.value === 'string' && (choices as readonly string[]).includes(node.value)) {
    return node.value as T;
  }
  const near = node.kind === 'scalar' && typeof node.value === 'string' ? suggest(node.value, choices) : undefined;
  const hint = near !== undefined ? `; did you mean '${near}'?` : '';
  problems.error(node.at, 'bad-choice', `${what} must be one of ${choices.map((c) => `'${c}'`).join(', ')}, not ${describe(node)}${hint}`);
  return undefined;
}

/** A scalar's text for expression parsing, with the position of its first character. */
export function scalarText(node: YScalar): string {
  return node.value === null ? '' : String(node.value);
}

/** The position `offset` characters into a scalar's content (for expression errors). */
export function offsetInto(node: YScalar, offset: number): SourcePosition {
  const startCol = node.at.col + (node.quoted ? 1 : 0);
  return { ...node.at, col: startCol + offset };
}
