import { suggest } from '../circuit/suggest.js';
import type { ProblemList } from './problem.js';
import type { YEntry, YMap } from './yamlTree.js';

/** Keys that modify a step rather than name its action. */
export const STEP_MODIFIERS = ['angle', 'angles', 'noise', 'for', 'on', 'label', 'into', 'if'] as const;

/** Step actions other than gate names. */
export const STEP_ACTIONS = ['idle', 'barrier', 'measure', 'reset'] as const;

/** A step split into its one action entry (null for a standalone noise step) and its modifiers. */
export interface StepShape {
  readonly action: YEntry | null;
  readonly modifiers: ReadonlyMap<string, YEntry>;
}

/**
 * Splits a step map: exactly one action key (a gate name or one of STEP_ACTIONS), or —
 * when no action key is present — a standalone `noise` step. Unknown keys get a
 * did-you-mean suggestion drawn from `gateNames`, the actions and the modifiers.
 */
export function splitStep(
  map: YMap,
  gateNames: readonly string[],
  where: string,
  problems: ProblemList,
  allowedActions: readonly string[] = STEP_ACTIONS,
): StepShape | undefined {
  const modifiers = new Map<string, YEntry>();
  const actions: YEntry[] = [];
  let ok = true;
  for (const e of map.entries) {
    if ((STEP_MODIFIERS as readonly string[]).includes(e.key)) {
      modifiers.set(e.key, e);
    } else if (gateNames.includes(e.key) || allowedActions.includes(e.key)) {
      actions.push(e);
    } else {
      ok = false;
      const candidates = [...gateNames, ...allowedActions, ...STEP_MODIFIERS];
      const near = suggest(e.key, candidates);
      const hint = near !== undefined ? `did you mean '${near}'?` : `expected a gate name, ${allowedActions.join(', ')}, or a modifier (${STEP_MODIFIERS.join(', ')})`;
      problems.error(e.keyAt, 'unknown-gate', `${where}: unknown gate or key '${e.key}'; ${hint}`);
    }
  }
  if (!ok) return undefined;
  if (actions.length > 1) {
    problems.error(actions[1]!.keyAt, 'two-actions', `${where} has more than one action (${actions.map((a) => a.key).join(', ')}); put each in its own step`);
    return undefined;
  }
  if (actions.length === 0) {
    if (modifiers.has('noise')) return { action: null, modifiers };
    problems.error(map.at, 'no-action', `${where} has no action; expected a gate name, ${allowedActions.join(', ')} or a standalone noise step`);
    return undefined;
  }
  return { action: actions[0]!, modifiers };
}

/** Reports modifiers that the step's action does not take. */
export function checkModifiers(shape: StepShape, allowed: readonly string[], actionName: string, where: string, problems: ProblemList): boolean {
  let ok = true;
  for (const [key, e] of shape.modifiers) {
    if (!allowed.includes(key)) {
      problems.error(e.keyAt, 'bad-modifier', `${where}: '${key}' does not apply to ${actionName}${allowed.length > 0 ? ` (it takes: ${allowed.join(', ')})` : ''}`);
      ok = false;
    }
  }
  return ok;
}
