import { UsageError } from './main.js';

/** `--set name=value` options (repeatable) as a name → expression map. */
export function parseSetOptions(values: readonly string[] | undefined): Record<string, string> {
  const set: Record<string, string> = {};
  for (const s of values ?? []) {
    const eq = s.indexOf('=');
    if (eq <= 0) throw new UsageError(`--set ${s}: expected name=value, e.g. --set theta=0.4`);
    set[s.slice(0, eq).trim()] = s.slice(eq + 1);
  }
  return set;
}

/** `--observe` options (repeatable or comma-separated) as a list of Pauli strings. */
export function parseObserveOptions(values: readonly string[] | undefined): string[] {
  return (values ?? []).flatMap((s) => s.split(',')).map((s) => s.trim()).filter((s) => s !== '');
}
