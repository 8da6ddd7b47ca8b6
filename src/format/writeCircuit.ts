/**
 * A typed circuit written as a YAML circuit file (docs/format.md) that reads back into the
 * same circuit: qubit labels, custom gates as written (composites with their steps, matrix
 * gates with their entries), and one step per source statement (a statement that applied
 * one gate to several qubits stays one step with a list of targets). Angles are written
 * exactly (src/format/angleText.ts). In record mode the record's bits are written as
 * `bits:`, measurements with `into:` and conditions with `if:`. Noise written on steps is not
 * carried over: this is for circuits read from formats without noise, such as OpenQASM.
 */
import type { Circuit, Condition, GateDefinition, Operation } from '../circuit/circuit.js';
import type { CMatrix } from '../linalg/cmatrix.js';
import { angleText } from './angleText.js';

/** Header lines (without '# ') above the circuit, e.g. where it was converted from. */
export interface YamlWriteOptions {
  readonly header: readonly string[];
  /** The circuit's `name:` (default: the circuit's own name, if any). */
  readonly name?: string;
}

/** A YAML scalar that reads back as this exact string (JSON strings are YAML). */
const str = (s: string): string => (/^[A-Za-z_][A-Za-z0-9_]*$/.test(s) && !['true', 'false', 'null', 'yes', 'no', 'on', 'off', 'all'].includes(s.toLowerCase()) ? s : JSON.stringify(s));

/** An angle as a YAML scalar: a number, or a quoted expression such as "pi/2". */
const angle = (x: number): string => {
  const t = angleText(x);
  return /pi/.test(t) ? JSON.stringify(t) : t;
};

/** Writes the circuit as YAML text. */
export function writeCircuitYaml(circuit: Circuit, options: YamlWriteOptions): string {
  const out: string[] = options.header.map((h) => `# ${h}`);
  const name = options.name ?? circuit.name;
  if (name !== null && name !== undefined) out.push(`name: ${JSON.stringify(name)}`);
  const labels = circuit.register.labels;
  out.push(labels === null ? `qubits: ${circuit.register.n}` : `qubits: [${labels.map(str).join(', ')}]`);
  const q = (i: number): string => (labels === null ? String(i) : str(labels[i]!));
  const defs = circuit.definitions ?? new Map<string, GateDefinition>();
  if (defs.size > 0) {
    out.push('gates:');
    for (const d of defs.values()) {
      out.push(`  ${d.name}:`);
      if (d.kind === 'matrix') {
        out.push(`    matrix: ${matrixText(d.matrix)}`);
        continue;
      }
      out.push(`    qubits: ${d.qubits}`);
      if (d.params.length > 0) out.push(`    params: [${d.params.join(', ')}]`);
      out.push('    steps:');
      for (const s of d.steps) {
        const t = s.targets.length === 1 ? String(s.targets[0]) : `[${s.targets.join(', ')}]`;
        const a = s.angles.length === 0 ? '' : s.angles.length === 1 ? `, angle: ${scalar(s.angles[0]!)}` : `, angles: [${s.angles.map(scalar).join(', ')}]`;
        out.push(`      - { ${s.gate}: ${t}${a} }`);
      }
    }
  }
  const bits = circuit.bits;
  if (bits !== null) out.push(`bits: [${bits.map(str).join(', ')}]`);
  const ifLine = (c: Condition | undefined): string[] =>
    c === undefined || bits === null ? [] : [`    if: { ${c.terms.map((t) => `${JSON.stringify(bits[t.bit]!)}: ${t.value}`).join(', ')} }`];
  out.push('steps:');
  for (const group of groupSteps(circuit.operations)) {
    const op = group[0]!;
    const targets = group.map((o) => o.qubits);
    const list = (apps: readonly (readonly number[])[]): string =>
      apps.length === 1 && apps[0]!.length === 1 ? q(apps[0]![0]!) : apps.every((a) => a.length === 1) ? `[${apps.map((a) => q(a[0]!)).join(', ')}]` : apps.length === 1 ? `[${apps[0]!.map(q).join(', ')}]` : `[${apps.map((a) => `[${a.map(q).join(', ')}]`).join(', ')}]`;
    switch (op.kind) {
      case 'gate': {
        out.push(`  - ${op.name}: ${list(targets)}`);
        const angles = op.angles ?? [];
        if (angles.length === 1) out.push(`    angle: ${angle(angles[0]!)}`);
        else if (angles.length > 1) out.push(`    angles: [${angles.map(angle).join(', ')}]`);
        out.push(...ifLine(op.condition));
        break;
      }
      case 'idle':
        out.push(`  - idle: ${list(targets)}`, `    for: ${op.duration}ns`);
        break;
      case 'barrier':
        out.push(`  - barrier: [${op.qubits.map(q).join(', ')}]`);
        break;
      case 'measure':
        out.push(`  - measure: ${list(targets)}`);
        if (bits !== null) out.push(`    into: [${group.map((o) => (o.kind === 'measure' ? JSON.stringify(bits[o.bit!]!) : '')).join(', ')}]`);
        break;
      case 'reset':
        out.push(`  - reset: ${list(targets)}`);
        out.push(...ifLine(op.condition));
        break;
      case 'channel':
        break; // noise is not carried over (see the module comment)
    }
  }
  return out.join('\n') + '\n';
}

/** Consecutive operations of one source step that are the same action (same gate and angles) form one YAML step. */
function groupSteps(ops: readonly Operation[]): Operation[][] {
  const groups: Operation[][] = [];
  for (const op of ops) {
    const last = groups[groups.length - 1];
    const head = last?.[0];
    const same =
      head !== undefined &&
      head.step === op.step &&
      head.kind === op.kind &&
      op.kind !== 'barrier' &&
      (op.kind !== 'gate' || (head.kind === 'gate' && head.name === op.name && sameAngles(head.angles, op.angles))) &&
      (op.kind !== 'idle' || (head.kind === 'idle' && head.duration === op.duration)) &&
      sameCondition(head, op) &&
      !last!.some((o) => o.qubits.some((x) => op.qubits.includes(x)));
    if (same) last!.push(op);
    else groups.push([op]);
  }
  return groups;
}

const conditionOf = (op: Operation): Condition | undefined => (op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel' ? op.condition : undefined);
const sameCondition = (a: Operation, b: Operation): boolean => JSON.stringify(conditionOf(a)?.terms) === JSON.stringify(conditionOf(b)?.terms);

const sameAngles = (a: readonly number[] | undefined, b: readonly number[] | undefined): boolean =>
  (a ?? []).length === (b ?? []).length && (a ?? []).every((x, i) => x === b![i]);

/** A composite step's angle text as a YAML scalar (numbers bare, expressions quoted). */
const scalar = (text: string): string => (/^-?\d+(\.\d+)?(e[+-]?\d+)?$/i.test(text) ? text : JSON.stringify(text));

/** A matrix as nested YAML lists with complex entries as strings ("0.5-0.5i"). */
function matrixText(m: CMatrix): string {
  const rows: string[] = [];
  for (let r = 0; r < m.rows; r++) {
    const cells: string[] = [];
    for (let c = 0; c < m.cols; c++) {
      const re = m.data[2 * (r * m.cols + c)]!;
      const im = m.data[2 * (r * m.cols + c) + 1]!;
      cells.push(im === 0 ? String(re) : JSON.stringify(`${re}${im < 0 ? '-' : '+'}${Math.abs(im)}i`));
    }
    rows.push(`[${cells.join(', ')}]`);
  }
  return `[${rows.join(', ')}]`;
}
