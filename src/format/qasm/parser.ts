/**
 * The OpenQASM grammar (chevrotain, embedded actions) → the syntax tree of ./ast.ts.
 * The rules follow the two specifications' own grammars, restricted to what fray reads:
 *
 *   program    := ('OPENQASM' NUMBER ';')? statement*
 *   statement  := include | qreg | creg | qubit | bit | gate | opaque | measure | assign
 *               | reset | barrier | delay | if | gphase | call
 *   assign     := operand '=' 'measure' operand ';'                       (OpenQASM 3)
 *   measure    := 'measure' operand ('->' operand)? ';'
 *   if         := 'if' '(' ('!' operand | operand ('==' NUMBER)?) ')' (statement | '{' statement* '}')
 *   call       := modifier* NAME ('(' expr (',' expr)* ')')? operand (',' operand)* ';'
 *   modifier   := ('ctrl' | 'negctrl') ('(' expr ')')? '@' | 'inv' '@' | 'pow' '(' expr ')' '@'
 *   expr       := term (('+' | '-') term)*        term := unary (('*' | '/') unary)*
 *   unary      := '-' unary | power               power := primary (('^' | '**') unary)?
 *   primary    := NUMBER | NAME ('(' expr ')')? | '(' expr ')'
 *
 * Syntax errors stop the parse at the first one (one located message); constructs of
 * OpenQASM 3 that fray does not simulate are caught before parsing by ./unsupported.ts.
 */
import type { IToken, TokenType, IParserErrorMessageProvider } from 'chevrotain';
import type { At, Condition, Expr, GateCall, Modifier, Operand, Program, Statement } from './ast.js';
import { qasmTokens, type QasmTokens } from './tokens.js';
import { qasmToolkit, type Toolkit } from './toolkit.js';
import { findUnsupported } from './unsupported.js';

/** A syntax error: the message and where it is. */
export interface SyntaxProblem {
  readonly message: string;
  readonly at: At;
}

/** Builds the grammar with the toolkit and the tokens (once, on first use: see parseQasm). */
function buildParser(c: Toolkit, T: QasmTokens) {
const EOF = c.EOF;
const show = (t: IToken): string => (t.tokenType === EOF ? 'the end of the file' : `'${t.image}'`);
const names = (ts: readonly TokenType[]): string => [...new Set(ts.map((t) => (typeof t.LABEL === 'string' ? t.LABEL : t.name)))].join(' or ');

/** Messages in fray's own words: lowercase, saying what was found and what is expected. */
const messages: IParserErrorMessageProvider = {
  buildMismatchTokenMessage: ({ expected, actual }) => `expected ${names([expected])} but found ${show(actual)}`,
  buildNotAllInputParsedMessage: ({ firstRedundant }) => `unexpected ${show(firstRedundant)}; expected a statement`,
  buildNoViableAltMessage: ({ expectedPathsPerAlt, actual, ruleName }) => {
    const first = expectedPathsPerAlt.flatMap((alt) => alt.map((path) => path[0]!)).filter((t) => t !== undefined);
    const what = ruleName === 'statement' ? 'a statement' : ruleName === 'primary' ? 'a number, a name or (' : names(first);
    return `expected ${what} but found ${show(actual[0]!)}`;
  },
  buildEarlyExitMessage: ({ expectedIterationPaths, actual }) => `expected ${names(expectedIterationPaths.map((p) => p[0]!))} but found ${show(actual[0]!)}`,
};

class QasmParser extends c.EmbeddedActionsParser {
  constructor() {
    super(T.ALL_TOKENS, { maxLookahead: 3, errorMessageProvider: messages, recoveryEnabled: false });
    this.performSelfAnalysis();
  }

  program = this.RULE('program', (): Program => {
    let version: 2 | 3 = 3;
    let versionAt: At = { line: 1, col: 1 };
    const statements: Statement[] = [];
    this.OPTION(() => {
      const kw = this.CONSUME(T.OpenQasm);
      const v = this.CONSUME(T.NumberLit);
      this.CONSUME(T.Semi);
      this.ACTION(() => {
        versionAt = at(v);
        const n = Number(v.image);
        if (n === 2) version = 2;
        else if (n === 3 || n === 3.0) version = 3;
        else throw new QasmStop(`OpenQASM version ${v.image} is not supported; fray reads 2.0 and 3`, at(v));
        void kw;
      });
    });
    this.MANY(() => statements.push(this.SUBRULE(this.statement)));
    return { version, versionAt, statements };
  });

  statement = this.RULE('statement', (): Statement => {
    return this.OR([
      { ALT: () => this.SUBRULE(this.include) },
      { ALT: () => this.SUBRULE(this.oldRegister) },
      { ALT: () => this.SUBRULE(this.newRegister) },
      { ALT: () => this.SUBRULE(this.gateDef) },
      { ALT: () => this.SUBRULE(this.opaque) },
      { ALT: () => this.SUBRULE(this.measure) },
      { ALT: () => this.SUBRULE(this.assign) },
      { ALT: () => this.SUBRULE(this.resetStatement) },
      { ALT: () => this.SUBRULE(this.barrier) },
      { ALT: () => this.SUBRULE(this.delay) },
      { ALT: () => this.SUBRULE(this.ifStatement) },
      { ALT: () => this.SUBRULE(this.gphase) },
      { ALT: () => this.SUBRULE(this.call) },
    ]);
  });

  include = this.RULE('include', (): Statement => {
    const kw = this.CONSUME(T.Include);
    const s = this.CONSUME(T.StringLit);
    this.CONSUME(T.Semi);
    return { k: 'include', path: s.image.slice(1, -1), at: at(kw) };
  });

  /** `qreg q[n];` / `creg c[n];` (OpenQASM 2). */
  oldRegister = this.RULE('oldRegister', (): Statement => {
    const kw = this.OR([{ ALT: () => this.CONSUME(T.Qreg) }, { ALT: () => this.CONSUME(T.Creg) }]);
    const name = this.CONSUME(T.Identifier);
    this.CONSUME(T.LBracket);
    const size = this.CONSUME(T.NumberLit);
    this.CONSUME(T.RBracket);
    this.CONSUME(T.Semi);
    return { k: kw.tokenType === T.Qreg ? 'qreg' : 'creg', name: name.image, size: Number(size.image), sized: true, at: at(kw), nameAt: at(name), sizeAt: at(size), style: 2 };
  });

  /** `qubit[n] q;` / `qubit q;` / `bit[n] c;` / `bit c;` (OpenQASM 3). */
  newRegister = this.RULE('newRegister', (): Statement => {
    const kw = this.OR([{ ALT: () => this.CONSUME(T.Qubit) }, { ALT: () => this.CONSUME(T.Bit) }]);
    let size: IToken | undefined;
    this.OPTION(() => {
      this.CONSUME(T.LBracket);
      size = this.CONSUME(T.NumberLit);
      this.CONSUME(T.RBracket);
    });
    const name = this.CONSUME(T.Identifier);
    this.CONSUME(T.Semi);
    return {
      k: kw.tokenType === T.Qubit ? 'qreg' : 'creg',
      name: name.image,
      size: size === undefined ? 1 : Number(size.image),
      sized: size !== undefined,
      at: at(kw),
      nameAt: at(name),
      sizeAt: size === undefined ? at(kw) : at(size),
      style: 3,
    };
  });

  gateDef = this.RULE('gateDef', (): Statement => {
    const kw = this.CONSUME(T.Gate);
    const name = this.CONSUME(T.Identifier);
    const params: { name: string; at: At }[] = [];
    const qubits: { name: string; at: At }[] = [];
    const body: Statement[] = [];
    this.OPTION(() => {
      this.CONSUME(T.LParen);
      this.MANY_SEP({ SEP: T.Comma, DEF: () => {
        const p = this.CONSUME2(T.Identifier);
        params.push({ name: p.image, at: at(p) });
      } });
      this.CONSUME(T.RParen);
    });
    this.AT_LEAST_ONE_SEP({ SEP: T.Comma, DEF: () => {
      const q = this.CONSUME3(T.Identifier);
      qubits.push({ name: q.image, at: at(q) });
    } });
    this.CONSUME(T.LBrace);
    this.MANY(() => body.push(this.OR([
      { ALT: () => this.SUBRULE(this.barrier) },
      { ALT: () => this.SUBRULE(this.gphase) },
      { ALT: () => this.SUBRULE(this.call) },
    ])));
    this.CONSUME(T.RBrace);
    return { k: 'gate', name: name.image, params, qubits, body, at: at(kw), nameAt: at(name) };
  });

  opaque = this.RULE('opaque', (): Statement => {
    const kw = this.CONSUME(T.Opaque);
    const name = this.CONSUME(T.Identifier);
    this.OPTION(() => {
      this.CONSUME(T.LParen);
      this.MANY_SEP({ SEP: T.Comma, DEF: () => this.CONSUME2(T.Identifier) });
      this.CONSUME(T.RParen);
    });
    this.AT_LEAST_ONE_SEP({ SEP: T.Comma, DEF: () => this.CONSUME3(T.Identifier) });
    this.CONSUME(T.Semi);
    return { k: 'opaque', name: name.image, at: at(kw) };
  });

  measure = this.RULE('measure', (): Statement => {
    const kw = this.CONSUME(T.Measure);
    const qubit = this.SUBRULE(this.operand);
    let bit: Operand | null = null;
    this.OPTION(() => {
      this.CONSUME(T.Arrow);
      bit = this.SUBRULE2(this.operand);
    });
    this.CONSUME(T.Semi);
    return { k: 'measure', qubit, bit, at: at(kw) };
  });

  /** `c[0] = measure q[0];` and `c = measure q;` (OpenQASM 3). */
  assign = this.RULE('assign', (): Statement => {
    const bit = this.SUBRULE(this.operand);
    this.CONSUME(T.Equals);
    this.CONSUME(T.Measure);
    const qubit = this.SUBRULE2(this.operand);
    this.CONSUME(T.Semi);
    return { k: 'measure', qubit, bit, at: bit.at };
  });

  resetStatement = this.RULE('resetStatement', (): Statement => {
    const kw = this.CONSUME(T.Reset);
    const operands = this.SUBRULE(this.operands);
    this.CONSUME(T.Semi);
    return { k: 'reset', operands, at: at(kw) };
  });

  barrier = this.RULE('barrier', (): Statement => {
    const kw = this.CONSUME(T.Barrier);
    let operands: Operand[] = [];
    this.OPTION(() => (operands = this.SUBRULE(this.operands)));
    this.CONSUME(T.Semi);
    return { k: 'barrier', operands, at: at(kw) };
  });

  delay = this.RULE('delay', (): Statement => {
    const kw = this.CONSUME(T.Delay);
    this.CONSUME(T.LBracket);
    const d = this.CONSUME(T.DurationLit);
    this.CONSUME(T.RBracket);
    let operands: Operand[] = [];
    this.OPTION(() => (operands = this.SUBRULE(this.operands)));
    this.CONSUME(T.Semi);
    const m = /^(.*?)(ns|us|µs|ms|dt|s)$/.exec(d.image); // null only while chevrotain records the grammar
    return { k: 'delay', duration: { value: Number(m?.[1]), unit: m?.[2] ?? '', at: at(d) }, operands, at: at(kw) };
  });

  ifStatement = this.RULE('ifStatement', (): Statement => {
    const kw = this.CONSUME(T.If);
    this.CONSUME(T.LParen);
    const condition = this.OR([
      {
        ALT: (): Condition => {
          const bang = this.CONSUME(T.Bang);
          const operand = this.SUBRULE(this.operand);
          return { operand, value: 0, valueAt: at(bang), compared: false };
        },
      },
      {
        ALT: (): Condition => {
          const operand = this.SUBRULE2(this.operand);
          let value = 1;
          let valueAt = operand.at;
          let compared = false;
          this.OPTION(() => {
            this.CONSUME(T.EqEq);
            const v = this.CONSUME(T.NumberLit);
            value = Number(v.image);
            valueAt = at(v);
            compared = true;
          });
          return { operand, value, valueAt, compared };
        },
      },
    ]);
    this.CONSUME(T.RParen);
    const body: Statement[] = [];
    this.OR2([
      {
        ALT: () => {
          this.CONSUME(T.LBrace);
          this.MANY(() => body.push(this.SUBRULE(this.statement)));
          this.CONSUME(T.RBrace);
        },
      },
      { ALT: () => body.push(this.SUBRULE2(this.statement)) },
    ]);
    return { k: 'if', condition, body, at: at(kw) };
  });

  gphase = this.RULE('gphase', (): Statement => {
    const kw = this.CONSUME(T.Gphase);
    this.CONSUME(T.LParen);
    const arg = this.SUBRULE(this.expr);
    this.CONSUME(T.RParen);
    this.OPTION(() => this.SUBRULE(this.operands));
    this.CONSUME(T.Semi);
    return { k: 'gphase', arg, at: at(kw) };
  });

  call = this.RULE('call', (): GateCall => {
    const modifiers: Modifier[] = [];
    this.MANY(() => modifiers.push(this.SUBRULE(this.modifier)));
    const name = this.CONSUME(T.Identifier);
    const args: Expr[] = [];
    this.OPTION(() => {
      this.CONSUME(T.LParen);
      this.MANY_SEP({ SEP: T.Comma, DEF: () => args.push(this.SUBRULE(this.expr)) });
      this.CONSUME(T.RParen);
    });
    const operands = this.SUBRULE(this.operands);
    this.CONSUME(T.Semi);
    return { k: 'call', modifiers, name: name.image, args, operands, at: modifiers[0]?.at ?? at(name), nameAt: at(name) };
  });

  modifier = this.RULE('modifier', (): Modifier => {
    return this.OR([
      {
        ALT: (): Modifier => {
          const kw = this.OR2([{ ALT: () => this.CONSUME(T.Ctrl) }, { ALT: () => this.CONSUME(T.Negctrl) }]);
          let count: Expr | null = null;
          this.OPTION(() => {
            this.CONSUME(T.LParen);
            count = this.SUBRULE(this.expr);
            this.CONSUME(T.RParen);
          });
          this.CONSUME(T.At);
          return { k: kw.tokenType === T.Ctrl ? 'ctrl' : 'negctrl', count, at: at(kw) };
        },
      },
      {
        ALT: (): Modifier => {
          const kw = this.CONSUME(T.Inv);
          this.CONSUME2(T.At);
          return { k: 'inv', at: at(kw) };
        },
      },
      {
        ALT: (): Modifier => {
          const kw = this.CONSUME(T.Pow);
          this.CONSUME2(T.LParen);
          const exponent = this.SUBRULE2(this.expr);
          this.CONSUME2(T.RParen);
          this.CONSUME3(T.At);
          return { k: 'pow', exponent, at: at(kw) };
        },
      },
    ]);
  });

  operands = this.RULE('operands', (): Operand[] => {
    const out: Operand[] = [];
    this.AT_LEAST_ONE_SEP({ SEP: T.Comma, DEF: () => out.push(this.SUBRULE(this.operand)) });
    return out;
  });

  operand = this.RULE('operand', (): Operand => {
    const name = this.OR([{ ALT: () => this.CONSUME(T.Identifier) }, { ALT: () => this.CONSUME(T.PhysicalQubit) }]);
    let index: number | null = null;
    let indexAt: At | null = null;
    this.OPTION(() => {
      this.CONSUME(T.LBracket);
      const i = this.CONSUME(T.NumberLit);
      this.CONSUME(T.RBracket);
      index = Number(i.image);
      indexAt = at(i);
    });
    return { name: name.image, index, at: at(name), indexAt };
  });

  expr = this.RULE('expr', (): Expr => {
    let l = this.SUBRULE(this.term);
    this.MANY(() => {
      const op = this.OR([{ ALT: () => this.CONSUME(T.Plus) }, { ALT: () => this.CONSUME(T.Minus) }]);
      const r = this.SUBRULE2(this.term);
      l = { k: 'bin', op: op.image as '+' | '-', l, r, at: at(op) };
    });
    return l;
  });

  term = this.RULE('term', (): Expr => {
    let l = this.SUBRULE(this.unary);
    this.MANY(() => {
      const op = this.OR([{ ALT: () => this.CONSUME(T.Star) }, { ALT: () => this.CONSUME(T.Slash) }]);
      const r = this.SUBRULE2(this.unary);
      l = { k: 'bin', op: op.image as '*' | '/', l, r, at: at(op) };
    });
    return l;
  });

  unary = this.RULE('unary', (): Expr => {
    return this.OR([
      {
        ALT: (): Expr => {
          const m = this.CONSUME(T.Minus);
          const arg = this.SUBRULE(this.unary);
          return { k: 'neg', arg, at: at(m) };
        },
      },
      {
        ALT: (): Expr => {
          this.CONSUME(T.Plus);
          return this.SUBRULE2(this.unary);
        },
      },
      { ALT: () => this.SUBRULE(this.power) },
    ]);
  });

  power = this.RULE('power', (): Expr => {
    const base = this.SUBRULE(this.primary);
    let out = base;
    this.OPTION(() => {
      const op = this.OR([{ ALT: () => this.CONSUME(T.Caret) }, { ALT: () => this.CONSUME(T.StarStar) }]);
      const exp = this.SUBRULE(this.unary);
      out = { k: 'bin', op: '^', l: base, r: exp, at: at(op) };
    });
    return out;
  });

  primary = this.RULE('primary', (): Expr => {
    return this.OR([
      {
        ALT: (): Expr => {
          const n = this.CONSUME(T.NumberLit);
          return { k: 'num', value: Number(n.image), at: at(n) };
        },
      },
      {
        ALT: (): Expr => {
          const id = this.CONSUME(T.Identifier);
          let call: Expr | null = null;
          this.OPTION(() => {
            this.CONSUME(T.LParen);
            call = this.SUBRULE(this.expr);
            this.CONSUME(T.RParen);
          });
          return call === null ? { k: 'id', name: id.image, at: at(id) } : { k: 'call', fn: id.image, arg: call, at: at(id) };
        },
      },
      {
        ALT: (): Expr => {
          this.CONSUME2(T.LParen);
          const e = this.SUBRULE2(this.expr);
          this.CONSUME2(T.RParen);
          return e;
        },
      },
    ]);
  });
}

return new QasmParser();
}

const at = (t: IToken): At => ({ line: t.startLine ?? 0, col: t.startColumn ?? 0 });

/** Stops the parse with a located message (an unsupported version, for instance). */
export class QasmStop extends Error {
  constructor(
    message: string,
    readonly at: At,
  ) {
    super(message);
  }
}

let shared: ReturnType<typeof buildParser> | undefined;

/** Parses OpenQASM text into its syntax tree, or returns the first syntax problem. */
export function parseQasm(text: string): { program: Program } | { problem: SyntaxProblem } {
  const T = qasmTokens();
  const EOF = qasmToolkit().EOF;
  const lexed = T.qasmLexer.tokenize(text);
  if (lexed.errors.length > 0) {
    const e = lexed.errors[0]!;
    const ch = text.slice(e.offset, e.offset + 1);
    return { problem: { message: `unexpected character '${ch}'`, at: { line: e.line ?? 1, col: e.column ?? 1 } } };
  }
  const unsupported = findUnsupported(lexed.tokens);
  if (unsupported !== undefined) return { problem: unsupported };
  const parser = (shared ??= buildParser(qasmToolkit(), T));
  parser.input = lexed.tokens;
  try {
    const program = parser.program();
    if (parser.errors.length > 0) {
      const e = parser.errors[0]!;
      const previous = (e as { previousToken?: IToken }).previousToken;
      // a missing ';' belongs right after the statement it ends, not at the next token
      const wantSemi = e.message.startsWith("expected ';'") && previous !== undefined && previous.tokenType !== EOF;
      // an operand right after another on the same line: the ',' between them is missing
      const operandish = (t: IToken): boolean => t.tokenType === T.Identifier || t.tokenType === T.PhysicalQubit || t.tokenType === T.RBracket;
      if (wantSemi && operandish(previous) && operandish(e.token) && e.token.tokenType !== T.RBracket && e.token.startLine === previous.endLine) {
        return { problem: { message: `expected ',' between operands or ';' at the end of the statement, but found '${e.token.image}'`, at: at(e.token) } };
      }
      const tok = e.token.tokenType === EOF ? lexed.tokens[lexed.tokens.length - 1] : e.token;
      const where = wantSemi ? endOf(previous) : tok === undefined ? { line: 1, col: 1 } : e.token.tokenType === EOF ? endOf(tok) : at(tok);
      return { problem: { message: e.message, at: where } };
    }
    return { program };
  } catch (e) {
    if (e instanceof QasmStop) return { problem: { message: e.message, at: e.at } };
    throw e;
  }
}

/** The position just after a token (where a missing ';' belongs). */
function endOf(t: IToken): At {
  return { line: t.endLine ?? t.startLine ?? 1, col: (t.endColumn ?? t.startColumn ?? 0) + 1 };
}
