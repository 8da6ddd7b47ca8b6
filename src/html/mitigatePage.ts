/**
 * The HTML report of `fray mitigate --html FILE`: what was applied, the observables ideal /
 * noisy / mitigated as bars and table (with the extrapolation's points), the readout
 * correction's distributions, and the distance to the ideal distribution before and after.
 */
import { formatDuration } from '../format/duration.js';
import type { MitigationResult } from '../mitigation/mitigate.js';
import { comparisonBarsSpec, renderSvg, type ComparisonBar, type Series } from '../plots/index.js';
import { studyFooter, type StudyTable } from './comparePage.js';
import { esc, figure, keyValueList, page, pair, table, type PageSection } from './page.js';

/** Values within this of zero show as 0 (rounding residue of the simulation). */
export const SHOWN_ZERO_VALUE = 5e-7;

/** A value to 6 decimals, rounding residue shown as 0. */
export function valueText(x: number): string {
  return (Math.abs(x) < SHOWN_ZERO_VALUE ? 0 : x).toFixed(6);
}

/** A noise scale λ as a column name: whole numbers plain, others to 3 decimals. */
export function scaleText(s: number): string {
  return Number.isInteger(s) ? String(s) : s.toFixed(3).replace(/0+$/, '');
}

/**
 * The observables of a mitigation: ⟨P⟩ ideal, noisy, mitigated, the errors |noisy − ideal| and
 * |mitigated − ideal|; with an extrapolation also its standard error and the value at each scale λ.
 */
export function mitigationObservableTable(r: MitigationResult): StudyTable {
  const names = Object.keys(r.observables);
  const scales = r.fit !== undefined && names.length > 0 ? r.observables[names[0]!]!.points.map((p) => p.scale) : [];
  const head = ['observable', 'ideal', 'noisy', 'mitigated', 'err before', 'err after', ...(r.fit !== undefined ? ['std err', ...scales.map((s) => `λ=${scaleText(s)}`)] : [])];
  const rows = names.map((k) => {
    const o = r.observables[k]!;
    const cells = [k, ...[o.ideal, o.noisy, o.mitigated, Math.abs(o.noisy - o.ideal), Math.abs(o.mitigated - o.ideal)].map(valueText)];
    if (r.fit !== undefined) cells.push(o.stderr === null ? '—' : valueText(o.stderr), ...o.points.map((p) => valueText(p.value)));
    return cells;
  });
  return { head, rows, numeric: head.map((_, c) => c).filter((c) => c > 0) };
}

/** The readout correction's distributions over every outcome seen (sorted), ideal, as read, mitigated. */
export function readoutTable(r: MitigationResult): StudyTable {
  const ro = r.readout!;
  const keys = [...new Set([...Object.keys(ro.ideal), ...Object.keys(ro.measured), ...Object.keys(ro.mitigated)])].sort();
  return { head: ['outcome', 'ideal', 'as is', 'mitigated'], rows: keys.map((k) => [k, ...[ro.ideal[k] ?? 0, ro.measured[k] ?? 0, ro.mitigated[k] ?? 0].map(valueText)]), numeric: [1, 2, 3] };
}

/** How many outcomes the readout chart draws (the most likely, ideal and as read together); the table lists all. */
export const DRAWN_OUTCOMES = 8;

/** Builds the self-contained HTML page of a mitigation. */
export async function mitigatePage(r: MitigationResult, version: string): Promise<string> {
  const how = [r.decoupling !== undefined ? 'decoupled' : '', r.twirl !== undefined ? 'twirled' : ''].filter((x) => x !== '').join(' and ');
  const applied = [
    ...(r.decoupling !== undefined ? [['decoupling', `${r.decoupling.sequence} in idle windows of at least ${formatDuration(r.decoupling.min_idle_ns)}`] as const] : []),
    ...(r.twirl !== undefined
      ? [['twirling', `${r.twirl.gates} 2-qubit Clifford gate application${r.twirl.gates === 1 ? '' : 's'}, ${r.twirl.mode === 'exact' ? 'exactly' : `${r.twirl.instances} random instances (seed ${r.twirl.seed}), averaged`}`] as const]
      : []),
    ...(r.fit !== undefined ? [['zero-noise extrapolation', `${r.amplify === 'fold' ? 'unitary folding' : 'noise scale'}, ${r.fit} fit`] as const] : []),
    ...(r.readout !== undefined ? [['readout correction', r.readout.method] as const] : []),
  ];
  const d = r.distribution;
  const sections: PageSection[] = [
    {
      id: 'mitigation',
      heading: 'Mitigation',
      body:
        keyValueList([['circuit', r.file], ...applied]) +
        table(['distance to the ideal distribution', 'as is', 'mitigated'], [['total variation distance', valueText(d.tvd_before), valueText(d.tvd_after)], ['classical fidelity', valueText(d.classical_before), valueText(d.classical_after)]], [1, 2], 'distribution'),
    },
  ];
  if (r.decoupling !== undefined) {
    const dd = r.decoupling;
    const rows = [
      ...dd.inserted.map((i) => [String(i.qubit), formatDuration(i.start), formatDuration(i.end), `inserted ${i.pulses.join(' ')}`]),
      ...dd.skipped.map((s) => [String(s.qubit), formatDuration(s.start), formatDuration(s.end), `left: ${s.reason}`]),
    ];
    sections.push({
      id: 'decoupling',
      heading: `Dynamical decoupling (${dd.sequence})`,
      note: 'Idle windows of the unmitigated schedule and what was put in them.',
      body: rows.length === 0 ? `<p>No idle window long enough.</p>` : table(['qubit', 'from', 'to', 'what'], rows, [0], 'decoupling'),
    });
  }
  const names = Object.keys(r.observables);
  if (names.length > 0) {
    const t = mitigationObservableTable(r);
    const series: Series[] = ['ideal', 'noisy', 'mitigated'];
    const bars: ComparisonBar[] = names.flatMap((k) =>
      series.map((s) => {
        const o = r.observables[k]!;
        const v = s === 'ideal' ? o.ideal : s === 'noisy' ? o.noisy : o.mitigated;
        return { category: k, series: s, value: v, title: `⟨${k}⟩ ${s} = ${valueText(v)}` };
      }),
    );
    sections.push({
      id: 'observables',
      heading: r.fit !== undefined ? `Zero-noise extrapolation${how !== '' ? ` of the ${how} circuit` : ''}` : `Observables, ${how}`,
      note:
        `⟨P⟩ = Tr(Pρ), qubit 0 leftmost. Bars: ideal hollow, noisy light, mitigated black (three steps of lightness, in this order in every group).` +
        (r.fit !== undefined ? ` λ: ${r.amplify === 'fold' ? 'the scale folding achieved (1 + 2·folds/gates)' : 'every noise strength × λ'}; std err: least squares, — where the fit interpolates.` : ''),
      // the extrapolation's table is wide (one column per scale): below the chart rather than beside it
      body: (r.fit !== undefined ? (a: string, b: string) => a + b : pair)(
        figure(await renderSvg(comparisonBarsSpec({ bars, categories: names, categoryTitle: 'Pauli string', valueTitle: '⟨P⟩', domain: [-1, 1], monospace: true })), 'Expectation values: ideal, noisy, mitigated.'),
        table(t.head, t.rows, t.numeric, 'observables'),
      ),
    });
  }
  if (r.readout !== undefined) {
    const ro = r.readout;
    const t = readoutTable(r);
    const drawn = [...t.rows]
      .sort((a, b) => (ro.ideal[b[0]!] ?? 0) + (ro.measured[b[0]!] ?? 0) - ((ro.ideal[a[0]!] ?? 0) + (ro.measured[a[0]!] ?? 0)) || (a[0]! < b[0]! ? -1 : 1))
      .slice(0, DRAWN_OUTCOMES)
      .map((row) => row[0]!)
      .sort();
    const bars: ComparisonBar[] = drawn.flatMap((k) =>
      (['ideal', 'measured', 'mitigated'] as const).map((s) => {
        const p = (s === 'ideal' ? ro.ideal : s === 'measured' ? ro.measured : ro.mitigated)[k] ?? 0;
        return { category: k, series: s, value: p, title: `${k}: ${s === 'measured' ? 'as read' : s} probability ${valueText(p)}` };
      }),
    );
    sections.push({
      id: 'readout',
      heading: `Readout correction (${ro.method}${ro.method === 'bounded' ? ': nearest distribution to the inverse' : ': tensored inverse confusion'})`,
      note: `Bars: ideal hollow, as read with readout error (measured) dark blue, mitigated black${drawn.length < t.rows.length ? `; the ${drawn.length} most likely of ${t.rows.length} outcomes are drawn, the table lists all` : ''}.`,
      body: pair(
        figure(await renderSvg(comparisonBarsSpec({ bars, categories: drawn, categoryTitle: 'outcome (qubit 0 leftmost)', valueTitle: 'probability', domain: [0, 1], monospace: true })), 'Outcome probabilities: ideal, as read, mitigated.'),
        table(t.head, t.rows, t.numeric, 'readout'),
      ),
    });
  }
  if (r.warnings.length > 0) sections.push({ id: 'warnings', heading: 'Warnings', body: `<ul class="warnings">${r.warnings.map((w) => `<li>${esc(w)}</li>`).join('')}</ul>` });
  return page(`Mitigation of ${r.file}`, applied.map(([k]) => k).join(' · '), sections, studyFooter(version));
}
