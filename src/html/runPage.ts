/**
 * The HTML report of one run (`fray run --html FILE`): header, fidelity block, the schedule
 * as a timeline with its costliest idle windows, outcome bars (ideal / noisy / measured),
 * per-qubit Bloch vector lengths, observables, sampled counts and warnings.
 */
import { deviceDescription, deviceFacts } from '../api/describe.js';
import type { Simulation } from '../api/simulate.js';
import { operationName } from '../circuit/operationName.js';
import { formatDuration } from '../format/duration.js';
import { warningText } from '../format/problem.js';
import { formatFrequency } from '../format/frequency.js';
import { qubitName } from '../format/register.js';
import { comparisonBarsSpec, renderSvg, timelineSpec, type ComparisonBar, type Series } from '../plots/index.js';
import { HEADLINE_FIGURES } from '../results/headlineFigures.js';
import { topOutcomes } from '../results/topOutcomes.js';
import { esc, figure, keyValueList, page, pair, table, type PageSection } from './page.js';
import { idleWindowCost, timelineData } from './timelineData.js';

/** Options of the run page. */
export interface RunPageOptions {
  /** How many of the most likely outcomes to draw and list. */
  readonly top: number;
  /** The fray version written in the footer. */
  readonly version: string;
}

/** How many idle windows the page lists, costliest first. */
export const LISTED_IDLE_WINDOWS = 6;

/** Builds the self-contained HTML page of a run. */
export async function runPage(sim: Simulation, opts: RunPageOptions): Promise<string> {
  const r = sim.result;
  const reg = sim.circuit.register;
  const name = (q: number) => qubitName(q, reg);
  // record mode: outcomes are the record's bits (leftmost first); otherwise the measured qubits
  const record = r.bits !== undefined;
  const bitNames = record ? [...r.bits!] : r.measured.map(name);
  const bitOrder = bitNames.join(' ');
  const leftmost = record ? `bit ${bitNames[0] ?? ''}` : `qubit ${bitNames[0] ?? ''}`;
  const sections: PageSection[] = [];

  sections.push({
    id: 'fidelity',
    heading: 'Fidelity with the ideal run',
    body:
      `<div class="cards">` +
      HEADLINE_FIGURES.map(
        (f) =>
          `<div class="card"><div class="name">${esc(f.name)}</div>` +
          `<div class="value" data-figure="${f.key}" title="${f.value(r)}">${f.value(r).toFixed(6)}</div>` +
          `<div class="def">${esc(f.definition)}</div></div>`,
      ).join('') +
      `</div>`,
  });

  const facts = deviceFacts(sim);
  const tl = timelineData(sim);
  const idleNote =
    sim.profile.idle === 'thermal'
      ? 'Idle windows are the thin bands, shaded by their own cost: 1 − F_avg of the thermal relaxation the qubit undergoes while it waits (the number printed where the band is wide enough)' +
        (facts.drift !== undefined ? '; the coherent drift of the device (detuning, zz) acts during the waits too and is not in this shading.' : '.')
      : 'The profile says idle: none, so idle windows (the thin bands) cost nothing.';
  const worst = [...sim.schedule.idleWindows]
    .map((w) => ({ w, cost: idleWindowCost(sim, w.qubit, w.end - w.start) }))
    .sort((a, b) => b.cost - a.cost || b.w.end - b.w.start - (a.w.end - a.w.start))
    .slice(0, LISTED_IDLE_WINDOWS);
  sections.push({
    id: 'timeline',
    heading: 'Schedule',
    note:
      `One lane per qubit; each operation is a box from its start to its end on every qubit it acts on, a line joins the boxes of a multi-qubit gate. ` +
      `M marks a measurement, R a reset, N a standalone noise step; dashed ticks are barriers and the dashed line is the end of the circuit. ` +
      (sim.schedule.feeds.length > 0 ? `A label ending in ? is a step that runs only when record bits agree; a dotted line runs from each measurement to the steps its bit conditions. ` : '') +
      `${idleNote} ` +
      `Hover a box or a band for its exact figures.`,
    body:
      figure(await renderSvg(timelineSpec(tl)), `${r.schedule.toUpperCase()} schedule, ${formatDuration(r.duration_ns)} in total.${zzCaption(sim)}`) +
      (worst.length === 0
        ? `<p class="note">No qubit waits: there are no idle windows.</p>`
        : table(
            ['qubit', 'idle from (ns)', 'to (ns)', 'length', '1 − F_avg'],
            worst.map(({ w, cost }) => [name(w.qubit), num(w.start), num(w.end), formatDuration(w.end - w.start), cost.toExponential(3)]),
            [1, 2, 3, 4],
            'idle-windows',
          ) + `<p class="note">The ${worst.length === 1 ? 'only idle window' : `${worst.length} costliest idle windows`} of ${sim.schedule.idleWindows.length}.</p>`) +
      `<details><summary>Every scheduled step (${sim.schedule.items.length})</summary>` +
      table(
        ['step', 'operation', 'qubits', 'start (ns)', 'end (ns)'],
        sim.schedule.items.map((it) => [
          String(it.op.step + 1),
          operationName(it.op),
          it.op.qubits.map(name).join(' '),
          num(it.start),
          num(it.end),
        ]),
        [0, 3, 4],
      ) +
      `</details>`,
  });

  const keys = topOutcomes(r.probabilities, opts.top);
  const series = ['ideal', 'noisy', 'measured'] as const satisfies readonly Series[];
  const bars: ComparisonBar[] = keys.flatMap((k) =>
    series.map((s) => {
      const p = r.probabilities[s][k] ?? 0;
      return { category: k, series: s, value: p, title: `${k}: ${s} probability ${p.toPrecision(6)}` };
    }),
  );
  const total = 2 ** bitNames.length;
  const bitTitle = `${record ? 'record' : 'outcome'}, bits ${bitOrder} (${leftmost} leftmost)`;
  sections.push({
    id: 'outcomes',
    heading: `Most likely ${record ? 'records' : 'outcomes'} (${keys.length} of ${total})`,
    note: record
      ? `Ideal (hollow), noisy (light) and measured as feed-forward saw it, readout error included (dark). Each bit string lists the record bits ${bitOrder}, ${leftmost} leftmost.`
      : `Ideal (hollow), noisy before readout (light) and measured with readout error (dark). Each bit string lists the measured qubits ${bitOrder}, ${leftmost} leftmost.`,
    body: pair(
      figure(await renderSvg(comparisonBarsSpec({ bars, categories: keys, categoryTitle: bitTitle, valueTitle: 'probability', domain: [0, 1], monospace: true })), 'Outcome probabilities.'),
      table(
        [`outcome (${bitOrder})`, 'ideal', 'noisy', 'measured'],
        keys.map((k) => [k, ...series.map((s) => (r.probabilities[s][k] ?? 0).toFixed(6))]),
        [1, 2, 3],
      ),
    ),
  });

  const lengths = (v: readonly number[]) => Math.hypot(v[0]!, v[1]!, v[2]!);
  const qubits = Array.from({ length: r.qubits }, (_, q) => q);
  const blochBars: ComparisonBar[] = qubits.flatMap((q) =>
    (['ideal', 'noisy'] as const).map((s) => {
      const v = r.bloch[s][q]!;
      return { category: name(q), series: s, value: lengths(v), title: `qubit ${name(q)}: ${s} Bloch vector (${v.map((x) => round(x).toFixed(4)).join(', ')}), length ${lengths(v).toFixed(6)}` };
    }),
  );
  sections.push({
    id: 'state',
    heading: 'Per-qubit state',
    note: 'Length |r| of each qubit’s Bloch vector (⟨X⟩, ⟨Y⟩, ⟨Z⟩) of its reduced state: 1 for a pure single-qubit state, shorter when the qubit is mixed by noise or by entanglement with the others (0 for a qubit of a GHZ state).',
    body: pair(
      figure(await renderSvg(comparisonBarsSpec({ bars: blochBars, categories: qubits.map(name), categoryTitle: 'qubit', valueTitle: 'Bloch vector length |r|', domain: [0, 1] })), 'Bloch vector lengths, ideal (hollow) and noisy (filled).'),
      table(
        ['qubit', 'ideal (⟨X⟩, ⟨Y⟩, ⟨Z⟩)', 'noisy (⟨X⟩, ⟨Y⟩, ⟨Z⟩)', 'ideal |r|', 'noisy |r|'],
        qubits.map((q) => [name(q), vec(r.bloch.ideal[q]!), vec(r.bloch.noisy[q]!), lengths(r.bloch.ideal[q]!).toFixed(4), lengths(r.bloch.noisy[q]!).toFixed(4)]),
        [1, 2, 3, 4],
      ),
    ),
  });

  if (r.observables !== undefined) {
    const strings = Object.keys(r.observables);
    const obsBars: ComparisonBar[] = strings.flatMap((p) =>
      (['ideal', 'noisy'] as const).map((s) => ({ category: p, series: s, value: r.observables![p]![s], title: `⟨${p}⟩ ${s} = ${round(r.observables![p]![s]).toFixed(6)}` })),
    );
    sections.push({
      id: 'observables',
      heading: 'Pauli expectation values',
      note: `⟨P⟩ = Tr(Pρ); one letter per qubit, qubit ${name(0)} leftmost.`,
      body: pair(
        figure(await renderSvg(comparisonBarsSpec({ bars: obsBars, categories: strings, categoryTitle: 'Pauli string', valueTitle: '⟨P⟩', domain: [-1, 1], monospace: true })), 'Expectation values, ideal (hollow) and noisy (filled).'),
        table(['Pauli string', 'ideal', 'noisy'], strings.map((p) => [p, round(r.observables![p]!.ideal).toFixed(6), round(r.observables![p]!.noisy).toFixed(6)]), [1, 2]),
      ),
    });
  }

  if (r.counts !== undefined) {
    const sorted = Object.entries(r.counts).sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1));
    sections.push({
      id: 'counts',
      heading: `Sampled counts (${r.shots} shots, seed ${r.seed})`,
      body: table([`outcome (${bitOrder})`, 'count'], sorted.slice(0, opts.top).map(([k, c]) => [k, String(c)]), [1]) +
        (sorted.length > opts.top ? `<p class="note">… ${sorted.length - opts.top} more outcomes.</p>` : ''),
    });
  }

  if (r.warnings.length > 0) {
    sections.push({ id: 'warnings', heading: 'Warnings', body: `<ul class="warnings">${r.warnings.map((w) => `<li>${esc(warningText(w))}${w.count > 1 ? ` (${w.count} times)` : ''}</li>`).join('')}</ul>` });
  }

  const header: PageSection = {
    id: 'run',
    heading: 'Run',
    body: keyValueList([
      ['file', r.file],
      ['device', deviceDescription(sim)],
      ['qubits', `${r.qubits}${reg.labels !== null ? ` (${reg.labels.join(' ')})` : ''}`],
      [record ? 'record' : 'measured', `${bitOrder} (bit order of every outcome, left to right)`],
      ['duration', formatDuration(r.duration_ns)],
      ['schedule', `${r.schedule.toUpperCase()}; idle windows ${sim.profile.idle === 'thermal' ? 'relax (idle: thermal)' : 'do not relax (idle: none)'}`],
      ...(facts.readout !== undefined ? [['readout', facts.readout] as const] : []),
      ...(facts.couplings !== undefined ? [['couplings', `${facts.couplings.pairs}; ${facts.couplings.map}`] as const] : []),
      ...(facts.drift !== undefined ? [['drift', `${facts.drift} (not in the idle shading, which is relaxation only)`] as const] : []),
    ]),
  };
  return page(
    r.name ?? r.file,
    `${r.qubits} qubit${r.qubits === 1 ? '' : 's'} · ${formatDuration(r.duration_ns)} · ${deviceDescription(sim)}`,
    [header, ...sections],
    `Written by fray ${opts.version} from ${r.file}. One self-contained page: no scripts, nothing loaded from the network.`,
  );
}

/** The always-on zz of coupled pairs, for the timeline's caption ('' when there is none); δ in lane names is a qubit's detuning. */
function zzCaption(sim: Simulation): string {
  const reg = sim.circuit.register;
  const pairs = (sim.profile.couplings ?? []).filter((c) => c.zz !== 0);
  const detuned = sim.profile.qubits.some((q) => q.detuning !== 0);
  const zz = pairs.length === 0 ? '' : ` Always-on zz: ${pairs.map((c) => `${qubitName(c.a, reg)}–${qubitName(c.b, reg)} ${formatFrequency(c.zz)}`).join(', ')}.`;
  return zz + (detuned ? ' δ in a lane name is the qubit\'s detuning.' : '');
}

/** Values within 5e-7 of zero are shown as 0 (rounding noise of the simulation). */
function round(x: number): number {
  return Math.abs(x) < 5e-7 ? 0 : x;
}

function vec(v: readonly number[]): string {
  return `(${v.map((x) => round(x).toFixed(4)).join(', ')})`;
}

function num(x: number): string {
  return String(Number(x.toPrecision(10)));
}
