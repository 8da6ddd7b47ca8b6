/**
 * A built-in gate written as text, `name` or `name(angle, …)` with angle expressions in
 * radians (src/circuit/expression.ts), e.g. 'cx', 'rz(pi/4)', 'u(0.1, 0, pi)'. Used where a
 * channel definition or the `--against` option names a unitary by gate.
 */
import { builtinGate, BUILTIN_GATES } from '../circuit/gates.js';
import { evaluateReal } from '../circuit/expression.js';
import { suggest } from '../circuit/suggest.js';
import type { CMatrix } from '../linalg/cmatrix.js';

/** The unitary of a gate call, or an error with the 0-based character offset it concerns. */
export type GateCallResult = { readonly name: string; readonly matrix: CMatrix } | { readonly error: string; readonly offset: number };

/** Parses and evaluates `name` or `name(a1, a2, …)` against the named values in `env`. */
export function parseGateCall(text: string, env: Readonly<Record<string, number>>): GateCallResult {
  const m = /^(\s*)([A-Za-z_][A-Za-z0-9_]*)\s*(?:\((.*)\))?\s*$/.exec(text);
  if (m === null) return { error: `'${text}' is not a gate; write a built-in gate name with its angles, e.g. cx or rz(pi/4)`, offset: 0 };
  const lead = m[1]!.length;
  const name = m[2]!;
  const gate = builtinGate(name);
  if (gate === undefined) {
    const near = suggest(name, [...BUILTIN_GATES.keys()]);
    return { error: `unknown gate '${name}'${near !== undefined ? `; did you mean '${near}'?` : ''}`, offset: lead };
  }
  const argText = m[3];
  const args: Array<{ text: string; offset: number }> = [];
  if (argText !== undefined && argText.trim() !== '') {
    const open = text.indexOf('(') + 1;
    let depth = 0;
    let start = 0;
    for (let i = 0; i <= argText.length; i++) {
      const ch = argText[i];
      if (ch === '(') depth++;
      else if (ch === ')') depth--;
      if (i === argText.length || (ch === ',' && depth === 0)) {
        args.push({ text: argText.slice(start, i), offset: open + start });
        start = i + 1;
      }
    }
  }
  if (args.length !== gate.params.length) {
    const want = gate.params.length === 0 ? 'no angles' : `${gate.params.length} angle(s) (${gate.params.join(', ')})`;
    return { error: `gate '${name}' takes ${want}, got ${args.length}`, offset: lead };
  }
  const angles: number[] = [];
  for (const a of args) {
    const v = evaluateReal(a.text, env);
    if ('error' in v) return { error: `angle of '${name}': ${v.error.message}`, offset: a.offset + v.error.offset };
    angles.push(v.value);
  }
  return { name, matrix: gate.matrix(angles) };
}
