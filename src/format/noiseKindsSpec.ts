import { NOISE_KIND_KEYS, type NoiseKinds } from '../noise/kinds.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { readAngle } from './angles.js';
import { asMap, checkKeys, readProbability, readString, unknownKey, type NumberEnv } from './read.js';
import type { YEntry, YMap } from './yamlTree.js';

/** A value with the position of the key or value it was read from. */
export interface Loc<T> {
  readonly value: T;
  readonly at: SourcePosition;
}

/** Noise kinds as read from a file, each with its position (validated, not yet resolved). */
export type NoiseKindsSpec = { -readonly [K in Exclude<keyof NoiseKinds, 'coherent'>]?: Loc<NonNullable<NoiseKinds[K]>> } & {
  /** `zzAt`: where its `zz` key is, for the arity check (zz needs a 2-qubit application). */
  coherent?: Loc<NonNullable<NoiseKinds['coherent']>> & { readonly zzAt?: SourcePosition };
};

/** The position of a `coherent: {zz: …}` that may not be used on an application of `arity` qubits, if any. */
export function misplacedZz(kinds: NoiseKindsSpec, arity: number): SourcePosition | undefined {
  const c = kinds.coherent;
  return c !== undefined && c.zzAt !== undefined && arity !== 2 ? c.zzAt : undefined;
}

/** The keys of a `pauli:` map: the X, Y and Z probabilities. */
export const PAULI_KEYS = ['x', 'y', 'z'] as const;

/** True when `key` names a noise kind. */
export function isNoiseKindKey(key: string): boolean {
  return (NOISE_KIND_KEYS as readonly string[]).includes(key);
}

/** Fields of a `coherent:` entry: rotation angles (radians) about X, Y, Z of each qubit, and the ZZ angle of a pair. */
export const COHERENT_KEYS = ['x', 'y', 'z', 'zz'] as const;

/**
 * Reads one noise-kind entry (e.g. `depolarizing: 0.01`, `pauli: {x: 0.01}`) into `into`.
 * Returns false when the key is not a noise kind (the caller decides what else it may be).
 * `env` holds the names an angle expression of `coherent:` may use (the circuit's params
 * inside a circuit file; none in a device file).
 */
export function readNoiseKindEntry(
  e: YEntry,
  into: NoiseKindsSpec,
  where: string,
  problems: ProblemList,
  env?: NumberEnv,
): boolean {
  const what = `'${e.key}' in ${where}`;
  switch (e.key) {
    case 'error':
    case 'depolarizing':
    case 'amplitude_damping':
    case 'phase_damping':
    case 'bit_flip':
    case 'phase_flip':
    case 'bit_phase_flip': {
      const p = readProbability(e.value, what, problems, env);
      if (p !== undefined) into[e.key] = { value: p, at: e.value.at };
      return true;
    }
    case 'pauli': {
      const m = asMap(e.value, what, problems);
      if (m === undefined) return true;
      checkKeys(m, PAULI_KEYS, what, problems);
      const get = (k: 'x' | 'y' | 'z'): number | undefined => {
        const ent = m.entries.find((x) => x.key === k);
        return ent === undefined ? 0 : readProbability(ent.value, `'${k}' of ${what}`, problems, env);
      };
      const x = get('x');
      const y = get('y');
      const z = get('z');
      if (x === undefined || y === undefined || z === undefined) return true;
      if (x + y + z > 1 + 1e-12) {
        problems.error(m.at, 'out-of-range', `${what}: x + y + z = ${x + y + z} exceeds 1; the identity keeps probability 1 − x − y − z`);
        return true;
      }
      into.pauli = { value: { x, y, z }, at: e.value.at };
      return true;
    }
    case 'coherent': {
      const m = asMap(e.value, `${what} (angles in radians: x, y, z, zz)`, problems);
      if (m === undefined) return true;
      checkKeys(m, COHERENT_KEYS, what, problems);
      const angles = { x: 0, y: 0, z: 0, zz: 0 };
      let ok = true;
      for (const ent of m.entries) {
        if (!(COHERENT_KEYS as readonly string[]).includes(ent.key)) continue;
        const v = readAngle(ent.value, `'${ent.key}' of ${what}`, env ?? {}, problems);
        if (v === undefined) ok = false;
        else angles[ent.key as (typeof COHERENT_KEYS)[number]] = v;
      }
      if (!ok) return true;
      const zzAt = m.entries.find((x) => x.key === 'zz')?.keyAt;
      into.coherent = { value: angles, at: e.value.at, ...(zzAt !== undefined ? { zzAt } : {}) };
      return true;
    }
    case 'channel': {
      const name = readString(e.value, what, problems);
      if (name !== undefined) into.channel = { value: name, at: e.value.at };
      return true;
    }
    default:
      return false;
  }
}

/** Reads a whole map of noise kinds (a step's `noise:` annotation or a standalone noise step). */
export function readNoiseKinds(
  map: YMap,
  where: string,
  problems: ProblemList,
  allowError = true,
  env?: NumberEnv,
): NoiseKindsSpec {
  const kinds: NoiseKindsSpec = {};
  const allowed = NOISE_KIND_KEYS.filter((k) => allowError || k !== 'error');
  for (const e of map.entries) {
    if (!allowError && e.key === 'error') {
      problems.error(e.keyAt, 'error-needs-gate', `'error' in ${where} needs a gate to measure the infidelity against; use depolarizing or another kind here`);
      continue;
    }
    if (!readNoiseKindEntry(e, kinds, where, problems, env)) unknownKey(e, allowed, where, problems);
  }
  checkErrorAndDepolarizing(kinds, where, problems);
  return kinds;
}

/** `error` and `depolarizing` in one entry is an input error (they would both set the depolarizing part). */
export function checkErrorAndDepolarizing(kinds: NoiseKindsSpec, where: string, problems: ProblemList): void {
  if (kinds.error !== undefined && kinds.depolarizing !== undefined) {
    const later = kinds.error.at.line > kinds.depolarizing.at.line ? kinds.error : kinds.depolarizing;
    problems.error(later.at, 'error-and-depolarizing', `${where} gives both 'error' and 'depolarizing'; give one: 'error' solves for the depolarizing probability`);
    delete kinds.depolarizing;
  }
}

/** The plain NoiseKinds of a spec (positions dropped). */
export function plainKinds(spec: NoiseKindsSpec): NoiseKinds {
  const out: { [k: string]: unknown } = {};
  for (const [k, v] of Object.entries(spec)) if (v !== undefined) out[k] = (v as Loc<unknown>).value;
  return out as NoiseKinds;
}
