/**
 * The JSON Schema parts of a noise profile (a device file, or a circuit's inline `noise:`),
 * built from the key tables of src/format/profileSpec.ts and src/format/noiseKindsSpec.ts.
 * What a key table cannot say is written beside the reader it mirrors.
 */
import { NOISE_KIND_KEYS } from '../../noise/kinds.js';
import { COHERENT_KEYS, PAULI_KEYS } from '../noiseKindsSpec.js';
import { COUPLING_KEYS, GATE_KEYS, PROFILE_KEYS, QUBIT_KEYS, READOUT_KEYS } from '../profileSpec.js';
import { keyedObject, type JsonSchema, type SchemaGap } from './keyedObject.js';
import { DURATION, FREQUENCY, NUMBER_OR_EXPRESSION, PROBABILITY, ref, TEXT } from './leaves.js';

/** Value schemas of the noise kinds (readNoiseKindEntry): probabilities, a Pauli map, a channel name. */
function noiseKindValues(gaps: SchemaGap[]): Record<string, JsonSchema> {
  const p = (description: string): JsonSchema => ({ ...PROBABILITY, description });
  return {
    error: p('average gate infidelity r of the whole gate channel; fray solves for the depolarizing probability that gives it'),
    depolarizing: p('k-qubit depolarizing probability p: ρ → (1 − p)ρ + p·I/d'),
    amplitude_damping: p('amplitude damping γ'),
    phase_damping: p('phase damping λ'),
    bit_flip: p('probability of X'),
    phase_flip: p('probability of Z'),
    bit_phase_flip: p('probability of Y'),
    pauli: keyedObject('pauli', PAULI_KEYS, { x: PROBABILITY, y: PROBABILITY, z: PROBABILITY }, gaps, {
      description: 'Pauli channel probabilities x, y, z (x + y + z ≤ 1)',
    }),
    channel: { type: 'string', description: "name of a custom channel from the circuit's 'channels:'" },
    coherent: keyedObject('coherent', COHERENT_KEYS, {
      x: { ...NUMBER_OR_EXPRESSION, description: 'over-rotation about X after the gate, radians' },
      y: { ...NUMBER_OR_EXPRESSION, description: 'over-rotation about Y after the gate, radians' },
      z: { ...NUMBER_OR_EXPRESSION, description: 'over-rotation about Z after the gate, radians' },
      zz: { ...NUMBER_OR_EXPRESSION, description: 'ZZ rotation of a 2-qubit gate, radians' },
    }, gaps, { description: 'coherent (unitary) gate error: rotation angles in radians, acting right after the gate' }),
  };
}

/** `$defs` of a noise profile: the profile itself and its entries. */
export function profileDefs(gaps: SchemaGap[]): Record<string, JsonSchema> {
  const kinds = noiseKindValues(gaps);
  const gateValues: Record<string, JsonSchema> = {
    duration: DURATION,
    thermal: { type: 'boolean', description: 'whether the qubits relax (t1, t2) during the gate (default true)' },
    latency: { ...DURATION, description: "the 'measure' entry: classical delay from a measurement's end to a step conditioned on its bit" },
    split: { type: 'boolean', description: "a composite gate's entry: run it as its parts, each scheduled and noisy on its own" },
    simultaneous: { type: 'boolean', description: "the 'measure' entry: a measure step's readouts start together" },
    ...kinds,
  };
  const gateEntry = keyedObject('profile gate entry', GATE_KEYS, gateValues, gaps, {
    description: "a gate's duration and noise: 'all', a gate name, or a gate on given qubits such as \"cx 1 2\"",
  });
  // checkMeasureEntry (src/noise/profile.ts): a measurement takes only a duration and 'simultaneous'.
  const measureEntry: JsonSchema = {
    type: 'object',
    description: "the measurement's duration; its errors are the qubits' 'readout' probabilities",
    properties: { duration: DURATION, simultaneous: gateValues['simultaneous']!, latency: gateValues['latency']! },
    additionalProperties: false,
  };
  // checkResetEntry (src/noise/profile.ts): a duration and noise kinds, but no 'error' or 'coherent' (no unitary to compare with or rotate).
  const resetKeys = GATE_KEYS.filter((k) => !['thermal', 'latency', 'split', 'simultaneous', 'error', 'coherent'].includes(k));
  const resetEntry: JsonSchema = {
    type: 'object',
    description: "the reset's duration and the noise after it (no 'thermal', 'error' or 'coherent')",
    properties: Object.fromEntries(resetKeys.map((k) => [k, gateValues[k] ?? {}])),
    additionalProperties: false,
  };
  const readout: JsonSchema = {
    description: 'readout error: one probability (symmetric), or zero_as_one and one_as_zero',
    anyOf: [
      PROBABILITY,
      keyedObject('readout', READOUT_KEYS, {
        zero_as_one: { ...PROBABILITY, description: 'P(read 1 | prepared 0)' },
        one_as_zero: { ...PROBABILITY, description: 'P(read 0 | prepared 1)' },
      }, gaps),
    ],
  };
  const qubitEntry = keyedObject('profile qubit entry', QUBIT_KEYS, {
    t1: { ...DURATION, description: 'energy relaxation time T1 (a duration above zero)' },
    t2: { ...DURATION, description: 'dephasing time T2 (at most 2·t1; default 2·t1)' },
    excited: { ...PROBABILITY, description: 'equilibrium excited-state population p_e' },
    readout,
    detuning: { ...FREQUENCY, description: "the qubit's detuning from its drive frame (drift about Z)" },
  }, gaps, { description: "a qubit's relaxation and readout: 'all', an index or a label" });
  const profile = keyedObject('noise profile', PROFILE_KEYS, {
    name: { ...TEXT, description: "the device's name, shown in reports" },
    qubits: { type: 'object', description: "per-qubit entries: 'all', an index or a label", additionalProperties: ref('qubitEntry') },
    couplings: {
      description: 'the coupling map: pairs "a b" → { zz: frequency } (or {} for a coupling without ZZ); gates between uncoupled qubits are warned about',
      anyOf: [
        { type: 'null' },
        {
          type: 'object',
          propertyNames: { pattern: '^\\s*\\S+\\s+\\S+\\s*$' },
          additionalProperties: { anyOf: [{ type: 'null' }, ref('couplingEntry')] },
        },
      ],
    },
    gates: {
      type: 'object',
      description: "per-gate entries: 'all', a gate name, \"name q1 q2 …\", measure, reset",
      properties: { measure: ref('measureEntry'), reset: ref('resetEntry') },
      additionalProperties: ref('gateEntry'),
    },
    idle: { enum: ['thermal', 'none'], description: 'whether idle windows relax (default thermal)' },
    schedule: { enum: ['asap', 'alap'], description: 'schedule policy (default asap)' },
  }, gaps, { description: 'a noise profile: qubit relaxation and readout, gate durations and noise, idle and schedule policy' });
  const noiseKinds = keyedObject('noise kinds', NOISE_KIND_KEYS, kinds, gaps, { description: 'noise kinds that replace the profile\'s for this step' });
  const couplingEntry = keyedObject('coupling entry', COUPLING_KEYS, { zz: { ...FREQUENCY, description: 'always-on ZZ strength ζ of the pair' } }, gaps);
  return { profile, qubitEntry, gateEntry, measureEntry, resetEntry, couplingEntry, noiseKinds };
}
