import { suggest } from '../circuit/suggest.js';
import type { Condition, ConditionTerm, Operation } from '../circuit/circuit.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { describe, type YEntry, type YNode, type YScalar } from './yamlTree.js';

/**
 * The classical record of format version 2 (record mode): bit names written by `measure …
 * into:`, read by `if:`, and ordered by the optional top-level `bits:`. Record order: the
 * order of `bits:` when given, else the order of first writes; character i of a record key
 * is bit i.
 */

/** A bit name: a word, or a word followed by `[index]` (e.g. `m1`, `c[3]`). */
export const BIT_NAME = /^[A-Za-z_][A-Za-z0-9_]*(\[(0|[1-9][0-9]*)\])?$/;

/** True when some step of `steps` has an `into:` key: the circuit is then in record mode. */
export function hasInto(steps: YNode): boolean {
  return steps.kind === 'seq' && steps.items.some((s) => s.kind === 'map' && s.entries.some((e) => e.key === 'into'));
}

/** Reads `into:` and `if:` of the steps in order, remembering which bits earlier steps wrote. */
export class RecordReader {
  /** Bit name → the first step (1-based) whose `into` names it, from a look ahead over all steps (for messages). */
  private readonly anyWrite = new Map<string, { step: number; line: number }>();

  /** `steps` (when given) is looked over once so that a read before a bit's first write can say where that write is. */
  constructor(steps?: YNode) {
    if (steps?.kind !== 'seq') return;
    steps.items.forEach((item, i) => {
      if (item.kind !== 'map') return;
      const into = item.entries.find((e) => e.key === 'into');
      if (into === undefined) return;
      for (const n of into.value.kind === 'seq' ? into.value.items : [into.value]) {
        if (n.kind === 'scalar' && typeof n.value === 'string' && !this.anyWrite.has(n.value)) this.anyWrite.set(n.value, { step: i + 1, line: n.at.line });
      }
    });
  }

  /** Bit name → index in order of first write. */
  private readonly written = new Map<string, number>();
  /** Position of each bit's first write, in order of first write. */
  private readonly writes: { name: string; at: SourcePosition }[] = [];
  /** The first step with `into` (1-based), for the message about a measure without it. */
  private firstInto: { step: number; at: SourcePosition } | undefined;
  /** Measure steps without `into` (1-based step and position). */
  private readonly plainMeasures: { step: number; at: SourcePosition }[] = [];

  /** A measure step without `into` (an input error in record mode, reported by finish). */
  notePlainMeasure(step: number, at: SourcePosition): void {
    this.plainMeasures.push({ step, at });
  }

  /**
   * `into:` of a measure step with `targets` applications: one bit name per target, in
   * order. Returns the bits' indices (order of first write) or undefined after a problem.
   */
  readInto(entry: YEntry, targets: number, step: number, where: string, problems: ProblemList): number[] | undefined {
    const items: readonly YNode[] = entry.value.kind === 'seq' ? entry.value.items : [entry.value];
    const names: { name: string; at: SourcePosition }[] = [];
    let ok = true;
    for (const item of items) {
      const name = bitName(item, `'into' of ${where}`, problems);
      if (name === undefined) ok = false;
      else names.push({ name, at: item.at });
    }
    if (!ok) return undefined;
    if (names.length !== targets) {
      problems.error(
        entry.value.at,
        'into-count',
        `${where}: 'into' names ${names.length} bit${names.length === 1 ? '' : 's'} for ${targets} measured qubit${targets === 1 ? '' : 's'}; give one bit per target, in order`,
      );
      return undefined;
    }
    this.firstInto ??= { step, at: entry.keyAt };
    return names.map(({ name, at }) => {
      let index = this.written.get(name);
      if (index === undefined) {
        index = this.written.size;
        this.written.set(name, index);
        this.writes.push({ name, at });
      }
      return index;
    });
  }

  /**
   * `if:` of a gate, reset or noise step: a bit name (the bit must read 1) or a map bit → 0
   * or 1 (all must hold). Every bit must be written by an earlier step.
   */
  readIf(entry: YEntry, where: string, problems: ProblemList): Condition | undefined {
    const v = entry.value;
    const pairs: { key: YScalar | { value: string; at: SourcePosition }; value: YNode | null }[] = [];
    if (v.kind === 'scalar') pairs.push({ key: v as YScalar, value: null });
    else if (v.kind === 'map') {
      if (v.entries.length === 0) {
        problems.error(v.at, 'bad-if', `${where}: 'if' is an empty map; give a bit name, or a map of bits to 0 or 1`);
        return undefined;
      }
      for (const e of v.entries) pairs.push({ key: { value: e.key, at: e.keyAt }, value: e.value });
    } else {
      problems.error(v.at, 'bad-if', `${where}: 'if' must be a bit name or a map of bits to 0 or 1, not ${describe(v)}`);
      return undefined;
    }
    const terms: ConditionTerm[] = [];
    const seen = new Set<number>();
    let ok = true;
    for (const { key, value } of pairs) {
      const name = String(key.value);
      if (!BIT_NAME.test(name)) {
        problems.error(key.at, 'bad-bit', `${where}: '${name}' is not a bit name; expected a word or a word with an index, e.g. m1 or c[3]`);
        ok = false;
        continue;
      }
      const bit = this.written.get(name);
      const later = this.anyWrite.get(name);
      if (bit === undefined && later !== undefined) {
        problems.error(key.at, 'unknown-bit', `${where}: 'if' reads bit '${name}', which is first written by step ${later.step} (line ${later.line}), after this step; a condition reads only bits that earlier steps wrote`);
        ok = false;
        continue;
      }
      if (bit === undefined) {
        const near = suggest(name, [...this.written.keys()]);
        const hint = near !== undefined ? `did you mean '${near}'?` : this.written.size > 0 ? `written so far: ${[...this.written.keys()].join(', ')}` : `no earlier step measures into a bit`;
        problems.error(key.at, 'unknown-bit', `${where}: 'if' reads bit '${name}', which no earlier step writes; ${hint}`);
        ok = false;
        continue;
      }
      let bitValue: 0 | 1 = 1;
      if (value !== null) {
        if (value.kind !== 'scalar' || (value.value !== 0 && value.value !== 1)) {
          problems.error(value.at, 'bad-if', `${where}: bit '${name}' in 'if' must be 0 or 1, not ${describe(value)}`);
          ok = false;
          continue;
        }
        bitValue = value.value;
      }
      if (seen.has(bit)) continue; // a YAML map cannot repeat a key; kept for safety of the scalar form
      seen.add(bit);
      terms.push({ bit, value: bitValue });
    }
    return ok ? { terms, at: entry.keyAt } : undefined;
  }

  /**
   * Ends the steps: checks the record-mode rule and `bits:`, and returns the record's bit
   * names in record order with the operations' bit indices mapped to it (null without `into`).
   */
  finish(
    bitsEntry: YEntry | undefined,
    ops: readonly Operation[],
    problems: ProblemList,
  ): { bits: readonly string[] | null; operations: readonly Operation[] } {
    if (this.firstInto !== undefined) {
      for (const m of this.plainMeasures) {
        problems.error(
          m.at,
          'measure-without-into',
          `step ${m.step} (measure) has no 'into', but step ${this.firstInto.step} (line ${this.firstInto.at.line}) records into bits; once any measurement records, every 'measure' needs 'into'`,
        );
      }
    }
    if (bitsEntry === undefined) {
      return { bits: this.firstInto === undefined ? null : this.writes.map((w) => w.name), operations: ops };
    }
    const declared = readDeclaredBits(bitsEntry.value, problems);
    if (declared === undefined) return { bits: null, operations: ops };
    const position = new Map(declared.map((d, i) => [d.name, i]));
    for (const w of this.writes) {
      if (position.has(w.name)) continue;
      const near = suggest(w.name, declared.map((d) => d.name));
      const hint = near !== undefined ? `; did you mean '${near}'?` : `; add it to 'bits:'`;
      problems.error(w.at, 'undeclared-bit', `bit '${w.name}' is not declared in 'bits:' (line ${bitsEntry.keyAt.line})${hint}`);
    }
    for (const d of declared) {
      if (!this.written.has(d.name)) problems.error(d.at, 'unwritten-bit', `bit '${d.name}' is declared in 'bits:' but no step measures into it; every declared bit must be written`);
    }
    if (!problems.ok) return { bits: null, operations: ops };
    // first-write index → record position
    const remap = this.writes.map((w) => position.get(w.name)!);
    const operations = ops.map((op): Operation => {
      if (op.kind === 'measure' && op.bit !== undefined) return { ...op, bit: remap[op.bit]! };
      if ((op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel') && op.condition !== undefined) {
        const terms = op.condition.terms.map((t) => ({ bit: remap[t.bit]!, value: t.value }));
        return { ...op, condition: { terms, at: op.condition.at } };
      }
      return op;
    });
    return { bits: declared.map((d) => d.name), operations };
  }
}

/** A scalar bit name, checked against BIT_NAME. */
function bitName(node: YNode, what: string, problems: ProblemList): string | undefined {
  if (node.kind !== 'scalar' || typeof node.value !== 'string') {
    problems.error(node.at, 'bad-bit', `${what}: expected a bit name such as m1 or c[3], not ${describe(node)}`);
    return undefined;
  }
  if (!BIT_NAME.test(node.value)) {
    problems.error(node.at, 'bad-bit', `${what}: '${node.value}' is not a bit name; expected a word or a word with an index, e.g. m1 or c[3]`);
    return undefined;
  }
  return node.value;
}

/** The top-level `bits:` list: distinct bit names. */
function readDeclaredBits(node: YNode, problems: ProblemList): { name: string; at: SourcePosition }[] | undefined {
  if (node.kind !== 'seq') {
    problems.error(node.at, 'bad-bits', `'bits' must be a list of bit names (the record's order), not ${describe(node)}`);
    return undefined;
  }
  const out: { name: string; at: SourcePosition }[] = [];
  const seen = new Map<string, SourcePosition>();
  let ok = true;
  for (const item of node.items) {
    const name = bitName(item, "'bits'", problems);
    if (name === undefined) {
      ok = false;
      continue;
    }
    const before = seen.get(name);
    if (before !== undefined) {
      problems.error(item.at, 'duplicate-bit', `'bits' lists '${name}' twice (first on line ${before.line}); each bit has one place in the record`);
      ok = false;
      continue;
    }
    seen.set(name, item.at);
    out.push({ name, at: item.at });
  }
  return ok ? out : undefined;
}
