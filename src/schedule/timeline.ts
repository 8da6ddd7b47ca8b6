/**
 * The event timeline of a scheduled circuit (format version 2's timing model).
 *
 * Event times are t = 0, the circuit's end T, and the start and end of every scheduled
 * operation (gates, resets, standalone noise steps, measurements; `idle` steps and barriers
 * are not operations). Taking them in ascending order, at each event time t with t′ the
 * previous one, the evolution applies:
 *   1. drift for t − t′: exp(−i·H·(t − t′)) of every detuning term of a qubit and every zz term
 *      of a coupled pair that acts in [t′, t) — a qubit's drift acts from 0 until its terminal
 *      measurement starts (or T; a mid-circuit measurement in record mode does not stop it),
 *      a pair's while neither of its qubits is terminally measured;
 *   2. thermal relaxation for t − t′ of every qubit idle throughout [t′, t) (the idle windows of
 *      src/schedule/schedule.ts, cut at event times);
 *   3. the operations that start at t, in step order, each applied whole at this instant.
 * This is a first-order (Lie–Trotter) splitting of the continuous evolution in which drift
 * and relaxation act together; it is exact when they commute (no drift, or detuning only).
 *
 * A mid-circuit measurement (record mode) is an operation like any other: it acts at its start
 * (the branches split), its qubit then relaxes for its duration, and drift goes on (the
 * schedule's measureStart lists terminal measurements only). Extending it: a new kind of event
 * adds its times to `eventTimes` and its effect on the drift and `starts`; the consumer
 * (src/program/program.ts) walks `events` in order.
 */
import type { Schedule } from './schedule.js';

/** One event time t and what happens in the segment [t′, t) before it and at t. */
export interface TimelineEvent {
  /** The event time t, ns. */
  readonly time: number;
  /** Length t − t′ of the segment that ends here, ns (0 for the first event, t = 0). */
  readonly segment: number;
  /** Qubits whose drift acts throughout [t′, t) (not measured before t), ascending. */
  readonly driftQubits: readonly number[];
  /** Qubits idle throughout [t′, t), ascending. */
  readonly idleQubits: readonly number[];
  /** Indices into Schedule.items of the operations that start at t, in step (program) order. */
  readonly starts: readonly number[];
}

/** The events of one schedule in ascending time. */
export interface Timeline {
  readonly events: readonly TimelineEvent[];
}

/** True for what the timeline counts as an operation (it has a start and an end event). */
function isOperation(kind: string): boolean {
  return kind === 'gate' || kind === 'reset' || kind === 'channel' || kind === 'measure';
}

/** Event times of a schedule, ascending and distinct. */
export function eventTimes(schedule: Schedule): number[] {
  const times = new Set<number>([0, schedule.duration]);
  for (const it of schedule.items) {
    if (!isOperation(it.op.kind)) continue;
    times.add(it.start);
    times.add(it.end);
  }
  return [...times].sort((a, b) => a - b);
}

/** Index of the first element of the ascending `xs` that is ≥ x. */
function lowerBound(xs: readonly number[], x: number): number {
  let lo = 0;
  let hi = xs.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The timeline of `schedule` on n qubits (see above). */
export function buildTimeline(schedule: Schedule, n: number): Timeline {
  const times = eventTimes(schedule);
  const idle: number[][] = times.map(() => []);
  const drift: number[][] = times.map(() => []);
  const starts: number[][] = times.map(() => []);
  // Every segment [times[i−1], times[i]) inside an idle window [w.start, w.end] has the qubit idle.
  for (const w of schedule.idleWindows) {
    const first = lowerBound(times, w.start) + 1;
    for (let i = first; i < times.length && times[i]! <= w.end; i++) idle[i]!.push(w.qubit);
  }
  for (let q = 0; q < n; q++) {
    const until = schedule.measureStart[q] ?? schedule.duration;
    for (let i = 1; i < times.length && times[i]! <= until; i++) drift[i]!.push(q);
  }
  schedule.items.forEach((it, index) => {
    if (isOperation(it.op.kind)) starts[lowerBound(times, it.start)]!.push(index);
  });
  return {
    events: times.map((time, i) => ({
      time,
      segment: i === 0 ? 0 : time - times[i - 1]!,
      driftQubits: drift[i]!,
      idleQubits: idle[i]!.sort((a, b) => a - b),
      starts: starts[i]!,
    })),
  };
}
