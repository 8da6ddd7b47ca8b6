/**
 * The syntax tree of an OpenQASM 2.0 or 3 program as fray reads it (the subset listed in
 * docs/qasm.md). Every node carries the 1-based line and column of its first token, so
 * every later complaint is located in the .qasm text.
 */

/** A 1-based line and column in the program text. */
export interface At {
  readonly line: number;
  readonly col: number;
}

/** An angle expression (radians), as written. */
export type Expr =
  | { readonly k: 'num'; readonly value: number; readonly at: At }
  | { readonly k: 'id'; readonly name: string; readonly at: At }
  | { readonly k: 'neg'; readonly arg: Expr; readonly at: At }
  | { readonly k: 'bin'; readonly op: '+' | '-' | '*' | '/' | '^'; readonly l: Expr; readonly r: Expr; readonly at: At }
  | { readonly k: 'call'; readonly fn: string; readonly arg: Expr; readonly at: At };

/** A qubit or bit operand: a whole register `q`, or one element `q[3]`. */
export interface Operand {
  readonly name: string;
  readonly index: number | null;
  readonly at: At;
  /** Where the index is (for out-of-range complaints). */
  readonly indexAt: At | null;
}

/** A gate modifier of OpenQASM 3, in the order written (the leftmost applies last). */
export type Modifier =
  | { readonly k: 'ctrl' | 'negctrl'; readonly count: Expr | null; readonly at: At }
  | { readonly k: 'inv'; readonly at: At }
  | { readonly k: 'pow'; readonly exponent: Expr; readonly at: At };

/** A gate application `mods name(args) operands;`. */
export interface GateCall {
  readonly k: 'call';
  readonly modifiers: readonly Modifier[];
  readonly name: string;
  readonly args: readonly Expr[];
  readonly operands: readonly Operand[];
  readonly at: At;
  /** Where the gate's name is. */
  readonly nameAt: At;
}

/** A duration literal of OpenQASM 3 (`100ns`, `2.5us`, `1dt`). */
export interface DurationLiteral {
  readonly value: number;
  readonly unit: string;
  readonly at: At;
}

/** The condition of an `if`: `reg == n`, `reg[i] == n`, `reg[i]` or `!reg[i]`. */
export interface Condition {
  readonly operand: Operand;
  /** The compared integer; for the bare forms 1 (`c[i]`) or 0 (`!c[i]`). */
  readonly value: number;
  /** Whether the condition compares with `==` (false for the bare forms). */
  readonly compared: boolean;
  readonly valueAt: At;
}

/** A statement of the program body (or of a gate body, where only calls, barriers and gphase occur). */
export type Statement =
  | { readonly k: 'include'; readonly path: string; readonly at: At }
  | { readonly k: 'qreg' | 'creg'; readonly name: string; readonly size: number; readonly sized: boolean; readonly at: At; readonly nameAt: At; readonly sizeAt: At; readonly style: 2 | 3 }
  | { readonly k: 'gate'; readonly name: string; readonly params: readonly { name: string; at: At }[]; readonly qubits: readonly { name: string; at: At }[]; readonly body: readonly Statement[]; readonly at: At; readonly nameAt: At }
  | { readonly k: 'opaque'; readonly name: string; readonly at: At }
  | GateCall
  | { readonly k: 'gphase'; readonly arg: Expr; readonly at: At }
  | { readonly k: 'measure'; readonly qubit: Operand; readonly bit: Operand | null; readonly at: At }
  | { readonly k: 'reset'; readonly operands: readonly Operand[]; readonly at: At }
  | { readonly k: 'barrier'; readonly operands: readonly Operand[]; readonly at: At }
  | { readonly k: 'delay'; readonly duration: DurationLiteral; readonly operands: readonly Operand[]; readonly at: At }
  | { readonly k: 'if'; readonly condition: Condition; readonly body: readonly Statement[]; readonly at: At };

/** A whole program: its declared version and statements in order. */
export interface Program {
  /** 2 or 3 (from `OPENQASM 2.0;` / `OPENQASM 3;`); a program without the line is read as 3. */
  readonly version: 2 | 3;
  readonly versionAt: At;
  readonly statements: readonly Statement[];
}
