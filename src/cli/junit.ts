import type { CheckResult } from '../mitigation/check.js';

/** XML text with &, <, >, " and ' escaped. */
function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

/**
 * A check as JUnit XML, the report format CI systems read: one <testsuite> per file, one
 * <testcase> per expectation (and per baseline figure), a <failure> for each that does not
 * hold; a file without expectations is one skipped case saying so.
 */
export function checkToJunit(result: CheckResult): string {
  const out: string[] = ['<?xml version="1.0" encoding="UTF-8"?>'];
  const total = result.files.reduce((n, f) => n + Math.max(1, f.expectations.length + (f.baseline?.length ?? 0)), 0);
  const failures = result.files.reduce((n, f) => n + f.expectations.filter((e) => !e.pass).length + (f.baseline ?? []).filter((b) => !b.pass).length, 0);
  out.push(`<testsuites name="fray check" tests="${total}" failures="${failures}">`);
  for (const f of result.files) {
    const cases: string[] = [];
    for (const e of f.expectations) {
      const body = e.pass ? '' : `<failure message="${esc(`${e.expectation} does not hold: the value is ${e.value}`)}">${esc(e.at)}</failure>`;
      cases.push(`    <testcase classname="${esc(f.file)}" name="${esc(e.expectation)}">${body}</testcase>`);
    }
    for (const b of f.baseline ?? []) {
      const why = b.value === null ? 'no longer produced' : `moved from ${b.baseline} to ${b.value}`;
      const body = b.pass ? '' : `<failure message="${esc(`${b.figure} ${why}`)}"/>`;
      cases.push(`    <testcase classname="${esc(f.file)}" name="${esc(`baseline ${b.figure}`)}">${body}</testcase>`);
    }
    if (cases.length === 0) cases.push(`    <testcase classname="${esc(f.file)}" name="expect"><skipped message="the file has no expect: block"/></testcase>`);
    const fails = f.expectations.filter((e) => !e.pass).length + (f.baseline ?? []).filter((b) => !b.pass).length;
    out.push(`  <testsuite name="${esc(f.file)}" tests="${cases.length}" failures="${fails}"${cases.length === 1 && f.status === 'no-expectations' ? ' skipped="1"' : ''}>`, ...cases, '  </testsuite>');
  }
  out.push('</testsuites>');
  return out.join('\n') + '\n';
}
