import type { MitigationResult } from '../mitigation/mitigate.js';
import type { Style } from './style.js';
import { formatDuration } from '../format/duration.js';
import { mitigationObservableTable, readoutTable } from '../html/index.js';

/** The terminal report of `fray mitigate`: one table of observables, then the readout distributions. */
export function renderMitigationReport(r: MitigationResult, style: Style): string {
  const lines: string[] = [style.bold(r.file)];
  if (r.decoupling !== undefined) {
    const d = r.decoupling;
    lines.push('', style.bold(`Dynamical decoupling (${d.sequence}, windows of at least ${formatDuration(d.min_idle_ns)})`));
    for (const i of d.inserted) lines.push(`  qubit ${String(i.qubit).padEnd(3)} ${window(i)}  inserted ${i.pulses.join(' ')}`);
    for (const s of d.skipped) lines.push(style.dim(`  qubit ${String(s.qubit).padEnd(3)} ${window(s)}  left: ${s.reason}`));
    if (d.inserted.length + d.skipped.length === 0) lines.push('  no idle window long enough');
  }
  if (r.twirl !== undefined) {
    const t = r.twirl;
    lines.push('', style.bold('Pauli twirling'));
    lines.push(`  ${t.gates} 2-qubit Clifford gate application${t.gates === 1 ? '' : 's'} twirled ${t.mode === 'exact' ? 'exactly (the noise replaced by its Pauli twirl)' : `by ${t.instances} random instance${t.instances === 1 ? '' : 's'} (seed ${t.seed}), averaged`}`);
  }
  const names = Object.keys(r.observables);
  const how = [r.decoupling !== undefined ? 'decoupled' : '', r.twirl !== undefined ? 'twirled' : ''].filter((x) => x !== '').join(' and ');
  if (names.length > 0) {
    const t = mitigationObservableTable(r);
    const amplifier = r.amplify === 'fold' ? 'unitary folding' : 'noise scale';
    lines.push(
      '',
      style.bold(
        r.fit === undefined
          ? `Observables, ${how} (⟨P⟩ with qubit 0 leftmost)`
          : `Zero-noise extrapolation (${amplifier}${how !== '' ? ` of the ${how} circuit` : ''}, ${r.fit} fit; ⟨P⟩ with qubit 0 leftmost)`,
      ),
    );
    const pw = Math.max(10, ...names.map((k) => k.length));
    lines.push(`  ${style.dim('observable'.padEnd(pw))}${t.head.slice(1).map((h) => style.dim(h.padStart(11))).join('')}`);
    for (const row of t.rows) lines.push(`  ${row[0]!.padEnd(pw)}${row.slice(1).map((c) => c.padStart(11)).join('')}`);
    if (r.fit !== undefined) {
      const lambda = r.amplify === 'fold' ? 'the scale folding achieved (1 + 2·folds/gates)' : 'every noise strength × λ';
      lines.push(`  ${style.dim(`λ: ${lambda}; std err: least squares, — where the fit interpolates`)}`);
    }
  }
  if (r.readout !== undefined) {
    const ro = r.readout;
    lines.push('', style.bold(`Readout correction (${ro.method}${ro.method === 'bounded' ? ': nearest distribution to the inverse' : ': tensored inverse confusion'})`));
    const t = readoutTable(r);
    const w = Math.max(7, t.rows[0]?.[0]?.length ?? 0);
    lines.push(`  ${style.dim('outcome'.padEnd(w))}${t.head.slice(1).map((h) => style.dim(h.padStart(11))).join('')}`);
    for (const row of t.rows) lines.push(`  ${row[0]!.padEnd(w)}${row.slice(1).map((c) => c.padStart(11)).join('')}`);
    lines.push(`  total variation distance to ideal  ${ro.tvd_before.toFixed(6)} → ${ro.tvd_after.toFixed(6)}`);
    lines.push(`  classical fidelity to ideal        ${ro.classical_before.toFixed(6)} → ${ro.classical_after.toFixed(6)}`);
  }
  if (r.warnings.length > 0) {
    lines.push('', style.yellow(style.bold('Warnings')));
    for (const w of r.warnings) lines.push(style.yellow(`  ${w}`));
  }
  return lines.join('\n') + '\n';
}

/** An interval of the unmitigated schedule, e.g. 450 ns → 1.65 µs. */
function window(w: { start: number; end: number }): string {
  return `${formatDuration(w.start)} → ${formatDuration(w.end)}`.padEnd(24);
}
