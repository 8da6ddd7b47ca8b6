import { parseDocument, isAlias, isMap, isScalar, isSeq, Scalar, visit } from 'yaml';
import type { Alias, Node as YamlNode, Document } from 'yaml';
import { fileStart, oneLine, ProblemList, type SourcePosition } from './problem.js';

/**
 * A YAML document as a small located tree: maps, sequences and scalars, each with the
 * 1-based line and column where it starts. Aliases are expanded here under a node
 * budget, so an alias bomb is refused instead of expanded, and the validators never
 * see the yaml library's node classes.
 */
export type YNode = YMap | YSeq | YScalar;

/** A mapping; keys are scalars turned into strings (`3:` gives the key "3"). */
export interface YMap {
  readonly kind: 'map';
  readonly at: SourcePosition;
  readonly entries: readonly YEntry[];
}

/** One key–value pair of a mapping, with the key's own position. */
export interface YEntry {
  readonly key: string;
  readonly keyAt: SourcePosition;
  readonly value: YNode;
}

/** A sequence. */
export interface YSeq {
  readonly kind: 'seq';
  readonly at: SourcePosition;
  readonly items: readonly YNode[];
}

/** A scalar as the YAML 1.2 core schema reads it (numbers, booleans, null, strings). */
export interface YScalar {
  readonly kind: 'scalar';
  readonly at: SourcePosition;
  readonly value: string | number | boolean | null;
  /** True for '…' and "…" scalars; their text starts one column after `at`. */
  readonly quoted: boolean;
}

/** Largest input file fray reads, in bytes (a circuit or profile is a few KiB). */
export const MAX_INPUT_BYTES = 1 << 20;

/**
 * Largest number of nodes that expanding aliases may add to a document. Nodes written out
 * in the file are bounded by MAX_INPUT_BYTES instead (a 1 MiB file of 100 000 steps is fine).
 */
export const MAX_EXPANDED_NODES = 200_000;

/** Deepest nesting of maps and lists accepted (levels below the top). */
export const MAX_NESTING = 200;

/** Records that the input at `at` is larger than MAX_INPUT_BYTES. */
export function recordTooLarge(at: SourcePosition, problems: ProblemList): void {
  problems.error(at, 'file-too-large', `the file is larger than ${MAX_INPUT_BYTES / 1024} KiB; fray reads hand-written circuits and profiles, not data dumps`);
}

/** Position of a scalar's first character of content (after an opening quote). */
export function contentStart(s: YScalar): SourcePosition {
  return s.quoted ? { ...s.at, col: s.at.col + 1 } : s.at;
}

/**
 * Parses YAML text into a located tree; syntax errors, size, nesting and alias limits go into
 * `problems`. `maxExpanded` is the budget of nodes aliases may add (MAX_EXPANDED_NODES).
 */
export function parseYamlTree(text: string, file: string, problems: ProblemList, maxExpanded: number = MAX_EXPANDED_NODES): YNode | undefined {
  const whole = { file, line: 1, col: 1 };
  if (Buffer.byteLength(text, 'utf8') > MAX_INPUT_BYTES) {
    recordTooLarge(whole, problems);
    return undefined;
  }
  const lines = lineStartsOf(text);
  const at = (offset: number): SourcePosition => positionIn(lines, offset, file);
  let doc: Document.Parsed;
  try {
    doc = parseDocument(text, { prettyErrors: false, uniqueKeys: true });
  } catch (e) {
    if (e instanceof RangeError) tooDeep(text, lines, file, problems);
    else problems.error(whole, 'yaml-syntax', `not readable as YAML: ${oneLine((e as Error).message)}`);
    return undefined;
  }
  if (doc.errors.length > 0) {
    // the parser runs out of stack on very deep nesting and reports it as a syntax error
    if (doc.errors.some((err) => /call stack/i.test(err.message))) {
      tooDeep(text, lines, file, problems);
      return undefined;
    }
    for (const err of doc.errors) {
      const message = err.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '');
      problems.error(at(err.pos[0]), 'yaml-syntax', `YAML syntax: ${lowerFirst(message)}`);
    }
    return undefined;
  }
  if (doc.contents === null) {
    problems.error(whole, 'empty-file', 'the file is empty; expected a YAML mapping');
    return undefined;
  }
  // Each alias's anchor, found in one pass in document order (the last anchor of that name
  // before the alias, as YAML defines it); Alias.resolve walks the whole document per call.
  // An alias is written `*name`: text without a '*' has none, and the pass is skipped.
  const targets = new Map<Alias, unknown>();
  const latest = new Map<string, unknown>();
  if (text.includes('*')) visit(doc, {
    Node: (_key, node) => {
      if (isAlias(node)) {
        const t = latest.get(node.source);
        if (t !== undefined) targets.set(node, t);
      } else if (typeof node.anchor === 'string') latest.set(node.anchor, node);
    },
  });
  let budget = maxExpanded;
  let stopped = false;
  const convert = (node: unknown, depth: number, viaAlias: boolean): YNode | undefined => {
    if (stopped) return undefined;
    const yn = node as YamlNode;
    const pos = at(yn.range?.[0] ?? 0);
    if (depth > MAX_NESTING) {
      stopped = true;
      problems.error(pos, 'too-deep', `the document nests deeper than ${MAX_NESTING} levels of maps and lists here${viaAlias ? ' (through aliases)' : ''}; fray reads hand-written circuits and profiles`);
      return undefined;
    }
    if (viaAlias && --budget < 0) {
      stopped = true;
      problems.error(
        whole,
        'alias-bomb',
        `the document expands to more than ${maxExpanded} extra nodes through anchors and aliases; refusing to expand it`,
      );
      return undefined;
    }
    if (isAlias(node)) {
      const target = targets.get(node);
      if (target === undefined) {
        problems.error(pos, 'yaml-alias', `alias *${oneLine(node.source)} refers to no anchor before it`);
        return undefined;
      }
      return convert(target, depth + 1, true);
    }
    if (isMap(node)) {
      const entries: YEntry[] = [];
      for (const pair of node.items) {
        const k = pair.key;
        let keyText: string;
        let keyAt = pos;
        if (isScalar(k)) {
          keyText = k.value === null ? '' : String(k.value);
          keyAt = at(k.range?.[0] ?? 0);
        } else {
          problems.error(at((k as YamlNode | null)?.range?.[0] ?? 0), 'bad-key', 'keys must be plain words or numbers, not lists or maps');
          continue;
        }
        const v = pair.value === null ? nullScalar(keyAt) : convert(pair.value, depth + 1, viaAlias);
        if (v === undefined) continue;
        entries.push({ key: keyText, keyAt, value: v });
      }
      return { kind: 'map', at: pos, entries };
    }
    if (isSeq(node)) {
      const items: YNode[] = [];
      for (const item of node.items) {
        const v = item === null ? nullScalar(pos) : convert(item, depth + 1, viaAlias);
        if (v !== undefined) items.push(v);
      }
      return { kind: 'seq', at: pos, items };
    }
    if (isScalar(node)) {
      const v = node.value;
      const value = typeof v === 'string' || typeof v === 'number' || typeof v === 'boolean' || v === null ? v : String(v);
      const quoted = node.type === Scalar.QUOTE_DOUBLE || node.type === Scalar.QUOTE_SINGLE;
      return { kind: 'scalar', at: pos, value, quoted };
    }
    problems.error(pos, 'yaml-node', 'unsupported YAML node');
    return undefined;
  };
  const root = convert(doc.contents, 0, false);
  return stopped ? undefined : root;
}

/** Where the lines of a text start, and its last non-blank offset. */
interface LineStarts {
  /** Offsets at which lines start (a line ends at \n; a \r before it belongs to the line). */
  readonly starts: readonly number[];
  /** Offset of the last character that is not white space (0 for a blank text). */
  readonly last: number;
}

function lineStartsOf(text: string): LineStarts {
  const starts = [0];
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) starts.push(i + 1);
  let last = text.length - 1;
  while (last > 0 && /\s/.test(text[last]!)) last--;
  return { starts, last: Math.max(0, last) };
}

/**
 * The 1-based line and column of `offset`, computed from the text itself (the parser's own
 * line counter misses the line breaks of block scalars it skips while recovering from an
 * error, and then reports columns past the end of a line). An offset at or past the end of
 * the text is placed on the last character.
 */
function positionIn(lines: LineStarts, offset: number, file: string): SourcePosition {
  const starts = lines.starts;
  const o = Math.max(0, Math.min(offset, lines.last));
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid]! <= o) lo = mid;
    else hi = mid - 1;
  }
  return { file, line: lo + 1, col: o - starts[lo]! + 1 };
}

/**
 * Records that the document nests too deeply for the parser, located where the nesting of
 * flow collections ([ and {, outside quotes and comments) first passes MAX_NESTING, else at
 * the start of the file.
 */
function tooDeep(text: string, lines: LineStarts, file: string, problems: ProblemList): void {
  let depth = 0;
  let where = -1;
  let quote = '';
  for (let i = 0; i < text.length && where < 0; i++) {
    const c = text[i]!;
    if (quote !== '') {
      if (c === '\\' && quote === '"') i++;
      else if (c === quote) quote = '';
    } else if (c === '"' || c === "'") quote = c;
    else if (c === '#' && (i === 0 || /\s/.test(text[i - 1]!))) {
      const end = text.indexOf('\n', i);
      i = end < 0 ? text.length : end;
    } else if (c === '[' || c === '{') {
      if (++depth > MAX_NESTING) where = i;
    } else if (c === ']' || c === '}') depth--;
  }
  problems.error(
    where >= 0 ? positionIn(lines, where, file) : fileStart(file),
    'too-deep',
    `the document nests deeper than ${MAX_NESTING} levels of maps and lists; fray reads hand-written circuits and profiles`,
  );
}

function nullScalar(at: SourcePosition): YScalar {
  return { kind: 'scalar', at, value: null, quoted: false };
}

function lowerFirst(s: string): string {
  return s.length > 0 ? s[0]!.toLowerCase() + s.slice(1) : s;
}

/** A short description of a node's type for messages ("a list", "a map", "the number 3"). */
export function describe(node: YNode): string {
  if (node.kind === 'map') return 'a map';
  if (node.kind === 'seq') return 'a list';
  if (node.value === null) return 'nothing';
  if (typeof node.value === 'string') return `'${node.value}'`;
  return `${typeof node.value === 'number' ? 'the number' : 'the value'} ${String(node.value)}`;
}
