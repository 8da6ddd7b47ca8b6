/**
 * OpenQASM syntax tree → fray's typed circuit (src/circuit/circuit.ts), the same type the
 * YAML reader produces. Registers are laid out in declaration order (the first declared
 * register's element 0 is qubit 0, the most significant bit, see src/engine/layout.ts) and
 * each qubit is labelled `name[index]`. Gate definitions become composite gates (one gate
 * for noise and scheduling, with their own profile entry); standard gates become fray's
 * built-ins (./library.ts); modifiers are resolved by ./modifiers.ts.
 *
 * Measurement: a program whose measurements are all terminal (nothing acts on a measured
 * qubit afterwards, no bit is written twice, no `if`) is a version-1 circuit with fray's
 * terminal measurement; its outcome order is fray's (measured qubits in ascending index,
 * see src/api/simulate.ts measuredQubits), which equals the classical-bit order whenever bits
 * are assigned to qubits in increasing order (a warning says so when they are not). Any
 * other program is in record mode (docs/format.md, mid-circuit measurement): every
 * `measure` writes its bit, `if` becomes a condition on the bits, and the record's order is
 * the bit registers' declaration order, then index (only bits some measurement writes).
 * `finishRecord` is the one place that decides.
 */
import type { Circuit, CompositeGateDefinition, CompositeStep, Condition, ConditionTerm, GateDefinition, GateOperation, Operation } from '../../circuit/circuit.js';
import { definitionParts, definitionUnitary } from '../../circuit/definitions.js';
import { BUILTIN_GATES, builtinGate } from '../../circuit/gates.js';
import { suggest } from '../../circuit/suggest.js';
import { fromRows, mul, adjoint, type CMatrix } from '../../linalg/cmatrix.js';
import { fileStart, type ProblemList, type SourcePosition } from '../problem.js';
import { MAX_DECLARED_QUBITS } from '../register.js';
import { STEP_ACTIONS, STEP_MODIFIERS } from '../stepShape.js';
import type { At, Expr, GateCall, Modifier, Operand, Program, Statement } from './ast.js';
import { evaluateQasm, frayParamName, toFrayText, unknownNameIn } from './expression.js';
import { frayGateOf, HEADER, QELIB1_GATES, standardGates, STDGATES, UNSUPPORTED_STANDARD_GATES } from './library.js';
import { CONTROLLED, inverseOf } from './modifiers.js';
import { parseQasm } from './parser.js';

/** Two unitaries count as the same gate when they differ by at most this (entrywise, after removing a global phase). */
export const SAME_GATE_TOLERANCE = 1e-9;

/** Nanoseconds per OpenQASM 3 time unit (`dt`, a device cycle, has no fixed length and is refused). */
export const QASM_TIME_UNITS: ReadonlyMap<string, number> = new Map([['ns', 1], ['us', 1e3], ['µs', 1e3], ['ms', 1e6], ['s', 1e9]]);

/** A gate the program may call: a fray built-in (under an OpenQASM name) or a program-defined composite. */
interface Callable {
  readonly frayName: string;
  readonly qubits: number;
  readonly params: number;
  readonly composite: boolean;
}

interface Register {
  readonly offset: number;
  readonly size: number;
  readonly sized: boolean;
  readonly at: At;
}

/** One gate application after modifiers: fray gate name, angles (numbers or expression text), targets. */
interface Application<A> {
  readonly name: string;
  readonly angles: readonly A[];
  readonly targets: readonly number[];
}

/** Arithmetic on angles during modifier resolution: numbers at top level, fray expression text in gate bodies. */
interface AngleOps<A> {
  neg(a: A): A;
  constant(x: number): A;
}

const numberOps: AngleOps<number> = { neg: (a) => -a, constant: (x) => x };
const textOps: AngleOps<string> = { neg: (a) => (/^[\w.]+$/.test(a) ? `-${a}` : `-(${a})`), constant: (x) => (x === -Math.PI / 2 ? '-pi/2' : String(x)) };

/** Reads OpenQASM text into a typed circuit; problems (located in the text) are collected in `problems`. */
export function readQasm(text: string, file: string, problems: ProblemList): Circuit | undefined {
  const parsed = parseQasm(text);
  if ('problem' in parsed) {
    problems.error({ file, ...parsed.problem.at }, 'qasm-syntax', parsed.problem.message);
    return undefined;
  }
  return lowerQasm(parsed.program, file, problems);
}

/** A parsed program (./parser.ts) as a typed circuit; problems (located in `file`) are collected in `problems`. */
export function lowerQasm(program: Program, file: string, problems: ProblemList): Circuit | undefined {
  return new Lowering(program, file, problems).run();
}

class Lowering {
  private readonly version: 2 | 3;
  private included = false;
  private readonly qregs = new Map<string, Register>();
  private readonly cregs = new Map<string, Register>();
  private readonly labels: string[] = [];
  private bitCount = 0;
  private readonly bitNames: string[] = [];
  private readonly defined = new Map<string, Callable>();
  private readonly definitions = new Map<string, GateDefinition>();
  private readonly ops: Operation[] = [];
  /** Qubit → where it was measured (measurement is terminal here). */
  private readonly measuredAt = new Map<number, At>();
  /** Bit → where it was written. */
  private readonly bitWrittenAt = new Map<number, At>();
  /** (bit, qubit) of every measurement with a bit, in program order. */
  private readonly records: { bit: number; qubit: number; at: At }[] = [];
  private firstQregAt: At | undefined;
  /** The first thing that needs record mode (an operation after a measurement, a bit written twice, an `if`). */
  private needsRecord: { at: At; why: string } | undefined;
  /** Measurements that store no bit (`measure q;`): an input error in record mode. */
  private readonly plainMeasures: At[] = [];

  constructor(
    private readonly program: Program,
    private readonly file: string,
    private readonly problems: ProblemList,
  ) {
    this.version = program.version;
  }

  private pos(at: At): SourcePosition {
    return { file: this.file, line: at.line, col: at.col };
  }

  private error(at: At, code: string, message: string): void {
    this.problems.error(this.pos(at), code, message);
  }

  run(): Circuit | undefined {
    this.physicalQubits();
    this.program.statements.forEach((s, i) => this.statement(s, i));
    if (this.labels.length === 0 && this.problems.ok) {
      this.error(this.program.versionAt, 'no-qubits', `the program declares no qubits; declare them with ${this.version === 2 ? "'qreg q[n];'" : "'qubit[n] q;'"}`);
    }
    const record = this.finishRecord();
    if (!this.problems.ok || record === undefined) return undefined;
    const gateArity = new Map<string, number>();
    for (const [name, g] of BUILTIN_GATES) if (name === g.name) gateArity.set(name, g.qubits);
    for (const d of this.definitions.values()) gateArity.set(d.name, d.qubits);
    const at = this.firstQregAt ?? this.program.versionAt;
    return {
      file: this.file,
      name: null,
      register: { n: this.labels.length, labels: [...this.labels] },
      params: {},
      channels: new Map(),
      gateArity,
      definitions: this.definitions,
      compositeGates: new Set(this.definitions.keys()),
      observe: [],
      device: null,
      inlineNoise: null,
      operations: record.operations,
      stepsAt: fileStart(this.file),
      qubitsAt: this.pos(at),
      bits: record.bits,
    };
  }

  /**
   * OpenQASM 3's physical qubits `$0`, `$1`, … need no declaration: the ones a program uses
   * become its qubits in ascending number, labelled `$k`. A program may not also declare qubits.
   */
  private physicalQubits(): void {
    const used = new Map<number, At>();
    const visit = (st: Statement): void => {
      const ops: Operand[] = st.k === 'call' || st.k === 'reset' || st.k === 'barrier' || st.k === 'delay' ? [...st.operands] : st.k === 'measure' ? [st.qubit] : [];
      for (const o of ops) if (o.name.startsWith('$') && !used.has(Number(o.name.slice(1)))) used.set(Number(o.name.slice(1)), o.at);
      if (st.k === 'if') st.body.forEach(visit);
    };
    this.program.statements.forEach(visit);
    if (used.size === 0) return;
    const declared = this.program.statements.find((st) => st.k === 'qreg');
    if (declared !== undefined) {
      this.error(declared.at, 'qasm-physical', `the program uses physical qubits (${[...used.keys()].map((k) => `$${k}`).join(', ')}) and declares qubits; use one or the other`);
      return;
    }
    const ks = [...used.keys()].sort((a, b) => a - b);
    if (ks.length > MAX_DECLARED_QUBITS) {
      this.error(used.get(ks[MAX_DECLARED_QUBITS]!)!, 'qasm-size', `the program uses ${ks.length} physical qubits; fray simulates at most ${MAX_DECLARED_QUBITS}`);
      return;
    }
    for (const k of ks) {
      this.qregs.set(`$${k}`, { offset: this.labels.length, size: 1, sized: false, at: used.get(k)! });
      this.labels.push(`$${k}`);
    }
    this.firstQregAt = used.get(ks[0]!);
  }

  private statement(s: Statement, index: number, cond?: Condition): void {
    const v3only = (what: string, at: At): boolean => {
      if (this.version === 3) return false;
      this.error(at, 'qasm-version', `${what} is OpenQASM 3; this program declares 'OPENQASM 2.0;'`);
      return true;
    };
    switch (s.k) {
      case 'include':
        return this.include(s.path, s.at);
      case 'qreg':
      case 'creg':
        if (s.style === 3 && v3only(`'${s.k === 'qreg' ? 'qubit' : 'bit'}' declaration`, s.at)) return;
        return this.declare(s.k, s.name, s.size, s.sized, s.at, s.nameAt, s.sizeAt);
      case 'gate':
        return this.defineGate(s);
      case 'opaque':
        return this.error(s.at, 'qasm-opaque', `opaque gate '${s.name}' has no definition, so fray cannot simulate it; give it a 'gate' definition`);
      case 'call':
        if (s.modifiers.length > 0 && v3only('a gate modifier', s.modifiers[0]!.at)) return;
        return this.call(s, index, cond);
      case 'gphase':
        // A global phase multiplies the whole state: it cannot be observed, so it adds nothing.
        v3only("'gphase'", s.at);
        return;
      case 'measure':
        return this.measure(s.qubit, s.bit, s.at, index);
      case 'reset':
        for (const q of this.qubitsOf(s.operands)) {
          this.afterMeasure(q, s.at);
          this.ops.push({ step: index, at: this.pos(s.at), kind: 'reset', qubits: [q], ...(cond !== undefined ? { condition: cond } : {}) });
        }
        return;
      case 'barrier': {
        const qs = s.operands.length === 0 ? this.labels.map((_, i) => i) : this.qubitsOf(s.operands);
        if (qs.length > 0) this.ops.push({ step: index, at: this.pos(s.at), kind: 'barrier', qubits: [...new Set(qs)] });
        return;
      }
      case 'delay':
        if (v3only("'delay'", s.at)) return;
        return this.delay(s.duration, s.operands, s.at, index);
      case 'if':
        return this.ifStatement(s, index, cond);
    }
  }

  /**
   * `if (c == n)` → every bit c[i] must read bit i of n (c[0] least significant, as OpenQASM
   * 2.0 defines it); `if (c[i] == v)`, `if (c[i])`, `if (!c[i])` → one bit. A bit no earlier
   * measurement writes reads 0: a term asking 0 of it always holds and is left out, one
   * asking 1 can never hold and is an error. Nested `if`s (OpenQASM 3) join their terms.
   */
  private ifStatement(s: Extract<Statement, { k: 'if' }>, index: number, outer: Condition | undefined): void {
    const c = s.condition;
    this.needsRecord ??= { at: s.at, why: "'if'" };
    const bits = this.element(c.operand, 'creg');
    if (bits === undefined) return;
    const whole = c.operand.index === null && bits.length > 1;
    if (this.version === 2 && c.operand.index !== null) {
      this.error(c.operand.at, 'qasm-condition', `OpenQASM 2.0 compares a whole bit register with an integer ('if (${c.operand.name} == n)'); single bits are OpenQASM 3`);
      return;
    }
    if (whole && !c.compared) {
      this.error(c.operand.at, 'qasm-condition', `a condition on the whole register '${c.operand.name}' needs '== n' (fray conditions on bit values, not on a register being non-zero)`);
      return;
    }
    if (!Number.isInteger(c.value) || c.value < 0 || c.value >= 2 ** bits.length) {
      const range = bits.length === 1 ? '0 or 1' : `a whole number from 0 to ${2 ** bits.length - 1}`;
      this.error(c.valueAt, 'qasm-condition', `${whole ? `register '${c.operand.name}'` : `bit ${this.bitNames[bits[0]!]}`} can hold ${range}, so '== ${c.value}' can never hold`);
      return;
    }
    const terms: ConditionTerm[] = [...(outer?.terms ?? [])];
    for (let i = 0; i < bits.length; i++) {
      const b = bits[i]!;
      const value = ((c.value >> i) & 1) as 0 | 1;
      if (!this.bitWrittenAt.has(b)) {
        if (value === 0) continue;
        this.error(c.valueAt, 'qasm-condition', `bit ${this.bitNames[b]} is not written by any measurement before this 'if', so it reads 0 and the condition can never hold`);
        return;
      }
      terms.push({ bit: b, value });
    }
    const condition: Condition | undefined = terms.length > 0 ? { terms, at: this.pos(s.at) } : undefined;
    for (const st of s.body) {
      if (st.k === 'call' || st.k === 'reset' || st.k === 'if' || st.k === 'barrier' || st.k === 'gphase') this.statement(st, index, condition);
      else this.error(st.at, 'qasm-condition', `fray conditions gates and resets on bits; a conditional '${st.k}' is not supported`);
    }
  }

  /**
   * Version 1 (terminal measurement) when nothing needs the record, record mode otherwise:
   * bits renumbered to the record's order (declaration order, then index, of written bits).
   */
  private finishRecord(): { operations: Operation[]; bits: string[] | null } | undefined {
    if (this.needsRecord === undefined) {
      this.checkRecordOrder();
      // terminal measurement: no bits
      return { operations: this.ops.map((op) => (op.kind === 'measure' && op.bit !== undefined ? { step: op.step, at: op.at, kind: 'measure', qubits: op.qubits } : op)), bits: null };
    }
    for (const at of this.plainMeasures) {
      this.error(at, 'qasm-measure', `this measurement stores no bit, but the program uses mid-circuit measurement (${this.needsRecord.why} on line ${this.needsRecord.at.line}); write 'c[i] = measure q[j];' or 'measure q[j] -> c[i];'`);
    }
    if (this.plainMeasures.length > 0) return undefined;
    const written = [...this.bitWrittenAt.keys()].sort((a, b) => a - b);
    const index = new Map(written.map((b, i) => [b, i] as const));
    const remap = (c: Condition): Condition => ({ at: c.at, terms: c.terms.map((t) => ({ bit: index.get(t.bit)!, value: t.value })) });
    const operations = this.ops.map((op): Operation => {
      if (op.kind === 'measure') return { ...op, bit: index.get(op.bit!)! };
      if ((op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel') && op.condition !== undefined) return { ...op, condition: remap(op.condition) };
      return op;
    });
    return { operations, bits: written.map((b) => this.bitNames[b]!) };
  }

  private include(path: string, at: At): void {
    if (path === HEADER[this.version]) {
      this.included = true;
      return;
    }
    const other = this.version === 2 ? 3 : 2;
    if (path === HEADER[other]) {
      this.error(at, 'qasm-include', `'${path}' is the OpenQASM ${other === 2 ? '2.0' : '3'} header; this OpenQASM ${this.version === 2 ? '2.0' : '3'} program includes "${HEADER[this.version]}"`);
      return;
    }
    this.error(at, 'qasm-include', `cannot include '${path}': fray reads only the standard header "${HEADER[this.version]}"; copy the definitions you need into the program`);
  }

  private declare(kind: 'qreg' | 'creg', name: string, size: number, sized: boolean, at: At, nameAt: At, sizeAt: At): void {
    const other = this.qregs.get(name) ?? this.cregs.get(name);
    if (other !== undefined) {
      this.error(nameAt, 'qasm-duplicate', `register '${name}' is declared twice (first on line ${other.at.line})`);
      return;
    }
    if (!Number.isInteger(size) || size < 1) {
      this.error(sizeAt, 'qasm-size', `a register size must be a whole number, 1 or more, not ${size}`);
      return;
    }
    if (kind === 'qreg') {
      if (this.labels.length + size > MAX_DECLARED_QUBITS) {
        this.error(sizeAt, 'qasm-size', `the program declares ${this.labels.length + size} qubits; fray simulates at most ${MAX_DECLARED_QUBITS}`);
        return;
      }
      this.firstQregAt ??= at;
      this.qregs.set(name, { offset: this.labels.length, size, sized, at });
      for (let i = 0; i < size; i++) this.labels.push(sized ? `${name}[${i}]` : name);
    } else {
      this.cregs.set(name, { offset: this.bitCount, size, sized, at });
      for (let i = 0; i < size; i++) this.bitNames.push(sized ? `${name}[${i}]` : name);
      this.bitCount += size;
    }
  }

  /** The gate called `name` (program definitions first, then the standard gates in scope), or a located problem. */
  private callable(name: string, at: At): Callable | undefined {
    const d = this.defined.get(name);
    if (d !== undefined) return d;
    const available = standardGates(this.version, this.included);
    if (available.includes(name)) {
      const g = builtinGate(frayGateOf(name))!;
      return { frayName: g.name, qubits: g.qubits, params: g.params.length, composite: false };
    }
    const unsupported = UNSUPPORTED_STANDARD_GATES.get(name);
    if (unsupported !== undefined) {
      this.error(at, 'qasm-unsupported-gate', `gate '${name}' is not supported: ${unsupported}`);
      return undefined;
    }
    const header = this.version === 2 ? QELIB1_GATES : STDGATES;
    if (!this.included && header.includes(name)) {
      this.error(at, 'qasm-unknown-gate', `gate '${name}' is defined in ${HEADER[this.version]}; add 'include "${HEADER[this.version]}";' after the version line`);
      return undefined;
    }
    const known = [...this.defined.keys(), ...available];
    const near = suggest(name, known);
    const hint = near !== undefined ? `did you mean '${near}'?` : known.length > 0 ? `known gates: ${known.slice(0, 12).join(', ')}${known.length > 12 ? ', …' : ''}` : 'the program defines no gates';
    this.error(at, 'qasm-unknown-gate', `unknown gate '${name}'; ${hint}`);
    return undefined;
  }

  /** Evaluates an angle or a modifier argument at top level (only constants). */
  private number(e: Expr): number | undefined {
    const r = evaluateQasm(e, new Map(), this.version);
    if ('problem' in r) {
      this.error(r.problem.at, 'qasm-angle', r.problem.message);
      return undefined;
    }
    return r.value;
  }

  /** A whole number ≥ min from a modifier argument. */
  private count(e: Expr, what: string, min: number): number | undefined {
    const v = this.number(e);
    if (v === undefined) return undefined;
    if (!Number.isInteger(v) || v < min) {
      this.error(e.at, 'qasm-modifier', `${what} must be a whole number${min > 0 ? `, ${min} or more` : ''}, not ${v}${what.startsWith('pow') ? '; fray applies integer powers only' : ''}`);
      return undefined;
    }
    return v;
  }

  /**
   * Resolves modifiers on gate `g` with `angles`: modifiers commute for integer powers
   * (C-(U^k) = (C-U)^k and (U^k)† = (U†)^k), so the result is `repeat` applications of the
   * built-in controlled form of U or U†, with negated controls between x gates.
   */
  private modified<A>(g: Callable, angles: readonly A[], mods: readonly Modifier[], targets: readonly number[], ops: AngleOps<A>): Application<A>[] | undefined {
    let invert = false;
    let repeat = 1;
    const controls: ('ctrl' | 'negctrl')[] = [];
    for (const m of mods) {
      if (m.k === 'inv') invert = !invert;
      else if (m.k === 'pow') {
        const k = this.count(m.exponent, 'pow(k)', Number.NEGATIVE_INFINITY);
        if (k === undefined) return undefined;
        if (k < 0) invert = !invert;
        repeat *= Math.abs(k);
      } else {
        const c = m.count === null ? 1 : this.count(m.count, `${m.k}(n)`, 1);
        if (c === undefined) return undefined;
        for (let i = 0; i < c; i++) controls.push(m.k);
      }
    }
    let name = g.frayName;
    let a: readonly A[] = angles;
    const where = mods[0]?.at;
    if (invert) {
      const inv = g.composite ? this.inverseComposite(name, a, where!) : inverseOfAngles(name, a, ops);
      if (inv === null) return undefined;
      if (inv === undefined) {
        this.error(where!, 'qasm-modifier', `inv @ ${name}: fray has no built-in inverse of '${name}'; define the inverse as a gate of its own`);
        return undefined;
      }
      ({ name, angles: a } = inv);
    }
    for (let i = 0; i < controls.length; i++) {
      const c = g.composite ? undefined : CONTROLLED.get(name);
      if (c === undefined) {
        this.error(where!, 'qasm-modifier', `ctrl @ ${name}: fray has no built-in controlled '${name}' (it has ${[...CONTROLLED].map(([, v]) => v).filter((v, j, all) => all.indexOf(v) === j).join(', ')})`);
        return undefined;
      }
      name = c;
    }
    const negated = controls.flatMap((c, i) => (c === 'negctrl' ? [targets[i]!] : []));
    const one: Application<A>[] = [
      ...negated.map((q) => ({ name: 'x', angles: [], targets: [q] })),
      { name, angles: a, targets },
      ...negated.map((q) => ({ name: 'x', angles: [], targets: [q] })),
    ];
    return Array.from({ length: repeat }, () => one).flat();
  }

  /**
   * `inv @ g` for a defined gate g: the composite `g_inv` (g's steps reversed, each replaced
   * by its built-in inverse), defined once; it is a gate of its own for noise profiles.
   * Null when it cannot be built (the problem is recorded).
   */
  private inverseComposite<A>(name: string, angles: readonly A[], at: At): { name: string; angles: A[] } | null {
    const invName = `${name}_inv`;
    const existing = this.definitions.get(invName);
    if (existing === undefined) {
      if (this.defined.has(invName) || builtinGate(invName) !== undefined) {
        this.error(at, 'qasm-modifier', `inv @ ${name} would define '${invName}', which already names another gate; define the inverse yourself`);
        return null;
      }
      const def = this.definitions.get(name)!;
      if (def.kind !== 'composite') return null;
      const steps: CompositeStep[] = [];
      for (const st of [...def.steps].reverse()) {
        const inner = this.definitions.get(st.gate);
        const inv = inner !== undefined ? this.inverseComposite(st.gate, st.angles, at) : inverseOfAngles(st.gate, st.angles, textOps);
        if (inv === null) return null;
        if (inv === undefined) {
          this.error(at, 'qasm-modifier', `inv @ ${name}: its step '${st.gate}' has no built-in inverse in fray; define the inverse as a gate of its own`);
          return null;
        }
        steps.push({ gate: inv.name, targets: st.targets, angles: inv.angles });
      }
      this.definitions.set(invName, { kind: 'composite', name: invName, qubits: def.qubits, params: def.params, steps });
    }
    return { name: invName, angles: [...angles] };
  }

  private call(s: GateCall, index: number, cond?: Condition): void {
    const g = this.callable(s.name, s.nameAt);
    if (g === undefined) return;
    const ctrlCount = this.controlCount(s.modifiers);
    if (ctrlCount === undefined) return;
    if (!this.checkArgs(g, s, ctrlCount)) return;
    const angles: number[] = [];
    for (const e of s.args) {
      const v = this.number(e);
      if (v === undefined) return;
      angles.push(v);
    }
    const groups = this.broadcast(s.operands, s.at);
    if (groups === undefined) return;
    for (const targets of groups) {
      if (new Set(targets).size !== targets.length) {
        this.error(s.operands[0]!.at, 'qasm-repeated-qubit', `${s.name} names qubit ${this.labels[targets.find((q, i) => targets.indexOf(q) !== i)!]} twice in one application; each qubit may appear once`);
        return;
      }
      for (const q of targets) this.afterMeasure(q, s.at);
      const apps = this.modified(g, angles, s.modifiers, targets, numberOps);
      if (apps === undefined) return;
      for (const app of apps) {
        const unitary = this.unitaryOf(app.name, app.angles, s.at);
        if (unitary === undefined) return;
        const def = this.definitions.get(app.name);
        const parts = def?.kind === 'composite' ? definitionParts(def, app.angles, this.definitions, app.targets) : undefined;
        if (parts !== undefined && 'error' in parts) throw new Error(`internal: ${parts.error}`); // the unitary above evaluated the same steps
        const op: GateOperation = { step: index, at: this.pos(s.at), kind: 'gate', name: app.name, qubits: app.targets, unitary, ...(app.angles.length > 0 ? { angles: app.angles } : {}), ...(parts !== undefined ? { parts } : {}), ...(cond !== undefined ? { condition: cond } : {}) };
        this.ops.push(op);
      }
    }
  }

  /** The number of control qubits the modifiers add (validated again when resolved). */
  private controlCount(mods: readonly Modifier[]): number | undefined {
    let n = 0;
    for (const m of mods) {
      if (m.k !== 'ctrl' && m.k !== 'negctrl') continue;
      const c = m.count === null ? 1 : this.count(m.count, `${m.k}(n)`, 1);
      if (c === undefined) return undefined;
      n += c;
    }
    return n;
  }

  private checkArgs(g: Callable, s: GateCall, controls: number): boolean {
    if (s.args.length !== g.params) {
      const want = g.params === 0 ? 'no angles' : `${g.params} angle${g.params === 1 ? '' : 's'}`;
      this.error(s.nameAt, 'qasm-arity', `gate '${s.name}' takes ${want}, ${s.args.length} given`);
      return false;
    }
    const want = g.qubits + controls;
    if (s.operands.length !== want) {
      this.error(s.operands[0]?.at ?? s.nameAt, 'qasm-arity', `gate '${s.name}'${controls > 0 ? ` with ${controls} control${controls === 1 ? '' : 's'}` : ''} acts on ${want} qubit${want === 1 ? '' : 's'}, ${s.operands.length} given`);
      return false;
    }
    return true;
  }

  /** The unitary of a fray gate (built-in or program-defined composite) at these angles; a body angle that does not evaluate (1/a at a = 0) is a problem at the call. */
  private unitaryOf(name: string, angles: readonly number[], at: At): CMatrix | undefined {
    const b = builtinGate(name);
    if (b !== undefined) return b.matrix(angles);
    const u = definitionUnitary(this.definitions.get(name)!, angles, this.definitions);
    if ('error' in u) {
      this.error(at, 'qasm-angle', `${u.error} (with the angles of this call)`);
      return undefined;
    }
    return u.matrix;
  }

  /** Qubit index of a register element, or undefined (with a located problem). */
  private element(o: Operand, kind: 'qreg' | 'creg'): number[] | undefined {
    const regs = kind === 'qreg' ? this.qregs : this.cregs;
    const r = regs.get(o.name);
    if (r === undefined) {
      const otherKind = (kind === 'qreg' ? this.cregs : this.qregs).has(o.name);
      if (otherKind) {
        this.error(o.at, 'qasm-register-kind', `'${o.name}' is a ${kind === 'qreg' ? 'bit' : 'qubit'} register; ${kind === 'qreg' ? 'a qubit' : 'a bit'} is expected here`);
        return undefined;
      }
      const names = [...regs.keys()];
      const near = suggest(o.name, names);
      const hint = near !== undefined ? `did you mean '${near}'?` : names.length > 0 ? `declared: ${names.join(', ')}` : `none is declared yet`;
      this.error(o.at, 'qasm-unknown-register', `unknown ${kind === 'qreg' ? 'qubit' : 'bit'} register '${o.name}'; ${hint}`);
      return undefined;
    }
    if (o.index === null) return Array.from({ length: r.size }, (_, i) => r.offset + i);
    if (!r.sized || !Number.isInteger(o.index) || o.index >= r.size) {
      const range = r.sized ? `indices 0 to ${r.size - 1}` : 'no index (it is a single one)';
      this.error(o.indexAt ?? o.at, 'qasm-index', `${o.name}[${o.index}] is out of range; '${o.name}' has ${range}`);
      return undefined;
    }
    return [r.offset + o.index];
  }

  private qubitsOf(operands: readonly Operand[]): number[] {
    const out: number[] = [];
    for (const o of operands) out.push(...(this.element(o, 'qreg') ?? []));
    return out;
  }

  /**
   * OpenQASM's broadcast: a register operand stands for each of its elements in turn;
   * all register operands of one call must have the same size; single qubits repeat.
   */
  private broadcast(operands: readonly Operand[], at: At): number[][] | undefined {
    const lists: number[][] = [];
    for (const o of operands) {
      const l = this.element(o, 'qreg');
      if (l === undefined) return undefined;
      lists.push(o.index === null ? l : [l[0]!]);
    }
    const sizes = new Set(operands.map((o, i) => (o.index === null ? lists[i]!.length : 0)).filter((n) => n > 0));
    if (sizes.size > 1) {
      this.error(at, 'qasm-broadcast', `registers of different sizes (${[...sizes].join(' and ')}) in one call; OpenQASM applies a gate element by element to registers of one size`);
      return undefined;
    }
    const n = sizes.size === 0 ? 1 : [...sizes][0]!;
    return Array.from({ length: n }, (_, j) => lists.map((l, i) => (operands[i]!.index === null ? l[j]! : l[0]!)));
  }

  /** Notes an operation on a qubit after its measurement: the program then needs record mode. */
  private afterMeasure(q: number, at: At): void {
    if (this.measuredAt.has(q)) this.needsRecord ??= { at, why: `an operation on ${this.labels[q]} after its measurement` };
  }

  private measure(qo: Operand, bo: Operand | null, at: At, index: number): void {
    const qs = this.element(qo, 'qreg');
    const bs = bo === null ? null : this.element(bo, 'creg');
    if (qs === undefined || bs === undefined) return;
    if (bs !== null && bs.length !== qs.length) {
      this.error(bo!.at, 'qasm-broadcast', `measure maps ${qs.length} qubit${qs.length === 1 ? '' : 's'} onto ${bs.length} bit${bs.length === 1 ? '' : 's'}; give a qubit and a bit, or registers of one size`);
      return;
    }
    qs.forEach((q, j) => {
      this.afterMeasure(q, at);
      if (bs === null) this.plainMeasures.push(at);
      else {
        const b = bs[j]!;
        if (this.bitWrittenAt.has(b)) this.needsRecord ??= { at, why: `bit ${this.bitNames[b]} written twice` };
        this.bitWrittenAt.set(b, at);
        this.records.push({ bit: b, qubit: q, at });
      }
      this.measuredAt.set(q, at);
      // the bit is the bit register's own index here; finishRecord renumbers or drops it
      this.ops.push({ step: index, at: this.pos(at), kind: 'measure', qubits: [q], ...(bs !== null ? { bit: bs[j]! } : {}) });
    });
  }

  /** Warns when the classical-bit order differs from fray's outcome order (measured qubits ascending). */
  private checkRecordOrder(): void {
    const byBit = [...this.records].sort((x, y) => x.bit - y.bit);
    for (let i = 1; i < byBit.length; i++) {
      if (byBit[i]!.qubit < byBit[i - 1]!.qubit) {
        const r = byBit[i]!;
        this.problems.warn(
          this.pos(r.at),
          'qasm-record-order',
          `${this.bitNames[r.bit]} holds ${this.labels[r.qubit]} but an earlier bit holds ${this.labels[byBit[i - 1]!.qubit]}: fray's outcomes list the measured qubits in ascending order (lowest leftmost), so they are not in this program's bit order`,
        );
        return;
      }
    }
  }

  private delay(d: { value: number; unit: string; at: At }, operands: readonly Operand[], at: At, index: number): void {
    if (d.unit === 'dt') {
      this.error(d.at, 'qasm-delay', `'dt' (one device cycle) has no fixed length; give the delay in ns, us, µs, ms or s`);
      return;
    }
    const ns = d.value * QASM_TIME_UNITS.get(d.unit)!;
    if (!Number.isFinite(ns) || ns < 0) {
      this.error(d.at, 'qasm-delay', `a delay must be a finite time of 0 or more, not ${d.value}${d.unit}`);
      return;
    }
    const qs = operands.length === 0 ? this.labels.map((_, i) => i) : this.qubitsOf(operands);
    for (const q of [...new Set(qs)]) this.ops.push({ step: index, at: this.pos(at), kind: 'idle', qubits: [q], duration: ns });
  }

  /** A `gate` definition → a composite gate (or fray's built-in of that name when the body equals it). */
  private defineGate(s: Extract<Statement, { k: 'gate' }>): void {
    const name = s.name;
    if (this.defined.has(name)) {
      this.error(s.nameAt, 'qasm-duplicate', `gate '${name}' is defined twice`);
      return;
    }
    if (standardGates(this.version, this.included).includes(name)) {
      this.error(s.nameAt, 'qasm-duplicate', `'${name}' is a standard gate${PRIMITIVE_OR_HEADER(this.version, name)}; give the definition another name`);
      return;
    }
    const reserved = [...STEP_ACTIONS, ...STEP_MODIFIERS, 'all', 'noise'];
    if (reserved.includes(name)) {
      this.error(s.nameAt, 'qasm-gate-name', `'${name}' is a word of fray's circuit format (${reserved.join(', ')}); give the gate another name`);
      return;
    }
    const params = s.params.map((p) => p.name);
    const qubits = s.qubits.map((q) => q.name);
    for (const list of [s.params, s.qubits]) {
      for (let i = 0; i < list.length; i++) {
        if (list.findIndex((x) => x.name === list[i]!.name) !== i) {
          this.error(list[i]!.at, 'qasm-duplicate', `'${list[i]!.name}' is listed twice in the definition of '${name}'`);
          return;
        }
      }
    }
    const steps: CompositeStep[] = [];
    for (const st of s.body) {
      if (st.k !== 'call') continue; // barriers inside one gate and global phases change nothing fray simulates
      const g = this.callable(st.name, st.nameAt);
      if (g === undefined) return;
      const ctrl = this.controlCount(st.modifiers);
      if (ctrl === undefined || !this.checkArgs(g, st, ctrl)) return;
      const targets: number[] = [];
      for (const o of st.operands) {
        const k = qubits.indexOf(o.name);
        if (o.index !== null || k < 0) {
          const near = suggest(o.name, qubits);
          const why = o.index !== null ? 'inside a gate definition, qubits are its arguments, without an index' : `unknown qubit argument '${o.name}'${near !== undefined ? `; did you mean '${near}'?` : ` (arguments: ${qubits.join(', ')})`}`;
          this.error(o.at, 'qasm-gate-body', why);
          return;
        }
        targets.push(k);
      }
      if (new Set(targets).size !== targets.length) {
        this.error(st.operands[0]!.at, 'qasm-repeated-qubit', `${st.name} names one qubit twice in one application; each qubit may appear once`);
        return;
      }
      for (const e of st.args) if (!this.checkNames(e, params)) return;
      const apps = this.modified(g, st.args.map(toFrayText), st.modifiers, targets, textOps);
      if (apps === undefined) return;
      for (const a of apps) steps.push({ gate: a.name, targets: a.targets, angles: a.angles });
    }
    const def: CompositeGateDefinition = { kind: 'composite', name, qubits: qubits.length, params: params.map(frayParamName), steps };
    const builtin = builtinGate(name);
    if (builtin !== undefined) {
      // A program may define a gate fray has built in (a header it does not include, an exporter's definition):
      // it is that gate when the matrices agree up to a global phase at a few angles, otherwise a clash.
      if (builtin.qubits === qubits.length && builtin.params.length === params.length && sameUpToPhase(builtin, def, this.definitions)) {
        this.defined.set(name, { frayName: builtin.name, qubits: builtin.qubits, params: builtin.params.length, composite: false });
      } else {
        this.error(s.nameAt, 'qasm-gate-name', `gate '${name}' is defined here differently from fray's built-in '${name}'; give it another name`);
      }
      return;
    }
    this.definitions.set(name, def);
    this.defined.set(name, { frayName: name, qubits: qubits.length, params: params.length, composite: true });
  }

  /** Every name in a gate body's angle is a parameter or a constant, every function known. */
  private checkNames(e: Expr, params: readonly string[]): boolean {
    const bad = unknownNameIn(e, params, this.version);
    if (bad !== undefined) this.error(bad.at, 'qasm-angle', bad.message);
    return bad === undefined;
  }
}

function PRIMITIVE_OR_HEADER(version: 2 | 3, name: string): string {
  return name === 'U' || (version === 2 && name === 'CX') ? ' of the language' : ` of ${HEADER[version]}`;
}

/** The built-in inverse with angles of type A (numbers or expression text). */
function inverseOfAngles<A>(name: string, angles: readonly A[], ops: AngleOps<A>): { name: string; angles: A[] } | undefined {
  // Work on indices so that the same rule serves numbers and text: inverseOf on numbers 1, 2, 3… tells where each angle goes.
  const probe = angles.map((_, i) => i + 1);
  const inv = inverseOf(name, probe);
  if (inv === undefined) return undefined;
  const mapped = inv.angles.map((v) => {
    if (Math.abs(v) >= 1 && Math.abs(v) <= angles.length && Number.isInteger(v)) {
      const a = angles[Math.abs(v) - 1]!;
      return v < 0 ? ops.neg(a) : a;
    }
    return ops.constant(v);
  });
  return { name: inv.name, angles: mapped };
}

/** Whether a definition and a built-in agree up to a global phase at three fixed angle sets. */
function sameUpToPhase(builtin: { matrix(a: readonly number[]): CMatrix; params: readonly string[] }, def: CompositeGateDefinition, defs: ReadonlyMap<string, GateDefinition>): boolean {
  const samples = [0.3, 1.1, -0.7, 2.3];
  for (let t = 0; t < 3; t++) {
    const angles = builtin.params.map((_, i) => samples[(i + t) % samples.length]! * (t + 1));
    const u = definitionUnitary(def, angles, defs);
    if ('error' in u) return false;
    // W = B† U is e^{iα} I exactly when the two agree up to a phase.
    const w = mul(adjoint(builtin.matrix(angles)), u.matrix);
    const d = w.rows;
    const [pr, pi] = [w.data[0]!, w.data[1]!];
    const want = fromRows(Array.from({ length: d }, (_, r) => Array.from({ length: d }, (_, c) => (r === c ? ([pr, pi] as const) : 0))));
    for (let i = 0; i < w.data.length; i++) if (Math.abs(w.data[i]! - want.data[i]!) > SAME_GATE_TOLERANCE) return false;
    if (Math.abs(Math.hypot(pr, pi) - 1) > SAME_GATE_TOLERANCE) return false;
  }
  return true;
}

