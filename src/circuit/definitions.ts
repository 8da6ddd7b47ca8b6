/**
 * The unitary of a written gate definition (src/circuit/circuit.ts GateDefinition): a
 * matrix gate's matrix, or a composite's steps multiplied on its local qubits with
 * src/circuit/compose.ts (local qubit 0 most significant; the first step acts first); and
 * a composite application's parts on circuit qubits (for profiles that split composites).
 */
import type { CompositeGateDefinition, GateDefinition, GatePart } from './circuit.js';
import { evaluateReal } from './expression.js';
import { sequenceUnitary } from './compose.js';
import { builtinGate } from './gates.js';
import type { CMatrix } from '../linalg/cmatrix.js';

/** One evaluated step of a composite: its gate, local targets, angles and unitary. */
interface EvaluatedStep {
  readonly gate: string;
  readonly targets: readonly number[];
  readonly angles: readonly number[];
  readonly matrix: CMatrix;
  readonly composite: CompositeGateDefinition | undefined;
}

/** The steps of a composite called with `args`, evaluated; an error message when an angle does not evaluate. */
function evaluateSteps(def: CompositeGateDefinition, args: readonly number[], definitions: ReadonlyMap<string, GateDefinition>): EvaluatedStep[] | { error: string } {
  const env: Record<string, number> = Object.create(null) as Record<string, number>;
  def.params.forEach((p, i) => (env[p] = args[i]!));
  const out: EvaluatedStep[] = [];
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
      out.push({ gate: b.name, targets: s.targets, angles, matrix: b.matrix(angles), composite: undefined });
      continue;
    }
    if (inner === undefined) return { error: `gate '${def.name}' uses unknown gate '${s.gate}'` };
    const u = definitionUnitary(inner, angles, definitions);
    if ('error' in u) return u;
    out.push({ gate: s.gate, targets: s.targets, angles, matrix: u.matrix, composite: inner.kind === 'composite' ? inner : undefined });
  }
  return out;
}

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
  const steps = evaluateSteps(def, args, definitions);
  if ('error' in steps) return steps;
  return { matrix: sequenceUnitary(def.qubits, steps.map((s) => ({ matrix: s.matrix, targets: s.targets }))) };
}

/** The parts of a composite applied on circuit `qubits` (local qubit i → qubits[i]), composite parts with their own parts. */
export function definitionParts(
  def: CompositeGateDefinition,
  args: readonly number[],
  definitions: ReadonlyMap<string, GateDefinition>,
  qubits: readonly number[],
): GatePart[] | { error: string } {
  const steps = evaluateSteps(def, args, definitions);
  if ('error' in steps) return steps;
  const out: GatePart[] = [];
  for (const s of steps) {
    const pq = s.targets.map((t) => qubits[t]!);
    let parts: GatePart[] | undefined;
    if (s.composite !== undefined) {
      const inner = definitionParts(s.composite, s.angles, definitions, pq);
      if ('error' in inner) return inner;
      parts = inner;
    }
    out.push({ name: s.gate, qubits: pq, unitary: s.matrix, ...(parts !== undefined ? { parts } : {}) });
  }
  return out;
}
