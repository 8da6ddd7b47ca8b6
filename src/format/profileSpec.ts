import { ProblemList } from './problem.js';
import { checkErrorAndDepolarizing, readNoiseKindEntry, type Loc, type NoiseKindsSpec } from './noiseKindsSpec.js';
import {
  asMap,
  checkKeys,
  readBoolean,
  readChoice,
  readDuration,
  readFrequency,
  readProbability,
  isNone,
  readString,
  unknownKey,
  type NumberEnv,
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
  /** Detuning δ in Hz from the drive frame: H_q = π·δ·Z_q (the qubit turns by rz(2π·δ·τ) over τ). */
  detuning?: Loc<number>;
  /** Fields switched off with `none` (they then take their no-noise default, whatever a less specific entry says). */
  off?: Set<string>;
}

/** One `couplings:` entry: an unordered pair as written ("a b") and its always-on ZZ strength ζ in Hz. */
export interface CouplingSpec {
  readonly refs: readonly [string, string];
  /** ζ in Hz: H_ab = (π·ζ/2)·Z_a Z_b. */
  zz?: Loc<number>;
}

/** One `gates:` entry of a noise profile as written (duration in ns). */
export interface GateEntrySpec {
  duration?: Loc<number>;
  /** Classical latency after a measurement before a step it conditions may start (ns; the `measure` entry only). */
  latency?: Loc<number>;
  thermal?: Loc<boolean>;
  /** Composite gates: run as their parts, each scheduled and noisy under its own entry (default false). */
  split?: Loc<boolean>;
  /** `measure` entry only: every measure step starts all its qubits' measurements together (default false). */
  simultaneous?: Loc<boolean>;
  kinds: NoiseKindsSpec;
  /** Fields switched off with `none` (`duration` or a noise kind), whatever a less specific entry says. */
  off?: Set<string>;
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
  /**
   * A device file describes a whole chip: its entries for qubits beyond a smaller circuit are
   * ignored. 'override' is the command line's `--set` layer, applied over everything it addresses.
   */
  readonly source: 'device' | 'inline' | 'override';
  name?: Loc<string>;
  qubits: KeyedSpec<QubitEntrySpec>[];
  gates: KeyedSpec<GateEntrySpec>[];
  /** The coupling map (present, possibly empty, when the profile has a `couplings:` section). */
  couplings?: KeyedSpec<CouplingSpec>[];
  idle?: Loc<'thermal' | 'none'>;
  schedule?: Loc<'asap' | 'alap'>;
}

/** The top-level keys of a noise profile. */
export const PROFILE_KEYS = ['name', 'qubits', 'couplings', 'gates', 'idle', 'schedule'] as const;
/** The keys of one `qubits:` entry of a noise profile. */
export const QUBIT_KEYS = ['t1', 't2', 'excited', 'readout', 'detuning'] as const;
/** The keys of a `readout:` map (P(read 1 | prepared 0), P(read 0 | prepared 1)). */
export const READOUT_KEYS = ['zero_as_one', 'one_as_zero'] as const;
/** The keys of one `couplings:` entry (a qubit pair) of a noise profile. */
export const COUPLING_KEYS = ['zz'] as const;
/** The keys of one `gates:` entry of a noise profile. */
export const GATE_KEYS = ['duration', 'thermal', 'latency', 'split', 'simultaneous', ...NOISE_KIND_KEYS] as const;
/** Gate-entry fields that are switches (true/false), not noise: `none` does not apply to them. */
const GATE_SWITCHES: ReadonlySet<string> = new Set(['thermal', 'split', 'simultaneous']);

/**
 * Reads a noise profile map (device file root, inline `noise:`, or the command line's
 * overrides) into a ProfileSpec. With `env` (the circuit's params) numbers may be
 * expressions of them; a device file describes hardware and takes literals only.
 */
export function readProfile(
  node: YNode,
  file: string,
  where: string,
  problems: ProblemList,
  source: ProfileSpec['source'],
  env?: NumberEnv,
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
          const entry = readQubitEntry(q.value, `qubit entry '${q.key}'`, problems, env);
          if (entry !== undefined) spec.qubits.push({ key: q.key, keyAt: q.keyAt, entry });
        }
        break;
      }
      case 'gates': {
        const m = asMap(e.value, `'gates' of ${where}`, problems);
        if (m !== undefined) for (const g of m.entries) {
          const entry = readGateEntry(g.value, `gate entry '${g.key}'`, problems, env);
          if (entry !== undefined) spec.gates.push({ key: g.key.trim().replace(/\s+/g, ' '), keyAt: g.keyAt, entry });
        }
        break;
      }
      case 'couplings': {
        spec.couplings = [];
        if (e.value.kind === 'scalar' && e.value.value === null) break; // `couplings:` with nothing: a map with no pairs
        const m = asMap(e.value, `'couplings' of ${where} (pairs "a b" → { zz: … })`, problems);
        if (m !== undefined) for (const c of m.entries) {
          const entry = readCouplingEntry(c.key, c.keyAt, c.value, problems, env);
          if (entry !== undefined) spec.couplings.push({ key: c.key, keyAt: c.keyAt, entry });
        }
        break;
      }
    }
  }
  return spec;
}

/** A `couplings:` entry: the key names two qubits ("0 1", "q0 q1"); the value is a map with an optional `zz`. */
function readCouplingEntry(key: string, keyAt: Loc<string>['at'], node: YNode, problems: ProblemList, env: NumberEnv | undefined): CouplingSpec | undefined {
  const where = `coupling '${key}'`;
  const refs = key.trim().split(/\s+/);
  if (refs.length !== 2 || refs[0] === '') {
    problems.error(keyAt, 'bad-coupling', `${where}: a coupling names two qubits separated by a space, e.g. "0 1" or "q0 q1"`);
    return undefined;
  }
  const out: CouplingSpec = { refs: [refs[0]!, refs[1]!] };
  if (node.kind === 'scalar' && node.value === null) return out;
  const m = asMap(node, `${where} (a map such as { zz: 80kHz }, or {} for a coupling without a ZZ term)`, problems);
  if (m === undefined) return undefined;
  checkKeys(m, COUPLING_KEYS, where, problems);
  for (const e of m.entries) {
    if (e.key !== 'zz') continue;
    const hz = readFrequency(e.value, `'zz' of ${where}`, problems, env);
    if (hz !== undefined) out.zz = { value: hz, at: e.value.at };
  }
  return out;
}

function readQubitEntry(node: YNode, where: string, problems: ProblemList, env: NumberEnv | undefined): QubitEntrySpec | undefined {
  const m = asMap(node, where, problems);
  if (m === undefined) return undefined;
  checkKeys(m, QUBIT_KEYS, where, problems);
  const out: QubitEntrySpec = {};
  for (const e of m.entries) {
    const what = `'${e.key}' of ${where}`;
    if ((QUBIT_KEYS as readonly string[]).includes(e.key) && isNone(e.value)) {
      (out.off ??= new Set()).add(e.key);
      continue;
    }
    if (e.key === 't1' || e.key === 't2') {
      const ns = readDuration(e.value, what, problems, env);
      if (ns === undefined) continue;
      if (ns <= 0) {
        problems.error(e.value.at, 'out-of-range', `${what} must be longer than zero; leave it out for no relaxation`);
        continue;
      }
      out[e.key] = { value: ns, at: e.value.at };
    } else if (e.key === 'excited') {
      const p = readProbability(e.value, what, problems, env);
      if (p !== undefined) out.excited = { value: p, at: e.value.at };
    } else if (e.key === 'readout') {
      const r = readReadout(e.value, what, problems, env);
      if (r !== undefined) out.readout = { value: r, at: e.value.at };
    } else if (e.key === 'detuning') {
      const hz = readFrequency(e.value, what, problems, env);
      if (hz !== undefined) out.detuning = { value: hz, at: e.value.at };
    }
  }
  return out;
}

function readReadout(node: YNode, what: string, problems: ProblemList, env: NumberEnv | undefined): Readout | undefined {
  if (node.kind === 'scalar') {
    const p = readProbability(node, what, problems, env);
    return p === undefined ? undefined : { zeroAsOne: p, oneAsZero: p };
  }
  const m = asMap(node, `${what} (one probability, or zero_as_one and one_as_zero)`, problems);
  if (m === undefined) return undefined;
  checkKeys(m, READOUT_KEYS, what, problems);
  let zeroAsOne: number | undefined = 0;
  let oneAsZero: number | undefined = 0;
  for (const e of m.entries) {
    if (e.key === 'zero_as_one') zeroAsOne = readProbability(e.value, `'zero_as_one' of ${what}`, problems, env);
    if (e.key === 'one_as_zero') oneAsZero = readProbability(e.value, `'one_as_zero' of ${what}`, problems, env);
  }
  return zeroAsOne === undefined || oneAsZero === undefined ? undefined : { zeroAsOne, oneAsZero };
}

function readGateEntry(node: YNode, where: string, problems: ProblemList, env: NumberEnv | undefined): GateEntrySpec | undefined {
  const m: YMap | undefined = asMap(node, where, problems);
  if (m === undefined) return undefined;
  const out: GateEntrySpec = { kinds: {} };
  for (const e of m.entries) {
    const what = `'${e.key}' of ${where}`;
    if (!GATE_SWITCHES.has(e.key) && (GATE_KEYS as readonly string[]).includes(e.key) && isNone(e.value)) {
      (out.off ??= new Set()).add(e.key);
      continue;
    }
    if (e.key === 'duration') {
      const ns = readDuration(e.value, what, problems, env);
      if (ns !== undefined) out.duration = { value: ns, at: e.value.at };
    } else if (e.key === 'latency') {
      const ns = readDuration(e.value, what, problems, env);
      if (ns !== undefined) out.latency = { value: ns, at: e.value.at };
    } else if (e.key === 'thermal') {
      const b = readBoolean(e.value, what, problems);
      if (b !== undefined) out.thermal = { value: b, at: e.value.at };
    } else if (e.key === 'split' || e.key === 'simultaneous') {
      const b = readBoolean(e.value, what, problems);
      if (b !== undefined) out[e.key] = { value: b, at: e.value.at };
    } else if (!readNoiseKindEntry(e, out.kinds, where, problems, env)) {
      unknownKey(e, GATE_KEYS, where, problems);
    }
  }
  checkErrorAndDepolarizing(out.kinds, where, problems);
  return out;
}
