import { suggest } from '../circuit/suggest.js';
import { ProblemList, type Problem, type SourcePosition } from './problem.js';
import { PROFILE_KEYS, readProfile, type ProfileSpec } from './profileSpec.js';
import type { NumberEnv } from './read.js';
import { parseYamlTree, type YEntry, type YNode } from './yamlTree.js';

/**
 * The command line's overrides, `--set KEY=VALUE`: one syntax for a circuit parameter
 * (`theta=0.5`, `params.theta=0.5`) and for any field of the noise profile by its dotted
 * path (`qubits.all.t1=50us`, `"gates.cx 1 2.error=0.02"`, `idle=none`). A profile key is
 * turned into the little YAML map the same value would be in a file and read by the
 * profile reader itself, so every value is checked exactly as in a file (units, ranges,
 * `none`); the resulting spec is the top precedence level of resolveProfile.
 *
 * Positions: problems about the n-th override are in the pseudo-file COMMAND_LINE at line
 * n, the column counting within `KEY=VALUE`, and their message starts with `--set KEY=VALUE:`.
 */

/** The pseudo-file name of positions on the command line. */
export const COMMAND_LINE = '(command line)';

/** One `KEY=VALUE` override as given. */
export interface Override {
  readonly key: string;
  readonly value: string;
}

/** Overrides split by what they address: circuit parameters, and the profile layer. */
export interface SplitOverrides {
  /** Parameter name → expression text (the circuit reader's `set`). */
  readonly params: Readonly<Record<string, string>>;
  /** The profile overrides as located YAML (a map like a profile file's root), or undefined when there are none. */
  readonly profileTree: YNode | undefined;
  /** The original `KEY=VALUE` texts, in order (line n of COMMAND_LINE is texts[n − 1]). */
  readonly texts: readonly string[];
}

/** Top-level keys a `--set` may start with besides a bare parameter name. */
const PROFILE_TOP = PROFILE_KEYS.filter((k) => k !== 'name');
/** Profile keys that stand alone (no dotted path after them). */
const SINGLE_PROFILE_KEYS: ReadonlySet<string> = new Set(['idle', 'schedule']);

/** Splits `KEY=VALUE` text at the first '=' (keys never contain one). */
export function parseOverride(text: string): Override | undefined {
  const eq = text.indexOf('=');
  if (eq <= 0) return undefined;
  return { key: text.slice(0, eq).trim(), value: text.slice(eq + 1) };
}

/**
 * Classifies overrides into parameter sets and a profile tree. Problems (an unknown top
 * key, a malformed value) are recorded at command-line positions.
 */
export function splitOverrides(overrides: readonly Override[], problems: ProblemList): SplitOverrides {
  const params: Record<string, string> = Object.create(null) as Record<string, string>;
  const texts = overrides.map((o) => `${o.key}=${o.value}`);
  // Nested maps built from the dotted paths, kept as insertion-ordered Maps until the end.
  type Tree = Map<string, { keyAt: SourcePosition; node: Tree | YNode }>;
  const root: Tree = new Map();
  let any = false;
  overrides.forEach((o, index) => {
    const line = index + 1;
    const keyAt: SourcePosition = { file: COMMAND_LINE, line, col: 1 };
    const path = o.key.split('.');
    const top = path[0]!;
    if (top === 'params' || (path.length === 1 && !SINGLE_PROFILE_KEYS.has(top))) {
      const name = top === 'params' ? path.slice(1).join('.') : top;
      if (name === '' || (top === 'params' && path.length !== 2)) {
        problems.error(keyAt, 'bad-override', `--set ${texts[index]}: expected params.NAME=VALUE`);
        return;
      }
      params[name] = o.value;
      return;
    }
    if (!(PROFILE_TOP as readonly string[]).includes(top)) {
      const near = suggest(top, ['params', ...PROFILE_TOP]);
      problems.error(keyAt, 'unknown-key', `--set ${texts[index]}: '${top}' is neither a parameter nor a profile key${near !== undefined ? `; did you mean '${near}'?` : `; expected a parameter name or one of: params, ${PROFILE_TOP.join(', ')}`}`);
      return;
    }
    if (SINGLE_PROFILE_KEYS.has(top) !== (path.length === 1) || path.some((p) => p.trim() === '')) {
      const shape = SINGLE_PROFILE_KEYS.has(top) ? `${top}=VALUE` : `${top}.ENTRY.FIELD=VALUE, e.g. qubits.all.t1=50us or gates.cx.error=0.01`;
      problems.error(keyAt, 'bad-override', `--set ${texts[index]}: expected ${shape}`);
      return;
    }
    const valueCol = o.key.length + 2;
    const value = valueNode(o.value, line, valueCol, problems, texts[index]!);
    if (value === undefined) return;
    let at: Tree = root;
    for (let i = 0; i < path.length - 1; i++) {
      const seg = path[i]!.trim().replace(/\s+/g, ' ');
      const child = at.get(seg);
      if (child !== undefined && child.node instanceof Map) at = child.node;
      else {
        const fresh: Tree = new Map();
        at.set(seg, { keyAt, node: fresh });
        at = fresh;
      }
    }
    at.set(path[path.length - 1]!, { keyAt: { ...keyAt, col: o.key.length - path[path.length - 1]!.length + 1 }, node: value });
    any = true;
  });
  const toNode = (t: Tree, at: SourcePosition): YNode => ({
    kind: 'map',
    at,
    entries: [...t].map(([key, v]): YEntry => ({ key, keyAt: v.keyAt, value: v.node instanceof Map ? toNode(v.node, v.keyAt) : v.node })),
  });
  return { params, profileTree: any ? toNode(root, { file: COMMAND_LINE, line: 1, col: 1 }) : undefined, texts };
}

/** The value text as a located YAML node (a number, a word, or a flow map such as `{zero_as_one: 0.01}`). */
function valueNode(text: string, line: number, col: number, problems: ProblemList, whole: string): YNode | undefined {
  if (text.trim() === '') {
    problems.error({ file: COMMAND_LINE, line, col }, 'bad-override', `--set ${whole}: the value is empty`);
    return undefined;
  }
  const scratch = new ProblemList();
  const node = parseYamlTree(text, COMMAND_LINE, scratch);
  const shift = (p: SourcePosition): SourcePosition => ({ file: COMMAND_LINE, line, col: p.col + col - 1 });
  for (const p of scratch.errors) problems.error(shift(p), p.code, `--set ${whole}: ${p.message}`);
  if (node === undefined) return undefined;
  const move = (n: YNode): YNode =>
    n.kind === 'scalar'
      ? { ...n, at: shift(n.at) }
      : n.kind === 'seq'
        ? { ...n, at: shift(n.at), items: n.items.map(move) }
        : { ...n, at: shift(n.at), entries: n.entries.map((e) => ({ ...e, keyAt: shift(e.keyAt), value: move(e.value) })) };
  return move(node);
}

/** Reads the profile overrides into the 'override' spec, checking every value as the profile reader does. */
export function readOverrideProfile(split: SplitOverrides, problems: ProblemList, env?: NumberEnv): ProfileSpec | undefined {
  if (split.profileTree === undefined) return undefined;
  return readProfile(split.profileTree, COMMAND_LINE, 'the --set overrides', problems, 'override', env);
}

/**
 * Prefixes every problem located on the command line with the override it is about
 * (`--set KEY=VALUE: …`), so the message says where it came from; other problems pass.
 */
export function explainCommandLine(items: readonly Problem[], texts: readonly string[]): Problem[] {
  return items.map((p) => {
    if (p.file !== COMMAND_LINE || p.message.startsWith('--set ')) return p;
    const text = texts[p.line - 1];
    return text === undefined ? p : { ...p, message: `--set ${text}: ${p.message}` };
  });
}
