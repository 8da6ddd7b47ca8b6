/**
 * JSON text with a stable, readable key order. Objects whose keys are all bitstrings
 * (outcome maps) are written in ascending bitstring order — JSON.stringify cannot do
 * that, because JavaScript objects put integer-like keys such as "10" before "01".
 * Numbers are written as JSON.stringify writes them (shortest round-trip form).
 */
export function toJson(value: unknown, indent = 2): string {
  return write(value, '', ' '.repeat(indent));
}

/** The same order on one line (JSON Lines): no indentation, no newlines. */
export function toJsonLine(value: unknown): string {
  return write(value, '', '', true);
}

const BITSTRING = /^[01]+$/;

function write(v: unknown, pad: string, step: string, flat = false): string {
  if (v === undefined || typeof v === 'function') return 'null';
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  const inner = pad + step;
  if (Array.isArray(v)) {
    if (v.length === 0) return '[]';
    // Short arrays of numbers (Bloch vectors, qubit lists) stay on one line.
    if (flat) return `[${v.map((x) => write(x, '', '', true)).join(',')}]`;
    if (v.every((x) => typeof x === 'number') && v.length <= 32) return `[${v.map((x) => JSON.stringify(x)).join(', ')}]`;
    return `[\n${v.map((x) => inner + write(x, inner, step)).join(',\n')}\n${pad}]`;
  }
  let entries = Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined);
  if (entries.length === 0) return '{}';
  if (entries.every(([k]) => BITSTRING.test(k))) entries = entries.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  if (flat) return `{${entries.map(([k, x]) => `${JSON.stringify(k)}:${write(x, '', '', true)}`).join(',')}}`;
  return `{\n${entries.map(([k, x]) => `${inner}${JSON.stringify(k)}: ${write(x, inner, step)}`).join(',\n')}\n${pad}}`;
}
