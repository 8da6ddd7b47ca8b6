import { LineCounter, parseDocument, isAlias, isMap, isScalar, isSeq, Scalar } from 'yaml';
import type { Node as YamlNode, Document } from 'yaml';
import { ProblemList, type SourcePosition } from './problem.js';

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

/** Largest number of nodes a document may expand to, aliases included. */
export const MAX_EXPANDED_NODES = 200_000;

/** Position of a scalar's first character of content (after an opening quote). */
export function contentStart(s: YScalar): SourcePosition {
  return s.quoted ? { ...s.at, col: s.at.col + 1 } : s.at;
}

/** Parses YAML text into a located tree; syntax errors, size and alias limits go into `problems`. */
export function parseYamlTree(text: string, file: string, problems: ProblemList): YNode | undefined {
  const whole = { file, line: 1, col: 1 };
  if (Buffer.byteLength(text, 'utf8') > MAX_INPUT_BYTES) {
    problems.error(
      whole,
      'file-too-large',
      `the file is larger than ${MAX_INPUT_BYTES / 1024} KiB; fray reads hand-written circuits and profiles, not data dumps`,
    );
    return undefined;
  }
  const lines = new LineCounter();
  let doc: Document.Parsed;
  try {
    doc = parseDocument(text, { lineCounter: lines, prettyErrors: false, uniqueKeys: true });
  } catch (e) {
    problems.error(whole, 'yaml-syntax', `not readable as YAML: ${(e as Error).message}`);
    return undefined;
  }
  const at = (offset: number): SourcePosition => {
    const p = lines.linePos(offset);
    return { file, line: p.line, col: p.col };
  };
  if (doc.errors.length > 0) {
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
  let budget = MAX_EXPANDED_NODES;
  let exhausted = false;
  const convert = (node: unknown, depth: number): YNode | undefined => {
    if (exhausted) return undefined;
    if (--budget < 0 || depth > 200) {
      exhausted = true;
      problems.error(
        whole,
        'alias-bomb',
        `the document expands to more than ${MAX_EXPANDED_NODES} nodes (or nests deeper than 200) through anchors and aliases; refusing to expand it`,
      );
      return undefined;
    }
    if (isAlias(node)) {
      const target = node.resolve(doc);
      if (target === undefined) {
        problems.error(at(node.range?.[0] ?? 0), 'yaml-alias', `alias *${node.source} refers to no anchor`);
        return undefined;
      }
      return convert(target, depth + 1);
    }
    const yn = node as YamlNode;
    const pos = at(yn.range?.[0] ?? 0);
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
        const v = pair.value === null ? nullScalar(keyAt) : convert(pair.value, depth + 1);
        if (v === undefined) continue;
        entries.push({ key: keyText, keyAt, value: v });
      }
      return { kind: 'map', at: pos, entries };
    }
    if (isSeq(node)) {
      const items: YNode[] = [];
      for (const item of node.items) {
        const v = item === null ? nullScalar(pos) : convert(item, depth + 1);
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
  const root = convert(doc.contents, 0);
  return exhausted ? undefined : root;
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
