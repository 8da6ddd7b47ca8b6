import { ProblemList } from './problem.js';
import { checkErrorAndDepolarizing, readNoiseKindEntry, type Loc, type NoiseKindsSpec } from './noiseKindsSpec.js';
import {
  asMap,
  checkKeys,
  readBoolean,
  readChoice,
  readDuration,
  readProbability,
  readString,
  unknownKey,
} from './read.js';
import { NOISE_KIND_KEYS } from '../noise/kinds.js';
import type { YMap, YNode } from './yamlTree.js';

/** Readout confusion of one qubit: P(read 1 | prepared 0) and P(read 0 | prepared 1). */
export interface Readout {
  readonly zeroAsOne: number;
  readonly oneAsZero: number;
}

/** One `qubits:` entry of a noise profile as written (times in ns). */
export interface QubitEntrySpec {
  t1?: Loc<number>;
  t2?: Loc<number>;
  excited?: Loc<number>;
  readout?: Loc<Readout>;
}

/** One `gates:` entry of a noise profile as written (duration in ns). */
export interface GateEntrySpec {
  duration?: Loc<number>;
  thermal?: Loc<boolean>;
  kinds: NoiseKindsSpec;
}

/** An entry under a key that is resolved later against the circuit ('all', a qubit, a gate, "cx 1 2"). */
export interface KeyedSpec<T> {
  readonly key: string;
  readonly keyAt: Loc<string>['at'];
  readonly entry: T;
}

/** A noise profile as written in a device file or a circuit's inline `noise:` (unresolved). */
export interface ProfileSpec {
  readonly file: string;
  /** A device file describes a whole chip: its entries for qubits beyond a smaller circuit are ignored. */
  readonly source: 'device' | 'inline';
  name?: Loc<string>;
  qubits: KeyedSpec<QubitEntrySpec>[];
  gates: KeyedSpec<GateEntrySpec>[];
  idle?: Loc<'thermal' | 'none'>;
  schedule?: Loc<'asap' | 'alap'>;
}

/** The top-level keys of a noise profile. */
export const PROFILE_KEYS = ['name', 'qubits', 'gates', 'idle', 'schedule'] as const;
/** The keys of one `qubits:` entry of a noise profile. */
export const QUBIT_KEYS = ['t1', 't2', 'excited', 'readout'] as const;
/** The keys of a `readout:` map (P(read 1 | prepared 0), P(read 0 | prepared 1)). */
export const READOUT_KEYS = ['zero_as_one', 'one_as_zero'] as const;
/** The keys of one `gates:` entry of a noise profile. */
export const GATE_KEYS = ['duration', 'thermal', ...NOISE_KIND_KEYS] as const;

/** Reads a noise profile map (device file root or inline `noise:`) into a ProfileSpec. */
export function readProfile(
  node: YNode,
  file: string,
  where: string,
  problems: ProblemList,
  source: 'device' | 'inline',
): ProfileSpec | undefined {
  const map = asMap(node, where, problems);
  if (map === undefined) return undefined;
  checkKeys(map, PROFILE_KEYS, where, problems);
  const spec: ProfileSpec = { file, source, qubits: [], gates: [] };
  for (const e of map.entries) {
    switch (e.key) {
      case 'name': {
        const s = readString(e.value, `'name' of ${where}`, problems, true);
        if (s !== undefined) spec.name = { value: s, at: e.value.at };
        break;
      }
      case 'idle': {
        const v = readChoice(e.value, `'idle' of ${where}`, ['thermal', 'none'] as const, problems);
        if (v !== undefined) spec.idle = { value: v, at: e.value.at };
        break;
      }
      case 'schedule': {
        const v = readChoice(e.value, `'schedule' of ${where}`, ['asap', 'alap'] as const, problems);
        if (v !== undefined) spec.schedule = { value: v, at: e.value.at };
        break;
      }
      case 'qubits': {
        const m = asMap(e.value, `'qubits' of ${where}`, problems);
        if (m !== undefined) for (const q of m.entries) {
          const entry = readQubitEntry(q.value, `qubit entry '${q.key}'`, problems);
          if (entry !== undefined) spec.qubits.push({ key: q.key, keyAt: q.keyAt, entry });
        }
        break;
      }
      case 'gates': {
        const m = asMap(e.value, `'gates' of ${where}`, problems);
        if (m !== undefined) for (const g of m.entries) {
          const entry = readGateEntry(g.value, `gate entry '${g.key}'`, problems);
          if (entry !== undefined) spec.gates.push({ key: g.key.trim().replace(/\s+/g, ' '), keyAt: g.keyAt, entry });
        }
        break;
      }
    }
  }
  return spec;
}

function readQubitEntry(node: YNode, where: string, problems: ProblemList): QubitEntrySpec | undefined {
  const m = asMap(node, where, problems);
  if (m === undefined) return undefined;
  checkKeys(m, QUBIT_KEYS, where, problems);
  const out: QubitEntrySpec = {};
  for (const e of m.entries) {
    const what = `'${e.key}' of ${where}`;
    if (e.key === 't1' || e.key === 't2') {
      const ns = readDuration(e.value, what, problems);
      if (ns === undefined) continue;
      if (ns <= 0) {
        problems.error(e.value.at, 'out-of-range', `${what} must be longer than zero; leave it out for no relaxation`);
        continue;
      }
      out[e.key] = { value: ns, at: e.value.at };
    } else if (e.key === 'excited') {
      const p = readProbability(e.value, what, problems);
      if (p !== undefined) out.excited = { value: p, at: e.value.at };
    } else if (e.key === 'readout') {
      const r = readReadout(e.value, what, problems);
      if (r !== undefined) out.readout = { value: r, at: e.value.at };
    }
  }
  return out;
}

function readReadout(node: YNode, what: string, problems: ProblemList): Readout | undefined {
  if (node.kind === 'scalar') {
    const p = readProbability(node, what, problems);
    return p === undefined ? undefined : { zeroAsOne: p, oneAsZero: p };
  }
  const m = asMap(node, `${what} (one probability, or zero_as_one and one_as_zero)`, problems);
  if (m === undefined) return undefined;
  checkKeys(m, READOUT_KEYS, what, problems);
  let zeroAsOne: number | undefined = 0;
  let oneAsZero: number | undefined = 0;
  for (const e of m.entries) {
    if (e.key === 'zero_as_one') zeroAsOne = readProbability(e.value, `'zero_as_one' of ${what}`, problems);
    if (e.key === 'one_as_zero') oneAsZero = readProbability(e.value, `'one_as_zero' of ${what}`, problems);
  }
  return zeroAsOne === undefined || oneAsZero === undefined ? undefined : { zeroAsOne, oneAsZero };
}

function readGateEntry(node: YNode, where: string, problems: ProblemList): GateEntrySpec | undefined {
  const m: YMap | undefined = asMap(node, where, problems);
  if (m === undefined) return undefined;
  const out: GateEntrySpec = { kinds: {} };
  for (const e of m.entries) {
    const what = `'${e.key}' of ${where}`;
    if (e.key === 'duration') {
      const ns = readDuration(e.value, what, problems);
      if (ns !== undefined) out.duration = { value: ns, at: e.value.at };
    } else if (e.key === 'thermal') {
      const b = readBoolean(e.value, what, problems);
      if (b !== undefined) out.thermal = { value: b, at: e.value.at };
    } else if (!readNoiseKindEntry(e, out.kinds, where, problems)) {
      unknownKey(e, GATE_KEYS, where, problems);
    }
  }
  checkErrorAndDepolarizing(out.kinds, where, problems);
  return out;
}
