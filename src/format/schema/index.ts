/**
 * JSON Schemas (draft 2020-12) of fray's file kinds, for editors: the circuit file, the
 * noise profile (device file) and the channel file of `fray channel`. Built from the validator's own key tables (./keyedObject.ts says how),
 * printed by `fray schema circuit|profile` and committed as docs/schemas/*.schema.json.
 */
import { circuitDefs } from './circuitSchema.js';
import type { JsonSchema, SchemaGap } from './keyedObject.js';
import { profileDefs } from './profileSchema.js';

export type { JsonSchema, SchemaGap } from './keyedObject.js';

/** The file kinds that have a schema. */
export const SCHEMA_KINDS = ['circuit', 'profile', 'channels'] as const;

/** One of SCHEMA_KINDS. */
export type SchemaKind = (typeof SCHEMA_KINDS)[number];

/** The dialect every fray schema declares. */
export const SCHEMA_DIALECT = 'https://json-schema.org/draft/2020-12/schema';

/** Both schemas, and the gaps between the validator's key tables and the value schemas (empty when they agree). */
export function buildSchemas(): { readonly [K in SchemaKind]: JsonSchema } & { readonly gaps: readonly SchemaGap[] } {
  const gaps: SchemaGap[] = [];
  const pDefs = profileDefs(gaps);
  const cDefs = circuitDefs(gaps);
  const doc = (title: string, root: string, defs: Record<string, JsonSchema>): JsonSchema => {
    const { [root]: top, ...rest } = defs;
    return { $schema: SCHEMA_DIALECT, title, ...top, $defs: rest };
  };
  return {
    circuit: doc('fray circuit file', 'circuit', { ...cDefs, ...pDefs }),
    profile: doc('fray noise profile (device file)', 'profile', pDefs),
    // readChannelFile (src/cli/channelCommand.ts): the circuit file's keys, only 'channels' required.
    channels: doc('fray channel file (fray channel)', 'circuit', { ...cDefs, ...pDefs, circuit: { ...cDefs['circuit'], required: ['channels'] } }),
    gaps,
  };
}

/** The schema of one file kind as JSON text (two-space indent, trailing newline). */
export function schemaText(kind: SchemaKind): string {
  return JSON.stringify(buildSchemas()[kind], null, 2) + '\n';
}
