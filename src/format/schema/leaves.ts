/**
 * The small value schemas every fray file shares: durations, probabilities, numbers or
 * expressions, qubit references and step targets, matrices. Each mirrors one reader of
 * src/format/read.ts (or its sibling) and names it.
 */
import { DURATION_PATTERN } from '../duration.js';
import { FREQUENCY_PATTERN } from '../frequency.js';
import type { JsonSchema } from './keyedObject.js';

/** A reference to a schema under `$defs` of the same document. */
export function ref(name: string): JsonSchema {
  return { $ref: `#/$defs/${name}` };
}

/** A duration with a unit, as readDuration takes it (a bare number is refused). */
export const DURATION: JsonSchema = {
  type: 'string',
  pattern: DURATION_PATTERN,
  description: 'a duration with a unit: ns, us (µs), ms or s, e.g. 35ns or 1.2us',
};

/** A frequency with a unit, as readFrequency takes it (either sign; a bare number is refused). */
export const FREQUENCY: JsonSchema = {
  type: 'string',
  pattern: FREQUENCY_PATTERN,
  description: 'a frequency with a unit: Hz, kHz, MHz or GHz, e.g. 80kHz or -1.5MHz',
};

/** A probability in [0, 1], as readProbability takes it (a plain number). */
export const PROBABILITY: JsonSchema = { type: 'number', minimum: 0, maximum: 1, description: 'a probability between 0 and 1' };

/** A number or an expression string ("pi/4", "90deg", "sqrt(0.9)"), as readAngle and the channel reader take them. */
export const NUMBER_OR_EXPRESSION: JsonSchema = {
  type: ['number', 'string'],
  description: 'a number, or an expression of the circuit parameters such as "pi/4" or "90deg"',
};

/** Text that may also be written as a number (readString with numbersOk). */
export const TEXT: JsonSchema = { type: ['string', 'number'] };

/** A name fray accepts for a parameter or a custom gate: a word of letters, digits and _ (not starting with a digit). */
export const WORD_PATTERN = '^[A-Za-z_][A-Za-z0-9_]*$';

/** One qubit reference: a 0-based index or a label ('all' names every qubit where a target is expected). */
export const QUBIT_REF: JsonSchema = {
  type: ['integer', 'string'],
  minimum: 0,
  description: 'a qubit: its index (from 0) or its label',
};

/** A step target (src/format/targets.ts): a qubit, 'all', a list of qubits, or a list of lists (one application each). */
export const TARGET: JsonSchema = {
  anyOf: [
    ref('qubit'),
    {
      type: 'array',
      minItems: 1,
      items: { anyOf: [ref('qubit'), { type: 'array', minItems: 1, items: ref('qubit') }] },
    },
  ],
  description: "a qubit, 'all', a list of qubits (controls first for a multi-qubit gate), or a list of lists (one application each)",
};

/** A complex matrix as a list of rows; entries are numbers or complex strings ("0.5-0.5i", "exp(i*pi/4)") (src/format/matrix.ts). */
export const MATRIX: JsonSchema = {
  type: 'array',
  minItems: 1,
  items: { type: 'array', minItems: 1, items: { type: ['number', 'string'] } },
  description: 'a matrix as a list of rows; entries are numbers or complex strings such as "0.5-0.5i"',
};
