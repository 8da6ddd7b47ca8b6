import { deviceDescription, deviceFacts } from '../api/describe.js';
import type { Simulation } from '../api/simulate.js';
import { operationName } from '../circuit/operationName.js';
import { HEADLINE_FIGURES } from '../results/headlineFigures.js';
import { topOutcomes } from '../results/topOutcomes.js';
import { formatDuration } from '../format/duration.js';
import { warningText } from '../format/problem.js';
import { formatFrequency } from '../format/frequency.js';
import { hasDrift } from '../program/program.js';
import { qubitName } from '../format/register.js';
import type { Style } from './style.js';

/** Options of the human-readable run report. */
export interface ReportOptions {
  /** How many of the most likely outcomes to list. */
  readonly top: number;
  readonly showState: boolean;
  readonly showSchedule: boolean;
}

/** Width of the probability bar at probability 1, in characters. */
const BAR_WIDTH = 24;

/** The terminal report of one run: header, fidelity block, top outcomes, observables, extras. */
export function renderRunReport(sim: Simulation, opts: ReportOptions, style: Style): string {
  const r = sim.result;
  const reg = sim.circuit.register;
  const lines: string[] = [];
  const kv = (k: string, v: string) => lines.push(`  ${style.dim(k.padEnd(10))}${v}`);
  lines.push(style.bold(r.name ?? r.file));
  kv('file', r.file);
  kv('device', deviceDescription(sim));
  const measured = r.measured.map((q) => qubitName(q, reg)).join(' ');
  if (r.bits !== undefined) kv('qubits', `${r.qubits}${reg.labels ? ` (${reg.labels.join(' ')})` : ''}, record: ${r.bits.join(' ')}`);
  else kv('qubits', `${r.qubits}${reg.labels ? ` (${reg.labels.join(' ')})` : ''}, measured: ${measured}`);
  if (r.layout !== undefined) kv('layout', r.layout.map((p, i) => `${qubitName(i, reg)}→${p}`).join(' ') + ' (circuit qubit → device qubit)');
  if (r.noise_scale !== undefined) kv('noise', `every strength × ${r.noise_scale} (--noise-scale)`);
  kv('duration', `${formatDuration(r.duration_ns)} (${r.schedule.toUpperCase()} schedule)`);
  const facts = deviceFacts(sim);
  if (facts.readout !== undefined) kv('readout', facts.readout);
  if (facts.couplings !== undefined) kv('couplings', `${facts.couplings.pairs}; ${facts.couplings.offMap ? style.yellow(facts.couplings.map) : facts.couplings.map}`);
  if (facts.drift !== undefined) kv('drift', `${facts.drift} (--schedule lists them)`);
  lines.push('');

  lines.push(style.bold('Fidelity with the ideal run'));
  for (const f of HEADLINE_FIGURES) lines.push(`  ${f.name.padEnd(26)}${f.value(r).toFixed(6)}  ${style.dim(f.definition)}`);
  lines.push('');

  const ranked = topOutcomes(r.probabilities, opts.top).map((k) => ({ k }));
  const record = r.bits !== undefined ? recordColumns(r.bits) : undefined;
  const show = (k: string): string => (record !== undefined ? record.cells(k) : k);
  let w: number;
  if (record !== undefined) {
    lines.push(style.bold(`Most likely records (${ranked.length} of ${Math.pow(2, r.bits!.length)}; recorded values as feed-forward saw them under 'measured')`));
    w = Math.max(7, record.header.length);
    lines.push(`  ${style.dim(record.header.padEnd(w))}  ${style.dim('ideal'.padStart(8))}  ${style.dim('noisy'.padStart(8))}  ${style.dim('measured'.padStart(8))}`);
  } else {
    const total = 1 << r.measured.length;
    lines.push(style.bold(`Most likely outcomes (${ranked.length} of ${total}; qubit ${qubitName(r.measured[0]!, reg)} leftmost)`));
    w = Math.max(7, r.measured.length);
    lines.push(`  ${style.dim('outcome'.padEnd(w))}  ${style.dim('ideal'.padStart(8))}  ${style.dim('noisy'.padStart(8))}  ${style.dim('measured'.padStart(8))}`);
  }
  for (const { k } of ranked) {
    const pi = r.probabilities.ideal[k] ?? 0;
    const pn = r.probabilities.noisy[k] ?? 0;
    const pm = r.probabilities.measured[k] ?? 0;
    const bar = style.cyan('█'.repeat(Math.round(pm * BAR_WIDTH))) + style.dim('·'.repeat(Math.max(0, Math.round(pi * BAR_WIDTH) - Math.round(pm * BAR_WIDTH))));
    lines.push(`  ${show(k).padEnd(w)}  ${pi.toFixed(4).padStart(8)}  ${pn.toFixed(4).padStart(8)}  ${pm.toFixed(4).padStart(8)}  ${bar}`);
  }
  lines.push(`  ${style.dim(`bar: measured probability (█), shortfall against ideal (·)`)}`);

  if (r.observables !== undefined) {
    lines.push('');
    lines.push(style.bold('Pauli expectation values ⟨P⟩ (qubit 0 leftmost)'));
    const pw = Math.max(6, ...Object.keys(r.observables).map((k) => k.length));
    lines.push(`  ${style.dim('string'.padEnd(pw))}  ${style.dim('ideal'.padStart(9))}  ${style.dim('noisy'.padStart(9))}`);
    for (const [k, v] of Object.entries(r.observables)) {
      lines.push(`  ${k.padEnd(pw)}  ${fmtSigned(v.ideal)}  ${fmtSigned(v.noisy)}`);
    }
  }

  if (r.counts !== undefined) {
    lines.push('');
    lines.push(style.bold(`Sampled counts (${r.shots} shots, seed ${r.seed})`));
    const sorted = Object.entries(r.counts).sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1));
    if (record !== undefined) lines.push(`  ${style.dim(record.header.padEnd(w))}  ${style.dim('count'.padStart(8))}`);
    for (const [k, c] of sorted.slice(0, opts.top)) lines.push(`  ${show(k).padEnd(w)}  ${String(c).padStart(8)}`);
    if (sorted.length > opts.top) lines.push(style.dim(`  … ${sorted.length - opts.top} more outcomes`));
  }

  if (opts.showState) lines.push('', ...renderState(sim, style));
  if (opts.showSchedule) lines.push('', ...renderSchedule(sim, style));

  if (r.warnings.length > 0) {
    lines.push('');
    lines.push(style.yellow(style.bold('Warnings')));
    for (const w of r.warnings) lines.push(style.yellow(`  ${warningText(w)}${w.count > 1 ? ` (${w.count} times)` : ''}`));
  }
  return lines.join('\n') + '\n';
}

/** Record keys shown bit by bit under the bit names: header 'm1 a b', key '101' as '1  0 1'. */
function recordColumns(bits: readonly string[]): { header: string; cells: (key: string) => string } {
  const widths = bits.map((b) => Math.max(1, b.length));
  return {
    header: bits.join(' '),
    cells: (key) => bits.map((_, i) => (key[i] ?? '?').padEnd(widths[i]!)).join(' ').trimEnd(),
  };
}

function fmtSigned(x: number): string {
  const v = Math.abs(x) < 5e-7 ? 0 : x;
  return (v >= 0 ? ' ' : '') + v.toFixed(6).padStart(8);
}

/** Largest register whose full density matrix --state prints. */
export const STATE_PRINT_MAX_QUBITS = 3;

function renderState(sim: Simulation, style: Style): string[] {
  const r = sim.result;
  const reg = sim.circuit.register;
  const lines = [style.bold('Final state, per qubit: Bloch vector (⟨X⟩, ⟨Y⟩, ⟨Z⟩)')];
  lines.push(`  ${style.dim('qubit'.padEnd(8))}${style.dim('ideal'.padEnd(30))}${style.dim('noisy')}`);
  const vec = (v: readonly number[]) => `(${v.map((x) => (Math.abs(x) < 5e-7 ? 0 : x).toFixed(4).padStart(7)).join(',')})`;
  r.bloch.ideal.forEach((b, q) => lines.push(`  ${qubitName(q, reg).padEnd(8)}${vec(b).padEnd(30)}${vec(r.bloch.noisy[q]!)}`));
  if (sim.branches !== undefined && r.bits !== undefined) {
    const record = recordColumns(r.bits);
    const keys = [...new Set([...sim.branches.noisy.keys(), ...sim.branches.ideal.keys()])].sort();
    const w = Math.max(6, record.header.length);
    lines.push('', style.bold(`Branches: one density matrix per record with non-zero weight (${sim.branches.noisy.size} noisy, ${sim.branches.ideal.size} ideal)`));
    lines.push(`  ${style.dim(record.header.padEnd(w))}  ${style.dim('ideal'.padStart(10))}  ${style.dim('noisy'.padStart(10))}`);
    for (const k of keys) {
      const pi = r.probabilities.ideal[k] ?? 0;
      const pm = r.probabilities.measured[k] ?? 0;
      lines.push(`  ${record.cells(k).padEnd(w)}  ${pi.toFixed(6).padStart(10)}  ${pm.toFixed(6).padStart(10)}`);
    }
    lines.push(`  ${style.dim('weight Tr ρ_r of each branch; noisy = every noise source, readout error included')}`);
  }
  const n = r.qubits;
  if (n <= STATE_PRINT_MAX_QUBITS) {
    lines.push('', style.bold(`Noisy density matrix ρ${r.bits !== undefined ? ' = Σ_r ρ_r' : ''} (rows and columns in basis order, qubit 0 leftmost)`));
    const d = 1 << n;
    const data = sim.rho.data;
    for (let i = 0; i < d; i++) {
      const cells: string[] = [];
      for (let j = 0; j < d; j++) cells.push(complexText(data[2 * (i * d + j)]!, data[2 * (i * d + j) + 1]!).padStart(17));
      lines.push(`  ${cells.join(' ')}`);
    }
  } else {
    lines.push(style.dim(`  (the full density matrix is printed for up to ${STATE_PRINT_MAX_QUBITS} qubits; use --json and the library API for larger registers)`));
  }
  return lines;
}

/** A complex number in fixed 4-decimal form, entries below 5e-5 shown as 0. */
function complexText(re: number, im: number): string {
  const r = Math.abs(re) < 5e-5 ? 0 : re;
  const i = Math.abs(im) < 5e-5 ? 0 : im;
  if (i === 0) return r.toFixed(4);
  if (r === 0) return `${i.toFixed(4)}i`;
  return `${r.toFixed(4)}${i < 0 ? '−' : '+'}${Math.abs(i).toFixed(4)}i`;
}

function renderSchedule(sim: Simulation, style: Style): string[] {
  const reg = sim.circuit.register;
  const lines = [style.bold(`Schedule (${sim.schedule.policy.toUpperCase()}, times in ns)`)];
  const bits = sim.circuit.bits ?? [];
  const names = sim.schedule.items.map(({ op }) => {
    let name = operationName(op);
    if (op.kind === 'measure' && op.bit !== undefined) name += ` → ${bits[op.bit]}`;
    if ((op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel') && op.condition !== undefined) {
      name += ` if ${op.condition.terms.map((t) => `${bits[t.bit]}=${t.value}`).join(',')}`;
    }
    return name;
  });
  const ow = Math.max(14, ...names.map((s) => s.length + 2));
  lines.push(`  ${style.dim('step'.padEnd(6))}${style.dim('operation'.padEnd(ow))}${style.dim('qubits'.padEnd(14))}${style.dim('start'.padStart(10))}${style.dim('end'.padStart(10))}`);
  sim.schedule.items.forEach((it, i) => {
    const op = it.op;
    lines.push(`  ${String(op.step + 1).padEnd(6)}${names[i]!.padEnd(ow)}${op.qubits.map((q) => qubitName(q, reg)).join(' ').padEnd(14)}${num(it.start).padStart(10)}${num(it.end).padStart(10)}`);
  });
  lines.push('', style.bold('Idle windows (relaxation applies when the profile says idle: thermal)'));
  if (sim.schedule.idleWindows.length === 0) lines.push(style.dim('  none'));
  for (const w of sim.schedule.idleWindows) {
    lines.push(`  qubit ${qubitName(w.qubit, reg).padEnd(6)}${num(w.start).padStart(10)} → ${num(w.end).padStart(10)}  (${formatDuration(w.end - w.start)})`);
  }
  lines.push(`  ${style.dim(`total duration ${formatDuration(sim.schedule.duration)}`)}`);
  if (sim.circuit.bits !== null) {
    lines.push('', style.bold('Classical dependencies (a measured bit feeds a conditioned step no earlier than its end + latency)'));
    if (sim.schedule.feeds.length === 0) lines.push(style.dim('  none'));
    for (const f of sim.schedule.feeds) {
      const m = sim.schedule.items[f.measure]!;
      const to = sim.schedule.items[f.to]!;
      const toName = operationName(to.op);
      lines.push(
        `  step ${m.op.step + 1} measure ${qubitName(m.op.qubits[0]!, reg)} → bit ${bits[f.bit]} → step ${to.op.step + 1} ${toName} ${to.op.qubits.map((q) => qubitName(q, reg)).join(' ')}` +
          `  (measurement ends ${num(m.end)}, latency ${formatDuration(f.latency)}, step starts ${num(to.start)})`,
      );
    }
  }
  lines.push(...renderDrift(sim, style));
  return lines;
}

/** The always-on drift per qubit and coupled pair, with the time it acts (from 0 until a terminal measurement starts, or the end). */
function renderDrift(sim: Simulation, style: Style): string[] {
  const reg = sim.circuit.register;
  const p = sim.profile;
  if (p.couplings === null && !hasDrift(p)) return [];
  const until = (q: number): number => sim.schedule.measureStart[q] ?? sim.schedule.duration;
  const lines = ['', style.bold('Drift (always on, diagonal; H = Σ π·δ·Z_q + Σ (π·ζ/2)·Z_a Z_b; not in the ideal run)')];
  p.qubits.forEach((q, i) => {
    if (q.detuning === 0) return;
    lines.push(`  qubit ${qubitName(i, reg).padEnd(8)}detuning ${formatFrequency(q.detuning).padStart(12)}   acts 0 → ${num(until(i))} ns`);
  });
  for (const c of p.couplings ?? []) {
    const pair = `${qubitName(c.a, reg)} ${qubitName(c.b, reg)}`;
    const zz = c.zz === 0 ? style.dim('coupled, no zz') : `zz       ${formatFrequency(c.zz).padStart(12)}   acts 0 → ${num(Math.min(until(c.a), until(c.b)))} ns`;
    lines.push(`  pair  ${pair.padEnd(8)}${zz}`);
  }
  return lines;
}

function num(x: number): string {
  return String(Number(x.toPrecision(10)));
}
