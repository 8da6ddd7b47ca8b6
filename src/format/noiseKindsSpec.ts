import { NOISE_KIND_KEYS, type NoiseKinds } from '../noise/kinds.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { asMap, checkKeys, readProbability, readString, unknownKey } from './read.js';
import type { YEntry, YMap } from './yamlTree.js';

/** A value with the position of the key or value it was read from. */
export interface Loc<T> {
  readonly value: T;
  readonly at: SourcePosition;
}

/** Noise kinds as read from a file, each with its position (validated, not yet resolved). */
export type NoiseKindsSpec = { -readonly [K in keyof NoiseKinds]?: Loc<NonNullable<NoiseKinds[K]>> };

/** The keys of a `pauli:` map: the X, Y and Z probabilities. */
export const PAULI_KEYS = ['x', 'y', 'z'] as const;

/** True when `key` names a noise kind. */
export function isNoiseKindKey(key: string): boolean {
  return (NOISE_KIND_KEYS as readonly string[]).includes(key);
}

/**
 * Reads one noise-kind entry (e.g. `depolarizing: 0.01`, `pauli: {x: 0.01}`) into `into`.
 * Returns false when the key is not a noise kind (the caller decides what else it may be).
 */
export function readNoiseKindEntry(e: YEntry, into: NoiseKindsSpec, where: string, problems: ProblemList): boolean {
  const what = `'${e.key}' in ${where}`;
  switch (e.key) {
    case 'error':
    case 'depolarizing':
    case 'amplitude_damping':
    case 'phase_damping':
    case 'bit_flip':
    case 'phase_flip':
    case 'bit_phase_flip': {
      const p = readProbability(e.value, what, problems);
      if (p !== undefined) into[e.key] = { value: p, at: e.value.at };
      return true;
    }
    case 'pauli': {
      const m = asMap(e.value, what, problems);
      if (m === undefined) return true;
      checkKeys(m, PAULI_KEYS, what, problems);
      const get = (k: 'x' | 'y' | 'z'): number | undefined => {
        const ent = m.entries.find((x) => x.key === k);
        return ent === undefined ? 0 : readProbability(ent.value, `'${k}' of ${what}`, problems);
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
export function readNoiseKinds(map: YMap, where: string, problems: ProblemList, allowError = true): NoiseKindsSpec {
  const kinds: NoiseKindsSpec = {};
  const allowed = NOISE_KIND_KEYS.filter((k) => allowError || k !== 'error');
  for (const e of map.entries) {
    if (!allowError && e.key === 'error') {
      problems.error(e.keyAt, 'error-needs-gate', `'error' in ${where} needs a gate to measure the infidelity against; use depolarizing or another kind here`);
      continue;
    }
    if (!readNoiseKindEntry(e, kinds, where, problems)) unknownKey(e, allowed, where, problems);
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
  for (const [k, v] of Object.entries(spec)) if (v !== undefined) out[k] = v.value;
  return out as NoiseKinds;
}
