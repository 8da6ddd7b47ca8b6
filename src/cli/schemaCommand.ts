import { SCHEMA_KINDS, schemaText, type SchemaKind } from '../format/schema/index.js';
import { suggest } from '../circuit/suggest.js';
import { UsageError, type CliIO } from './main.js';

/** `fray schema KIND`: prints the JSON Schema (draft 2020-12) of a circuit file, a noise profile or a channel file. */
export function schemaCommand(kind: string, io: CliIO): void {
  if (!(SCHEMA_KINDS as readonly string[]).includes(kind)) {
    const near = suggest(kind, SCHEMA_KINDS);
    throw new UsageError(`schema ${kind}: expected one of ${SCHEMA_KINDS.join(', ')}${near !== undefined ? `; did you mean '${near}'?` : ''}`);
  }
  io.stdout.write(schemaText(kind as SchemaKind));
}
