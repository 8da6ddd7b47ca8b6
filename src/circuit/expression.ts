/**
 * A small, safe arithmetic language for gate angles and complex matrix entries.
 * No eval / Function: source → tokens → syntax tree → complex value (complex.js).
 *
 * Grammar (lowest precedence first):
 *   expr    := term (('+' | '-') term)*
 *   term    := unary (('*' | '/') unary)*
 *   unary   := ('+' | '-') unary | power
 *   power   := primary ('^' unary)?                 right-associative; -2^2 = -4, 2^-1 = 0.5
 *   primary := NUMBER | NAME | FUNC '(' expr ')' | '(' expr ')'
 *   NUMBER  := (digits ['.' digits] | '.' digits) [('e'|'E') ['+'|'-'] digits] ['deg' | 'i']
 * A number literal may carry, with no space, the suffix `deg` (× π/180) or, for complex
 * entries only, `i` (imaginary literal). Names: the constants `pi`, `e`, the imaginary unit
 * `i` (complex entries only; these are reserved and never read from the environment), then
 * the own properties of the environment. Functions: sqrt sin cos tan exp ln (principal
 * branches for complex or negative arguments).
 */
import { Complex } from 'complex.js';
import { suggest } from './suggest.js';

/** A problem in an expression: lowercase message, and the 0-based character offset where it is. */
export interface ExpressionError {
  message: string;
  offset: number;
}

/** A real result may carry an imaginary part up to this, relative to max(1, |real part|). */
export const IMAGINARY_TOLERANCE = 1e-12;

/** Deepest nesting (parentheses, signs, powers, operator chains) an expression may have. */
export const MAX_EXPRESSION_DEPTH = 200;

/** Named constants of the language (radian-valued where relevant). */
export const EXPRESSION_CONSTANTS: ReadonlyMap<string, number> = new Map([
  ['pi', Math.PI],
  ['e', Math.E],
]);

/** One-argument functions of the language (ln is the natural logarithm). */
export const EXPRESSION_FUNCTIONS: readonly string[] = ['sqrt', 'sin', 'cos', 'tan', 'exp', 'ln'];

/** Names a parameter may not take: constants, functions, the imaginary unit, the deg suffix. */
export const RESERVED_NAMES: readonly string[] = [...EXPRESSION_CONSTANTS.keys(), 'i', 'deg', ...EXPRESSION_FUNCTIONS];

/** Evaluates a real expression (an angle in radians, or a plain number) against named values. */
export function evaluateReal(
  src: string,
  env: Readonly<Record<string, number>>,
): { value: number } | { error: ExpressionError } {
  const r = run(src, env, false);
  if ('error' in r) return r;
  const z = r.value;
  if (Math.abs(z.im) > IMAGINARY_TOLERANCE * Math.max(1, Math.abs(z.re))) {
    return fail(`expected a real value but the result has imaginary part ${fmt(z.im)}`, 0);
  }
  return { value: z.re + 0 }; // + 0 turns −0 into 0
}

/** Evaluates a complex matrix entry (`i` is the imaginary unit) as [re, im]. */
export function evaluateComplex(
  src: string,
  env: Readonly<Record<string, number>>,
): { value: [number, number] } | { error: ExpressionError } {
  const r = run(src, env, true);
  if ('error' in r) return r;
  return { value: [r.value.re + 0, r.value.im + 0] };
}

/** Parses an expression into its syntax tree without evaluating it (for printing it in another syntax). */
export function parseExpression(src: string, imaginaryUnit = false): { tree: ExpressionNode } | { error: ExpressionError } {
  try {
    return { tree: new Parser(tokenize(src, imaginaryUnit), src.length).parseAll() };
  } catch (e) {
    if (e instanceof Fail) return fail(e.message, e.offset);
    throw e;
  }
}

// ─── internals ──────────────────────────────────────────────────────────────────────

type Token =
  | { kind: 'num'; text: string; re: number; im: number; at: number }
  | { kind: 'name'; text: string; at: number }
  | { kind: 'sym'; text: string; at: number } // + - * / ^ ( ) ,
  | { kind: 'end'; text: ''; at: number };

/** A parsed expression (the syntax tree the evaluator walks); `at` is a 0-based offset, `depth` the subtree height. */
export type ExpressionNode =
  | { k: 'num'; re: number; im: number; at: number; depth: number }
  | { k: 'name'; name: string; at: number; depth: number }
  | { k: 'neg'; arg: Node; at: number; depth: number }
  | { k: 'bin'; op: string; l: Node; r: Node; at: number; depth: number }
  | { k: 'call'; fn: string; arg: Node; at: number; depth: number };

type Node = ExpressionNode;

/** Thrown inside the parser/evaluator, caught once at the top. */
class Fail {
  constructor(
    readonly message: string,
    readonly offset: number,
  ) {}
}

function fail(message: string, offset: number): { error: ExpressionError } {
  return { error: { message, offset } };
}

function fmt(x: number): string {
  return String(Number(x.toPrecision(6)));
}

function run(
  src: string,
  env: Readonly<Record<string, number>>,
  imaginaryUnit: boolean,
): { value: Complex } | { error: ExpressionError } {
  try {
    const tree = new Parser(tokenize(src, imaginaryUnit), src.length).parseAll();
    return { value: evaluate(tree, env, imaginaryUnit) };
  } catch (e) {
    if (e instanceof Fail) return fail(e.message, e.offset);
    throw e;
  }
}

const isDigit = (c: string | undefined): boolean => c !== undefined && c >= '0' && c <= '9';
const isNameStart = (c: string | undefined): boolean => c !== undefined && /[A-Za-z_]/.test(c);
const isNamePart = (c: string | undefined): boolean => c !== undefined && /[A-Za-z0-9_]/.test(c);

function tokenize(src: string, imaginaryUnit: boolean): Token[] {
  const out: Token[] = [];
  let p = 0;
  while (p < src.length) {
    const c = src[p]!;
    if (/\s/.test(c)) {
      p++;
    } else if (isDigit(c) || (c === '.' && isDigit(src[p + 1]))) {
      const start = p;
      while (isDigit(src[p])) p++;
      if (src[p] === '.') {
        p++;
        while (isDigit(src[p])) p++;
      }
      if (src[p] === 'e' || src[p] === 'E') {
        const q = src[p + 1] === '+' || src[p + 1] === '-' ? p + 2 : p + 1;
        if (isDigit(src[q])) {
          p = q;
          while (isDigit(src[p])) p++;
        }
      }
      const digits = src.slice(start, p);
      let re = Number(digits);
      let im = 0;
      if (!Number.isFinite(re)) throw new Fail(`the number '${digits}' is too large`, start);
      if (isNameStart(src[p])) {
        const s = p;
        while (isNamePart(src[p])) p++;
        const suffix = src.slice(s, p);
        if (suffix === 'deg') re = (re * Math.PI) / 180;
        else if (suffix === 'i' && imaginaryUnit) [re, im] = [0, re];
        else if (suffix === 'i') throw new Fail(`unexpected 'i' after the number '${digits}': only a real value is allowed here`, s);
        else throw new Fail(`unexpected '${suffix}' directly after the number '${digits}' (write '${digits}*${suffix}' to multiply)`, s);
      }
      out.push({ kind: 'num', text: src.slice(start, p), re, im, at: start });
    } else if (isNameStart(c)) {
      const start = p;
      while (isNamePart(src[p])) p++;
      out.push({ kind: 'name', text: src.slice(start, p), at: start });
    } else if ('+-*/^(),'.includes(c)) {
      out.push({ kind: 'sym', text: c, at: p });
      p++;
    } else {
      throw new Fail(`unexpected character '${c}'`, p);
    }
  }
  out.push({ kind: 'end', text: '', at: src.length });
  return out;
}

/** Depth of a node whose children are the given nodes. */
const above = (...children: Node[]): number => 1 + Math.max(...children.map((c) => c.depth));

const describe = (t: Token): string => (t.kind === 'end' ? 'the end of the expression' : `'${t.text}'`);

/** Recursive-descent parser over the token list; builds the tree and bounds its depth. */
class Parser {
  private pos = 0;
  private nesting = 0;

  constructor(
    private readonly toks: Token[],
    private readonly length: number,
  ) {}

  parseAll(): Node {
    const tree = this.expr();
    const t = this.peek();
    if (t.kind === 'sym' && t.text === ')') throw new Fail("unmatched ')'", t.at);
    if (t.kind !== 'end') throw new Fail(`unexpected ${describe(t)} after the end of the expression`, t.at);
    return tree;
  }

  private peek(): Token {
    return this.toks[this.pos]!;
  }

  private isSym(text: string): boolean {
    const t = this.peek();
    return t.kind === 'sym' && t.text === text;
  }

  private enter(at: number): void {
    if (++this.nesting > MAX_EXPRESSION_DEPTH) throw new Fail('the expression is nested too deeply or too long', at);
  }

  /** Accepts a freshly built node unless the tree has grown too deep to evaluate safely. */
  private node<N extends Node>(n: N): N {
    if (n.depth > MAX_EXPRESSION_DEPTH) throw new Fail('the expression is nested too deeply or too long', n.at);
    return n;
  }

  private expr(): Node {
    this.enter(this.peek().at);
    let l = this.term();
    while (this.isSym('+') || this.isSym('-')) {
      const op = this.toks[this.pos++]!;
      const r = this.term();
      l = this.node({ k: 'bin', op: op.text, l, r, at: op.at, depth: above(l, r) });
    }
    this.nesting--;
    return l;
  }

  private term(): Node {
    let l = this.unary();
    while (this.isSym('*') || this.isSym('/')) {
      const op = this.toks[this.pos++]!;
      const r = this.unary();
      l = this.node({ k: 'bin', op: op.text, l, r, at: op.at, depth: above(l, r) });
    }
    return l;
  }

  private unary(): Node {
    const t = this.peek();
    this.enter(t.at);
    let out: Node;
    if (this.isSym('-') || this.isSym('+')) {
      this.pos++;
      const arg = this.unary();
      out = t.text === '-' ? this.node({ k: 'neg', arg, at: t.at, depth: above(arg) }) : arg;
    } else {
      const base = this.primary();
      if (this.isSym('^')) {
        const op = this.toks[this.pos++]!;
        const exp = this.unary(); // right-associative, and allows 2^-1
        out = this.node({ k: 'bin', op: '^', l: base, r: exp, at: op.at, depth: above(base, exp) });
      } else out = base;
    }
    this.nesting--;
    return out;
  }

  /** Consumes the ')' closing a group or call, or explains what is there instead. */
  private close(): void {
    const t = this.peek();
    if (this.isSym(')')) this.pos++;
    else if (t.kind === 'end') throw new Fail("missing ')'", this.length);
    else throw new Fail(`expected an operator or ')' but found ${describe(t)}`, t.at);
  }

  private primary(): Node {
    const t = this.peek();
    if (t.kind === 'num') {
      this.pos++;
      return { k: 'num', re: t.re, im: t.im, at: t.at, depth: 1 };
    }
    if (t.kind === 'name') {
      this.pos++;
      const isFn = EXPRESSION_FUNCTIONS.includes(t.text);
      if (this.isSym('(')) {
        if (!isFn) {
          const guess = suggest(t.text, EXPRESSION_FUNCTIONS);
          const hint = guess ? `did you mean '${guess}'? ` : '';
          throw new Fail(`unknown function '${t.text}'; ${hint}functions: ${EXPRESSION_FUNCTIONS.join(', ')}`, t.at);
        }
        this.pos++;
        if (this.isSym(')')) throw new Fail(`'${t.text}' takes one argument`, this.peek().at);
        const arg = this.expr();
        if (this.isSym(',')) throw new Fail(`'${t.text}' takes one argument`, this.peek().at);
        this.close();
        return this.node({ k: 'call', fn: t.text, arg, at: t.at, depth: above(arg) });
      }
      if (isFn) throw new Fail(`expected '(' after the function '${t.text}' but found ${describe(this.peek())}`, this.peek().at);
      return { k: 'name', name: t.text, at: t.at, depth: 1 };
    }
    if (t.kind === 'sym' && t.text === '(') {
      this.pos++;
      const inner = this.expr();
      this.close();
      return inner;
    }
    throw new Fail(`expected a number, name or '(' but found ${describe(t)}`, t.at);
  }
}

const ZERO = new Complex(0, 0);
const isFiniteC = (z: Complex): boolean => Number.isFinite(z.re) && Number.isFinite(z.im);
const isReal = (z: Complex): boolean => z.im === 0;
/** Turns −0 parts into +0, so that branch cuts see −1 as (−1, +0): ln(−1) = +iπ (principal). */
const tidy = (z: Complex): Complex => (Object.is(z.re, -0) || Object.is(z.im, -0) ? new Complex(z.re + 0, z.im + 0) : z);

/** Evaluates the tree; every intermediate value must be finite. */
function evaluate(n: Node, env: Readonly<Record<string, number>>, imaginaryUnit: boolean): Complex {
  const ev = (m: Node): Complex => evaluate(m, env, imaginaryUnit);
  switch (n.k) {
    case 'num':
      return new Complex(n.re, n.im);
    case 'name':
      return lookup(n.name, n.at, env, imaginaryUnit);
    case 'neg':
      return tidy(ev(n.arg).neg());
    case 'bin': {
      const a = ev(n.l);
      const b = ev(n.r);
      const both = isReal(a) && isReal(b); // plain IEEE arithmetic then, for bit-exact reals
      let z: Complex;
      if (n.op === '+') z = both ? new Complex(a.re + b.re, 0) : a.add(b);
      else if (n.op === '-') z = both ? new Complex(a.re - b.re, 0) : a.sub(b);
      else if (n.op === '*') z = both ? new Complex(a.re * b.re, 0) : a.mul(b);
      else if (n.op === '/') {
        if (b.re === 0 && b.im === 0) throw new Fail('division by zero', n.at);
        z = both ? new Complex(a.re / b.re, 0) : a.div(b);
      } else z = power(a, b);
      if (!isFiniteC(z)) {
        const what = n.op === '^' && a.re === 0 && a.im === 0 ? 'zero raised to a negative power' : `the result of '${n.op}' is not a finite number`;
        throw new Fail(what, n.at);
      }
      return tidy(z);
    }
    case 'call': {
      const z = callFunction(n.fn, ev(n.arg));
      if (!isFiniteC(z)) throw new Fail(`the result of '${n.fn}' is not a finite number`, n.at);
      return tidy(z);
    }
  }
}

/** a^b: exact real arithmetic when both are real and the result is real; exact repeated
 * multiplication for small integer exponents (so i^2 = −1 exactly); principal branch otherwise. */
function power(a: Complex, b: Complex): Complex {
  if (isReal(a) && isReal(b)) {
    const r = Math.pow(a.re, b.re);
    if (!Number.isNaN(r)) return new Complex(r, 0);
  }
  if (isReal(b) && Number.isInteger(b.re) && Math.abs(b.re) <= 64) {
    let k = Math.abs(b.re);
    let base = a;
    let acc = new Complex(1, 0);
    while (k > 0) {
      if (k & 1) acc = acc.mul(base);
      base = base.mul(base);
      k >>= 1;
    }
    if (b.re >= 0) return acc;
    return acc.re === 0 && acc.im === 0 ? new Complex(Infinity, 0) : new Complex(1, 0).div(acc);
  }
  if (a.re === 0 && a.im === 0) return b.re > 0 ? ZERO : new Complex(Infinity, 0);
  return a.pow(b);
}

/** The built-in functions; real arguments with real results go through Math for exactness. */
function callFunction(fn: string, z: Complex): Complex {
  const r = isReal(z);
  switch (fn) {
    case 'sqrt':
      return r && z.re >= 0 ? new Complex(Math.sqrt(z.re), 0) : z.sqrt();
    case 'sin':
      return r ? new Complex(Math.sin(z.re), 0) : z.sin();
    case 'cos':
      return r ? new Complex(Math.cos(z.re), 0) : z.cos();
    case 'tan':
      return r ? new Complex(Math.tan(z.re), 0) : z.tan();
    case 'exp':
      return r ? new Complex(Math.exp(z.re), 0) : z.exp();
    default: // 'ln' (the parser admits only the listed names)
      if (z.re === 0 && z.im === 0) return new Complex(-Infinity, 0);
      return r && z.re > 0 ? new Complex(Math.log(z.re), 0) : z.log();
  }
}

/** Resolves a name: reserved constants first, then the environment's own properties only
 * (so prototype members such as 'constructor' or '__proto__' are never reachable). */
function lookup(name: string, at: number, env: Readonly<Record<string, number>>, imaginaryUnit: boolean): Complex {
  if (imaginaryUnit && name === 'i') return new Complex(0, 1);
  const c = EXPRESSION_CONSTANTS.get(name);
  if (c !== undefined) return new Complex(c, 0);
  if (Object.prototype.hasOwnProperty.call(env, name)) {
    const v: unknown = env[name];
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new Fail(`the value of '${name}' is not a finite number`, at);
    return new Complex(v, 0);
  }
  const known = [...Object.keys(env), ...EXPRESSION_CONSTANTS.keys(), ...(imaginaryUnit ? ['i'] : [])];
  const guess = suggest(name, known);
  const hint =
    !imaginaryUnit && name === 'i'
      ? ': the imaginary unit is allowed only in matrix entries'
      : guess !== undefined
        ? `; did you mean '${guess}'?`
        : '';
  throw new Fail(`unknown name '${name}'${hint} (known names: ${known.join(', ')})`, at);
}
