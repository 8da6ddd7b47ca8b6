/**
 * The HTML report of a comparison (`fray compare --html FILE`): the verdict, the ranking
 * metric as bars, and the ranked table the text report prints.
 */
import { formatDuration } from '../format/duration.js';
import { warningText } from '../format/problem.js';
import { plotCompare } from '../plots/index.js';
import { variantLabel, type CompareResult } from '../studies/index.js';
import { esc, figure, page, table, type PageSection } from './page.js';

/** A study table as text cells: the header, the rows, and which columns hold numbers. */
export interface StudyTable {
  readonly head: readonly string[];
  readonly rows: readonly (readonly string[])[];
  readonly numeric: readonly number[];
}

/** The ranked table of a comparison, best first (the text report and the page show the same cells). */
export function compareTable(r: CompareResult): StudyTable {
  const obs = r.by.startsWith('observable:') ? r.by.slice('observable:'.length) : undefined;
  const head = ['rank', 'variant', 'duration', '1q', '2q+', 'meas', 'reset', 'state F', 'classical F', 'TVD', ...(obs !== undefined ? [`|Δ⟨${obs}⟩|`] : []), ''];
  const rows = r.variants.map((v) => [
    String(v.rank),
    variantLabel(v),
    formatDuration(v.duration_ns),
    String(v.operations.one_qubit_gates),
    String(v.operations.two_qubit_gates),
    String(v.operations.measurements),
    String(v.operations.resets),
    v.fidelity.state.toFixed(6),
    v.fidelity.classical.toFixed(6),
    v.tvd.toFixed(6),
    ...(obs !== undefined ? [v.value.toFixed(6)] : []),
    v.failed.length > 0 ? `FAILS ${v.failed.join(', ')}` : '',
  ]);
  return { head, rows, numeric: head.map((_, c) => c).filter((c) => c === 0 || (c >= 2 && c < head.length - 1)) };
}

/** Builds the self-contained HTML page of a comparison. */
export async function comparePage(r: CompareResult, version: string): Promise<string> {
  const t = compareTable(r);
  const failing = r.variants.filter((v) => v.failed.length > 0);
  const warnings = [...new Set(r.variants.flatMap((v) => v.warnings.map(warningText)))];
  const sections: PageSection[] = [
    {
      id: 'verdict',
      heading: 'Verdict',
      body:
        `<p>${esc(r.verdict)}</p>` +
        (failing.length > 0 ? `<p class="warnings">${esc(`${failing.length} of ${r.variants.length} variants fail a requirement (marked FAILS in the table).`)}</p>` : '') +
        (r.comparable ? '' : `<p class="note">The variants differ in qubit count or measured qubits: each figure compares a variant with its own ideal run.</p>`),
    },
    {
      id: 'ranking',
      heading: `Variants ranked by ${r.by}`,
      note: 'Higher is better for state, classical and purity; lower for tvd, duration and observable:P. Bars are labelled with the rank and the variant, so the chart reads without colour.',
      body: figure(await plotCompare(r), `The ranking metric per variant, best first.`) + table(t.head, t.rows, t.numeric, 'compare'),
    },
  ];
  if (warnings.length > 0) sections.push({ id: 'warnings', heading: 'Warnings', body: `<ul class="warnings">${warnings.map((w) => `<li>${esc(w)}</li>`).join('')}</ul>` });
  return page(`Comparison of ${r.variants.length} variant${r.variants.length === 1 ? '' : 's'}`, `ranked by ${r.by}`, sections, studyFooter(version));
}

/** The footer of a study page. */
export function studyFooter(version: string): string {
  return `Written by fray ${version}. One self-contained page: no scripts, nothing loaded from the network.`;
}
