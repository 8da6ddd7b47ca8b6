/**
 * The one rule that keeps the JSON Schemas equal to the validator: every object schema with
 * fixed keys is built from the validator's own key table (CIRCUIT_KEYS, PROFILE_KEYS,
 * GATE_KEYS, …) and a map of value schemas. A key the table has and the map lacks still
 * appears in the schema (so editors complete it) and is recorded as a gap; a value schema
 * for a key the table does not have is recorded too. test/format/schema.test.ts requires
 * the list of gaps to be empty, so a new key in a validator table fails the tests until its
 * value schema is written here.
 */

/** A JSON Schema (draft 2020-12) node, as plain JSON. */
export type JsonSchema = { readonly [key: string]: unknown };

/** A mismatch between a validator key table and the value schemas written for it. */
export interface SchemaGap {
  /** Which object the table describes, e.g. "profile gate entry". */
  readonly object: string;
  readonly key: string;
  /** 'no value schema': the validator takes the key, the schema does not describe its value; 'not in the table': the reverse. */
  readonly problem: 'no value schema' | 'not in the table';
}

/**
 * An object schema whose properties are exactly `keys` (the validator's table), each with
 * its schema from `values`; other keys are refused unless `extra` says what they may be.
 * Mismatches between `keys` and `values` are appended to `gaps`.
 */
export function keyedObject(
  object: string,
  keys: readonly string[],
  values: Readonly<Record<string, JsonSchema>>,
  gaps: SchemaGap[],
  extra: { description?: string; required?: readonly string[]; additionalProperties?: JsonSchema | false } = {},
): JsonSchema {
  const properties: Record<string, JsonSchema> = {};
  for (const key of keys) {
    const v = values[key];
    if (v === undefined) gaps.push({ object, key, problem: 'no value schema' });
    properties[key] = v ?? { description: `a key fray reads; its value is not described in the schema yet` };
  }
  for (const key of Object.keys(values)) if (!keys.includes(key)) gaps.push({ object, key, problem: 'not in the table' });
  return {
    type: 'object',
    ...(extra.description !== undefined ? { description: extra.description } : {}),
    properties,
    ...(extra.required !== undefined && extra.required.length > 0 ? { required: [...extra.required] } : {}),
    additionalProperties: extra.additionalProperties ?? false,
  };
}
