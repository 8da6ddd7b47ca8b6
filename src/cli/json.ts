/**
 * JSON text with a stable, readable key order. Objects whose keys are all bitstrings
 * (outcome maps) are written in ascending bitstring order — JSON.stringify cannot do
 * that, because JavaScript objects put integer-like keys such as "10" before "01".
 * Numbers are written as JSON.stringify writes them (shortest round-trip form).
 */
export function toJson(value: unknown, indent = 2): string {
  return write(value, '', ' '.repeat(indent));
}

const BITSTRING = /^[01]+$/;

function write(v: unknown, pad: string, step: string): string {
  if (v === undefined || typeof v === 'function') return 'null';
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  const inner = pad + step;
  if (Array.isArray(v)) {
    if (v.length === 0) return '[]';
    // Short arrays of numbers (Bloch vectors, qubit lists) stay on one line.
    if (v.every((x) => typeof x === 'number') && v.length <= 32) return `[${v.map((x) => JSON.stringify(x)).join(', ')}]`;
    return `[\n${v.map((x) => inner + write(x, inner, step)).join(',\n')}\n${pad}]`;
  }
  let entries = Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined);
  if (entries.length === 0) return '{}';
  if (entries.every(([k]) => BITSTRING.test(k))) entries = entries.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{\n${entries.map(([k, x]) => `${inner}${JSON.stringify(k)}: ${write(x, inner, step)}`).join(',\n')}\n${pad}}`;
}
