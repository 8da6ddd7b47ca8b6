import { BUILTIN_GATES, OPENQASM_NAMED_GATES, type GateDef } from '../circuit/gates.js';
import { sequenceUnitary } from '../circuit/compose.js';
import { RESERVED_NAMES } from '../circuit/expression.js';
import { unitarityResidual, type CMatrix } from '../linalg/cmatrix.js';
import { exactNumberText, memoised } from '../linalg/exactKeys.js';
import { readAngle } from './angles.js';
import { qubitsOfDimension, readMatrix } from './matrix.js';
import type { GateDefinition } from '../circuit/circuit.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { asMap, checkKeys, entryOf, readNumber } from './read.js';
import { checkModifiers, splitStep, STEP_ACTIONS, STEP_MODIFIERS } from './stepShape.js';
import { readTargets } from './targets.js';
import { describe, type YNode } from './yamlTree.js';

/** Largest deviation from unitarity accepted for a custom matrix: max |(U†U − I)_ij| (the contract's 1e-9). */
export const UNITARITY_TOLERANCE = 1e-9;

/** Qubits a custom gate may act on. */
export const MAX_CUSTOM_GATE_QUBITS = 6;

/** The keys of a composite custom gate (a matrix gate has only `matrix`). */
export const COMPOSITE_GATE_KEYS = ['qubits', 'params', 'steps'] as const;

/** A gate usable in steps: built-in, custom matrix, or composite of other gates. */
export interface LibraryGate {
  readonly name: string;
  readonly qubits: number;
  /** Angle names in order (radians). */
  readonly params: readonly string[];
  readonly kind: 'builtin' | 'matrix' | 'composite';
  /** The exact unitary for these angles; problems found on the way are recorded. */
  unitary(angles: readonly number[], problems: ProblemList): CMatrix | undefined;
  /** Composite gates: the parts for these angles (gate names, local targets 0..k−1, evaluated angles), in order. */
  parts?(angles: readonly number[], problems: ProblemList): CompositePart[] | undefined;
}

/** One part of a composite gate: a gate of the library on local qubits of the composite, with its angles. */
export interface CompositePart {
  readonly gate: string;
  readonly targets: readonly number[];
  readonly angles: readonly number[];
}

interface SubStep {
  readonly gate: string;
  readonly targets: readonly number[];
  readonly angles: readonly YNode[];
  readonly at: SourcePosition;
}

/** Every gate a circuit may use, built-ins first, then its `gates:` map. */
export class GateLibrary {
  private readonly customs = new Map<string, LibraryGate>();
  private readonly written = new Map<string, GateDefinition>();
  /** Built-in unitaries by gate and exact angles: every application of cx (or of rz(0.3)) shares one matrix, built once. */
  private readonly builtinMatrices = new Map<string, CMatrix>();

  constructor(private readonly circuitParams: Readonly<Record<string, number>>) {}

  /** The gate called `name`, if any. */
  get(name: string): LibraryGate | undefined {
    const own = OPENQASM_NAMED_GATES.has(name) ? this.customs.get(name) : undefined;
    if (own !== undefined) return own;
    const b = BUILTIN_GATES.get(name);
    if (b !== undefined) {
      return { name: b.name, qubits: b.qubits, params: b.params, kind: 'builtin', unitary: (a) => this.builtinMatrix(b, a) };
    }
    return this.customs.get(name);
  }

  private builtinMatrix(b: GateDef, angles: readonly number[]): CMatrix {
    return memoised(this.builtinMatrices, `${b.name}(${angles.map(exactNumberText).join(',')})`, () => b.matrix(angles));
  }

  /** The custom gates that read without problems, as written (angles as expression text). */
  definitions(): Map<string, GateDefinition> {
    const out = new Map<string, GateDefinition>();
    for (const [name, d] of this.written) if (this.customs.has(name)) out.set(name, d);
    return out;
  }

  /** Every gate name, built-in and custom. */
  names(): string[] {
    return [...new Set([...BUILTIN_GATES.keys(), ...this.customs.keys()])];
  }

  /** Reads the circuit's `gates:` map. */
  readCustomGates(node: YNode, problems: ProblemList): void {
    const map = asMap(node, "'gates'", problems);
    if (map === undefined) return;
    const composites: { name: string; k: number; params: string[]; stepsNode: YNode; at: SourcePosition }[] = [];
    const reserved = new Set<string>([...STEP_ACTIONS, ...STEP_MODIFIERS, 'noise', 'all']);
    for (const e of map.entries) {
      const where = `custom gate '${e.key}'`;
      if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(e.key)) {
        problems.error(e.keyAt, 'bad-gate-name', `gate name '${e.key}' must be a word of letters, digits and _ starting with a letter`);
        continue;
      }
      if ((BUILTIN_GATES.has(e.key) && !OPENQASM_NAMED_GATES.has(e.key)) || reserved.has(e.key)) {
        problems.error(e.keyAt, 'reserved-gate-name', `'${e.key}' is a built-in gate or a reserved word; give the custom gate another name`);
        continue;
      }
      const def = asMap(e.value, where, problems);
      if (def === undefined) continue;
      const matrixEntry = entryOf(def, 'matrix');
      if (matrixEntry !== undefined) {
        checkKeys(def, ['matrix'], where, problems);
        // A refused matrix whose size still says how many qubits the gate has stays known (with
        // no unitary), so its steps are checked and not reported as naming an unknown gate.
        const refused = (rows: number): void => {
          const k = qubitsOfDimension(rows);
          if (k !== undefined && k <= MAX_CUSTOM_GATE_QUBITS) this.customs.set(e.key, { name: e.key, qubits: k, params: [], kind: 'matrix', unitary: () => undefined });
        };
        const m = readMatrix(matrixEntry.value, `the matrix of ${where}`, this.circuitParams, problems);
        if (m === undefined) {
          if (matrixEntry.value.kind === 'seq') refused(matrixEntry.value.items.length);
          continue;
        }
        const k = qubitsOfDimension(m.rows);
        if (m.rows !== m.cols || k === undefined || k > MAX_CUSTOM_GATE_QUBITS) {
          problems.error(matrixEntry.value.at, 'bad-matrix', `the matrix of ${where} is ${m.rows}×${m.cols}; expected 2^k × 2^k for k from 1 to ${MAX_CUSTOM_GATE_QUBITS}`);
          continue;
        }
        const res = unitarityResidual(m);
        if (!(res <= UNITARITY_TOLERANCE)) {
          problems.error(matrixEntry.value.at, 'not-unitary', `the matrix of ${where} is not unitary: the largest entry of U†U − I is ${res.toExponential(2)} (allowed ${UNITARITY_TOLERANCE})`);
          refused(m.rows);
          continue;
        }
        this.customs.set(e.key, { name: e.key, qubits: k, params: [], kind: 'matrix', unitary: () => m });
        this.written.set(e.key, { kind: 'matrix', name: e.key, qubits: k, matrix: m });
        continue;
      }
      checkKeys(def, [...COMPOSITE_GATE_KEYS, 'matrix'], where, problems);
      const qe = entryOf(def, 'qubits');
      const se = entryOf(def, 'steps');
      if (qe === undefined || se === undefined) {
        problems.error(e.keyAt, 'bad-gate', `${where} needs either 'matrix', or 'qubits' and 'steps' (a composite gate)`);
        continue;
      }
      const k = readNumber(qe.value, `'qubits' of ${where}`, problems, { min: 1, max: MAX_CUSTOM_GATE_QUBITS, integer: true });
      const params: string[] = [];
      const pe = entryOf(def, 'params');
      if (pe !== undefined) {
        if (pe.value.kind !== 'seq') problems.error(pe.value.at, 'bad-params', `'params' of ${where} must be a list of names, not ${describe(pe.value)}`);
        else for (const p of pe.value.items) {
          if (p.kind !== 'scalar' || typeof p.value !== 'string' || !/^[A-Za-z_][A-Za-z0-9_]*$/.test(p.value) || RESERVED_NAMES.includes(p.value)) {
            problems.error(p.at, 'bad-param-name', `parameter names of ${where} must be words that are not ${RESERVED_NAMES.join(', ')}; got ${describe(p)}`);
          } else if (params.includes(p.value)) {
            problems.error(p.at, 'bad-param-name', `parameter '${p.value}' of ${where} is listed twice`);
          } else params.push(p.value);
        }
      }
      if (k === undefined) continue;
      composites.push({ name: e.key, k, params, stepsNode: se.value, at: e.keyAt });
    }
    // Register composites first (so they may use each other), then read their steps.
    const bodies = new Map<string, SubStep[]>();
    for (const c of composites) {
      const self = this;
      this.customs.set(c.name, {
        name: c.name,
        qubits: c.k,
        params: c.params,
        kind: 'composite',
        unitary(angles, problems) {
          return self.compositeUnitary(c.name, c.k, c.params, bodies.get(c.name) ?? [], angles, problems);
        },
        parts(angles, problems) {
          return self.compositeParts(c.name, c.params, bodies.get(c.name) ?? [], angles, problems);
        },
      });
    }
    for (const c of composites) {
      const body = this.readCompositeSteps(c.name, c.k, c.stepsNode, problems);
      if (body !== undefined) {
        bodies.set(c.name, body);
        const steps = body.map((s) => ({ gate: s.gate, targets: s.targets, angles: s.angles.map(angleText) }));
        this.written.set(c.name, { kind: 'composite', name: c.name, qubits: c.k, params: c.params, steps });
      } else this.customs.delete(c.name);
    }
    this.checkCycles(bodies, problems);
  }

  private readCompositeSteps(name: string, k: number, node: YNode, problems: ProblemList): SubStep[] | undefined {
    if (node.kind !== 'seq' || node.items.length === 0) {
      problems.error(node.at, 'bad-steps', `'steps' of custom gate '${name}' must be a non-empty list of gate steps`);
      return undefined;
    }
    const reg = { n: k, labels: null };
    const out: SubStep[] = [];
    let ok = true;
    node.items.forEach((item, i) => {
      const where = `step ${i + 1} of custom gate '${name}'`;
      const map = asMap(item, where, problems);
      if (map === undefined) return void (ok = false);
      const shape = splitStep(map, this.names(), where, problems, []);
      if (shape === undefined || shape.action === null) {
        if (shape !== undefined) problems.error(map.at, 'no-action', `${where} must apply a gate`);
        return void (ok = false);
      }
      const gate = this.get(shape.action.key)!;
      if (!checkModifiers(shape, ['angle', 'angles', 'label'], `a gate inside a custom gate`, where, problems)) return void (ok = false);
      const angles = angleNodes(shape.modifiers, gate, shape.action.keyAt, where, problems);
      const apps = readTargets(shape.action.value, gate.qubits === 1 ? { kind: 'each' } : { kind: 'tuple', arity: gate.qubits }, reg, `${where} (${gate.name})`, problems);
      if (angles === undefined || apps === undefined) return void (ok = false);
      for (const targets of apps) out.push({ gate: gate.name, targets, angles, at: map.at });
    });
    return ok ? out : undefined;
  }

  private checkCycles(bodies: ReadonlyMap<string, SubStep[]>, problems: ProblemList): void {
    const state = new Map<string, 'visiting' | 'done'>();
    const visit = (name: string, at: SourcePosition): boolean => {
      if (state.get(name) === 'done') return true;
      if (state.get(name) === 'visiting') {
        problems.error(at, 'gate-cycle', `custom gate '${name}' uses itself (directly or through other gates); composite gates may not be recursive`);
        return false;
      }
      state.set(name, 'visiting');
      for (const s of bodies.get(name) ?? []) {
        if (bodies.has(s.gate) && !visit(s.gate, s.at)) {
          this.customs.delete(name);
          return false;
        }
      }
      state.set(name, 'done');
      return true;
    };
    for (const name of bodies.keys()) visit(name, { file: '', line: 0, col: 0 });
  }

  private compositeParts(
    name: string,
    params: readonly string[],
    body: readonly SubStep[],
    args: readonly number[],
    problems: ProblemList,
  ): CompositePart[] | undefined {
    // The composite's own parameters shadow the circuit's.
    const env: Record<string, number> = Object.assign(Object.create(null) as Record<string, number>, this.circuitParams);
    params.forEach((p, i) => (env[p] = args[i]!));
    const parts: CompositePart[] = [];
    for (const s of body) {
      const angles: number[] = [];
      for (const a of s.angles) {
        const v = readAngle(a, `angle of ${s.gate} in custom gate '${name}'`, env, problems);
        if (v === undefined) return undefined;
        angles.push(v);
      }
      parts.push({ gate: s.gate, targets: s.targets, angles });
    }
    return parts;
  }

  private compositeUnitary(
    name: string,
    k: number,
    params: readonly string[],
    body: readonly SubStep[],
    args: readonly number[],
    problems: ProblemList,
  ): CMatrix | undefined {
    const parts = this.compositeParts(name, params, body, args, problems);
    if (parts === undefined) return undefined;
    const placed: { matrix: CMatrix; targets: readonly number[] }[] = [];
    for (const p of parts) {
      const m = this.get(p.gate)?.unitary(p.angles, problems);
      if (m === undefined) return undefined;
      placed.push({ matrix: m, targets: p.targets });
    }
    return sequenceUnitary(k, placed);
  }
}

/** An angle node as expression text (a number's shortest round-trip form, or the string as written). */
function angleText(node: YNode): string {
  return node.kind === 'scalar' ? String(node.value) : '';
}

/** The angle nodes a step gives for `gate` (`angle` for one, `angles` for several), checked for count. */
export function angleNodes(
  modifiers: ReadonlyMap<string, { key: string; keyAt: SourcePosition; value: YNode }>,
  gate: LibraryGate,
  stepAt: SourcePosition,
  where: string,
  problems: ProblemList,
): YNode[] | undefined {
  const one = modifiers.get('angle');
  const many = modifiers.get('angles');
  const want = gate.params.length;
  if (one !== undefined && many !== undefined) {
    problems.error(many.keyAt, 'angle-and-angles', `${where} gives both 'angle' and 'angles'; give one`);
    return undefined;
  }
  if (want === 0) {
    const extra = one ?? many;
    if (extra !== undefined) {
      problems.error(extra.keyAt, 'unexpected-angle', `${where}: ${gate.name} takes no angle`);
      return undefined;
    }
    return [];
  }
  const names = gate.params.join(', ');
  if (one === undefined && many === undefined) {
    problems.error(
      stepAt,
      'missing-angle',
      `${where}: ${gate.name} needs ${want === 1 ? `an angle (${names}): add 'angle: …'` : `${want} angles (${names}): add 'angles: [ … ]'`}`,
    );
    return undefined;
  }
  if (one !== undefined) {
    if (want !== 1) {
      problems.error(one.keyAt, 'wrong-angle-count', `${where}: ${gate.name} needs ${want} angles (${names}); write them as 'angles: [ … ]'`);
      return undefined;
    }
    return [one.value];
  }
  const list = many!.value;
  const items = list.kind === 'seq' ? list.items : [list];
  if (items.length !== want) {
    problems.error(list.at, 'wrong-angle-count', `${where}: ${gate.name} needs ${want} angle${want === 1 ? '' : 's'} (${names}), ${items.length} given`);
    return undefined;
  }
  return [...items];
}
