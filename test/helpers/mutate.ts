/**
 * A small seeded mutator of YAML text for the fuzz test (test/cli/fuzz.test.ts): each call
 * applies a few edits of the kinds that broke fray before (issue 13) — special numbers (NaN,
 * infinities, huge, tiny, negative), names that are object properties, near-miss and
 * reserved words, broken YAML punctuation, anchors and aliases, deleted, repeated and
 * re-indented lines, control characters in quoted values. Pure function of (text, rng).
 * mutateText does the same for program text (OpenQASM): tokens and characters deleted,
 * duplicated, swapped or inserted.
 */

/** Numbers and number-like tokens a mutated value may become. */
const SPECIAL_VALUES = [
  '.nan', '.inf', '-.inf', '0', '-0', '-1', '1', '2', '3', '0.5', '1e300', '-1e300', '1e-300', '1e-320', '5e-324', '1e308', '1e15', '24', '25', '31', '7',
  '2.0000000000001', '1e6', '0x10', '"0\\n1"', '"\\t"', '~', '[]', '{}', '[0, 0]', '[[0, 1]]', 'true', '"pi/0"', '"1/0"', '"exp(800)"',
  '"sqrt(-1)"', '"ln(0)"', '"90deg"', '"2*pi"', '99999999999999999999',
];

/** Words a mutated name or key may become. */
const WORDS = [
  'constructor', '__proto__', 'toString', 'hasOwnProperty', 'valueOf', 'prototype', 'all', 'none', 'thermal', 'asap', 'alap', 'cnot',
  'cx', 'ccx', 'h', 'x', 'rz', 'u', 'swap', 'measure', 'reset', 'idle', 'barrier', 'noise', 'on', 'for', 'angle', 'angles', 'label',
  'kraus', 'choi', 'ptm', 'stinespring', 'superoperator', 'unitary', 'sequence', 'parallel', 'depolarizing', 'error', 'channel', 't1',
  't2', 'time', 'excited', 'readout', 'duration', 'qubits', 'steps', 'params', 'gates', 'channels', 'device', 'observe', 'matrix', 'pi',
];

/** Units a duration may be rewritten with (including wrong ones). */
const UNITS = ['ns', 'us', 'µs', 'ms', 's', 'ks', '', 'ns ns'];

/** Fragments inserted at a random place. */
const FRAGMENTS = [
  ':', ': ', '-', '- ', '[', ']', '{', '}', ',', '&a ', '*a', '&b [1, *a]', '"', "'", '#', '\t', ' ', '  ', '\n', '\n  ', '|', '>', '!',
  '%', '@', '`', '? ', '\\', '\u0000', '\u2028', '<<: *a', '!!binary ', '!!set ', '---\n', '...\n',
];

function pick<T>(rng: () => number, items: readonly T[]): T {
  return items[Math.floor(rng() * items.length)]!;
}

/** Replaces one random match of `re` in `text` by `make(match)`; the text unchanged when there is none. */
function replaceOne(text: string, re: RegExp, rng: () => number, make: (m: string) => string): string {
  const hits = [...text.matchAll(new RegExp(re.source, 'g'))];
  if (hits.length === 0) return text;
  const h = pick(rng, hits);
  return text.slice(0, h.index!) + make(h[0]) + text.slice(h.index! + h[0].length);
}

/** One edit of `text`. */
function mutateOnce(text: string, rng: () => number): string {
  const lines = text.split('\n');
  const line = Math.floor(rng() * lines.length);
  switch (Math.floor(rng() * 10)) {
    case 0:
    case 1:
      return replaceOne(text, /-?\d+(\.\d+)?(e[+-]?\d+)?/, rng, () => pick(rng, SPECIAL_VALUES));
    case 2:
      return replaceOne(text, /[A-Za-z_][A-Za-z0-9_]*/, rng, () => pick(rng, WORDS));
    case 3:
      return replaceOne(text, /(ns|us|µs|ms)\b/, rng, () => pick(rng, UNITS));
    case 4:
      lines.splice(line, 1);
      return lines.join('\n');
    case 5:
      lines.splice(line, 0, lines[line] ?? '');
      return lines.join('\n');
    case 6: {
      const other = Math.floor(rng() * lines.length);
      [lines[line], lines[other]] = [lines[other]!, lines[line]!];
      return lines.join('\n');
    }
    case 7:
      lines[line] = rng() < 0.5 ? `  ${lines[line]}` : (lines[line] ?? '').replace(/^ {1,2}/, '');
      return lines.join('\n');
    case 8: {
      const at = Math.floor(rng() * (text.length + 1));
      return text.slice(0, at) + pick(rng, FRAGMENTS) + text.slice(at);
    }
    default: {
      const at = Math.floor(rng() * text.length);
      return text.slice(0, at) + text.slice(at + 1 + Math.floor(rng() * 8));
    }
  }
}

/** `text` after 1 to `most` seeded edits. */
export function mutateYaml(text: string, rng: () => number, most = 3): string {
  return repeatEdits(text, rng, most, mutateOnce);
}

/** `text` after 1 to `most` applications of `edit`. */
function repeatEdits(text: string, rng: () => number, most: number, edit: (t: string, rng: () => number) => string): string {
  let t = text;
  const edits = 1 + Math.floor(rng() * most);
  for (let i = 0; i < edits; i++) t = edit(t, rng);
  return t;
}

/** Tokens a mutated OpenQASM program may gain: keywords, gates, punctuation and special numbers. */
const QASM_TOKENS = [
  ';', ',', '(', ')', '[', ']', '{', '}', '->', '==', '+', '-', '*', '/', '**', '@', '"', '//', '/*', '\n', ' ', 'OPENQASM', '2.0', '3.0', '3',
  'include', '"qelib1.inc"', '"stdgates.inc"', 'qreg', 'creg', 'qubit', 'bit', 'gate', 'measure', 'reset', 'barrier', 'if', 'delay', 'ctrl',
  'inv', 'pow', 'negctrl', 'cx', 'cu1', 'u3', 'h', 'x', 'rz', 'swap', 'ccx', 'pi', 'tau', 'euler', '0', '1', '-1', '1e308', '1e-320', 'nan',
  'inf', '99999999999999999999', 'dt', 'ns', 'us', 'ms', 's', 'constructor', '__proto__', '\u0000', '\t',
];

/** One edit of program text: a token or a few characters deleted, a token duplicated, two tokens swapped, or a token inserted. */
function mutateTextOnce(text: string, rng: () => number): string {
  const tokens = [...text.matchAll(/[A-Za-z_][A-Za-z0-9_.]*|\d+(\.\d+)?(e[+-]?\d+)?|\S/g)];
  if (tokens.length === 0) return text + pick(rng, QASM_TOKENS);
  const t = pick(rng, tokens);
  const at = t.index!;
  const end = at + t[0].length;
  switch (Math.floor(rng() * 6)) {
    case 0:
      return text.slice(0, at) + text.slice(end);
    case 1:
      return text.slice(0, end) + ' ' + t[0] + text.slice(end);
    case 2: {
      const u = pick(rng, tokens);
      if (u.index! <= end) return text;
      return text.slice(0, at) + u[0] + text.slice(end, u.index!) + t[0] + text.slice(u.index! + u[0].length);
    }
    case 3:
      return text.slice(0, at) + pick(rng, QASM_TOKENS) + text.slice(end);
    case 4:
      return text.slice(0, at) + pick(rng, QASM_TOKENS) + ' ' + text.slice(at);
    default: {
      const c = Math.floor(rng() * text.length);
      return text.slice(0, c) + text.slice(c + 1 + Math.floor(rng() * 4));
    }
  }
}

/** `text` (a program, not YAML) after 1 to `most` seeded token or character edits. Pure function of (text, rng). */
export function mutateText(text: string, rng: () => number, most = 3): string {
  return repeatEdits(text, rng, most, mutateTextOnce);
}
