import { suggest } from '../circuit/suggest.js';
import type { CustomChannel, GatePart, NoiseOverride, Operation, Register } from '../circuit/circuit.js';
import { readAngle } from './angles.js';
import { angleNodes, type GateLibrary } from './gateLibrary.js';
import { misplacedZz, readNoiseKinds, type NoiseKindsSpec } from './noiseKindsSpec.js';
import type { ProblemList, SourcePosition } from './problem.js';
import { hasInto, RecordReader } from './record.js';
import { asMap, readDuration, readString } from './read.js';
import { qubitName } from './register.js';
import { checkModifiers, splitStep, type StepShape } from './stepShape.js';
import { readTargets } from './targets.js';
import { describe, type YEntry, type YNode } from './yamlTree.js';

/** What the step reader needs from the rest of the circuit file. */
export interface StepContext {
  readonly register: Register;
  readonly params: Readonly<Record<string, number>>;
  readonly gates: GateLibrary;
  readonly channels: ReadonlyMap<string, CustomChannel>;
}

/**
 * Reads `steps:` into operations in program order (one per application). Bits named by
 * `into`/`if` are numbered in order of first write by `record`, whose finish()
 * maps them to the record's order.
 */
export function readSteps(node: YNode, ctx: StepContext, problems: ProblemList, record: RecordReader): Operation[] {
  const ops: Operation[] = [];
  // Record mode (any `into`): no measurement is terminal.
  const recordMode = hasInto(node);
  if (node.kind !== 'seq') {
    problems.error(node.at, 'bad-steps', `'steps' must be a list of steps, not ${describe(node)}`);
    return ops;
  }
  if (node.items.length === 0) {
    problems.error(node.at, 'bad-steps', `'steps' is empty; expected at least one step`);
    return ops;
  }
  // Qubit → the step (1-based) and position of its measurement: measurement is terminal.
  const measured = new Map<number, { step: number; at: SourcePosition }>();
  const gateNames = ctx.gates.names();
  node.items.forEach((item, index) => {
    const stepNo = index + 1;
    const map = asMap(item, `step ${stepNo}`, problems);
    if (map === undefined) return;
    const shape = splitStep(map, gateNames, `step ${stepNo}`, problems);
    if (shape === undefined) return;
    const action = shape.action?.key ?? 'noise';
    const where = `step ${stepNo} (${action})`;
    const base = { step: index, at: shape.action?.keyAt ?? map.at, ...readLabel(shape, where, problems) };
    const afterMeasure = (apps: readonly (readonly number[])[]): boolean => {
      if (recordMode) return false;
      for (const app of apps) for (const q of app) {
        const m = measured.get(q);
        if (m !== undefined) {
          problems.error(base.at, 'after-measure', `${where} acts on qubit ${qubitName(q, ctx.register)} after its measurement in step ${m.step} (line ${m.at.line}); measurement is terminal in this version`);
          return true;
        }
      }
      return false;
    };

    // `if` modifies gate, reset and standalone noise steps; checkModifiers refuses it elsewhere.
    const takesIf = action !== 'idle' && action !== 'barrier' && action !== 'measure';
    const ifEntry = takesIf ? shape.modifiers.get('if') : undefined;
    const condition = ifEntry === undefined ? undefined : record.readIf(ifEntry, where, problems);
    if (ifEntry !== undefined && condition === undefined) return;
    const cond = condition !== undefined ? { condition } : {};

    if (shape.action === null) {
      // Standalone noise step.
      if (!checkModifiers(shape, ['noise', 'on', 'label', 'if'], 'a standalone noise step', where, problems)) return;
      const noiseEntry = shape.modifiers.get('noise')!;
      const on = shape.modifiers.get('on');
      if (on === undefined) {
        problems.error(noiseEntry.keyAt, 'missing-on', `${where}: a standalone noise step needs 'on' with its qubits`);
        return;
      }
      const nm = asMap(noiseEntry.value, `'noise' of ${where}`, problems);
      if (nm === undefined) return;
      const kinds = readNoiseKinds(nm, `${where}`, problems, false, ctx.params);
      const apps = readTargets(on.value, { kind: 'channel' }, ctx.register, where, problems);
      if (apps === undefined) return;
      if (!checkChannelArity(kinds.channel, apps, ctx, where, problems) || !checkZzArity(kinds, apps, where, problems, true) || afterMeasure(apps)) return;
      for (const qubits of apps) ops.push({ ...base, kind: 'channel', qubits, noise: { kinds, at: noiseEntry.value.at }, ...cond });
      return;
    }

    const targetNode = shape.action.value;
    switch (action) {
      case 'idle': {
        if (!checkModifiers(shape, ['for', 'label'], 'idle', where, problems)) return;
        const f = shape.modifiers.get('for');
        if (f === undefined) {
          problems.error(shape.action.keyAt, 'missing-for', `${where}: idle needs 'for' with a duration, e.g. 'for: 2us'`);
          return;
        }
        const duration = readDuration(f.value, `'for' of ${where}`, problems, ctx.params);
        const apps = readTargets(targetNode, { kind: 'each' }, ctx.register, where, problems);
        if (duration === undefined || apps === undefined) return;
        for (const qubits of apps) ops.push({ ...base, kind: 'idle', qubits, duration });
        return;
      }
      case 'barrier': {
        if (!checkModifiers(shape, ['label'], 'barrier', where, problems)) return;
        const apps = readTargets(targetNode, { kind: 'group' }, ctx.register, where, problems);
        if (apps === undefined) return;
        ops.push({ ...base, kind: 'barrier', qubits: apps[0]! });
        return;
      }
      case 'measure': {
        if (!checkModifiers(shape, ['label', 'into'], 'measure', where, problems)) return;
        const apps = readTargets(targetNode, { kind: 'each' }, ctx.register, where, problems);
        if (apps === undefined || afterMeasure(apps)) return;
        const into = shape.modifiers.get('into');
        if (into === undefined) record.notePlainMeasure(stepNo, base.at);
        const bits = into === undefined ? undefined : record.readInto(into, apps.length, stepNo, where, problems);
        if (into !== undefined && bits === undefined) return;
        apps.forEach((qubits, i) => {
          measured.set(qubits[0]!, { step: stepNo, at: base.at });
          ops.push({ ...base, kind: 'measure', qubits, ...(bits !== undefined ? { bit: bits[i]! } : {}) });
        });
        return;
      }
      case 'reset': {
        if (!checkModifiers(shape, ['noise', 'label', 'if'], 'reset', where, problems)) return;
        const noise = readOverride(shape.modifiers.get('noise'), where, false, ctx.params, problems);
        if (noise?.kinds.coherent !== undefined) {
          problems.error(noise.kinds.coherent.at, 'coherent-on-reset', `${where}: 'coherent' needs a gate to follow; a reset has no unitary to over- or under-rotate`);
          return;
        }
        const apps = readTargets(targetNode, { kind: 'each' }, ctx.register, where, problems);
        if (noise === null || apps === undefined || afterMeasure(apps)) return;
        if (noise !== undefined && !checkChannelArity(noise.kinds.channel, apps, ctx, where, problems)) return;
        for (const qubits of apps) ops.push({ ...base, kind: 'reset', qubits, ...(noise ? { noise } : {}), ...cond });
        return;
      }
      default: {
        const gate = ctx.gates.get(action)!;
        if (!checkModifiers(shape, ['angle', 'angles', 'noise', 'label', 'if'], `gate ${action}`, where, problems)) return;
        const angleNs = angleNodes(shape.modifiers, gate, shape.action.keyAt, where, problems);
        const noise = readOverride(shape.modifiers.get('noise'), where, true, ctx.params, problems);
        const apps = readTargets(targetNode, gate.qubits === 1 ? { kind: 'each' } : { kind: 'tuple', arity: gate.qubits }, ctx.register, where, problems);
        if (angleNs === undefined || noise === null || apps === undefined || afterMeasure(apps)) return;
        if (noise !== undefined && (!checkChannelArity(noise.kinds.channel, apps, ctx, where, problems) || !checkZzArity(noise.kinds, apps, where, problems))) return;
        const angles: number[] = [];
        for (const a of angleNs) {
          const v = readAngle(a, `angle of ${where}`, ctx.params, problems);
          if (v === undefined) return;
          angles.push(v);
        }
        const unitary = gate.unitary(angles, problems);
        if (unitary === undefined) return;
        const local = gate.kind === 'composite' ? partsOf(gate.name, angles, Array.from({ length: gate.qubits }, (_, i) => i), ctx.gates, problems) : undefined;
        for (const qubits of apps) {
          const parts = local === undefined ? {} : { parts: placeParts(local, qubits) };
          ops.push({ ...base, kind: 'gate', name: gate.name, qubits, unitary, ...(angles.length > 0 ? { angles } : {}), ...(noise ? { noise } : {}), ...cond, ...parts });
        }
      }
    }
  });
  return ops;
}

/** The parts of composite `name` on `qubits`, nested composites expanded into their own parts. */
function partsOf(name: string, angles: readonly number[], qubits: readonly number[], gates: GateLibrary, problems: ProblemList): GatePart[] {
  const parts = gates.get(name)?.parts?.(angles, problems) ?? [];
  const out: GatePart[] = [];
  for (const p of parts) {
    const g = gates.get(p.gate);
    const unitary = g?.unitary(p.angles, problems);
    if (g === undefined || unitary === undefined) continue;
    const pq = p.targets.map((t) => qubits[t]!);
    out.push({ name: g.name, qubits: pq, unitary, ...(g.kind === 'composite' ? { parts: partsOf(g.name, p.angles, pq, gates, problems) } : {}) });
  }
  return out;
}

/** Parts computed on local qubits 0..k−1, moved onto an application's qubits. */
function placeParts(parts: readonly GatePart[], qubits: readonly number[]): GatePart[] {
  return parts.map((p) => ({ ...p, qubits: p.qubits.map((q) => qubits[q]!), ...(p.parts !== undefined ? { parts: placeParts(p.parts, qubits) } : {}) }));
}

function readLabel(shape: StepShape, where: string, problems: ProblemList): { label?: string } {
  const e = shape.modifiers.get('label');
  if (e === undefined) return {};
  const s = readString(e.value, `'label' of ${where}`, problems, true);
  return s === undefined ? {} : { label: s };
}

/** A step's `noise:` — undefined when absent, null when invalid, an override otherwise. */
function readOverride(
  e: YEntry | undefined,
  where: string,
  allowError: boolean,
  env: Readonly<Record<string, number>>,
  problems: ProblemList,
): NoiseOverride | undefined | null {
  if (e === undefined) return undefined;
  if (e.value.kind === 'scalar' && e.value.value === 'none') return { kinds: {}, at: e.value.at };
  if (e.value.kind !== 'map') {
    problems.error(e.value.at, 'bad-noise', `'noise' of ${where} must be a map of noise kinds or 'none', not ${describe(e.value)}`);
    return null;
  }
  const before = problems.errors.length;
  const kinds = readNoiseKinds(e.value, `'noise' of ${where}`, problems, allowError, env);
  return problems.errors.length > before ? null : { kinds, at: e.value.at };
}

/** A custom channel named in a step must exist and act on 1 qubit or on every qubit of the application. */
function checkChannelArity(
  ref: { value: string; at: SourcePosition } | undefined,
  apps: readonly (readonly number[])[],
  ctx: StepContext,
  where: string,
  problems: ProblemList,
): boolean {
  if (ref === undefined) return true;
  const ch = ctx.channels.get(ref.value);
  if (ch === undefined) {
    const near = suggest(ref.value, [...ctx.channels.keys()]);
    const hint = near !== undefined ? `did you mean '${near}'?` : ctx.channels.size > 0 ? `defined: ${[...ctx.channels.keys()].join(', ')}` : `the circuit defines no 'channels:'`;
    problems.error(ref.at, 'unknown-channel', `${where}: unknown channel '${ref.value}'; ${hint}`);
    return false;
  }
  for (const app of apps) {
    if (ch.qubits !== 1 && ch.qubits !== app.length) {
      const hint =
        app.length === 1
          ? `give its ${ch.qubits} qubits as one inner list, e.g. on: [[${Array.from({ length: ch.qubits }, (_, i) => i).join(', ')}]]`
          : `use a ${app.length}-qubit or a 1-qubit channel`;
      problems.error(ref.at, 'channel-arity', `${where}: channel '${ref.value}' acts on ${ch.qubits} qubits but the application has ${app.length}; ${hint}`);
      return false;
    }
  }
  return true;
}

/** `coherent: {zz: …}` needs 2-qubit applications (rzz acts on a pair). */
function checkZzArity(kinds: NoiseKindsSpec, apps: readonly (readonly number[])[], where: string, problems: ProblemList, standalone = false): boolean {
  for (const app of apps) {
    const at = misplacedZz(kinds, app.length);
    if (at !== undefined) {
      problems.error(at, 'zz-arity', `${where}: 'zz' of 'coherent' acts on two qubits, but the application has ${app.length}; leave 'zz' out here${standalone && app.length === 1 ? ' (a flat list in on: gives 1-qubit applications; write [[a, b]] for a pair)' : ''}`);
      return false;
    }
  }
  return true;
}
