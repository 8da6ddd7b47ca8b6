/**
 * OpenQASM angle expressions: evaluation (radians), and printing in fray's expression
 * syntax (src/circuit/expression.ts) and back in OpenQASM's. The two languages share
 * + − * / and sin cos tan exp ln sqrt; OpenQASM 3 writes powers `**` (OpenQASM 2 `^`, as
 * fray does) and has the constants pi/π, tau/τ (2π) and euler/ℇ (e).
 */
import { EXPRESSION_FUNCTIONS, RESERVED_NAMES, type ExpressionNode } from '../../circuit/expression.js';
import { suggest } from '../../circuit/suggest.js';
import type { At, Expr } from './ast.js';

/** OpenQASM's named constants → value (OpenQASM 2 knows only pi). */
export function qasmConstants(version: 2 | 3): ReadonlyMap<string, number> {
  const c = new Map<string, number>([['pi', Math.PI]]);
  if (version === 3) {
    c.set('π', Math.PI).set('tau', 2 * Math.PI).set('τ', 2 * Math.PI).set('euler', Math.E).set('ℇ', Math.E);
  }
  return c;
}

/** A problem in an expression, located at the offending node. */
export interface ExprProblem {
  readonly message: string;
  readonly at: At;
}

/** Evaluates an angle expression (radians) with the gate's parameters in `env`. */
export function evaluateQasm(e: Expr, env: ReadonlyMap<string, number>, version: 2 | 3): { value: number } | { problem: ExprProblem } {
  const constants = qasmConstants(version);
  const fail = (message: string, at: At) => ({ problem: { message, at } });
  const ev = (x: Expr): { value: number } | { problem: ExprProblem } => {
    switch (x.k) {
      case 'num':
        return { value: x.value };
      case 'id': {
        const v = env.get(x.name) ?? constants.get(x.name);
        return v !== undefined ? { value: v } : { problem: unknownNameIn(x, [...env.keys()], version)! };
      }
      case 'neg': {
        const a = ev(x.arg);
        return 'problem' in a ? a : { value: -a.value };
      }
      case 'bin': {
        const a = ev(x.l);
        if ('problem' in a) return a;
        const b = ev(x.r);
        if ('problem' in b) return b;
        const v = x.op === '+' ? a.value + b.value : x.op === '-' ? a.value - b.value : x.op === '*' ? a.value * b.value : x.op === '/' ? a.value / b.value : Math.pow(a.value, b.value);
        return Number.isFinite(v) ? { value: v } : fail(`the result of '${x.op === '^' ? (version === 3 ? '**' : '^') : x.op}' is not a finite number`, x.at);
      }
      case 'call': {
        if (!EXPRESSION_FUNCTIONS.includes(x.fn)) return { problem: unknownNameIn({ ...x, arg: { k: 'num', value: 0, at: x.at } }, [], version)! };
        const a = ev(x.arg);
        if ('problem' in a) return a;
        const f = { sin: Math.sin, cos: Math.cos, tan: Math.tan, exp: Math.exp, ln: Math.log, sqrt: Math.sqrt }[x.fn as 'sin'];
        const v = f(a.value);
        return Number.isFinite(v) ? { value: v } : fail(`the result of '${x.fn}' is not a finite number`, x.at);
      }
    }
  };
  return ev(e);
}

/** The first name or function an expression uses that is neither in `names` nor a constant or function of the language. */
export function unknownNameIn(e: Expr, names: readonly string[], version: 2 | 3): ExprProblem | undefined {
  const constants = qasmConstants(version);
  switch (e.k) {
    case 'num':
      return undefined;
    case 'id': {
      if (names.includes(e.name) || constants.has(e.name)) return undefined;
      const known = [...names, ...constants.keys()];
      const near = suggest(e.name, known);
      return { message: `unknown name '${e.name}' in an angle${near !== undefined ? `; did you mean '${near}'?` : ` (known: ${known.join(', ')})`}`, at: e.at };
    }
    case 'neg':
      return unknownNameIn(e.arg, names, version);
    case 'bin':
      return unknownNameIn(e.l, names, version) ?? unknownNameIn(e.r, names, version);
    case 'call': {
      if (!EXPRESSION_FUNCTIONS.includes(e.fn)) {
        const near = suggest(e.fn, EXPRESSION_FUNCTIONS);
        return { message: `unknown function '${e.fn}'${near !== undefined ? `; did you mean '${near}'?` : ''} (fray reads ${EXPRESSION_FUNCTIONS.join(', ')})`, at: e.at };
      }
      return unknownNameIn(e.arg, names, version);
    }
  }
}

/** Binding strength for printing: sums 1, products 2, unary minus 3, powers 4, atoms 5. */
const PREC = { '+': 1, '-': 1, '*': 2, '/': 2, neg: 3, '^': 4, atom: 5 } as const;

/** A parameter name that fray's expressions reserve (pi, e, i, deg, the functions) gets a trailing underscore. */
export function frayParamName(name: string): string {
  return RESERVED_NAMES.includes(name) ? `${name}_` : name;
}

/** Which language an expression is printed in: fray's (src/circuit/expression.ts) or OpenQASM 2.0 / 3. */
export type ExprSyntax = 'fray' | 2 | 3;

/**
 * Prints an expression with the fewest parentheses its precedence needs. fray and OpenQASM
 * 2.0 write powers `^`, OpenQASM 3 `**`; π is `pi` in all three; τ becomes `2*pi`; Euler's
 * number is `e` in fray, `euler` in OpenQASM 3 and `exp(1)` in 2.0 (which has no constant for it).
 */
export function printExpr(e: Expr, syntax: ExprSyntax): string {
  const p = (x: Expr, min: number): string => {
    const [text, prec] = ((): [string, number] => {
      switch (x.k) {
        case 'num':
          return x.value < 0 ? [`-${String(-x.value)}`, PREC.neg] : [String(x.value), PREC.atom];
        case 'id':
          if (x.name === 'pi' || x.name === 'π') return ['pi', PREC.atom];
          if (x.name === 'tau' || x.name === 'τ') return ['2*pi', PREC['*']];
          if (x.name === 'euler' || x.name === 'ℇ') {
            return syntax === 'fray' ? ['e', PREC.atom] : syntax === 3 ? ['euler', PREC.atom] : ['exp(1)', PREC.atom];
          }
          return [syntax === 'fray' ? frayParamName(x.name) : x.name, PREC.atom];
        case 'neg':
          return [`-${p(x.arg, PREC.neg)}`, PREC.neg];
        case 'call':
          return [`${x.fn}(${p(x.arg, 0)})`, PREC.atom];
        case 'bin': {
          const me = PREC[x.op];
          // left-associative + − * /: the right operand needs parentheses at equal strength; powers are right-associative
          const l = x.op === '^' ? p(x.l, me + 1) : p(x.l, me);
          const r = x.op === '^' ? p(x.r, PREC.neg) : p(x.r, me + 1);
          return [x.op === '^' ? `${l}${syntax === 3 ? '**' : '^'}${r}` : `${l} ${x.op} ${r}`, me];
        }
      }
    })();
    return prec < min ? `(${text})` : text;
  };
  return p(e, 0);
}

/** An OpenQASM expression in fray's expression syntax. */
export function toFrayText(e: Expr): string {
  return printExpr(e, 'fray');
}

/**
 * A fray expression tree as an expression of ./ast.ts (fray's `e` becomes Euler's number,
 * names listed in `values` — the circuit's parameters — become their numbers, other names stay).
 */
export function fromFrayTree(node: ExpressionNode, values: Readonly<Record<string, number>>): Expr {
  const at = { line: 0, col: node.at };
  switch (node.k) {
    case 'num':
      return { k: 'num', value: node.re, at };
    case 'name':
      if (node.name === 'e') return { k: 'id', name: 'euler', at };
      if (Object.prototype.hasOwnProperty.call(values, node.name)) return { k: 'num', value: values[node.name]!, at };
      return { k: 'id', name: node.name, at };
    case 'neg':
      return { k: 'neg', arg: fromFrayTree(node.arg, values), at };
    case 'call':
      return { k: 'call', fn: node.fn, arg: fromFrayTree(node.arg, values), at };
    case 'bin':
      return { k: 'bin', op: node.op as '+' | '-' | '*' | '/' | '^', l: fromFrayTree(node.l, values), r: fromFrayTree(node.r, values), at };
  }
}
