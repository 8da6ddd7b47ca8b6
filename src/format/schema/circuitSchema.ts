/**
 * The JSON Schema parts of a circuit file, built from the key tables of src/format/
 * (CIRCUIT_KEYS, STEP_ACTIONS, STEP_MODIFIERS, COMPOSITE_GATE_KEYS, CHANNEL_DEFINITION_KEYS,
 * THERMAL_KEYS) and the built-in gate table. Custom gate names cannot be known to a schema,
 * so a step also accepts any other word as a gate name; fray itself checks those names.
 */
import { MAX_CHANNEL_QUBITS } from '../../channels/conventions.js';
import { BUILTIN_GATES, OPENQASM_NAMED_GATES } from '../../circuit/gates.js';
import { RESERVED_NAMES } from '../../circuit/expression.js';
import { CHANNEL_DEFINITION_KEYS, CHANNEL_FORM_KEYS, THERMAL_KEYS } from '../channelDefinitions.js';
import { CIRCUIT_KEYS } from '../circuitFile.js';
import { COMPOSITE_GATE_KEYS, MAX_CUSTOM_GATE_QUBITS } from '../gateLibrary.js';
import { PAULI_KEYS } from '../noiseKindsSpec.js';
import { BIT_NAME } from '../record.js';
import { MAX_DECLARED_QUBITS } from '../register.js';
import { AMPLIFY_KINDS, MITIGATION_DD_KEYS, MITIGATION_KEYS, MITIGATION_TWIRL_KEYS, MITIGATION_ZNE_KEYS } from '../mitigationBlock.js';
import { FIT_KINDS } from '../../mitigation/extrapolate.js';
import { READOUT_METHODS } from '../../mitigation/readoutCorrection.js';
import { DECOUPLING_SEQUENCES } from '../../transforms/sequences.js';
import { MAX_TWIRL_INSTANCES } from '../../transforms/twirl.js';
import { STEP_ACTIONS, STEP_MODIFIERS } from '../stepShape.js';
import { keyedObject, type JsonSchema, type SchemaGap } from './keyedObject.js';
import { DURATION, MATRIX, NUMBER_OR_EXPRESSION, QUBIT_REF, ref, TARGET, TEXT, WORD_PATTERN } from './leaves.js';

/** Modifiers a gate inside a composite gate takes (GateLibrary.readCompositeSteps). */
const COMPOSITE_STEP_MODIFIERS = ['angle', 'angles', 'label'] as const;

/** `$defs` of a circuit file besides those of the noise profile. */
export function circuitDefs(gaps: SchemaGap[]): Record<string, JsonSchema> {
  const gateNames = [...BUILTIN_GATES.keys()];
  const byGate = Object.fromEntries(gateNames.map((g) => [g, { ...ref('target'), description: gateDescription(g) }]));
  const modifierValues: Record<string, JsonSchema> = {
    angle: { ...NUMBER_OR_EXPRESSION, description: 'the angle of a one-angle gate, in radians (or with deg)' },
    angles: { anyOf: [NUMBER_OR_EXPRESSION, { type: 'array', minItems: 1, items: NUMBER_OR_EXPRESSION }], description: 'the angles of a several-angle gate, in order' },
    noise: { anyOf: [{ const: 'none' }, ref('noiseKinds')], description: "noise kinds that replace the profile's for this step, or none; with 'on' and no action: a standalone noise step" },
    for: { ...DURATION, description: 'how long an idle step waits' },
    on: { ...ref('target'), description: 'the qubits of a standalone noise step' },
    label: { ...TEXT, description: 'a label shown in reports' },
    into: { anyOf: [ref('bitName'), { type: 'array', minItems: 1, items: ref('bitName') }], description: 'record mode: the bit (one per measured qubit, in order) the measurement writes' },
    if: {
      anyOf: [ref('bitName'), { type: 'object', minProperties: 1, propertyNames: { pattern: BIT_NAME.source }, additionalProperties: { enum: [0, 1] } }],
      description: 'record mode: run this step only when the bit reads 1 (a name), or when the bits read the given values (a map)',
    },
  };
  const actionValues = Object.fromEntries(STEP_ACTIONS.map((a) => [a, { ...ref('target'), description: ACTION_DESCRIPTIONS[a] }]));
  const modifiers = keyedObject('step modifiers', STEP_MODIFIERS, modifierValues, gaps);
  const stepProperties = { ...byGate, ...actionValues, ...(modifiers['properties'] as Record<string, JsonSchema>) };
  const step: JsonSchema = {
    type: 'object',
    description: 'one step: exactly one action (a gate name, idle, barrier, measure, reset) with its modifiers, or a standalone noise step',
    minProperties: 1,
    properties: stepProperties,
    patternProperties: { [otherWord(Object.keys(stepProperties))]: { ...ref('target'), description: 'a custom gate of this circuit' } },
    additionalProperties: false,
    // an action step takes only its own modifiers (and idle needs 'for')
    allOf: STEP_ACTIONS.map((a) => ({
      if: { required: [a] },
      then: { propertyNames: { enum: [a, ...ACTION_MODIFIERS[a]] }, ...(a === 'idle' ? { required: ['for'] } : {}) },
    })),
  };
  const compositeProperties = { ...byGate, ...Object.fromEntries(COMPOSITE_STEP_MODIFIERS.map((m) => [m, modifierValues[m]!])) };
  const compositeStep: JsonSchema = {
    type: 'object',
    description: 'a gate applied inside a composite gate, on its local qubits 0..k−1',
    minProperties: 1,
    properties: compositeProperties,
    patternProperties: { [otherWord(Object.keys(compositeProperties))]: ref('target') },
    additionalProperties: false,
  };
  const matrixGate = keyedObject('matrix gate', ['matrix'], { matrix: { ...MATRIX, description: 'a 2^k × 2^k unitary, k from 1 to ' + MAX_CUSTOM_GATE_QUBITS } }, gaps, {
    required: ['matrix'],
  });
  const compositeGate = keyedObject('composite gate', COMPOSITE_GATE_KEYS, {
    qubits: { type: 'integer', minimum: 1, maximum: MAX_CUSTOM_GATE_QUBITS, description: 'how many qubits the gate acts on' },
    params: { type: 'array', items: { type: 'string', pattern: WORD_PATTERN, not: { enum: [...RESERVED_NAMES] } }, description: 'names of its angles, in order' },
    steps: { type: 'array', minItems: 1, items: ref('compositeStep') },
  }, gaps, { required: ['qubits', 'steps'] });
  const channelValues: Record<string, JsonSchema> = {
    kraus: { type: 'array', minItems: 1, items: MATRIX, description: 'Kraus operators, 2^k × 2^k each' },
    choi: { ...MATRIX, description: 'Choi matrix, 4^k × 4^k, input factor first, unnormalised' },
    superoperator: { ...MATRIX, description: 'superoperator on column-stacked vec(ρ), 4^k × 4^k' },
    ptm: { ...MATRIX, description: 'Pauli transfer matrix, 4^k × 4^k' },
    stinespring: { ...MATRIX, description: 'isometry (2^k·r) × 2^k, environment last' },
    unitary: { anyOf: [MATRIX, { type: 'string' }], description: "a unitary matrix, or a built-in gate call such as 'rz(pi/4)'" },
    depolarizing: NUMBER_OR_EXPRESSION,
    amplitude_damping: NUMBER_OR_EXPRESSION,
    phase_damping: NUMBER_OR_EXPRESSION,
    bit_flip: NUMBER_OR_EXPRESSION,
    phase_flip: NUMBER_OR_EXPRESSION,
    bit_phase_flip: NUMBER_OR_EXPRESSION,
    pauli: keyedObject('channel pauli', PAULI_KEYS, { x: NUMBER_OR_EXPRESSION, y: NUMBER_OR_EXPRESSION, z: NUMBER_OR_EXPRESSION }, gaps),
    thermal: keyedObject('channel thermal', THERMAL_KEYS, { t1: DURATION, t2: DURATION, time: DURATION, excited: NUMBER_OR_EXPRESSION }, gaps, { required: ['time'] }),
    sequence: { type: 'array', minItems: 1, items: { anyOf: [{ type: 'string' }, ref('channel')] }, description: 'channels applied one after the other (names or definitions)' },
    parallel: { type: 'array', minItems: 1, items: { anyOf: [{ type: 'string' }, ref('channel')] }, description: 'channels side by side, the first on the leftmost qubits' },
    qubits: { type: 'integer', minimum: 1, maximum: MAX_CHANNEL_QUBITS, description: 'how many qubits the channel acts on' },
  };
  const channel: JsonSchema = {
    ...keyedObject('channel definition', CHANNEL_DEFINITION_KEYS, channelValues, gaps, { description: 'a channel definition: exactly one form key, and optionally qubits' }),
    // readDefinition: exactly one form key.
    oneOf: CHANNEL_FORM_KEYS.map((f) => ({ required: [f] })),
  };
  const circuit = keyedObject('circuit file', CIRCUIT_KEYS, {
    name: { ...TEXT, description: 'text shown in reports (default: the file name)' },
    qubits: {
      description: `a count n (qubits 0..n−1, at most ${MAX_DECLARED_QUBITS}) or a list of unique labels`,
      anyOf: [
        { type: 'integer', minimum: 1, maximum: MAX_DECLARED_QUBITS },
        { type: 'array', minItems: 1, maxItems: MAX_DECLARED_QUBITS, uniqueItems: true, items: { type: ['string', 'number'], not: { const: 'all' } } },
      ],
    },
    device: { type: 'string', description: 'path of a noise profile, relative to this file' },
    noise: { ...ref('profile'), description: 'an inline noise profile, merged over the device field by field' },
    params: {
      type: 'object',
      description: 'parameters: name → number or expression (may use earlier ones)',
      propertyNames: { pattern: WORD_PATTERN, not: { enum: [...RESERVED_NAMES] } },
      additionalProperties: NUMBER_OR_EXPRESSION,
    },
    gates: {
      type: 'object',
      description: 'custom gates: a matrix, or qubits + params + steps (a composite); built-in names are reserved except the OpenQASM-named ones, which a custom gate may redefine',
      propertyNames: { pattern: WORD_PATTERN, not: { enum: [...new Set([...gateNames.filter((g) => !OPENQASM_NAMED_GATES.has(g)), ...STEP_ACTIONS, ...STEP_MODIFIERS, 'noise', 'all'])] } },
      additionalProperties: { anyOf: [ref('matrixGate'), ref('compositeGate')] },
    },
    channels: { type: 'object', description: 'custom channels by name', additionalProperties: ref('channel') },
    observe: {
      description: 'Pauli strings to report ⟨P⟩ for: one letter I, X, Y, Z per qubit, qubit 0 leftmost',
      anyOf: [ref('pauliString'), { type: 'array', items: ref('pauliString') }],
    },
    mitigation: ref('mitigation'),
    expect: { type: 'array', items: { type: 'string' }, description: "conditions the run must meet, e.g. 'state >= 0.9' (a failed one exits 3)" },
    bits: { type: 'array', items: ref('bitName'), uniqueItems: true, description: 'record mode: the order of the record bits (leftmost first)' },
    steps: { type: 'array', minItems: 1, items: ref('step'), description: 'the steps, executed in order' },
  }, gaps, { description: 'a fray circuit file', required: ['qubits', 'steps'] });
  // readMitigation (src/format/mitigationBlock.ts)
  const seed = { type: 'integer', description: 'seed of the random choices' };
  const mitigation = keyedObject('mitigation', MITIGATION_KEYS, {
    dd: keyedObject('mitigation dd', MITIGATION_DD_KEYS, { sequence: { enum: [...DECOUPLING_SEQUENCES] }, min_idle: DURATION }, gaps, { required: ['sequence'], description: 'dynamical decoupling in idle windows' }),
    twirl: {
      anyOf: [{ type: 'boolean' }, keyedObject('mitigation twirl', MITIGATION_TWIRL_KEYS, { instances: { type: 'integer', minimum: 1, maximum: MAX_TWIRL_INSTANCES }, seed }, gaps)],
      description: 'Pauli twirling: true, or instances and seed',
    },
    zne: keyedObject('mitigation zne', MITIGATION_ZNE_KEYS, {
      scales: { type: 'array', items: { type: 'number' }, description: 'noise scales, 1 first' },
      fit: { enum: [...FIT_KINDS] },
      amplify: { enum: [...AMPLIFY_KINDS] },
      fold: { enum: ['end', 'random'] },
      seed,
    }, gaps, { description: 'zero-noise extrapolation' }),
    readout: { enum: [...READOUT_METHODS], description: 'readout-error correction' },
  }, gaps, { description: 'error-mitigation recipe' });
  return {
    mitigation,
    circuit,
    step,
    compositeStep,
    matrixGate,
    compositeGate,
    channel,
    target: TARGET,
    qubit: QUBIT_REF,
    pauliString: { type: 'string', pattern: '^[IXYZ]+$' },
    bitName: { type: 'string', pattern: BIT_NAME.source, description: 'a record bit: a word, or a word with an index such as c[3]' },
  };
}

/**
 * The modifiers each action takes (readSteps in src/format/steps.ts checks them one action
 * at a time); test/format/schema.test.ts tries every action with every modifier in fray
 * and in the schema, so the two cannot drift apart.
 */
export const ACTION_MODIFIERS: Readonly<Record<(typeof STEP_ACTIONS)[number], readonly (typeof STEP_MODIFIERS)[number][]>> = {
  idle: ['for', 'label'],
  barrier: ['label'],
  measure: ['label', 'into'],
  reset: ['noise', 'label', 'if'],
};

const ACTION_DESCRIPTIONS: Readonly<Record<(typeof STEP_ACTIONS)[number], string>> = {
  idle: "qubits that wait (each) for the step's 'for'",
  barrier: 'qubits (together) that line up in time, or all',
  measure: 'qubits to measure (each); measurement is terminal',
  reset: 'qubits to reset to |0⟩ (each)',
};

/** A pattern for a word (a custom gate name) other than the listed keys, which have schemas of their own. */
function otherWord(known: readonly string[]): string {
  return `^(?!(?:${known.join('|')})$)${WORD_PATTERN.slice(1)}`;
}

function gateDescription(name: string): string {
  const g = BUILTIN_GATES.get(name)!;
  const angles = g.params.length === 0 ? '' : ` (${g.params.join(', ')}: ${g.params.length === 1 ? "'angle'" : "'angles'"})`;
  return `built-in ${g.qubits}-qubit gate ${g.name}${angles}`;
}
