/**
 * The tokens of OpenQASM 2.0 and 3 as fray reads them (chevrotain lexer). Keywords are
 * matched before identifiers (`longer_alt` keeps `gates` an identifier); comments and
 * white space are skipped. Unicode letters are allowed in identifiers, so OpenQASM 3's
 * `π`, `τ` and `ℇ` lex as names and are resolved as constants.
 */
import type { Lexer, TokenType } from 'chevrotain';
import { qasmToolkit, type Toolkit } from './toolkit.js';

/** Builds the token types with the toolkit (once, on first use: see qasmTokens). */
function buildTokens(c: Toolkit) {
const { createToken, Lexer } = c;

/** A name: register, gate, parameter. */
const Identifier = createToken({ name: 'Identifier', label: 'a name', pattern: /[A-Za-z_\u00c0-\uffff][A-Za-z0-9_\u00c0-\uffff]*/ });

const keyword = (word: string): TokenType => createToken({ name: `Kw_${word}`, label: `'${word}'`, pattern: new RegExp(word), longer_alt: Identifier });

const OpenQasm = keyword('OPENQASM');
const Include = keyword('include');
const Qreg = keyword('qreg');
const Creg = keyword('creg');
const Qubit = keyword('qubit');
const Bit = keyword('bit');
const Gate = keyword('gate');
const Opaque = keyword('opaque');
const Measure = keyword('measure');
const Reset = keyword('reset');
const Barrier = keyword('barrier');
const Delay = keyword('delay');
const If = keyword('if');
const Gphase = keyword('gphase');
const Ctrl = keyword('ctrl');
const Negctrl = keyword('negctrl');
const Inv = keyword('inv');
const Pow = keyword('pow');

/** A physical qubit of OpenQASM 3, `$0`, `$1`, … */
const PhysicalQubit = createToken({ name: 'PhysicalQubit', label: 'a physical qubit such as $0', pattern: /\$\d+/ });

/** A duration: a number glued to its unit (OpenQASM 3). Matched before plain numbers. */
const DurationLit = createToken({ name: 'DurationLit', label: 'a duration such as 100ns', pattern: /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?(?:ns|us|µs|ms|dt|s)(?![A-Za-z0-9_])/ });
/** A real or integer literal. */
const NumberLit = createToken({ name: 'NumberLit', label: 'a number', pattern: /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/ });
const StringLit = createToken({ name: 'StringLit', label: 'a quoted file name', pattern: /"[^"\n]*"/ });

const sym = (name: string, text: string): TokenType => createToken({ name, label: `'${text}'`, pattern: new RegExp(text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')) });

const Arrow = sym('Arrow', '->');
const EqEq = sym('EqEq', '==');
const Equals = sym('Equals', '=');
const Semi = sym('Semi', ';');
const Comma = sym('Comma', ',');
const LParen = sym('LParen', '(');
const RParen = sym('RParen', ')');
const LBracket = sym('LBracket', '[');
const RBracket = sym('RBracket', ']');
const LBrace = sym('LBrace', '{');
const RBrace = sym('RBrace', '}');
const At = sym('At', '@');
const StarStar = sym('StarStar', '**');
const Plus = sym('Plus', '+');
const Minus = sym('Minus', '-');
const Star = sym('Star', '*');
const Slash = sym('Slash', '/');
const Caret = sym('Caret', '^');
const Bang = sym('Bang', '!');
const Colon = sym('Colon', ':');
/** Any other punctuation of OpenQASM 3 (comparison, bitwise, ranges…): lexed so the parser can name it. */
const OtherSym = createToken({ name: 'OtherSym', label: 'an operator', pattern: /<=|>=|!=|&&|\|\||<<|>>|[<>&|~%#.]/ });

const WhiteSpace = createToken({ name: 'WhiteSpace', pattern: /[ \t\r\n\uFEFF\u00a0]+/, group: Lexer.SKIPPED });
const LineComment = createToken({ name: 'LineComment', pattern: /\/\/[^\n]*/, group: Lexer.SKIPPED });
const BlockComment = createToken({ name: 'BlockComment', pattern: /\/\*[\s\S]*?\*\//, group: Lexer.SKIPPED, line_breaks: true });

/** Every token in matching order (longer and more specific patterns first). */
const ALL_TOKENS: TokenType[] = [
  WhiteSpace,
  LineComment,
  BlockComment,
  OpenQasm,
  Include,
  Qreg,
  Creg,
  Qubit,
  Bit,
  Gate,
  Opaque,
  Measure,
  Reset,
  Barrier,
  Delay,
  If,
  Gphase,
  Ctrl,
  Negctrl,
  Inv,
  Pow,
  Identifier,
  PhysicalQubit,
  DurationLit,
  NumberLit,
  StringLit,
  Arrow,
  EqEq,
  Equals,
  Semi,
  Comma,
  LParen,
  RParen,
  LBracket,
  RBracket,
  LBrace,
  RBrace,
  At,
  StarStar,
  Plus,
  Minus,
  Star,
  Slash,
  Caret,
  OtherSym,
  Bang,
  Colon,
];

const qasmLexer = new Lexer(ALL_TOKENS, { positionTracking: 'full', ensureOptimizations: false });
return {
  Identifier, OpenQasm, Include, Qreg, Creg, Qubit, Bit, Gate, Opaque, Measure, Reset, Barrier, Delay, If, Gphase, Ctrl, Negctrl, Inv, Pow,
  PhysicalQubit, DurationLit, NumberLit, StringLit, Arrow, EqEq, Equals, Semi, Comma, LParen, RParen, LBracket, RBracket, LBrace, RBrace,
  At, StarStar, Plus, Minus, Star, Slash, Caret, Bang, Colon, OtherSym, ALL_TOKENS, qasmLexer: qasmLexer as Lexer,
};
}

/** The token types and the lexer of OpenQASM. */
export type QasmTokens = ReturnType<typeof buildTokens>;

let tokens: QasmTokens | undefined;

/** The token types and lexer, built on first use. */
export function qasmTokens(): QasmTokens {
  return (tokens ??= buildTokens(qasmToolkit()));
}
