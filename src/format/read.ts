import { suggest } from '../circuit/suggest.js';
import { evaluateReal } from '../circuit/expression.js';
import { DURATION_UNITS, parseDuration } from './duration.js';
import { FREQUENCY_UNITS, parseFrequency } from './frequency.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { describe, type YEntry, type YMap, type YNode, type YScalar } from './yamlTree.js';
import { PLAIN_NUMBER_RE } from './numberSyntax.js';

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

/**
 * A duration with a unit, in nanoseconds. With `env` the number may be an expression of
 * the circuit's params, the unit last after a space, scaling the whole expression:
 * `tau us` and `(2*tau + 1) us` are tau and 2·tau + 1 microseconds.
 */
export function readDuration(node: YNode, what: string, problems: ProblemList, env?: NumberEnv): number | undefined {
  return readWithUnit(node, what, problems, 'bad-duration', 'a duration with a unit such as 35ns or 1.2us', (t) => {
    const r = parseDuration(t);
    return 'error' in r ? r : { value: r.ns };
  }, { units: DURATION_UNITS, negative: false, ...(env !== undefined ? { env } : {}) });
}

/** A frequency with a unit (Hz, kHz, MHz, GHz), in hertz; either sign. With `env`, as readDuration: `"delta kHz"`. */
export function readFrequency(node: YNode, what: string, problems: ProblemList, env?: NumberEnv): number | undefined {
  return readWithUnit(node, what, problems, 'bad-frequency', 'a frequency with a unit such as 80kHz or -1.5MHz', (t) => {
    const r = parseFrequency(t);
    return 'error' in r ? r : { value: r.hz };
  }, { units: FREQUENCY_UNITS, negative: true, ...(env !== undefined ? { env } : {}) });
}

/** `EXPRESSION UNIT`: an expression, whitespace, then a unit word that scales the whole expression. */
const UNIT_EXPRESSION_RE = /^\s*(.*?\S)\s+([A-Za-zµμ]+)\s*$/;

/** How a quantity with a unit may also be written as an expression of the params. */
interface UnitExpressions {
  readonly units: Readonly<Record<string, number>>;
  /** Whether a negative value is allowed (a frequency) or not (a duration). */
  readonly negative: boolean;
  readonly env?: NumberEnv;
}

/** A scalar read as a number with a unit by `parse` (or, with params in scope, `EXPRESSION UNIT`); problems under `code`. */
function readWithUnit(
  node: YNode,
  what: string,
  problems: ProblemList,
  code: string,
  expected: string,
  parse: (text: string) => { value: number } | { error: string },
  expr: UnitExpressions,
): number | undefined {
  if (node.kind !== 'scalar' || node.value === null || typeof node.value === 'boolean') {
    problems.error(node.at, code, `${what} must be ${expected}, not ${describe(node)}`);
    return undefined;
  }
  const text = String(node.value);
  const env = expr.env;
  if (env !== undefined && typeof node.value === 'string') {
    const m = UNIT_EXPRESSION_RE.exec(text);
    const size = m !== null ? expr.units[m[2]!] : undefined;
    const r = size !== undefined ? evaluateIn(node, m![1]!, env, what, code, problems) : undefined;
    if (r !== undefined && 'failed' in r) return undefined;
    if (r !== undefined) {
      const v = r.value * size!;
      if (!Number.isFinite(v) || (!expr.negative && v < 0)) {
        problems.error(node.at, 'out-of-range', `${what} must be ${expr.negative ? 'finite' : 'zero or more'}, not ${shown(r.value, m![1])} ${m![2]}`);
        return undefined;
      }
      return v;
    }
    if (size === undefined && !PLAIN_NUMBER_RE.test(text) && !('error' in evaluateReal(text, env))) {
      const u = Object.keys(expr.units);
      problems.error(node.at, code, `${what}: '${text}' has no unit; write the unit last after a space, e.g. '${text.trim()} ${u[0]}' or '${text.trim()} ${u[1]}'`);
      return undefined;
    }
  }
  const r = parse(text);
  if ('error' in r) {
    problems.error(node.at, code, `${what}: ${r.error}`);
    return undefined;
  }
  return r.value;
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
