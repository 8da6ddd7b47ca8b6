import type { Circuit, Operation } from '../circuit/circuit.js';
import type { NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import type { ProblemList, SourcePosition } from '../format/problem.js';
import type { NoiseKinds } from './kinds.js';
import type { GateEntry, NoiseProfile, QubitNoise } from './profile.js';

/**
 * The uniform noise scale C ≥ 0 (`--noise-scale`, the `noise-scale` sweep key, and the
 * noise amplification of zero-noise extrapolation): every noise *strength* is multiplied
 * by C — the rates 1/T1 and 1/T2 (so T1 → T1/C, T2 → T2/C), each noise-kind probability
 * (each Pauli component), `error`, both readout errors, and the coherent errors: each
 * detuning, each coupling's ZZ strength, each `coherent:` angle. Durations and the equilibrium
 * excited population are not strengths and stay; a custom channel has no strength
 * parameter and stays as it is, with a warning. C = 0 is the noiseless device.
 *
 * The tables below say how each field scales, so a new noise field is made scalable by
 * one row (and a field missing from them fails to compile).
 */

/**
 * How a noise-kind field responds to the scale: a probability times C, each component
 * (of a Pauli distribution, bounded by a sum of 1) times C, each angle times C (unbounded),
 * or unchanged.
 */
export type KindScaling = 'probability' | 'components' | 'angles' | 'unscalable';

/** The scaling of every noise kind (data, so a new kind is one row). */
export const KIND_SCALING: { readonly [K in keyof Required<NoiseKinds>]: KindScaling } = {
  error: 'probability',
  depolarizing: 'probability',
  amplitude_damping: 'probability',
  phase_damping: 'probability',
  bit_flip: 'probability',
  phase_flip: 'probability',
  bit_phase_flip: 'probability',
  pauli: 'components',
  coherent: 'angles',
  channel: 'unscalable',
};

/** How a per-qubit field responds: a time (divided by C, as its rate is multiplied), a strength times C (either sign), a probability pair times C, or unchanged. */
export const QUBIT_SCALING: { readonly [K in keyof QubitNoise]: 'time' | 'strength' | 'probability pair' | 'fixed' } = {
  t1: 'time',
  t2: 'time',
  excited: 'fixed',
  readout: 'probability pair',
  detuning: 'strength',
};

/** Tolerance on a scaled Pauli sum x + y + z ≤ 1 (the same slack as the reader's). */
export const SCALED_SUM_TOLERANCE = 1e-12;

/** A time scaled as a rate: T/C, with C = 0 meaning no decay (∞). */
function scaleTime(t: number, c: number): number {
  return c === 0 ? Infinity : t / c;
}

/** Scales a map of noise kinds; a value leaving its range is an input error naming the scale. */
export function scaleKinds(kinds: NoiseKindsSpec, c: number, where: string, fallbackAt: SourcePosition, problems: ProblemList): NoiseKindsSpec {
  const out: NoiseKindsSpec = {};
  const label = `--noise-scale ${c}`;
  for (const key of Object.keys(kinds) as (keyof NoiseKindsSpec)[]) {
    const loc = kinds[key];
    if (loc === undefined) continue;
    const at = loc.at ?? fallbackAt;
    switch (KIND_SCALING[key]) {
      case 'probability': {
        const v = (loc.value as number) * c;
        if (v > 1) problems.error(at, 'scaled-out-of-range', `${label}: '${key}' of ${where} is ${String(loc.value)} and would become ${v}, above 1`);
        (out as Record<string, unknown>)[key] = { value: Math.min(v, 1), at };
        break;
      }
      case 'components': {
        const p = loc.value as { x: number; y: number; z: number };
        const s = { x: p.x * c, y: p.y * c, z: p.z * c };
        if (s.x + s.y + s.z > 1 + SCALED_SUM_TOLERANCE) {
          problems.error(at, 'scaled-out-of-range', `${label}: 'pauli' of ${where} would have x + y + z = ${s.x + s.y + s.z}, above 1`);
        }
        out.pauli = { value: s, at };
        break;
      }
      case 'angles': {
        const a = loc.value as Record<string, number>;
        const scaled: Record<string, number> = {};
        for (const [k, v] of Object.entries(a)) if (typeof v === 'number') scaled[k] = v * c;
        (out as Record<string, unknown>)[key] = { ...loc, value: scaled };
        break;
      }
      case 'unscalable':
        problems.warn(at, 'channel-not-scaled', `${label}: custom channel '${String(loc.value)}' of ${where} has no strength to scale and is applied as it is`);
        (out as Record<string, unknown>)[key] = loc;
        break;
    }
  }
  return out;
}

/** Scales one qubit's relaxation and readout (see QUBIT_SCALING). */
function scaleQubit(q: QubitNoise, c: number): { noise: QubitNoise; above1: boolean } {
  const out: Record<string, unknown> = {};
  let above1 = false;
  for (const key of Object.keys(QUBIT_SCALING) as (keyof QubitNoise)[]) {
    switch (QUBIT_SCALING[key]) {
      case 'time':
        out[key] = scaleTime(q[key] as number, c);
        break;
      case 'strength':
        out[key] = (q[key] as number) * c;
        break;
      case 'probability pair': {
        const r = q.readout;
        above1 ||= r.zeroAsOne * c > 1 || r.oneAsZero * c > 1;
        out[key] = { zeroAsOne: Math.min(1, r.zeroAsOne * c), oneAsZero: Math.min(1, r.oneAsZero * c) };
        break;
      }
      case 'fixed':
        out[key] = q[key];
        break;
    }
  }
  return { noise: out as unknown as QubitNoise, above1 };
}

/**
 * The circuit and profile with every noise strength multiplied by `c` (profile entries,
 * step `noise:` annotations and standalone noise steps). Range errors and the custom-channel
 * warning go into `problems`, checked for every entry the circuit uses.
 */
export function scaleNoise(circuit: Circuit, profile: NoiseProfile, c: number, problems: ProblemList): { circuit: Circuit; profile: NoiseProfile } {
  if (!(c >= 0) || !Number.isFinite(c)) throw new RangeError(`scaleNoise: the scale must be a finite number ≥ 0, not ${c}`);
  const qubits = profile.qubits.map((q, i) => {
    const s = scaleQubit(q, c);
    if (s.above1) problems.error(circuit.qubitsAt, 'scaled-out-of-range', `--noise-scale ${c}: the readout error of qubit ${i} would exceed 1`);
    return s.noise;
  });
  const cache = new Map<string, GateEntry>();
  const scaleEntry = (e: GateEntry, where: string, at: SourcePosition): GateEntry => ({ ...e, kinds: scaleKinds(e.kinds, c, where, at, problems) });
  const reset = scaleEntry(profile.reset, "gate entry 'reset'", circuit.stepsAt);
  // Each gate entry is scaled once and its problems reported once, when the circuit first uses it.
  const gateEntry = (name: string, qs: readonly number[], at: SourcePosition = circuit.stepsAt): GateEntry => {
    const key = `${name} ${qs.join(' ')}`;
    let e = cache.get(key);
    if (e === undefined) {
      e = scaleEntry(profile.gateEntry(name, qs), `the profile's entry for ${name} on ${qs.join(', ')}`, at);
      cache.set(key, e);
    }
    return e;
  };
  const operations = circuit.operations.map((op): Operation => {
    if (op.kind === 'gate') gateEntry(op.name, op.qubits, op.at);
    if ((op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel') && op.noise !== undefined) {
      return { ...op, noise: { kinds: scaleKinds(op.noise.kinds, c, `step ${op.step + 1}`, op.noise.at, problems), at: op.noise.at } } as Operation;
    }
    return op;
  });
  return {
    circuit: { ...circuit, operations },
    profile: {
      ...profile,
      qubits,
      // each coupling's always-on ZZ strength is a rate like a detuning
      couplings: profile.couplings === null ? null : profile.couplings.map((cp) => ({ ...cp, zz: cp.zz * c })),
      reset,
      gateEntry: (name, qs) => gateEntry(name, qs),
    },
  };
}
