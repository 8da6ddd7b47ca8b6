/**
 * A run's schedule as timeline data (src/plots/timeline.ts): boxes for gates, resets,
 * measurements and standalone noise steps, idle windows with their cost, barriers, the end.
 *
 * The cost of an idle window is its own average gate infidelity 1 − F_avg against the
 * identity: the thermal relaxation channel of that qubit for the window's length (the
 * channel the noisy run applies; coherenceLimitedInfidelity of src/noise/gateNoise.ts with
 * one qubit). With the profile's `idle: none` no window costs anything.
 */
import type { Simulation } from '../api/simulate.js';
import type { Operation } from '../circuit/circuit.js';
import { operationName } from '../circuit/operationName.js';
import { formatDuration } from '../format/duration.js';
import { formatFrequency } from '../format/frequency.js';
import { plainKinds } from '../format/noiseKindsSpec.js';
import { qubitName } from '../format/register.js';
import { coherenceLimitedInfidelity } from '../noise/gateNoise.js';
import type { OperationKind } from '../plots/palette.js';
import type { TimelineBox, TimelineData, TimelineFeed, TimelineIdle, TimelineLink } from '../plots/timeline.js';

/** Circuits at least this long (ns) are drawn in µs, shorter ones in ns. */
export const MICROSECOND_AXIS_FROM_NS = 2000;

/** Idle cost of one window of `ns` nanoseconds on qubit q: 1 − F_avg of its relaxation (0 with idle: none). */
export function idleWindowCost(sim: Simulation, q: number, ns: number): number {
  if (sim.profile.idle !== 'thermal') return 0;
  return coherenceLimitedInfidelity(1, ns, [sim.profile.qubits[q]!]);
}

/** The timeline of a run. Without durations (every operation 0 ns) the axis is the step number instead of time. */
export function timelineData(sim: Simulation): TimelineData {
  const reg = sim.circuit.register;
  const name = (q: number) => qubitName(q, reg);
  const total = sim.schedule.duration;
  const timed = total > 0;
  const scale = timed && total >= MICROSECOND_AXIS_FROM_NS ? 1e-3 : 1;
  // Untimed circuits are drawn in step order: step s occupies [s, s + 0.8].
  const place = (op: Operation, start: number, end: number) => (timed ? { start: start * scale, end: end * scale } : { start: op.step, end: op.step + 0.8 });
  const lastStep = Math.max(0, ...sim.schedule.items.map((i) => i.op.step));
  const bits = sim.circuit.bits ?? [];
  const boxes: TimelineBox[] = [];
  const links: TimelineLink[] = [];
  const barriers: { lane: number; at: number }[] = [];
  for (const item of sim.schedule.items) {
    const op = item.op;
    const { start, end } = place(op, item.start, item.end);
    if (op.kind === 'barrier') {
      for (const q of op.qubits) barriers.push({ lane: q, at: timed ? start : op.step - 0.1 });
      continue;
    }
    if (op.kind === 'idle') continue; // idle steps are idle time: they show as idle windows
    const kind = operationKind(op);
    const what = operationName(op);
    const qubits = op.qubits.map(name).join(', ');
    const noise = noiseText(sim, op);
    const title =
      `step ${op.step + 1}: ${what} on ${qubits}${op.label !== undefined ? ` (${op.label})` : ''}` +
      (timed ? ` · ${num(item.start)} ns → ${num(item.end)} ns (${formatDuration(item.end - item.start)})` : ' · no durations in the profile') +
      (noise !== '' ? ` · ${noise}` : '');
    const label = op.kind === 'gate' ? op.name : op.kind === 'measure' ? 'M' : op.kind === 'reset' ? 'R' : 'N';
    const condition = op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel' ? op.condition : undefined;
    const recordText =
      (op.kind === 'measure' && op.bit !== undefined ? ` · into bit ${bits[op.bit]}` : '') +
      (condition !== undefined ? ` · only if ${condition.terms.map((t) => `${bits[t.bit]} = ${t.value}`).join(' and ')}` : '');
    for (const q of op.qubits) boxes.push({ lane: q, start, end, kind, label, title: title + recordText, ...(condition !== undefined ? { conditional: true } : {}) });
    if (op.qubits.length > 1) {
      const lanes = [...op.qubits].sort((a, b) => a - b);
      links.push({ at: start + Math.max(end - start, 0) / 2, from: lanes[0]!, to: lanes[lanes.length - 1]! });
    }
  }
  const idle: TimelineIdle[] = sim.schedule.idleWindows
    .filter(() => timed)
    .map((w) => {
      const cost = idleWindowCost(sim, w.qubit, w.end - w.start);
      return {
        lane: w.qubit,
        start: w.start * scale,
        end: w.end * scale,
        cost,
        costText: cost.toExponential(1),
        title: `qubit ${name(w.qubit)} idle ${num(w.start)} ns → ${num(w.end)} ns (${formatDuration(w.end - w.start)}) · 1 − F_avg = ${cost.toExponential(3)}` +
          (sim.profile.idle === 'thermal' ? ' (thermal relaxation)' : " (the profile says idle: none)"),
      };
    });
  const feeds: TimelineFeed[] = timed
    ? sim.schedule.feeds.map((f) => {
        const m = sim.schedule.items[f.measure]!;
        const to = sim.schedule.items[f.to]!;
        return {
          from: m.end * scale,
          fromLane: m.op.qubits[0]!,
          to: to.start * scale,
          toLane: to.op.qubits[0]!,
          title: `bit ${bits[f.bit]}: measured on ${name(m.op.qubits[0]!)} (ends ${num(m.end)} ns) → step ${to.op.step + 1} ${operationName(to.op)} (starts ${num(to.start)} ns; latency ${formatDuration(f.latency)})`,
        };
      })
    : [];
  return {
    feeds,
    // a detuned qubit drifts about Z all the time: its lane says by how much
    lanes: Array.from({ length: reg.n }, (_, q) => {
      const detuning = sim.profile.qubits[q]!.detuning;
      return detuning !== 0 ? `${name(q)} (δ ${formatFrequency(detuning)})` : name(q);
    }),
    boxes,
    idle,
    links,
    barriers,
    end: timed ? total * scale : lastStep + 1,
    endLabel: timed ? `end ${formatDuration(total)}` : 'end',
    axisTitle: timed ? `time (${scale === 1 ? 'ns' : 'µs'}), ${sim.schedule.policy.toUpperCase()} schedule` : 'step (the profile gives no durations)',
    costTitle: sim.profile.idle === 'thermal' ? 'idle window cost 1 − F_avg' : 'idle window cost (idle: none)',
  };
}

function operationKind(op: Operation): OperationKind {
  switch (op.kind) {
    case 'measure':
      return 'measure';
    case 'reset':
      return 'reset';
    case 'channel':
      return 'noise step';
    default:
      return op.qubits.length > 1 ? 'gate, 2+ qubits' : 'gate, 1 qubit';
  }
}

/** The noise kinds acting after an operation, as "kind value" pairs (the step's own, or the profile's). */
function noiseText(sim: Simulation, op: Operation): string {
  let kinds;
  if (op.kind === 'gate') kinds = op.noise?.kinds ?? sim.profile.gateEntry(op.name, op.qubits).kinds;
  else if (op.kind === 'reset') kinds = op.noise?.kinds ?? sim.profile.reset.kinds;
  else if (op.kind === 'channel') kinds = op.noise.kinds;
  else return '';
  const parts = Object.entries(plainKinds(kinds)).map(([k, v]) => (typeof v === 'object' ? `${k} ${JSON.stringify(v)}` : `${k} ${v}`));
  return parts.length === 0 ? '' : `noise: ${parts.join(', ')}`;
}

function num(x: number): string {
  return String(Number(x.toPrecision(10)));
}
