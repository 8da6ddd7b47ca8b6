/**
 * The operations as the device runs them: a composite gate application whose profile entry
 * says `split: true` is replaced by its parts, each a gate application of its own (scheduled,
 * and noisy under its own profile entry); a part that is itself a split composite is replaced
 * in turn. Every part keeps the step (index, position, label) of the application it came from,
 * and a step's own `noise:` and `if:` apply to each part. Without split entries the list is returned as is.
 */
import type { GateOperation, GatePart, Operation } from '../circuit/circuit.js';
import type { NoiseProfile } from '../noise/profile.js';

/** `ops` with split composite applications replaced by their parts (see above). */
export function deviceOperations(ops: readonly Operation[], profile: NoiseProfile): readonly Operation[] {
  if (!ops.some((op) => op.kind === 'gate' && op.parts !== undefined && profile.gateEntry(op.name, op.qubits).split)) return ops;
  const out: Operation[] = [];
  const expand = (op: GateOperation): void => {
    if (op.parts === undefined || !profile.gateEntry(op.name, op.qubits).split) {
      out.push(op);
      return;
    }
    for (const part of op.parts) expand(asOperation(op, part));
  };
  for (const op of ops) {
    if (op.kind === 'gate') expand(op);
    else out.push(op);
  }
  return out;
}

/** A part as a gate application of the step `parent` belongs to. */
function asOperation(parent: GateOperation, part: GatePart): GateOperation {
  return {
    kind: 'gate',
    step: parent.step,
    at: parent.at,
    ...(parent.label !== undefined ? { label: parent.label } : {}),
    name: part.name,
    qubits: part.qubits,
    unitary: part.unitary,
    ...(parent.noise !== undefined ? { noise: parent.noise } : {}),
    ...(parent.condition !== undefined ? { condition: parent.condition } : {}),
    ...(part.parts !== undefined ? { parts: part.parts } : {}),
  };
}
