/**
 * Constructs of OpenQASM 3 that fray does not simulate (loops, subroutines, classical
 * variables and arithmetic, extern, timing boxes, calibrations, pragmas and annotations,
 * index ranges and sets).
 * They are found on the token stream, at the start of a statement, before the grammar
 * runs, so the message names the construct rather than a token the grammar did not expect.
 */
import type { IToken } from 'chevrotain';
import type { At } from './ast.js';

const CLASSICAL = 'classical variables and arithmetic';

/** Statement-opening words of OpenQASM 3 → what the construct is, for the message. */
export const UNSUPPORTED_WORDS: ReadonlyMap<string, string> = new Map([
  ['for', "'for' loops"],
  ['while', "'while' loops"],
  ['def', "subroutines ('def')"],
  ['extern', "'extern' functions"],
  ['return', "'return'"],
  ['break', "'break'"],
  ['continue', "'continue'"],
  ['end', "'end'"],
  ['else', "'else' branches"],
  ['switch', "'switch'"],
  ['box', "'box' timing blocks"],
  ['let', "aliases ('let')"],
  ['const', CLASSICAL],
  ['input', "'input' parameters"],
  ['output', "'output' variables"],
  ['int', CLASSICAL],
  ['uint', CLASSICAL],
  ['float', CLASSICAL],
  ['angle', CLASSICAL],
  ['bool', CLASSICAL],
  ['complex', CLASSICAL],
  ['duration', CLASSICAL],
  ['stretch', "'stretch' durations"],
  ['array', CLASSICAL],
  ['cal', 'pulse-level calibrations'],
  ['defcal', 'pulse-level calibrations'],
  ['defcalgrammar', 'pulse-level calibrations'],
]);

const WHAT_FRAY_READS = 'fray reads register declarations, gate definitions and calls, measure, reset, barrier, delay and if';

/** The first unsupported OpenQASM 3 construct at a statement start, with its message and position. */
export function findUnsupported(tokens: readonly IToken[]): { message: string; at: At } | undefined {
  // In OpenQASM 2.0 these words are ordinary names (a gate may be called 'box').
  const v2 = tokens[0]?.image === 'OPENQASM' && Number(tokens[1]?.image) === 2;
  let start = !v2;
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i]!;
    const at = { line: t.startLine ?? 1, col: t.startColumn ?? 1 };
    if (start) {
      const what = UNSUPPORTED_WORDS.get(t.image);
      if (what !== undefined) return { message: `${what} ${what.endsWith("'") && !what.includes(' ') ? 'is' : 'are'} not supported; ${WHAT_FRAY_READS}`, at };
      if (t.image === '#' || t.image === '@') return { message: `${t.image === '#' ? 'pragmas' : 'annotations'} are not supported; ${WHAT_FRAY_READS}`, at };
    }
    // an assignment other than `bit = measure …`, or an increment, is classical arithmetic
    if (!v2 && t.image === '=' && tokens[i + 1]?.image !== 'measure') return { message: `${CLASSICAL} are not supported; ${WHAT_FRAY_READS}`, at };
    start = !v2 && (t.image === ';' || t.image === '{' || t.image === '}');
  }
  for (let i = 0; i + 2 < tokens.length; i++) {
    if (tokens[i]!.image !== '[') continue;
    const set = tokens[i + 1]!.image === '{';
    if (set || tokens[i + 2]!.image === ':' || tokens[i + 1]!.image === ':') {
      const t = tokens[i]!;
      return { message: `index ${set ? 'sets (q[{0, 1}])' : 'ranges (q[0:2])'} are not supported; name each qubit, or the whole register`, at: { line: t.startLine ?? 1, col: t.startColumn ?? 1 } };
    }
  }
  return undefined;
}
