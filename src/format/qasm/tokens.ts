/**
 * The tokens of OpenQASM 2.0 and 3 as fray reads them (chevrotain lexer). Keywords are
 * matched before identifiers (`longer_alt` keeps `gates` an identifier); comments and
 * white space are skipped. Unicode letters are allowed in identifiers, so OpenQASM 3's
 * `π`, `τ` and `ℇ` lex as names and are resolved as constants.
 */
import { createToken, Lexer, type TokenType } from 'chevrotain';

/** A name: register, gate, parameter. */
export const Identifier = createToken({ name: 'Identifier', label: 'a name', pattern: /[A-Za-z_\u00c0-\uffff][A-Za-z0-9_\u00c0-\uffff]*/ });

const keyword = (word: string): TokenType => createToken({ name: `Kw_${word}`, label: `'${word}'`, pattern: new RegExp(word), longer_alt: Identifier });

export const OpenQasm = keyword('OPENQASM');
export const Include = keyword('include');
export const Qreg = keyword('qreg');
export const Creg = keyword('creg');
export const Qubit = keyword('qubit');
export const Bit = keyword('bit');
export const Gate = keyword('gate');
export const Opaque = keyword('opaque');
export const Measure = keyword('measure');
export const Reset = keyword('reset');
export const Barrier = keyword('barrier');
export const Delay = keyword('delay');
export const If = keyword('if');
export const Gphase = keyword('gphase');
export const Ctrl = keyword('ctrl');
export const Negctrl = keyword('negctrl');
export const Inv = keyword('inv');
export const Pow = keyword('pow');

/** A physical qubit of OpenQASM 3, `$0`, `$1`, … */
export const PhysicalQubit = createToken({ name: 'PhysicalQubit', label: 'a physical qubit such as $0', pattern: /\$\d+/ });

/** A duration: a number glued to its unit (OpenQASM 3). Matched before plain numbers. */
export const DurationLit = createToken({ name: 'DurationLit', label: 'a duration such as 100ns', pattern: /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?(?:ns|us|µs|ms|dt|s)(?![A-Za-z0-9_])/ });
/** A real or integer literal. */
export const NumberLit = createToken({ name: 'NumberLit', label: 'a number', pattern: /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/ });
export const StringLit = createToken({ name: 'StringLit', label: 'a quoted file name', pattern: /"[^"\n]*"/ });

const sym = (name: string, text: string): TokenType => createToken({ name, label: `'${text}'`, pattern: new RegExp(text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')) });

export const Arrow = sym('Arrow', '->');
export const EqEq = sym('EqEq', '==');
export const Equals = sym('Equals', '=');
export const Semi = sym('Semi', ';');
export const Comma = sym('Comma', ',');
export const LParen = sym('LParen', '(');
export const RParen = sym('RParen', ')');
export const LBracket = sym('LBracket', '[');
export const RBracket = sym('RBracket', ']');
export const LBrace = sym('LBrace', '{');
export const RBrace = sym('RBrace', '}');
export const At = sym('At', '@');
export const StarStar = sym('StarStar', '**');
export const Plus = sym('Plus', '+');
export const Minus = sym('Minus', '-');
export const Star = sym('Star', '*');
export const Slash = sym('Slash', '/');
export const Caret = sym('Caret', '^');
export const Bang = sym('Bang', '!');
export const Colon = sym('Colon', ':');
/** Any other punctuation of OpenQASM 3 (comparison, bitwise, ranges…): lexed so the parser can name it. */
export const OtherSym = createToken({ name: 'OtherSym', label: 'an operator', pattern: /<=|>=|!=|&&|\|\||<<|>>|[<>&|~%#.]/ });

const WhiteSpace = createToken({ name: 'WhiteSpace', pattern: /[ \t\r\n\uFEFF\u00a0]+/, group: Lexer.SKIPPED });
const LineComment = createToken({ name: 'LineComment', pattern: /\/\/[^\n]*/, group: Lexer.SKIPPED });
const BlockComment = createToken({ name: 'BlockComment', pattern: /\/\*[\s\S]*?\*\//, group: Lexer.SKIPPED, line_breaks: true });

/** Every token in matching order (longer and more specific patterns first). */
export const ALL_TOKENS: TokenType[] = [
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

/** The OpenQASM lexer (built once). */
export const qasmLexer = new Lexer(ALL_TOKENS, { positionTracking: 'full', ensureOptimizations: false });
