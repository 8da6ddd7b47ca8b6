import type { Operation } from './circuit.js';

/** How reports name an operation: the gate's name, 'noise' for a standalone noise step, else its kind (measure, reset, idle, barrier). */
export function operationName(op: Operation): string {
  return op.kind === 'gate' ? op.name : op.kind === 'channel' ? 'noise' : op.kind;
}
