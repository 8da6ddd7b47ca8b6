/**
 * What `fray channel` reports about one channel definition, as data (for --json) and as text.
 * The figures come from src/channels: physicality checks, Kraus rank and minimal Kraus form,
 * the nearest CPTP channel of an unphysical map, metrics against the target, and optionally
 * one representation. Complex entries are printed with complex.js after rounding to
 * `digits` significant digits; entries of magnitude below ZERO_BELOW print as 0.
 */
import { Complex } from 'complex.js';
import type { ChannelForm } from '../channels/conventions.js';
import { type DiamondDistance, diamondDistance } from '../channels/diamond.js';
import { type ChannelMetrics, type MetricsTarget, channelMetrics } from '../channels/metrics.js';
import { nearestCptp } from '../channels/nearestCptp.js';
import { checkPhysicality, type Physicality } from '../channels/physicality.js';
import type { ChannelDefinition } from '../format/channelDefinitions.js';
import type { CMatrix } from '../linalg/cmatrix.js';
import type { Style } from './style.js';

/** Matrix entries (real and imaginary parts) of smaller magnitude print as 0 in text reports. */
export const ZERO_BELOW = 1e-10;

/** Significant digits of text reports. */
export const REPORT_DIGITS = 4;

/** Significant digits of the pasteable `kraus:` block of a repaired channel (keeps Σ K†K = I to ~1e-12). */
export const PASTE_DIGITS = 12;

/** A complex matrix for JSON: real and imaginary parts as row lists. */
export interface JsonMatrix {
  readonly re: number[][];
  readonly im: number[][];
}

/** The repaired channel of an unphysical map. */
export interface RepairData {
  readonly method: string;
  readonly frobeniusDistance: number;
  readonly iterations: number;
  readonly converged: boolean;
  readonly diamondDistance: DiamondDistance;
  readonly kraus: readonly CMatrix[];
}

/** Everything reported about one channel. */
export interface ChannelReportData {
  readonly definition: ChannelDefinition;
  readonly physicality: Physicality;
  readonly choiEigenvalues: Float64Array;
  readonly krausRank: number;
  /** Minimal Kraus operators, or undefined for a map that is not completely positive. */
  readonly minimalKraus: readonly CMatrix[] | undefined;
  readonly repair: RepairData | undefined;
  /** Metrics, or why there are none. */
  readonly metrics: ChannelMetrics | { readonly error: string };
  /** The representation asked for with --as, or why it does not exist. */
  readonly representation: { readonly form: ChannelForm; readonly value: CMatrix | readonly CMatrix[] } | { readonly form: ChannelForm; readonly error: string } | undefined;
}

/** Computes the report of one channel against `target` (identity when undefined), with the representation `as`. */
export function buildChannelReport(def: ChannelDefinition, target: MetricsTarget | undefined, as: ChannelForm | undefined): ChannelReportData {
  const c = def.channel;
  const physicality = checkPhysicality(c);
  const cp = physicality.completelyPositive.ok;
  let repair: RepairData | undefined;
  if (!physicality.cptp && physicality.hermiticityPreserving.ok) {
    const r = nearestCptp(c);
    repair = {
      method: r.method,
      frobeniusDistance: r.distance,
      iterations: r.iterations,
      converged: r.converged,
      diamondDistance: diamondDistance(c, r.channel),
      kraus: r.channel.minimalKraus(),
    };
  }
  let metrics: ChannelReportData['metrics'];
  if (target !== undefined && target.channel.qubits !== c.qubits) {
    metrics = { error: `the target '${target.label}' acts on ${target.channel.qubits} qubit(s), this channel on ${c.qubits}` };
  } else {
    metrics = channelMetrics(c, target);
  }
  let representation: ChannelReportData['representation'];
  if (as !== undefined) {
    if ((as === 'kraus' || as === 'stinespring') && !cp) representation = { form: as, error: 'no such form: the map is not completely positive' };
    else representation = { form: as, value: as === 'kraus' ? c.minimalKraus() : c.form(as) };
  }
  return {
    definition: def,
    physicality,
    choiEigenvalues: c.choiEigen().values,
    krausRank: c.krausRank(),
    minimalKraus: cp ? c.minimalKraus() : undefined,
    repair,
    metrics,
    representation,
  };
}

// ─── JSON ──────────────────────────────────────────────────────────────────────────

/** A CMatrix as {re, im} row lists (exact doubles). */
export function jsonMatrix(m: CMatrix): JsonMatrix {
  const re: number[][] = [];
  const im: number[][] = [];
  for (let i = 0; i < m.rows; i++) {
    const r: number[] = [];
    const s: number[] = [];
    for (let j = 0; j < m.cols; j++) {
      r.push(m.data[2 * (i * m.cols + j)]! + 0);
      s.push(m.data[2 * (i * m.cols + j) + 1]! + 0);
    }
    re.push(r);
    im.push(s);
  }
  return { re, im };
}

function jsonDiamond(d: DiamondDistance): Record<string, unknown> {
  return { value: d.value ?? null, lower: d.lower, upper: d.upper, exact: d.exact, method: d.method };
}

/** The report as a plain JSON-ready object. */
export function channelReportJson(r: ChannelReportData): Record<string, unknown> {
  const def = r.definition;
  const c = def.channel;
  const p = r.physicality;
  const positive =
    p.positive.status === 'implied-by-cp' || p.positive.status === 'not-tested'
      ? { status: p.positive.status }
      : { status: p.positive.status, minOutputEigenvalue: p.positive.minOutputEigenvalue, method: p.positive.method };
  const m = r.metrics;
  return {
    name: def.name,
    at: `${def.at.file}:${def.at.line}:${def.at.col}`,
    given: def.kind,
    qubits: c.qubits,
    dimension: c.dim,
    physicality: {
      tolerance: p.tolerance,
      norm: 'spectral',
      hermiticityPreserving: { ok: p.hermiticityPreserving.ok, deviation: p.hermiticityPreserving.value },
      completelyPositive: { ok: p.completelyPositive.ok, minChoiEigenvalue: p.completelyPositive.value },
      tracePreserving: { ok: p.tracePreserving.ok, deviation: p.tracePreserving.value },
      unital: { ok: p.unital.ok, deviation: p.unital.value },
      positive,
      cptp: p.cptp,
    },
    krausRank: r.minimalKraus === undefined ? null : r.krausRank,
    choiEigenvalues: Array.from(r.choiEigenvalues),
    minimalKraus: r.minimalKraus === undefined ? null : r.minimalKraus.map(jsonMatrix),
    nearestCptp:
      r.repair === undefined
        ? null
        : {
            method: r.repair.method,
            frobeniusDistance: r.repair.frobeniusDistance,
            iterations: r.repair.iterations,
            converged: r.repair.converged,
            diamondDistance: jsonDiamond(r.repair.diamondDistance),
            kraus: r.repair.kraus.map(jsonMatrix),
          },
    metrics:
      'error' in m
        ? { error: m.error }
        : {
            target: m.target,
            processFidelity: m.processFidelity,
            processFidelityDefinition: m.processFidelityDefinition,
            averageGateFidelity: m.averageGateFidelity,
            unitarity: m.unitarity,
            pauliErrors: m.pauliErrors === null ? null : Object.fromEntries(m.pauliErrors.map((e) => [e.label, e.probability])),
            diamondDistance: jsonDiamond(m.diamond),
          },
    ...(r.representation === undefined
      ? {}
      : {
          representation:
            'error' in r.representation
              ? { form: r.representation.form, error: r.representation.error }
              : {
                  form: r.representation.form,
                  value: Array.isArray(r.representation.value)
                    ? (r.representation.value as readonly CMatrix[]).map(jsonMatrix)
                    : jsonMatrix(r.representation.value as CMatrix),
                },
        }),
  };
}

// ─── text ──────────────────────────────────────────────────────────────────────────

/** x with `digits` significant digits, scientific below 1e-4 (0 prints as 0). */
export function formatNumber(x: number, digits = REPORT_DIGITS): string {
  if (x === 0 || Object.is(x, -0)) return '0';
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a < 1e-4 || a >= 1e6) return x.toExponential(digits - 1).replace(/\.?0+e/, 'e');
  return String(Number(x.toPrecision(digits)));
}

function roundPart(x: number, digits: number, zeroBelow: number): number {
  if (Math.abs(x) < zeroBelow) return 0;
  return Number(x.toPrecision(digits));
}

/** A complex entry printed by complex.js, compactly ("0.5-0.5i", "i", "0"), after rounding and zeroing. */
export function formatComplex(re: number, im: number, digits = REPORT_DIGITS, zeroBelow = ZERO_BELOW): string {
  const z = new Complex(roundPart(re, digits, zeroBelow), roundPart(im, digits, zeroBelow));
  return z.toString().replace(/ ([+-]) /, '$1');
}

/** A matrix as aligned text rows "[ a  b ]", each prefixed by `indent`. */
export function renderMatrix(m: CMatrix, indent: string, digits = REPORT_DIGITS, zeroBelow = ZERO_BELOW): string[] {
  const cells: string[][] = [];
  const width = new Array<number>(m.cols).fill(0);
  for (let i = 0; i < m.rows; i++) {
    const row: string[] = [];
    for (let j = 0; j < m.cols; j++) {
      const s = formatComplex(m.data[2 * (i * m.cols + j)]!, m.data[2 * (i * m.cols + j) + 1]!, digits, zeroBelow);
      width[j] = Math.max(width[j]!, s.length);
      row.push(s);
    }
    cells.push(row);
  }
  return cells.map((row) => `${indent}[ ${row.map((s, j) => s.padEnd(width[j]!)).join('  ')} ]`);
}

/** A matrix as one YAML flow line [[a, b], [c, d]] with numbers or quoted complex strings (for pasting). */
export function yamlMatrix(m: CMatrix, digits = PASTE_DIGITS): string {
  const rows: string[] = [];
  for (let i = 0; i < m.rows; i++) {
    const row: string[] = [];
    for (let j = 0; j < m.cols; j++) {
      const re = roundPart(m.data[2 * (i * m.cols + j)]!, digits, 1e-15);
      const im = roundPart(m.data[2 * (i * m.cols + j) + 1]!, digits, 1e-15);
      row.push(im === 0 ? String(re) : `"${new Complex(re, im).toString().replace(/ ([+-]) /, '$1')}"`);
    }
    rows.push(`[${row.join(', ')}]`);
  }
  return `[${rows.join(', ')}]`;
}

function yesNo(ok: boolean, style: Style): string {
  return ok ? style.green('yes') : style.red('no ');
}

function describeDiamond(d: DiamondDistance): string {
  if (d.exact) {
    const how = d.method === 'unitaries' ? 'exact: two unitaries' : d.method === 'pauli' ? 'exact: Pauli-diagonal difference' : 'exact: the bounds meet';
    return `${formatNumber(d.value!)}  (${how})`;
  }
  // enough digits to tell the bounds apart
  let digits = REPORT_DIGITS;
  while (digits < 12 && formatNumber(d.lower, digits) === formatNumber(d.upper, digits)) digits++;
  return `in [${formatNumber(d.lower, digits)}, ${formatNumber(d.upper, digits)}]  (interval: optimised entangled input, Choi-matrix bound)`;
}

function krausBlock(ops: readonly CMatrix[], indent: string): string[] {
  const out: string[] = [];
  ops.forEach((k, i) => {
    const label = `K${i + 1} = `;
    renderMatrix(k, '').forEach((line, r) => out.push(`${indent}${r === 0 ? label : ' '.repeat(label.length)}${line}`));
  });
  return out;
}

const FORM_NAMES: Record<ChannelForm, string> = {
  kraus: 'minimal Kraus operators',
  choi: 'Choi matrix J = Σ |i⟩⟨j| ⊗ E(|i⟩⟨j|) (input first, unnormalised)',
  superoperator: 'superoperator S (column-stacked vec)',
  ptm: 'Pauli transfer matrix R_ij = Tr(P_i E(P_j))/d',
  stinespring: 'Stinespring isometry V = Σ K_k ⊗ |k⟩ (environment last)',
};

/** The text report of one channel. */
export function renderChannelReport(r: ChannelReportData, style: Style): string {
  const def = r.definition;
  const c = def.channel;
  const p = r.physicality;
  const out: string[] = [];
  const d = c.dim;
  out.push(`${style.bold(def.name)}  ${c.qubits} qubit${c.qubits === 1 ? '' : 's'} (d = ${d}), given as ${def.kind}  ${style.dim(`${def.at.file}:${def.at.line}:${def.at.col}`)}`);
  const stine = r.minimalKraus === undefined ? '' : ` · Stinespring ${d * r.minimalKraus.length}×${d}`;
  out.push(`  sizes       Kraus operators ${d}×${d} · Choi, superoperator, PTM ${d * d}×${d * d}${stine}`);
  const verdict = p.cptp
    ? style.green('a quantum channel (completely positive and trace preserving)')
    : style.red(
        `not a quantum channel: ${[
          !p.hermiticityPreserving.ok ? 'not Hermiticity preserving' : undefined,
          p.hermiticityPreserving.ok && !p.completelyPositive.ok ? (p.positive.status === 'positive' ? 'positive but not completely positive' : 'not completely positive') : undefined,
          !p.tracePreserving.ok ? 'not trace preserving' : undefined,
        ]
          .filter((x) => x !== undefined)
          .join(', ')}`,
      );
  out.push(`  physical    ${verdict}`);
  out.push(`    Hermiticity preserving  ${yesNo(p.hermiticityPreserving.ok, style)}  ‖J − J†‖ = ${formatNumber(p.hermiticityPreserving.value)}`);
  out.push(`    completely positive     ${yesNo(p.completelyPositive.ok, style)}  smallest Choi eigenvalue ${formatNumber(p.completelyPositive.value)}`);
  out.push(`    trace preserving        ${yesNo(p.tracePreserving.ok, style)}  ‖Tr_out J − I‖ = ${formatNumber(p.tracePreserving.value)}`);
  out.push(`    unital                  ${yesNo(p.unital.ok, style)}  ‖Tr_in J − I‖ = ${formatNumber(p.unital.value)}`);
  switch (p.positive.status) {
    case 'implied-by-cp':
      out.push(`    positive                ${yesNo(true, style)}  (implied by complete positivity)`);
      break;
    case 'not-tested':
      out.push(`    positive                ${style.dim('—')}    (not tested: the map is not Hermiticity preserving)`);
      break;
    case 'positive':
      out.push(`    positive                ${yesNo(true, style)}  smallest output eigenvalue over pure inputs ${formatNumber(p.positive.minOutputEigenvalue)} (numerical search)`);
      break;
    case 'not-positive':
      out.push(`    positive                ${yesNo(false, style)}  an input state has output eigenvalue ${formatNumber(p.positive.minOutputEigenvalue)}`);
      break;
  }
  out.push(style.dim(`    (norms are spectral; a property holds within ${p.tolerance})`));
  const ev = Array.from(r.choiEigenvalues, (x) => formatNumber(Math.abs(x) < ZERO_BELOW ? 0 : x));
  out.push(`  Kraus rank  ${r.minimalKraus !== undefined ? String(r.krausRank) : '— (no Kraus form)'}   Choi eigenvalues ${ev.join(', ')}`);
  if (r.minimalKraus !== undefined) {
    out.push('  minimal Kraus operators');
    out.push(...krausBlock(r.minimalKraus, '    '));
  } else {
    out.push(`  minimal Kraus operators  none: the map is not completely positive`);
  }
  if (r.repair !== undefined) {
    const rep = r.repair;
    out.push(`  nearest CPTP channel  ‖J − J'‖_F = ${formatNumber(rep.frobeniusDistance)}, diamond distance ${describeDiamond(rep.diamondDistance)}`);
    out.push(style.dim(`    ${rep.method}; ${rep.iterations} iteration${rep.iterations === 1 ? '' : 's'}${rep.converged ? '' : ' (stopped before converging)'}`));
    out.push(`    as a definition to paste (Kraus rank ${rep.kraus.length}):`);
    out.push('      kraus:');
    for (const k of rep.kraus) out.push(`        - ${yamlMatrix(k)}`);
  }
  const m = r.metrics;
  if ('error' in m) {
    out.push(`  metrics     none: ${m.error}`);
  } else {
    out.push(`  against ${m.target}${p.cptp ? '' : style.dim('  (figures of a map that is not a channel)')}`);
    const row = (label: string, value: string): void => void out.push(`    ${label.padEnd(32)}${value}`);
    const fid = m.processFidelityDefinition === 'unitary' ? 'process fidelity' : 'process fidelity (Choi states)';
    row(fid, m.processFidelity === null ? 'not defined: a Choi matrix is not positive semidefinite' : formatNumber(m.processFidelity, 6));
    if (m.averageGateFidelity !== null) row('average gate fidelity', formatNumber(m.averageGateFidelity, 6));
    row('unitarity', formatNumber(m.unitarity, 6));
    if (m.pauliErrors !== null) {
      const shown = m.pauliErrors.filter((e) => Math.abs(e.probability) >= ZERO_BELOW);
      const hidden = m.pauliErrors.length - shown.length;
      row('Pauli errors (twirled)', `${shown.map((e) => `${e.label} ${formatNumber(e.probability)}`).join('  ')}${hidden > 0 ? style.dim(`  (${hidden} more below ${ZERO_BELOW})`) : ''}`);
    }
    row('diamond distance', describeDiamond(m.diamond));
  }
  if (r.representation !== undefined) {
    const rep = r.representation;
    out.push(`  ${FORM_NAMES[rep.form]}`);
    if ('error' in rep) out.push(`    ${rep.error}`);
    else if (Array.isArray(rep.value)) out.push(...krausBlock(rep.value as readonly CMatrix[], '    '));
    else out.push(...renderMatrix(rep.value as CMatrix, '    '));
  }
  return out.join('\n') + '\n';
}
