/**
 * The HTML report of `fray check --html FILE`: the verdict per file, the expectations as
 * bars of the values they read, and the table of every expectation and moved baseline figure.
 */
import type { CheckResult } from '../mitigation/check.js';
import { plotCheck } from '../plots/index.js';
import { studyFooter, type StudyTable } from './comparePage.js';
import { esc, figure, page, table, type PageSection } from './page.js';

/** Every expectation of every file (value to 6 significant digits, as the text table), then each baseline figure that moved. */
export function checkTable(r: CheckResult): StudyTable {
  const rows = r.files.flatMap((f) => [
    ...(f.expectations.length === 0 ? [[f.file, 'no expect: block — nothing checked', '', 'not checked', '']] : []),
    ...f.expectations.map((e) => [f.file, e.expectation, e.value.toPrecision(6), e.pass ? 'pass' : 'FAIL', e.at]),
    ...(f.baseline ?? []).filter((b) => !b.pass).map((b) => [f.file, `baseline ${b.figure}`, b.value === null ? 'missing' : b.value.toPrecision(6), `FAIL (was ${b.baseline.toPrecision(6)})`, '']),
  ]);
  return { head: ['file', 'expectation', 'value', 'result', 'written at'], rows, numeric: [2] };
}

/** Builds the self-contained HTML page of a check. */
export async function checkPage(r: CheckResult, version: string): Promise<string> {
  const t = checkTable(r);
  const failed = r.files.filter((f) => f.status !== 'pass').length;
  const verdict = r.passed ? (r.files.length === 1 ? 'The file passes.' : `All ${r.files.length} files pass.`) : `${failed} of ${r.files.length} file${r.files.length === 1 ? '' : 's'} did not pass.`;
  const any = r.files.some((f) => f.expectations.length > 0);
  const baselines = r.files.filter((f) => f.baseline !== undefined);
  const sections: PageSection[] = [
    {
      id: 'verdict',
      heading: 'Verdict',
      body:
        `<p${r.passed ? '' : ' class="warnings"'}>${esc(verdict)}</p>` +
        table(['file', 'status'], r.files.map((f) => [f.file, f.status === 'no-expectations' ? 'no expect: block (not a pass)' : f.status]), [], 'check-files') +
        (baselines.length > 0 ? `<p class="note">${esc(`Baseline: ${baselines.map((f) => `${f.file}: ${f.baseline!.filter((b) => !b.pass).length} of ${f.baseline!.length} figures moved beyond the tolerance`).join('; ')}.`)}</p>` : ''),
    },
    {
      id: 'expectations',
      heading: 'Expectations',
      note: 'Each bar is the value an expectation read; its label starts with pass or FAIL (and names the file when several are checked), so the chart reads without colour.',
      body: (any ? figure(await plotCheck(r), 'The value behind each expectation.') : '') + table(t.head, t.rows, t.numeric, 'check'),
    },
  ];
  return page('Check', verdict, sections, studyFooter(version));
}
