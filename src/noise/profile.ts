import { GATE_ALIASES } from '../circuit/gates.js';
import { suggest } from '../circuit/suggest.js';
import type { Circuit } from '../circuit/circuit.js';
import type { Loc, NoiseKindsSpec } from '../format/noiseKindsSpec.js';
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
}

/** A gate (or reset) entry after precedence: duration in ns, relaxation during it, noise kinds. */
export interface GateEntry {
  readonly duration: number;
  readonly thermal: boolean;
  readonly kinds: NoiseKindsSpec;
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
  /** The reset entry (thermal is always false: no relaxation during a reset). */
  readonly reset: GateEntry;
  /** The entry for gate `name` on `qubits`: tuple entry > name entry > `all`, merged field by field. */
  gateEntry(name: string, qubits: readonly number[]): GateEntry;
}

/** The noiseless profile: no relaxation, no readout error, zero durations, ASAP. */
export function noiselessProfile(n: number): NoiseProfile {
  const q: QubitNoise = { t1: Infinity, t2: Infinity, excited: 0, readout: { zeroAsOne: 0, oneAsZero: 0 } };
  const empty: GateEntry = { duration: 0, thermal: false, kinds: {} };
  return {
    name: null,
    qubits: Array.from({ length: n }, () => q),
    idle: 'none',
    schedule: 'asap',
    measureDuration: 0,
    reset: empty,
    gateEntry: () => empty,
  };
}

interface PartialGate {
  duration?: Loc<number>;
  thermal?: Loc<boolean>;
  kinds: NoiseKindsSpec;
  off?: ReadonlySet<string>;
}

/**
 * Field-by-field merge of two gate entries, `over` winning; `error` and `depolarizing`
 * replace each other (the more specific or later one wins). A field `over` switches off
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
    ...(over.thermal ?? base.thermal ? { thermal: over.thermal ?? base.thermal } : {}),
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

  for (const spec of specs) {
    const layer = spec.source === 'override' ? command : files;
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
      if (key === 'all') {
        layer.gateAll = mergeGateEntries(layer.gateAll, entry);
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
    return { t1, t2, excited: e.excited?.value ?? 0, readout: e.readout?.value ?? { zeroAsOne: 0, oneAsZero: 0 } };
  });

  const finish = (p: PartialGate, thermalDefault: boolean): GateEntry => ({
    duration: p.duration?.value ?? 0,
    thermal: p.thermal?.value ?? thermalDefault,
    kinds: p.kinds,
  });
  const cache = new Map<string, GateEntry>();
  return {
    name,
    qubits,
    idle,
    schedule,
    measureDuration: mergeGateEntries(files.measure, command.measure).duration?.value ?? 0,
    reset: { ...finish(mergeGateEntries(files.reset, command.reset), false), thermal: false },
    gateEntry(gate, qs) {
      const tk = tupleKey(gate, qs);
      let e = cache.get(tk);
      if (e === undefined) {
        let m: PartialGate = { kinds: {} };
        for (const layer of [files, command]) {
          m = mergeGateEntries(m, layer.gateAll);
          const named = layer.byName.get(gate);
          if (named) m = mergeGateEntries(m, named);
          const tuple = layer.byTuple.get(tk);
          if (tuple) m = mergeGateEntries(m, tuple);
        }
        e = finish(m, true);
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
  const extra = [e.thermal?.at, ...Object.values(e.kinds).map((k) => k?.at)].filter((x): x is SourcePosition => x !== undefined);
  if (extra.length > 0) {
    problems.error(extra[0]!, 'bad-measure-entry', `${where}: a measurement takes only 'duration'; its errors are the qubits' 'readout' probabilities`);
    return false;
  }
  return true;
}

function checkResetEntry(e: GateEntrySpec, where: string, problems: ProblemList): boolean {
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
