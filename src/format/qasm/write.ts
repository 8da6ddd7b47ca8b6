/**
 * A typed circuit written as an OpenQASM 2.0 or 3 program. Built-in gates keep their names
 * (u as the language's U, i as id); a built-in the version's header lacks gets a `gate`
 * definition built from header gates (EXPORT_DEFINITIONS; reading it back yields the
 * built-in again); composite gates become `gate` definitions; one-qubit matrix gates become
 * a `gate` whose body is U with the ZYZ angles of the matrix (src/circuit/zyz.ts; the global
 * phase is dropped, unobservable). Measured qubits are written into one bit register in
 * fray's outcome order (ascending qubit), so bit k is the k-th character of fray's outcomes.
 * In record mode the record's bits are declared as bit registers (names `c[i]` grouped into
 * registers, other names as one-bit registers), measurements write them and conditions become
 * `if`: OpenQASM 3 tests single bits (nested for several), OpenQASM 2.0 only a whole register
 * against an integer (a condition on part of a register is an error there).
 * Noise is not part of OpenQASM: noise steps are dropped with a comment and a warning, and
 * the header comment names the profile. Idles become `delay` (OpenQASM 3) or are dropped
 * with a comment and a warning (OpenQASM 2.0 has no timing).
 */
import type { Circuit, CompositeGateDefinition, Condition, GateDefinition, Operation } from '../../circuit/circuit.js';
import { parseExpression } from '../../circuit/expression.js';
import { builtinGate } from '../../circuit/gates.js';
import { zyzAngles } from '../../circuit/zyz.js';
import { angleText } from '../angleText.js';
import { formatDuration } from '../duration.js';
import type { ProblemList } from '../problem.js';
import { fromFrayTree, printExpr } from './expression.js';
import { HEADER, QELIB1_GATES, STDGATES } from './library.js';

/** fray built-in → its name in a program (when it differs). */
const QASM_NAME: ReadonlyMap<string, string> = new Map([['u', 'U'], ['i', 'id']]);

/**
 * Definitions, from header gates, of fray built-ins a version's header lacks (read back,
 * each is recognised as the built-in: same matrix up to a global phase).
 */
export const EXPORT_DEFINITIONS: Readonly<Record<2 | 3, Readonly<Record<string, string>>>> = {
  2: {
    iswap: 'gate iswap a, b { s a; s b; h a; cx a, b; cx b, a; h b; }',
    ryy: 'gate ryy(theta) a, b { rx(pi/2) a; rx(pi/2) b; cx a, b; rz(theta) b; cx a, b; rx(-pi/2) a; rx(-pi/2) b; }',
  },
  3: {
    iswap: 'gate iswap a, b { s a; s b; h a; cx a, b; cx b, a; h b; }',
    ryy: 'gate ryy(theta) a, b { rx(pi/2) a; rx(pi/2) b; cx a, b; rz(theta) b; cx a, b; rx(-pi/2) a; rx(-pi/2) b; }',
    rxx: 'gate rxx(theta) a, b { h a; h b; cx a, b; rz(theta) b; cx a, b; h a; h b; }',
    rzz: 'gate rzz(theta) a, b { cx a, b; rz(theta) b; cx a, b; }',
    sxdg: 'gate sxdg a { inv @ sx a; }',
    cu1: 'gate cu1(lambda) a, b { cp(lambda) a, b; }',
    cu3: 'gate cu3(theta, phi, lambda) a, b { cu(theta, phi, lambda, 0) a, b; }',
    csx: 'gate csx a, b { ctrl @ sx a, b; }',
    c3x: 'gate c3x a, b, c, d { ctrl(3) @ x a, b, c, d; }',
    c4x: 'gate c4x a, b, c, d, e { ctrl(4) @ x a, b, c, d, e; }',
  },
};

/** Options of the writer: where the circuit came from and which profile it was simulated with. */
export interface QasmWriteOptions {
  readonly version: 2 | 3;
  /** The source file named in the header comment. */
  readonly source: string;
  /** The noise profile's name (or null when there is none). */
  readonly profile: string | null;
}

/** Writes `circuit` as an OpenQASM program; problems (what the version cannot express) and warnings go to `problems`. */
export function writeQasm(circuit: Circuit, options: QasmWriteOptions, problems: ProblemList): string | undefined {
  const v = options.version;
  const header = v === 2 ? QELIB1_GATES : STDGATES;
  const defs = circuit.definitions ?? new Map<string, GateDefinition>();
  const reg = registerLayout(circuit);
  const lines: string[] = [];
  lines.push(`OPENQASM ${v === 2 ? '2.0' : '3.0'};`);
  lines.push(`include "${HEADER[v]}";`);
  lines.push(`// written by fray from ${options.source}`);
  lines.push(
    options.profile !== null
      ? `// simulated with the noise profile '${options.profile}'; noise is not part of OpenQASM`
      : '// noise is not part of OpenQASM; this circuit was written without a noise profile',
  );
  if (reg.comment !== null) lines.push(reg.comment);

  // Gate definitions: fray built-ins the header lacks, then custom gates (dependencies first).
  const defined = new Set<string>();
  const body: string[] = [];
  const needBuiltin = (name: string): void => {
    if (defined.has(name) || header.includes(QASM_NAME.get(name) ?? name) || QASM_NAME.has(name)) return;
    const text = EXPORT_DEFINITIONS[v][name];
    if (text === undefined) throw new Error(`internal: no OpenQASM ${v} definition of '${name}'`);
    defined.add(name);
    body.push(text);
  };
  const needCustom = (name: string, at: Operation['at']): boolean => {
    if (defined.has(name)) return true;
    const d = defs.get(name);
    if (d === undefined) return false;
    if (header.includes(name) || builtinGate(name) !== undefined) {
      problems.error(at, 'qasm-export', `custom gate '${name}' has the name of a standard OpenQASM gate; rename it to export the circuit`);
      return false;
    }
    if (d.kind === 'matrix') {
      if (d.qubits !== 1) {
        problems.error(at, 'qasm-export', `custom matrix gate '${name}' acts on ${d.qubits} qubits; OpenQASM has no matrix gates and fray decomposes only 1-qubit matrices (ZYZ); write it as a composite gate`);
        return false;
      }
      const z = zyzAngles(d.matrix);
      defined.add(name);
      body.push(`gate ${name} a { U(${angleText(z.theta)}, ${angleText(z.phi)}, ${angleText(z.lambda)}) a; }`);
      return true;
    }
    for (const s of d.steps) {
      if (defs.has(s.gate)) {
        if (!needCustom(s.gate, at)) return false;
      } else needBuiltin(builtinGate(s.gate)!.name);
    }
    defined.add(name);
    body.push(compositeText(d, v, circuit.params));
    return true;
  };

  const ops: string[] = [];
  const measured = [...new Set(circuit.operations.filter((o) => o.kind === 'measure').map((o) => o.qubits[0]!))].sort((a, b) => a - b);
  const bitName = ['c', 'meas', 'bits'].find((n) => !reg.names.has(n))!;
  const record = circuit.bits === null ? undefined : recordLayout(circuit.bits, v);
  const written = new Set<number>();
  let dropped = 0;
  for (const op of circuit.operations) {
    const qs = op.qubits.map((q) => reg.ref[q]!).join(', ');
    const cond = (op.kind === 'gate' || op.kind === 'reset') && op.condition !== undefined && record !== undefined ? conditionPrefix(op.condition, record, written, v) : '';
    if (cond === undefined) {
      problems.error(op.at, 'qasm-export', 'OpenQASM 2.0 can only compare a whole bit register with an integer, and this condition reads part of a register; export to OpenQASM 3');
      return undefined;
    }
    const at0 = ops.length;
    switch (op.kind) {
      case 'gate': {
        const b = defs.has(op.name) ? undefined : builtinGate(op.name);
        if (b !== undefined && (b.params.length === 0 || op.angles !== undefined)) {
          needBuiltin(b.name);
          const args = b.params.length > 0 ? `(${op.angles!.map(angleText).join(', ')})` : '';
          ops.push(`${QASM_NAME.get(b.name) ?? b.name}${args} ${qs};`);
        } else if (b === undefined && defs.has(op.name)) {
          if (!needCustom(op.name, op.at)) return undefined;
          const args = op.angles !== undefined && op.angles.length > 0 ? `(${op.angles.map(angleText).join(', ')})` : '';
          ops.push(`${op.name}${args} ${qs};`);
        } else if (op.qubits.length === 1) {
          // a gate known only by its matrix (e.g. made by a transform): U with its ZYZ angles
          const z = zyzAngles(op.unitary);
          ops.push(`U(${angleText(z.theta)}, ${angleText(z.phi)}, ${angleText(z.lambda)}) ${qs};`);
        } else {
          problems.error(op.at, 'qasm-export', `gate '${op.name}' on ${op.qubits.length} qubits is known only by its matrix; OpenQASM cannot state a matrix on 2 or more qubits`);
          return undefined;
        }
        if (op.noise !== undefined) dropped++;
        break;
      }
      case 'measure': {
        const bit = record !== undefined && op.bit !== undefined ? record.ref[op.bit]! : `${bitName}[${measured.indexOf(op.qubits[0]!)}]`;
        if (op.bit !== undefined) written.add(op.bit);
        ops.push(`${v === 2 ? `measure ${qs} -> ${bit}` : `${bit} = measure ${qs}`};`);
        break;
      }
      case 'reset':
        ops.push(`reset ${qs};`);
        if (op.noise !== undefined) dropped++;
        break;
      case 'barrier':
        ops.push(`barrier ${qs};`);
        break;
      case 'idle':
        if (v === 3) ops.push(`delay[${op.duration}ns] ${qs};`);
        else {
          ops.push(`// idle of ${formatDuration(op.duration)} on ${qs} dropped: OpenQASM 2.0 has no timing`);
          problems.warn(op.at, 'qasm-export-idle', `the idle on ${qs} is dropped: OpenQASM 2.0 has no timing (export to OpenQASM 3 keeps it as a delay)`);
        }
        break;
      default:
        break;
    }
    if (cond !== '' && ops.length > at0) ops[at0] = `${cond}${ops[at0]}${cond.endsWith('{ ') ? ' }'.repeat(cond.split('{').length - 1) : ''}`;
    switch (op.kind) {
      case 'channel':
        ops.push(`// noise step on ${qs} dropped: noise is not part of OpenQASM`);
        problems.warn(op.at, 'qasm-export-noise', `the noise step on ${qs} is dropped: noise is not part of OpenQASM`);
        break;
    }
  }
  if (circuit.inlineNoise !== null) problems.warn(circuit.stepsAt, 'qasm-export-noise', "the circuit's own 'noise:' profile is dropped: noise is not part of OpenQASM (give it as a device file with --device when you run the program)");
  if (dropped > 0) problems.warn(circuit.stepsAt, 'qasm-export-noise', `${dropped} step${dropped === 1 ? '' : 's'}' own 'noise:' dropped: noise is not part of OpenQASM`);
  if (!problems.ok) return undefined;
  lines.push(...body);
  lines.push(...reg.declarations.map((d) => (v === 2 ? `qreg ${d.name}[${d.size}];` : `qubit[${d.size}] ${d.name};`)));
  if (record !== undefined) lines.push(...record.declarations);
  else if (measured.length > 0) lines.push(v === 2 ? `creg ${bitName}[${measured.length}];` : `bit[${measured.length}] ${bitName};`);
  lines.push(...ops);
  return lines.join('\n') + '\n';
}

/** The record's bits as bit registers: declarations, how each bit is named, and each register's bits. */
interface RecordLayout {
  readonly declarations: string[];
  /** Bit index → its reference in the program (`c[2]`, or `m` / `m[0]` for a one-bit register). */
  readonly ref: string[];
  /** Bit index → its register's name and its index there. */
  readonly place: { reg: string; index: number }[];
  /** Register name → the record bits it holds. */
  readonly members: Map<string, number[]>;
}

function recordLayout(bits: readonly string[], v: 2 | 3): RecordLayout {
  const size = new Map<string, number>();
  const place = bits.map((b) => {
    const m = /^([A-Za-z_][A-Za-z0-9_]*)\[(\d+)\]$/.exec(b);
    const p = m === null ? { reg: b, index: -1 } : { reg: m[1]!, index: Number(m[2]) };
    size.set(p.reg, Math.max(size.get(p.reg) ?? 0, p.index + 1));
    return p;
  });
  const members = new Map<string, number[]>();
  place.forEach((p, i) => members.set(p.reg, [...(members.get(p.reg) ?? []), i]));
  const declarations = [...size].map(([r, n]) => (n === 0 ? (v === 2 ? `creg ${r}[1];` : `bit ${r};`) : v === 2 ? `creg ${r}[${n}];` : `bit[${n}] ${r};`));
  const ref = place.map((p) => (p.index >= 0 ? `${p.reg}[${p.index}]` : v === 2 ? `${p.reg}[0]` : p.reg));
  return { declarations, ref, place: place.map((p) => ({ reg: p.reg, index: Math.max(0, p.index) })), members };
}

/**
 * The `if (…) ` prefix of a conditioned statement: OpenQASM 3 tests each bit (nested blocks for
 * several); OpenQASM 2.0 compares one whole register, whose bits written so far must all be in
 * the condition (unwritten bits read 0). Undefined when 2.0 cannot state it.
 */
function conditionPrefix(c: Condition, record: RecordLayout, written: ReadonlySet<number>, v: 2 | 3): string | undefined {
  if (v === 3) {
    if (c.terms.length === 1) return `if (${record.ref[c.terms[0]!.bit]} == ${c.terms[0]!.value}) `;
    return c.terms.map((t) => `if (${record.ref[t.bit]} == ${t.value}) { `).join('');
  }
  const regs = new Set(c.terms.map((t) => record.place[t.bit]!.reg));
  if (regs.size !== 1) return undefined;
  const reg = [...regs][0]!;
  const named = new Set(c.terms.map((t) => t.bit));
  if (record.members.get(reg)!.some((b) => written.has(b) && !named.has(b))) return undefined;
  const n = c.terms.reduce((acc, t) => acc + t.value * 2 ** record.place[t.bit]!.index, 0);
  return `if (${reg} == ${n}) `;
}

/** A composite as a `gate` definition over local qubits q0, q1, … (circuit parameters written as numbers). */
function compositeText(d: CompositeGateDefinition, v: 2 | 3, circuitParams: Readonly<Record<string, number>>): string {
  const values: Record<string, number> = {};
  for (const [k, x] of Object.entries(circuitParams)) if (!d.params.includes(k)) values[k] = x;
  const steps = d.steps.map((s) => {
    const args = s.angles.map((a) => {
      const t = parseExpression(a);
      if ('error' in t) throw new Error(`internal: angle '${a}' of gate '${d.name}' does not parse`);
      return printExpr(fromFrayTree(t.tree, values), v);
    });
    const name = builtinGate(s.gate)?.name ?? s.gate; // custom gates never share a built-in's name here (needCustom refuses)
    return `${QASM_NAME.get(name) ?? name}${args.length > 0 ? `(${args.join(', ')})` : ''} ${s.targets.map((t) => `q${t}`).join(', ')};`;
  });
  const params = d.params.length > 0 ? `(${d.params.join(', ')})` : '';
  return `gate ${d.name}${params} ${Array.from({ length: d.qubits }, (_, i) => `q${i}`).join(', ')} { ${steps.join(' ')} }`;
}

/**
 * Registers for the circuit's qubits: its labels when they are `name[index]` with every
 * register's indices 0..size−1 in order, otherwise one register `q` (labels listed in a comment).
 */
function registerLayout(circuit: Circuit): { declarations: { name: string; size: number }[]; ref: string[]; names: Set<string>; comment: string | null } {
  const n = circuit.register.n;
  const labels = circuit.register.labels;
  if (labels !== null) {
    const declarations: { name: string; size: number }[] = [];
    let ok = true;
    for (const l of labels) {
      const m = /^([a-z][A-Za-z0-9_]*)\[(\d+)\]$/.exec(l);
      if (m === null) {
        ok = false;
        break;
      }
      const last = declarations[declarations.length - 1];
      if (last !== undefined && last.name === m[1] && Number(m[2]) === last.size) last.size++;
      else if (Number(m[2]) === 0 && !declarations.some((d) => d.name === m[1])) declarations.push({ name: m[1]!, size: 1 });
      else {
        ok = false;
        break;
      }
    }
    if (ok) return { declarations, ref: [...labels], names: new Set(declarations.map((d) => d.name)), comment: null };
  }
  const ref = Array.from({ length: n }, (_, i) => `q[${i}]`);
  const comment = labels === null ? null : `// qubits: ${labels.map((l, i) => `q[${i}] = ${l}`).join(', ')}`;
  return { declarations: [{ name: 'q', size: n }], ref, names: new Set(['q']), comment };
}
