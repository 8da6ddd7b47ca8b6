import type { MitigationResult } from '../mitigation/mitigate.js';
import type { Style } from './style.js';
import { formatDuration } from '../format/duration.js';

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
  if (r.fit === undefined && names.length > 0) {
    lines.push('', style.bold(`Observables, ${how} (⟨P⟩ with qubit 0 leftmost)`));
    const pw = Math.max(10, ...names.map((k) => k.length));
    lines.push(`  ${style.dim('observable'.padEnd(pw))}${['ideal', 'noisy', 'mitigated', 'err before', 'err after'].map((h) => style.dim(h.padStart(11))).join('')}`);
    for (const k of names) {
      const o = r.observables[k]!;
      lines.push(`  ${k.padEnd(pw)}${[o.ideal, o.noisy, o.mitigated, Math.abs(o.noisy - o.ideal), Math.abs(o.mitigated - o.ideal)].map(fmt).join('')}`);
    }
  }
  if (r.fit !== undefined && names.length > 0) {
    const scales = r.observables[names[0]!]!.points.map((p) => p.scale);
    const amplifier = r.amplify === 'fold' ? 'unitary folding' : 'noise scale';
    lines.push('', style.bold(`Zero-noise extrapolation (${amplifier}${how !== '' ? ` of the ${how} circuit` : ''}, ${r.fit} fit; ⟨P⟩ with qubit 0 leftmost)`));
    const pw = Math.max(10, ...names.map((k) => k.length));
    const head = ['ideal', 'noisy', 'mitigated', 'err before', 'err after', 'std err', ...scales.map((s) => `λ=${fmtScale(s)}`)];
    lines.push(`  ${style.dim('observable'.padEnd(pw))}${head.map((h) => style.dim(h.padStart(11))).join('')}`);
    for (const k of names) {
      const o = r.observables[k]!;
      const cells = [o.ideal, o.noisy, o.mitigated, Math.abs(o.noisy - o.ideal), Math.abs(o.mitigated - o.ideal)].map(fmt);
      cells.push(o.stderr === null ? '—'.padStart(11) : fmt(o.stderr));
      for (const p of o.points) cells.push(fmt(p.value));
      lines.push(`  ${k.padEnd(pw)}${cells.join('')}`);
    }
    const lambda = r.amplify === 'fold' ? 'the scale folding achieved (1 + 2·folds/gates)' : 'every noise strength × λ';
    lines.push(`  ${style.dim(`λ: ${lambda}; std err: least squares, — where the fit interpolates`)}`);
  }
  if (r.readout !== undefined) {
    const ro = r.readout;
    lines.push('', style.bold(`Readout correction (${ro.method}${ro.method === 'bounded' ? ': nearest distribution to the inverse' : ': tensored inverse confusion'})`));
    const keys = [...new Set([...Object.keys(ro.ideal), ...Object.keys(ro.measured), ...Object.keys(ro.mitigated)])].sort();
    const w = Math.max(7, keys[0]?.length ?? 0);
    lines.push(`  ${style.dim('outcome'.padEnd(w))}${['ideal', 'as is', 'mitigated'].map((h) => style.dim(h.padStart(11))).join('')}`);
    for (const k of keys) lines.push(`  ${k.padEnd(w)}${[ro.ideal[k] ?? 0, ro.measured[k] ?? 0, ro.mitigated[k] ?? 0].map(fmt).join('')}`);
    lines.push(`  total variation distance to ideal  ${ro.tvd_before.toFixed(6)} → ${ro.tvd_after.toFixed(6)}`);
    lines.push(`  classical fidelity to ideal        ${ro.classical_before.toFixed(6)} → ${ro.classical_after.toFixed(6)}`);
  }
  if (r.warnings.length > 0) {
    lines.push('', style.yellow(style.bold('Warnings')));
    for (const w of r.warnings) lines.push(style.yellow(`  ${w}`));
  }
  return lines.join('\n') + '\n';
}

/** A value in an 11-character column, 6 decimals, rounding residue shown as 0. */
function fmt(x: number): string {
  const v = Math.abs(x) < 5e-7 ? 0 : x;
  return v.toFixed(6).padStart(11);
}

/** An interval of the unmitigated schedule, e.g. 450 ns → 1.65 µs. */
function window(w: { start: number; end: number }): string {
  return `${formatDuration(w.start)} → ${formatDuration(w.end)}`.padEnd(24);
}

function fmtScale(s: number): string {
  return Number.isInteger(s) ? String(s) : s.toFixed(3).replace(/0+$/, '');
}
