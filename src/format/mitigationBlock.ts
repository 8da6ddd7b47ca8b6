/**
 * The circuit file's `mitigation:` block: the recipe `fray mitigate FILE` applies when no
 * method is given on the command line, kept next to the circuit it belongs to.
 *
 *   mitigation:
 *     dd: { sequence: xy4, min_idle: 200ns }
 *     twirl: true                # or { instances: 50, seed: 3 }
 *     zne: { scales: [1, 3, 5], fit: richardson, amplify: fold, fold: end, seed: 1 }
 *     readout: inverse           # or bounded
 */
import { FIT_KINDS, type FitKind } from '../mitigation/extrapolate.js';
import { READOUT_METHODS, type ReadoutMethod } from '../mitigation/readoutCorrection.js';
import { DECOUPLING_SEQUENCES, type DecouplingSequence } from '../transforms/sequences.js';
import { MAX_FOLD_SCALE, type FoldOrder } from '../transforms/fold.js';
import { MAX_TWIRL_INSTANCES } from '../transforms/twirl.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { asMap, checkKeys, entryOf, readBoolean, readChoice, readDuration, readNumber } from './read.js';
import { describe, type YNode } from './yamlTree.js';

/** Keys of the `mitigation:` block and of its parts (one table each, so every key is listed once). */
export const MITIGATION_KEYS = ['dd', 'twirl', 'zne', 'readout'] as const;
export const MITIGATION_ZNE_KEYS = ['scales', 'fit', 'amplify', 'fold', 'seed'] as const;
export const MITIGATION_DD_KEYS = ['sequence', 'min_idle'] as const;
export const MITIGATION_TWIRL_KEYS = ['instances', 'seed'] as const;

/** How ZNE amplifies the noise: the uniform noise scale (default) or unitary folding. */
export const AMPLIFY_KINDS = ['scale', 'fold'] as const;


/** The recipe as read, with the block's position (for problems about the recipe as a whole). */
export interface MitigationSpec {
  readonly at: SourcePosition;
  readonly dd?: { readonly sequence: DecouplingSequence; readonly minIdle: number };
  /** Present: twirl; `instances` absent = the exact twirl. */
  readonly twirl?: { readonly instances?: number; readonly seed?: number };
  readonly zne?: { readonly scales: readonly number[]; readonly fit: FitKind; readonly amplify: (typeof AMPLIFY_KINDS)[number]; readonly order?: FoldOrder; readonly seed?: number };
  readonly readout?: ReadoutMethod;
}

/** Reads the `mitigation:` block; problems are recorded, the parts that read are kept. */
export function readMitigation(node: YNode, problems: ProblemList): MitigationSpec | undefined {
  const map = asMap(node, "'mitigation'", problems);
  if (map === undefined) return undefined;
  checkKeys(map, MITIGATION_KEYS, "'mitigation'", problems);
  const spec: { -readonly [K in keyof MitigationSpec]: MitigationSpec[K] } = { at: node.at };

  const dd = entryOf(map, 'dd');
  if (dd !== undefined) {
    const m = asMap(dd.value, "'mitigation.dd'", problems);
    if (m !== undefined) {
      checkKeys(m, MITIGATION_DD_KEYS, "'mitigation.dd'", problems);
      const se = entryOf(m, 'sequence');
      if (se === undefined) problems.error(dd.value.at, 'missing-key', `'mitigation.dd' needs 'sequence:' (${DECOUPLING_SEQUENCES.join(' or ')})`);
      const sequence = se === undefined ? undefined : readChoice(se.value, "'mitigation.dd.sequence'", DECOUPLING_SEQUENCES, problems);
      const me = entryOf(m, 'min_idle');
      const minIdle = me === undefined ? 0 : readDuration(me.value, "'mitigation.dd.min_idle'", problems);
      if (sequence !== undefined && minIdle !== undefined) spec.dd = { sequence, minIdle };
    }
  }

  const tw = entryOf(map, 'twirl');
  if (tw !== undefined) {
    if (tw.value.kind === 'scalar') {
      if (readBoolean(tw.value, "'mitigation.twirl' (true, or a map with 'instances' and 'seed')", problems) === true) spec.twirl = {};
    } else {
      const m = asMap(tw.value, "'mitigation.twirl'", problems);
      if (m !== undefined) {
        checkKeys(m, MITIGATION_TWIRL_KEYS, "'mitigation.twirl'", problems);
        const ie = entryOf(m, 'instances');
        const instances = ie === undefined ? undefined : readNumber(ie.value, "'mitigation.twirl.instances'", problems, { min: 1, max: MAX_TWIRL_INSTANCES, integer: true });
        const seed = readSeed(m, "'mitigation.twirl.seed'", problems);
        spec.twirl = { ...(instances !== undefined ? { instances } : {}), ...(seed !== undefined ? { seed } : {}) };
      }
    }
  }

  const ze = entryOf(map, 'zne');
  if (ze !== undefined) {
    const m = asMap(ze.value, "'mitigation.zne'", problems);
    if (m !== undefined) {
      checkKeys(m, MITIGATION_ZNE_KEYS, "'mitigation.zne'", problems);
      const scales = readScales(entryOf(m, 'scales')?.value, ze.value.at, problems);
      const fe = entryOf(m, 'fit');
      const fit = fe === undefined ? 'richardson' : readChoice(fe.value, "'mitigation.zne.fit'", FIT_KINDS, problems);
      const ae = entryOf(m, 'amplify');
      const amplify = ae === undefined ? 'scale' : readChoice(ae.value, "'mitigation.zne.amplify'", AMPLIFY_KINDS, problems);
      const oe = entryOf(m, 'fold');
      const order = oe === undefined ? undefined : readChoice(oe.value, "'mitigation.zne.fold'", ['end', 'random'] as const, problems);
      const seed = readSeed(m, "'mitigation.zne.seed'", problems);
      if (scales !== undefined && fit !== undefined && amplify !== undefined) {
        spec.zne = { scales, fit, amplify, ...(order !== undefined ? { order } : {}), ...(seed !== undefined ? { seed } : {}) };
      }
    }
  }

  const re = entryOf(map, 'readout');
  if (re !== undefined) {
    const method = readChoice(re.value, "'mitigation.readout'", READOUT_METHODS, problems);
    if (method !== undefined) spec.readout = method;
  }
  return spec;
}

function readSeed(m: { entries: readonly { key: string; value: YNode }[] }, what: string, problems: ProblemList): number | undefined {
  const e = m.entries.find((x) => x.key === 'seed');
  return e === undefined ? undefined : readNumber(e.value, what, problems, { integer: true, min: -Number.MAX_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER });
}

/** `scales: [1, 3, 5]`: at least two distinct numbers from 1 to MAX_FOLD_SCALE. */
function readScales(node: YNode | undefined, blockAt: SourcePosition, problems: ProblemList): number[] | undefined {
  if (node === undefined) {
    problems.error(blockAt, 'missing-key', "'mitigation.zne' needs 'scales:' (a list of noise scales such as [1, 3, 5])");
    return undefined;
  }
  if (node.kind !== 'seq') {
    problems.error(node.at, 'expected-list', `'mitigation.zne.scales' must be a list of noise scales such as [1, 3, 5], not ${describe(node)}`);
    return undefined;
  }
  const out: number[] = [];
  for (const item of node.items) {
    const v = readNumber(item, "a noise scale in 'mitigation.zne.scales'", problems, { min: 1, max: MAX_FOLD_SCALE });
    if (v === undefined) return undefined;
    if (out.includes(v)) {
      problems.error(item.at, 'duplicate-scale', `noise scale ${v} is listed twice in 'mitigation.zne.scales'`);
      return undefined;
    }
    out.push(v);
  }
  if (out.length < 2) {
    problems.error(node.at, 'too-few-scales', `'mitigation.zne.scales' needs at least 2 noise scales, got ${out.length}`);
    return undefined;
  }
  return out;
}
