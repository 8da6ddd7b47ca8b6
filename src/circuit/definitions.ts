/**
 * The unitary of a written gate definition (src/circuit/circuit.ts GateDefinition): a
 * matrix gate's matrix, or a composite's steps multiplied on its local qubits with
 * src/circuit/compose.ts (local qubit 0 most significant; the first step acts first).
 */
import type { GateDefinition } from './circuit.js';
import { evaluateReal } from './expression.js';
import { sequenceUnitary } from './compose.js';
import { builtinGate } from './gates.js';
import type { CMatrix } from '../linalg/cmatrix.js';

/**
 * The unitary of `def` called with `args` (radians, in its parameter order). Steps naming
 * other custom gates are looked up in `definitions`. Returns an error message when an angle
 * does not evaluate or a step names an unknown gate.
 */
export function definitionUnitary(
  def: GateDefinition,
  args: readonly number[],
  definitions: ReadonlyMap<string, GateDefinition>,
): { matrix: CMatrix } | { error: string } {
  if (def.kind === 'matrix') return { matrix: def.matrix };
  const env: Record<string, number> = Object.create(null) as Record<string, number>;
  def.params.forEach((p, i) => (env[p] = args[i]!));
  const parts: { matrix: CMatrix; targets: readonly number[] }[] = [];
  for (const s of def.steps) {
    const angles: number[] = [];
    for (const text of s.angles) {
      const v = evaluateReal(text, env);
      if ('error' in v) return { error: `gate '${def.name}', step ${s.gate}: ${v.error.message}` };
      angles.push(v.value);
    }
    // a definition of the same name shadows an OpenQASM-named built-in (src/circuit/gates.ts)
    const inner = definitions.get(s.gate);
    const b = inner === undefined ? builtinGate(s.gate) : undefined;
    if (b !== undefined) {
      parts.push({ matrix: b.matrix(angles), targets: s.targets });
      continue;
    }
    if (inner === undefined) return { error: `gate '${def.name}' uses unknown gate '${s.gate}'` };
    const u = definitionUnitary(inner, angles, definitions);
    if ('error' in u) return u;
    parts.push({ matrix: u.matrix, targets: s.targets });
  }
  return { matrix: sequenceUnitary(def.qubits, parts) };
}
