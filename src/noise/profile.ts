import { GATE_ALIASES } from '../circuit/gates.js';
import { suggest } from '../circuit/suggest.js';
import type { Circuit } from '../circuit/circuit.js';
import { misplacedZz, type Loc, type NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import { ProblemList, type SourcePosition } from '../format/problem.js';
import type { GateEntrySpec, ProfileSpec, QubitEntrySpec, Readout } from '../format/profileSpec.js';
import { qubitName, resolveQubit } from '../format/register.js';

/** Relaxation and readout of one qubit, resolved (times in ns; Infinity = no relaxation). */
export interface QubitNoise {
  readonly t1: number;
  readonly t2: number;
  /** Equilibrium excited-state population p_e the qubit relaxes towards. */
  readonly excited: number;
  readonly readout: Readout;
  /** Detuning δ in Hz: the always-on drift H_q = π·δ·Z_q (0 = none). */
  readonly detuning: number;
}

/** A coupled pair of the device's coupling map, a < b, with its always-on ZZ strength ζ in Hz (H = (π·ζ/2)·Z_a Z_b; 0 = none). */
export interface Coupling {
  readonly a: number;
  readonly b: number;
  readonly zz: number;
}

/** A gate (or reset) entry after precedence: duration in ns, relaxation during it, noise kinds. */
export interface GateEntry {
  readonly duration: number;
  readonly thermal: boolean;
  readonly kinds: NoiseKindsSpec;
  /** Run a composite gate as its parts (each under its own entry) instead of as one calibrated gate. */
  readonly split: boolean;
  /** True when neither a name entry nor a tuple entry exists, so every value came from `all`. */
  readonly fromAll: boolean;
}

/** A noise profile resolved against one circuit's register and gate names. */
export interface NoiseProfile {
  /** The device's name (the profile's `name:`), if it has one. */
  readonly name: string | null;
  /** Per qubit, by index. */
  readonly qubits: readonly QubitNoise[];
  readonly idle: 'thermal' | 'none';
  readonly schedule: 'asap' | 'alap';
  /** Duration of a measurement, ns. */
  readonly measureDuration: number;
  /** Classical latency (ns) from a measurement's end to the earliest start of a step conditioned on its bit. */
  readonly measureLatency: number;
  /** True when every measure step starts all its qubits' measurements together (the `measure` entry's `simultaneous`). */
  readonly simultaneousMeasure: boolean;
  /** The coupling map, or null when the profile has no `couplings:` section (then nothing is checked). */
  readonly couplings: readonly Coupling[] | null;
  /** The reset entry (thermal is always false: no relaxation during a reset). */
  readonly reset: GateEntry;
  /** The entry for gate `name` on `qubits`: tuple entry > name entry > `all`, merged field by field. */
  gateEntry(name: string, qubits: readonly number[]): GateEntry;
}

/** The noiseless profile: no relaxation, no readout error, zero durations, ASAP. */
export function noiselessProfile(n: number): NoiseProfile {
  const q: QubitNoise = { t1: Infinity, t2: Infinity, excited: 0, readout: { zeroAsOne: 0, oneAsZero: 0 }, detuning: 0 };
  const empty: GateEntry = { duration: 0, thermal: false, kinds: {}, split: false, fromAll: true };
  return {
    name: null,
    qubits: Array.from({ length: n }, () => q),
    idle: 'none',
    schedule: 'asap',
    measureDuration: 0,
    measureLatency: 0,
    simultaneousMeasure: false,
    couplings: null,
    reset: empty,
    gateEntry: () => empty,
  };
}

interface PartialGate {
  duration?: Loc<number>;
  latency?: Loc<number>;
  thermal?: Loc<boolean>;
  split?: Loc<boolean>;
  simultaneous?: Loc<boolean>;
  kinds: NoiseKindsSpec;
  off?: ReadonlySet<string>;
}

/**
 * Field-by-field merge of two gate entries, `over` winning; `error` and `depolarizing`
 * replace each other (the more specific or later one wins); `pauli` and `coherent` are one
 * field each, replaced whole. A field `over` switches off
 * (`none`) is dropped, and stays off through later merges until an entry sets it again.
 */
export function mergeGateEntries(base: PartialGate, over: PartialGate): PartialGate {
  const kinds: NoiseKindsSpec = { ...base.kinds };
  if (over.kinds.error !== undefined) delete kinds.depolarizing;
  if (over.kinds.depolarizing !== undefined) delete kinds.error;
  Object.assign(kinds, stripUndefined(over.kinds));
  const off = new Set([...(base.off ?? [])].filter((f) => !(f in over.kinds) && !(f === 'duration' && over.duration !== undefined)));
  for (const f of over.off ?? []) {
    off.add(f);
    delete (kinds as Record<string, unknown>)[f];
  }
  const duration = off.has('duration') ? undefined : (over.duration ?? base.duration);
  return {
    ...(duration ? { duration } : {}),
    ...(over.latency ?? base.latency ? { latency: over.latency ?? base.latency } : {}),
    ...(over.thermal ?? base.thermal ? { thermal: over.thermal ?? base.thermal } : {}),
    ...(over.split ?? base.split ? { split: over.split ?? base.split } : {}),
    ...(over.simultaneous ?? base.simultaneous ? { simultaneous: over.simultaneous ?? base.simultaneous } : {}),
    kinds,
    ...(off.size > 0 ? { off } : {}),
  };
}

/** Merges a qubit entry over another field by field; fields `over` switches off are dropped and remembered. */
function mergeQubitEntries(base: QubitEntrySpec, over: QubitEntrySpec): QubitEntrySpec {
  const out: QubitEntrySpec = { ...base, ...stripUndefined(over) };
  const off = new Set([...(base.off ?? [])].filter((f) => (over as Record<string, unknown>)[f] === undefined));
  for (const f of over.off ?? []) {
    off.add(f);
    delete (out as Record<string, unknown>)[f];
  }
  if (off.size > 0) out.off = off;
  else delete out.off;
  return out;
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  const out: Partial<T> = {};
  for (const [k, v] of Object.entries(o)) if (v !== undefined) (out as Record<string, unknown>)[k] = v;
  return out;
}

/** Tolerance on t2 ≤ 2·t1 (relative), so that t2 written as exactly 2·t1 passes. */
export const T2_LIMIT_TOLERANCE = 1e-12;

/** Options of profile resolution. */
export interface ResolveOptions {
  /**
   * Placement: circuit qubit i sits on device qubit layout[i]. Device-file entries keyed by
   * a qubit index are then read at the physical index (entries for other device qubits are
   * skipped); inline and command-line keys keep the circuit's numbering.
   */
  readonly layout?: readonly number[];
}

/** The entries of one precedence level (the files, or the command line's overrides). */
interface Layer {
  qubitAll: QubitEntrySpec;
  readonly qubitOne: QubitEntrySpec[];
  gateAll: PartialGate;
  readonly byName: Map<string, PartialGate>;
  readonly byTuple: Map<string, PartialGate>;
  measure: PartialGate;
  reset: PartialGate;
}

function emptyLayer(n: number): Layer {
  return {
    qubitAll: {},
    qubitOne: Array.from({ length: n }, () => ({})),
    gateAll: { kinds: {} },
    byName: new Map(),
    byTuple: new Map(),
    measure: { kinds: {} },
    reset: { kinds: {} },
  };
}

/**
 * Resolves profile specs (device first, then the circuit's inline noise, which wins per
 * field) against a circuit: qubit and gate keys to indices and names, precedence, and
 * the physical checks (t2 ≤ 2·t1). A spec of source 'override' (the command line's
 * `--set`) forms a level above all files: its `gates.cx` applies to every cx, even where a
 * file has a more specific "cx 1 2" entry (all < name < tuple within each level).
 */
export function resolveProfile(specs: readonly ProfileSpec[], circuit: Circuit, problems: ProblemList, options: ResolveOptions = {}): NoiseProfile {
  const reg = circuit.register;
  let name: string | null = null;
  let idle: 'thermal' | 'none' = 'thermal';
  let schedule: 'asap' | 'alap' = 'asap';
  const files = emptyLayer(reg.n);
  const command = emptyLayer(reg.n);
  const physical = options.layout !== undefined ? new Map(options.layout.map((p, i) => [String(p), i])) : undefined;
  // A device key that is a whole number names a device qubit: with a layout, map it to the circuit qubit placed there.
  const refOf = (spec: ProfileSpec, ref: string): string | null => {
    if (physical === undefined || spec.source !== 'device' || !/^\d+$/.test(ref)) return ref;
    const i = physical.get(String(Number(ref)));
    return i === undefined ? null : String(i);
  };

  let couplingMap: Map<string, { a: number; b: number; zz?: Loc<number> }> | null = null;

  for (const spec of specs) {
    const layer = spec.source === 'override' ? command : files;
    if (spec.couplings !== undefined) {
      couplingMap ??= new Map();
      const seenHere = new Map<string, string>();
      for (const { key, keyAt, entry } of spec.couplings) {
        const where = `coupling '${key}'`;
        const refs = entry.refs.map((r) => refOf(spec, r));
        if (refs.some((r) => r === null) || (physical === undefined && entry.refs.some((r) => beyondRegister(spec, r, reg)))) continue;
        const qs: number[] = [];
        for (const r of refs) {
          const q = resolveQubit(r!, reg);
          if (typeof q !== 'number') problems.error(keyAt, 'bad-qubit', `${where}: ${q.error}`);
          else qs.push(q);
        }
        if (qs.length !== 2) continue;
        if (qs[0] === qs[1]) {
          problems.error(keyAt, 'coupling-self', `${where} names qubit ${qubitName(qs[0]!, reg)} twice; a coupling joins two different qubits`);
          continue;
        }
        const a = Math.min(qs[0]!, qs[1]!);
        const b = Math.max(qs[0]!, qs[1]!);
        const pk = `${a} ${b}`;
        const earlier = seenHere.get(pk);
        if (earlier !== undefined) {
          problems.error(keyAt, 'repeated-coupling', `${where} repeats the pair '${earlier}' (pairs are unordered); list each pair once`);
          continue;
        }
        seenHere.set(pk, key);
        const old = couplingMap.get(pk) ?? { a, b };
        couplingMap.set(pk, entry.zz !== undefined ? { ...old, zz: entry.zz } : old);
      }
    }
    if (spec.name) name = spec.name.value;
    if (spec.idle) idle = spec.idle.value;
    if (spec.schedule) schedule = spec.schedule.value;
    for (const { key, keyAt, entry } of spec.qubits) {
      if (key === 'all') {
        layer.qubitAll = mergeQubitEntries(layer.qubitAll, entry);
        continue;
      }
      const ref = refOf(spec, key);
      if (ref === null || (physical === undefined && beyondRegister(spec, key, reg))) continue;
      const q = resolveQubit(ref, reg);
      if (typeof q !== 'number') {
        problems.error(keyAt, 'bad-qubit', `qubit entry '${key}': ${q.error}`);
        continue;
      }
      layer.qubitOne[q] = mergeQubitEntries(layer.qubitOne[q]!, entry);
    }
    for (const { key, keyAt, entry } of spec.gates) {
      const where = `gate entry '${key}'`;
      if (entry.latency !== undefined && key !== 'measure') {
        problems.error(entry.latency.at, 'bad-latency', `${where}: 'latency' belongs to the 'measure' entry (the classical delay before a step conditioned on a measured bit)`);
        continue;
      }
      if (key === 'all') {
        if (checkAllEntry(entry, problems)) layer.gateAll = mergeGateEntries(layer.gateAll, entry);
      } else if (key === 'measure') {
        if (checkMeasureEntry(entry, where, problems)) layer.measure = mergeGateEntries(layer.measure, entry);
      } else if (key === 'reset') {
        if (checkResetEntry(entry, where, problems)) layer.reset = mergeGateEntries(layer.reset, entry);
      } else {
        const parts = key.split(' ');
        const gate = GATE_ALIASES.get(parts[0]!) ?? parts[0]!;
        if (gate === 'all' || gate === 'measure' || gate === 'reset') {
          problems.error(keyAt, 'bad-gate-key', `${where}: '${gate}' entries apply to every qubit; a qubit tuple such as "cx 1 2" is only for gates`);
          continue;
        }
        const arity = circuit.gateArity.get(gate);
        if (arity === undefined) {
          const known = [...circuit.gateArity.keys(), 'all', 'measure', 'reset'];
          const near = suggest(gate, known);
          problems.error(keyAt, 'unknown-gate', `${where}: no gate named '${gate}' in this circuit or the built-ins${near !== undefined ? `; did you mean '${near}'?` : ''}`);
          continue;
        }
        if (!checkChannelRef(entry.kinds, arity, circuit, where, problems)) continue;
        const zzAt = misplacedZz(entry.kinds, arity);
        if (zzAt !== undefined) {
          problems.error(zzAt, 'zz-arity', `${where}: 'zz' of 'coherent' is a 2-qubit rotation, and ${gate} acts on ${arity} qubit${arity === 1 ? '' : 's'}`);
          continue;
        }
        if (entry.split !== undefined && !circuit.compositeGates.has(gate)) {
          problems.error(entry.split.at, 'split-not-composite', `${where}: 'split' runs a composite gate (one defined by 'steps' under 'gates:') as its parts; ${gate} is not one`);
          continue;
        }
        if (entry.simultaneous !== undefined) {
          problems.error(entry.simultaneous.at, 'bad-gate-entry', `${where}: 'simultaneous' belongs in the 'measure' entry`);
          continue;
        }
        if (parts.length === 1) {
          layer.byName.set(gate, mergeGateEntries(layer.byName.get(gate) ?? { kinds: {} }, entry));
          continue;
        }
        const refs = parts.slice(1).map((r) => refOf(spec, r));
        if (refs.some((r) => r === null)) continue;
        if (physical === undefined && parts.slice(1).some((r) => beyondRegister(spec, r, reg))) continue;
        if (refs.length !== arity) {
          problems.error(keyAt, 'wrong-arity', `${where}: ${gate} acts on ${arity} qubit${arity === 1 ? '' : 's'} but the key names ${refs.length}`);
          continue;
        }
        const qs: number[] = [];
        for (const r of refs) {
          const q = resolveQubit(r!, reg);
          if (typeof q !== 'number') problems.error(keyAt, 'bad-qubit', `${where}: ${q.error}`);
          else qs.push(q);
        }
        if (qs.length !== refs.length) continue;
        if (new Set(qs).size !== qs.length) {
          problems.error(keyAt, 'repeated-qubit', `${where} names a qubit twice`);
          continue;
        }
        const tk = tupleKey(gate, qs);
        layer.byTuple.set(tk, mergeGateEntries(layer.byTuple.get(tk) ?? { kinds: {} }, entry));
      }
    }
  }
  for (const layer of [files, command]) {
    if (layer.gateAll.kinds.channel !== undefined) checkChannelRef(layer.gateAll.kinds, 1, circuit, "gate entry 'all'", problems);
    if (layer.reset.kinds.channel !== undefined) checkChannelRef(layer.reset.kinds, 1, circuit, "gate entry 'reset'", problems);
  }

  const qubits: QubitNoise[] = files.qubitOne.map((own, q) => {
    const e = mergeQubitEntries(mergeQubitEntries(mergeQubitEntries(files.qubitAll, own), command.qubitAll), command.qubitOne[q]!);
    const t1 = e.t1?.value ?? Infinity;
    const t2 = e.t2?.value ?? (Number.isFinite(t1) ? 2 * t1 : Infinity);
    if (e.t2 !== undefined && t2 > 2 * t1 * (1 + T2_LIMIT_TOLERANCE)) {
      problems.error(
        e.t2.at,
        't2-too-long',
        `qubit ${qubitName(q, reg)}: t2 = ${e.t2.value} ns exceeds 2·t1 = ${2 * t1} ns, which no physical qubit allows (t2 ≤ 2·t1)`,
      );
    }
    return {
      t1,
      t2,
      excited: e.excited?.value ?? 0,
      readout: e.readout?.value ?? { zeroAsOne: 0, oneAsZero: 0 },
      detuning: e.detuning?.value ?? 0,
    };
  });

  const finish = (p: PartialGate, thermalDefault: boolean, fromAll: boolean): GateEntry => ({
    duration: p.duration?.value ?? 0,
    thermal: p.thermal?.value ?? thermalDefault,
    kinds: p.kinds,
    split: p.split?.value ?? false,
    fromAll,
  });
  const cache = new Map<string, GateEntry>();
  return {
    name,
    qubits,
    idle,
    schedule,
    measureDuration: mergeGateEntries(files.measure, command.measure).duration?.value ?? 0,
    measureLatency: mergeGateEntries(files.measure, command.measure).latency?.value ?? 0,
    simultaneousMeasure: mergeGateEntries(files.measure, command.measure).simultaneous?.value ?? false,
    couplings: couplingMap === null ? null : [...couplingMap.values()].sort((x, y) => x.a - y.a || x.b - y.b).map((c) => ({ a: c.a, b: c.b, zz: c.zz?.value ?? 0 })),
    reset: { ...finish(mergeGateEntries(files.reset, command.reset), false, false), thermal: false },
    gateEntry(gate, qs) {
      const tk = tupleKey(gate, qs);
      let e = cache.get(tk);
      if (e === undefined) {
        let m: PartialGate = { kinds: {} };
        let fromAll = true;
        for (const layer of [files, command]) {
          m = mergeGateEntries(m, layer.gateAll);
          const named = layer.byName.get(gate);
          if (named) m = mergeGateEntries(m, named);
          const tuple = layer.byTuple.get(tk);
          if (tuple) m = mergeGateEntries(m, tuple);
          fromAll &&= named === undefined && tuple === undefined;
        }
        e = finish(m, true, fromAll);
        cache.set(tk, e);
      }
      return e;
    },
  };
}

/**
 * A device profile may describe more qubits than a circuit uses: its entries for indices
 * beyond the circuit's register (and that are not labels of it) are skipped, not errors.
 */
function beyondRegister(spec: ProfileSpec, ref: string, reg: Circuit['register']): boolean {
  return spec.source === 'device' && /^\d+$/.test(ref) && Number(ref) >= reg.n && !(reg.labels ?? []).includes(ref);
}

function tupleKey(gate: string, qubits: readonly number[]): string {
  return `${gate} ${qubits.join(' ')}`;
}

function checkMeasureEntry(e: GateEntrySpec, where: string, problems: ProblemList): boolean {
  const extra = [e.thermal?.at, e.split?.at, ...Object.values(e.kinds).map((k) => k?.at)].filter((x): x is SourcePosition => x !== undefined);
  if (extra.length > 0) {
    problems.error(extra[0]!, 'bad-measure-entry', `${where}: a measurement takes only 'duration', 'latency' and 'simultaneous'; its errors are the qubits' 'readout' probabilities`);
    return false;
  }
  return true;
}

/** The `all` entry applies to every gate, first of all to 1-qubit ones: no `zz`, no `split`, no `simultaneous`. */
function checkAllEntry(e: GateEntrySpec, problems: ProblemList): boolean {
  const where = "gate entry 'all'";
  const zzAt = misplacedZz(e.kinds, 1);
  if (zzAt !== undefined) {
    problems.error(zzAt, 'zz-arity', `${where}: 'zz' of 'coherent' is a 2-qubit rotation; give it in a 2-qubit gate's entry (e.g. cz) instead of 'all'`);
    return false;
  }
  if (e.split !== undefined) {
    problems.error(e.split.at, 'split-not-composite', `${where}: 'split' belongs in the entry of a composite gate, by its name`);
    return false;
  }
  if (e.simultaneous !== undefined) {
    problems.error(e.simultaneous.at, 'bad-gate-entry', `${where}: 'simultaneous' belongs in the 'measure' entry`);
    return false;
  }
  return true;
}

function checkResetEntry(e: GateEntrySpec, where: string, problems: ProblemList): boolean {
  if (e.kinds.coherent !== undefined) {
    problems.error(e.kinds.coherent.at, 'coherent-on-reset', `${where}: 'coherent' needs a gate to follow; a reset has no unitary to over- or under-rotate`);
    return false;
  }
  const misplaced = e.split ?? e.simultaneous;
  if (misplaced !== undefined) {
    problems.error(misplaced.at, 'bad-reset-entry', `${where}: a reset takes 'duration' and noise kinds only`);
    return false;
  }
  if (e.thermal !== undefined) {
    problems.error(e.thermal.at, 'bad-reset-entry', `${where}: a reset has no relaxation during it; 'thermal' does not apply`);
    return false;
  }
  if (e.kinds.error !== undefined) {
    problems.error(e.kinds.error.at, 'bad-reset-entry', `${where}: 'error' needs a unitary gate to compare with; give the reset's noise as depolarizing or another kind`);
    return false;
  }
  return true;
}

function checkChannelRef(kinds: NoiseKindsSpec, arity: number, circuit: Circuit, where: string, problems: ProblemList): boolean {
  const ref = kinds.channel;
  if (ref === undefined) return true;
  const ch = circuit.channels.get(ref.value);
  if (ch === undefined) {
    const near = suggest(ref.value, [...circuit.channels.keys()]);
    problems.error(ref.at, 'unknown-channel', `${where}: unknown channel '${ref.value}'${near !== undefined ? `; did you mean '${near}'?` : circuit.channels.size === 0 ? "; the circuit defines no 'channels:'" : ''}`);
    return false;
  }
  if (ch.qubits !== 1 && ch.qubits !== arity) {
    problems.error(ref.at, 'channel-arity', `${where}: channel '${ref.value}' acts on ${ch.qubits} qubits; here it needs 1 or ${arity}`);
    return false;
  }
  return true;
}
