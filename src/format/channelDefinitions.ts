/**
 * Reads a `channels:` map of channel definitions (a channel file of `fray channel`, or the
 * `channels:` map of a circuit) into Channel values of src/channels, with every problem
 * located at FILE:LINE:COL. Conventions of each form: src/channels/conventions.ts.
 *
 * Each definition is a map with exactly one form key and an optional `qubits`:
 *   kraus: [M1, M2, …]          Kraus operators (2^k × 2^k each)
 *   choi: M                     Choi matrix (4^k × 4^k, input first, unnormalised)
 *   superoperator: M            column-stacking superoperator (4^k × 4^k)
 *   ptm: M                      Pauli transfer matrix (4^k × 4^k)
 *   stinespring: M              isometry ((2^k·r) × 2^k, environment last)
 *   unitary: M | 'rz(pi/4)'     a unitary matrix or a built-in gate call
 *   depolarizing: p             k-qubit depolarizing, k = `qubits` (default 1)
 *   amplitude_damping: γ, phase_damping: λ, bit_flip: p, phase_flip: p, bit_phase_flip: p,
 *   pauli: {x, y, z}, thermal: {t1, t2, time, excited}
 *                               one-qubit kinds; with `qubits: k` the same channel acts on
 *                               each of k qubits independently (a tensor power)
 *   sequence: [a, b, …]         a then b then … (names of other channels or inline maps)
 *   parallel: [a, b, …]         a on the leftmost qubits, b next, …
 * Matrix entries and numbers may be expressions of the circuit's parameters ("sqrt(0.9)").
 * Physicality is NOT required here (`fray channel` inspects unphysical maps); circuits check
 * it in ./customChannels.ts.
 */
import { evaluateReal } from '../circuit/expression.js';
import { suggest } from '../circuit/suggest.js';
import { Channel } from '../channels/channel.js';
import { MAX_CHANNEL_QUBITS, qubitsOfDim } from '../channels/conventions.js';
import {
  amplitudeDampingChannel,
  bitFlipChannel,
  bitPhaseFlipChannel,
  depolarizingChannel,
  pauliChannel,
  phaseDampingChannel,
  phaseFlipChannel,
  thermalRelaxationChannel,
} from '../channels/builtins.js';
import { parallel } from '../channels/parallel.js';
import { t2WithinLimit } from '../noise/channels.js';
import { sequence } from '../channels/sequence.js';
import { type CMatrix, unitarityResidual } from '../linalg/cmatrix.js';
import { parseGateCall } from './gateCall.js';
import { UNITARITY_TOLERANCE } from './gateLibrary.js';
import { readMatrix } from './matrix.js';
import { PAULI_KEYS } from './noiseKindsSpec.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { asMap, checkKeys, entryOf, offsetInto, readDuration } from './read.js';
import { describe, type YEntry, type YMap, type YNode } from './yamlTree.js';

/** The form keys of a channel definition (exactly one per definition). */
export const CHANNEL_FORM_KEYS = [
  'kraus',
  'choi',
  'superoperator',
  'ptm',
  'stinespring',
  'unitary',
  'depolarizing',
  'amplitude_damping',
  'phase_damping',
  'bit_flip',
  'phase_flip',
  'bit_phase_flip',
  'pauli',
  'thermal',
  'sequence',
  'parallel',
] as const;

/** One of CHANNEL_FORM_KEYS. */
export type ChannelFormKey = (typeof CHANNEL_FORM_KEYS)[number];

/** Every key a definition may hold. */
export const CHANNEL_DEFINITION_KEYS: readonly string[] = [...CHANNEL_FORM_KEYS, 'qubits'];

/** Keys of a `thermal:` map (t1, t2, time: durations; excited: probability). */
export const THERMAL_KEYS = ['t1', 't2', 'time', 'excited'] as const;

/** A channel as defined in a file. */
export interface ChannelDefinition {
  readonly name: string;
  readonly channel: Channel;
  /** The form key the definition used. */
  readonly kind: ChannelFormKey;
  /** Position of the channel's name. */
  readonly at: SourcePosition;
  /** Position of the form key's value (where problems with the map itself are reported). */
  readonly formAt: SourcePosition;
}

type Env = Readonly<Record<string, number>>;

/** Reads every definition of the `channels:` map `node`; definitions with problems are left out. */
export function readChannelDefinitions(node: YNode, env: Env, problems: ProblemList): Map<string, ChannelDefinition> {
  const out = new Map<string, ChannelDefinition>();
  const map = asMap(node, "'channels'", problems);
  if (map === undefined) return out;
  const reader = new DefinitionReader(map, env, problems);
  for (const e of map.entries) {
    const def = reader.resolve(e.key);
    if (def !== undefined) out.set(e.key, def);
  }
  return out;
}

class DefinitionReader {
  private readonly raw = new Map<string, YEntry>();
  private readonly done = new Map<string, ChannelDefinition | null>();
  private readonly visiting: string[] = [];

  constructor(
    map: YMap,
    private readonly env: Env,
    private readonly problems: ProblemList,
  ) {
    for (const e of map.entries) this.raw.set(e.key, e);
  }

  /** The definition named `name` (read once; undefined when it has problems, already reported). */
  resolve(name: string): ChannelDefinition | undefined {
    if (this.done.has(name)) return this.done.get(name) ?? undefined;
    const e = this.raw.get(name)!;
    this.visiting.push(name);
    const r = this.readDefinition(e.value, `channel '${name}'`);
    this.visiting.pop();
    const def = r === undefined ? null : { name, channel: r.channel, kind: r.kind, at: e.keyAt, formAt: r.formAt };
    this.done.set(name, def);
    return def ?? undefined;
  }

  /** A reference to another channel by name, from a `sequence`/`parallel` item. */
  private reference(node: YNode & { kind: 'scalar' }, where: string): Channel | undefined {
    const name = String(node.value);
    if (!this.raw.has(name)) {
      const near = suggest(name, [...this.raw.keys()]);
      const hint = near !== undefined ? `; did you mean '${near}'?` : '';
      this.problems.error(node.at, 'unknown-channel', `unknown channel '${name}' in ${where}${hint}`);
      return undefined;
    }
    const loop = this.visiting.indexOf(name);
    if (loop >= 0) {
      const path = [...this.visiting.slice(loop), name].join(' → ');
      this.problems.error(node.at, 'channel-cycle', `channel '${name}' is defined in terms of itself (${path})`);
      return undefined;
    }
    return this.resolve(name)?.channel;
  }

  private readDefinition(node: YNode, where: string): { channel: Channel; kind: ChannelFormKey; formAt: SourcePosition } | undefined {
    const map = asMap(node, where, this.problems);
    if (map === undefined) return undefined;
    checkKeys(map, CHANNEL_DEFINITION_KEYS, where, this.problems);
    const forms = map.entries.filter((e) => (CHANNEL_FORM_KEYS as readonly string[]).includes(e.key));
    if (forms.length === 0) {
      this.problems.error(map.at, 'bad-channel', `${where} needs one of: ${CHANNEL_FORM_KEYS.join(', ')}`);
      return undefined;
    }
    if (forms.length > 1) {
      this.problems.error(forms[1]!.keyAt, 'bad-channel', `${where} has both '${forms[0]!.key}' and '${forms[1]!.key}'; give exactly one form`);
      return undefined;
    }
    const form = forms[0]!;
    const kind = form.key as ChannelFormKey;
    let qubits: number | undefined;
    const qe = entryOf(map, 'qubits');
    if (qe !== undefined) {
      const v = qe.value;
      if (v.kind !== 'scalar' || typeof v.value !== 'number' || !Number.isInteger(v.value) || v.value < 1 || v.value > MAX_CHANNEL_QUBITS) {
        this.problems.error(v.at, 'bad-qubits', `'qubits' of ${where} must be a whole number from 1 to ${MAX_CHANNEL_QUBITS}, not ${describe(v)}`);
        return undefined;
      }
      qubits = v.value;
    }
    const channel = this.readForm(kind, form.value, `'${kind}' of ${where}`, qubits);
    if (channel === undefined) return undefined;
    if (isZeroMap(channel)) {
      this.problems.error(form.value.at, 'zero-map', `${where} is the zero map (it sends every state to 0); a channel needs at least one nonzero Kraus operator or matrix entry`);
      return undefined;
    }
    if (qubits !== undefined && channel.qubits !== qubits) {
      this.problems.error(qe!.value.at, 'bad-qubits', `${where} says 'qubits: ${qubits}' but its '${kind}' acts on ${channel.qubits} qubit${channel.qubits === 1 ? '' : 's'}`);
      return undefined;
    }
    return { channel, kind, formAt: form.value.at };
  }

  private readForm(kind: ChannelFormKey, node: YNode, what: string, qubits: number | undefined): Channel | undefined {
    switch (kind) {
      case 'kraus':
        return this.readKraus(node, what);
      case 'choi':
      case 'superoperator':
      case 'ptm': {
        const m = this.readSquare(node, what, 2, kind === 'ptm' ? 'a Pauli transfer matrix' : kind === 'choi' ? 'a Choi matrix' : 'a superoperator');
        if (m === undefined) return undefined;
        return kind === 'choi' ? Channel.fromChoi(m) : kind === 'superoperator' ? Channel.fromSuperoperator(m) : Channel.fromPtm(m);
      }
      case 'stinespring':
        return this.readStinespring(node, what);
      case 'unitary':
        return this.readUnitary(node, what);
      case 'depolarizing': {
        const p = this.readReal(node, what, 0, 1);
        return p === undefined ? undefined : depolarizingChannel(qubits ?? 1, p);
      }
      case 'amplitude_damping':
      case 'phase_damping':
      case 'bit_flip':
      case 'phase_flip':
      case 'bit_phase_flip': {
        const p = this.readReal(node, what, 0, 1);
        if (p === undefined) return undefined;
        const make = {
          amplitude_damping: amplitudeDampingChannel,
          phase_damping: phaseDampingChannel,
          bit_flip: bitFlipChannel,
          phase_flip: phaseFlipChannel,
          bit_phase_flip: bitPhaseFlipChannel,
        }[kind];
        return power(make(p), qubits);
      }
      case 'pauli':
        return power(this.readPauli(node, what), qubits);
      case 'thermal':
        return power(this.readThermal(node, what), qubits);
      case 'sequence':
      case 'parallel':
        return this.readCombination(kind, node, what);
    }
  }

  private readKraus(node: YNode, what: string): Channel | undefined {
    if (node.kind !== 'seq' || node.items.length === 0) {
      this.problems.error(node.at, 'bad-channel', `${what} must be a non-empty list of matrices, not ${describe(node)}`);
      return undefined;
    }
    const ops: CMatrix[] = [];
    let ok = true;
    node.items.forEach((item, i) => {
      const m = readMatrix(item, `Kraus operator ${i + 1} of ${what}`, this.env, this.problems);
      if (m === undefined) return void (ok = false);
      if (m.rows !== m.cols || qubitsOfDim(m.rows) === undefined) {
        this.problems.error(item.at, 'bad-matrix', `Kraus operator ${i + 1} of ${what} is ${m.rows}×${m.cols}; expected 2^k × 2^k for k from 1 to ${MAX_CHANNEL_QUBITS}`);
        return void (ok = false);
      }
      if (ops.length > 0 && ops[0]!.rows !== m.rows) {
        this.problems.error(item.at, 'bad-matrix', `Kraus operator ${i + 1} of ${what} is ${m.rows}×${m.cols} but the first is ${ops[0]!.rows}×${ops[0]!.cols}`);
        return void (ok = false);
      }
      ops.push(m);
    });
    return ok ? Channel.fromKraus(ops) : undefined;
  }

  /** A 2^(power·k) square matrix for k from 1 to MAX_CHANNEL_QUBITS (power 2: d² × d²). */
  private readSquare(node: YNode, what: string, pow: number, noun: string): CMatrix | undefined {
    const m = readMatrix(node, what, this.env, this.problems);
    if (m === undefined) return undefined;
    const sizes = Array.from({ length: MAX_CHANNEL_QUBITS }, (_, i) => 1 << (pow * (i + 1)));
    if (m.rows !== m.cols || !sizes.includes(m.rows)) {
      this.problems.error(node.at, 'bad-matrix', `${what} is ${m.rows}×${m.cols}; ${noun} must be ${sizes.map((s) => `${s}×${s}`).join(', ')} (1 to ${MAX_CHANNEL_QUBITS} qubits)`);
      return undefined;
    }
    return m;
  }

  private readStinespring(node: YNode, what: string): Channel | undefined {
    const m = readMatrix(node, what, this.env, this.problems);
    if (m === undefined) return undefined;
    if (qubitsOfDim(m.cols) === undefined || m.rows % m.cols !== 0) {
      this.problems.error(node.at, 'bad-matrix', `${what} is ${m.rows}×${m.cols}; a Stinespring isometry is (d·r) × d with d = 2^k (k from 1 to ${MAX_CHANNEL_QUBITS}) columns and r environment levels`);
      return undefined;
    }
    return Channel.fromStinespring(m);
  }

  private readUnitary(node: YNode, what: string): Channel | undefined {
    if (node.kind === 'scalar' && typeof node.value === 'string') {
      const r = parseGateCall(node.value, this.env);
      if ('error' in r) {
        this.problems.error(offsetInto(node, r.offset), 'bad-gate', `${what}: ${r.error}`);
        return undefined;
      }
      return Channel.fromUnitary(r.matrix);
    }
    const m = this.readSquare(node, what, 1, 'a unitary');
    if (m === undefined) return undefined;
    const res = unitarityResidual(m);
    if (!(res <= UNITARITY_TOLERANCE)) {
      this.problems.error(node.at, 'not-unitary', `${what} is not unitary: the largest entry of U†U − I is ${res.toExponential(2)} (allowed ${UNITARITY_TOLERANCE})`);
      return undefined;
    }
    return Channel.fromUnitary(m);
  }

  private readPauli(node: YNode, what: string): Channel | undefined {
    const m = asMap(node, what, this.problems);
    if (m === undefined) return undefined;
    checkKeys(m, PAULI_KEYS, what, this.problems);
    const get = (k: string): number | undefined => {
      const e = entryOf(m, k);
      return e === undefined ? 0 : this.readReal(e.value, `'${k}' of ${what}`, 0, 1);
    };
    const x = get('x');
    const y = get('y');
    const z = get('z');
    if (x === undefined || y === undefined || z === undefined) return undefined;
    if (x + y + z > 1 + 1e-12) {
      this.problems.error(m.at, 'out-of-range', `${what}: x + y + z = ${x + y + z} exceeds 1; the identity keeps probability 1 − x − y − z`);
      return undefined;
    }
    return pauliChannel(x, y, z);
  }

  private readThermal(node: YNode, what: string): Channel | undefined {
    const m = asMap(node, what, this.problems);
    if (m === undefined) return undefined;
    checkKeys(m, THERMAL_KEYS, what, this.problems);
    let ok = true;
    const time = (key: 't1' | 't2' | 'time', positive: boolean): number | undefined => {
      const e = entryOf(m, key);
      if (e === undefined) return undefined;
      const ns = readDuration(e.value, `'${key}' of ${what}`, this.problems);
      if (ns === undefined) ok = false;
      else if (positive && !(ns > 0)) {
        this.problems.error(e.value.at, 'out-of-range', `'${key}' of ${what} must be longer than zero; leave it out for no relaxation`);
        ok = false;
      }
      return ns;
    };
    const t1 = time('t1', true) ?? Infinity;
    // as in a profile: no t2 means no dephasing beyond what T1 causes, t2 = 2·t1
    const t2 = time('t2', true) ?? 2 * t1;
    const tau = time('time', false);
    const ee = entryOf(m, 'excited');
    const excited = ee === undefined ? 0 : this.readReal(ee.value, `'excited' of ${what}`, 0, 1);
    if (!ok || excited === undefined) return undefined;
    if (tau === undefined) {
      this.problems.error(m.at, 'missing-key', `${what} needs 'time': how long the qubit relaxes, e.g. time: 200ns`);
      return undefined;
    }
    if (!t2WithinLimit(t1, t2)) {
      this.problems.error(entryOf(m, 't2')!.value.at, 'out-of-range', `'t2' of ${what} exceeds 2·t1 (${2 * t1} ns); no physical qubit dephases more slowly than that`);
      return undefined;
    }
    return thermalRelaxationChannel({ t1, t2, excited, time: tau });
  }

  private readCombination(kind: 'sequence' | 'parallel', node: YNode, what: string): Channel | undefined {
    if (node.kind !== 'seq' || node.items.length === 0) {
      this.problems.error(node.at, 'bad-channel', `${what} must be a non-empty list of channel names or definitions, not ${describe(node)}`);
      return undefined;
    }
    const parts: Channel[] = [];
    let ok = true;
    node.items.forEach((item, i) => {
      const where = `item ${i + 1} of ${what}`;
      let c: Channel | undefined;
      if (item.kind === 'scalar' && typeof item.value === 'string') c = this.reference(item, what);
      else if (item.kind === 'map') c = this.readDefinition(item, where)?.channel;
      else this.problems.error(item.at, 'bad-channel', `${where} must be a channel name or a definition map, not ${describe(item)}`);
      if (c === undefined) return void (ok = false);
      if (kind === 'sequence' && parts.length > 0 && c.qubits !== parts[0]!.qubits) {
        this.problems.error(item.at, 'bad-channel', `${where} acts on ${c.qubits} qubit(s) but item 1 on ${parts[0]!.qubits}; a sequence needs one register size`);
        return void (ok = false);
      }
      parts.push(c);
    });
    if (!ok) return undefined;
    if (kind === 'parallel') {
      const total = parts.reduce((n, c) => n + c.qubits, 0);
      if (total > MAX_CHANNEL_QUBITS) {
        this.problems.error(node.at, 'too-many-qubits', `${what} acts on ${total} qubits together; channels act on at most ${MAX_CHANNEL_QUBITS}`);
        return undefined;
      }
      return parallel(parts);
    }
    return sequence(parts);
  }

  /** A real number (a YAML number or an expression string) within [min, max]. */
  private readReal(node: YNode, what: string, min: number, max: number): number | undefined {
    let v: number;
    if (node.kind === 'scalar' && typeof node.value === 'number') v = node.value;
    else if (node.kind === 'scalar' && typeof node.value === 'string') {
      const r = evaluateReal(node.value, this.env);
      if ('error' in r) {
        this.problems.error(offsetInto(node, r.error.offset), 'bad-expression', `${what}: ${r.error.message}`);
        return undefined;
      }
      v = r.value;
    } else {
      this.problems.error(node.at, 'expected-number', `${what} must be a number between ${min} and ${max}, not ${describe(node)}`);
      return undefined;
    }
    if (!Number.isFinite(v) || v < min || v > max) {
      this.problems.error(node.at, 'out-of-range', `${what} must be between ${min} and ${max}, not ${v}`);
      return undefined;
    }
    return v;
  }
}

/** True when every entry of the channel's Choi matrix is exactly zero. */
function isZeroMap(c: Channel): boolean {
  return c.choi().data.every((x) => x === 0);
}

/** The channel on each of k qubits independently (its k-th tensor power); itself when k is 1 or not given. */
function power(c: Channel | undefined, k: number | undefined): Channel | undefined {
  if (c === undefined || k === undefined || k === 1) return c;
  return parallel(Array.from({ length: k }, () => c));
}
