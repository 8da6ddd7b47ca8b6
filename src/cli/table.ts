/** A plain-text table: headers, then rows; numbers right-aligned, text left-aligned. */
export function renderTable(headers: readonly string[], rows: readonly (readonly string[])[], rightAligned: readonly boolean[]): string {
  const width = headers.map((h, c) => Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length)));
  const line = (cells: readonly string[]) =>
    '  ' + cells.map((s, c) => (rightAligned[c] ? s.padStart(width[c]!) : s.padEnd(width[c]!))).join('  ').trimEnd();
  return [line(headers), ...rows.map(line)].join('\n') + '\n';
}
