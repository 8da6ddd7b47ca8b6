import { describe, expect, it } from 'vitest';
import { scheduleCircuit } from '../../src/api/simulate.js';
import { buildTimeline, eventTimes } from '../../src/schedule/timeline.js';
import { loadText } from '../helpers/load.js';

/** The event timeline of issue 7's timing model, on small hand-checked schedules. */
function timelineOf(text: string) {
  const { circuit, profile } = loadText(text);
  const schedule = scheduleCircuit(circuit, profile);
  return { schedule, timeline: buildTimeline(schedule, circuit.register.n) };
}

const PROFILE = `noise:
  gates:
    h: { duration: 20ns }
    cx: { duration: 100ns }
    measure: { duration: 500ns }
`;

describe('buildTimeline', () => {
  it('events at 0, T and every operation start and end; idle steps and barriers are not operations', () => {
    const { schedule, timeline } = timelineOf(`qubits: 2
${PROFILE}steps:
  - h: 0
  - idle: 1
    for: 50ns
  - barrier: all
  - cx: [0, 1]
  - measure: 0
`);
    // h 0–20 on q0; idle q1 0–50 (not an event); barrier → cx 50–150; measure q0 150–650
    expect(eventTimes(schedule)).toEqual([0, 20, 50, 150, 650]);
    const ev = timeline.events;
    expect(ev.map((e) => e.segment)).toEqual([0, 20, 30, 100, 500]);
    expect(ev.map((e) => e.starts.map((i) => schedule.items[i]!.op.kind))).toEqual([['gate'], [], ['gate'], ['measure'], []]);
    // q0 idle 20–50; q1 idle 0–50 (its idle step is idle time) and, never measured, 150–650
    expect(ev.map((e) => e.idleQubits)).toEqual([[], [1], [0, 1], [], [1]]);
    // drift: q0 until its measurement starts at 150, q1 until the end
    expect(ev.map((e) => e.driftQubits)).toEqual([[], [0, 1], [0, 1], [0, 1], [1]]);
  });

  it('operations that start together come in step order; zero-length operations make one event', () => {
    const { schedule, timeline } = timelineOf(`qubits: 2
${PROFILE}steps:
  - noise: { bit_flip: 0.1 }
    on: [1]
  - h: [1, 0]
`);
    expect(eventTimes(schedule)).toEqual([0, 20]);
    expect(timeline.events[0]!.starts.map((i) => schedule.items[i]!.op.step)).toEqual([0, 1, 1]);
    expect(timeline.events[0]!.starts.map((i) => schedule.items[i]!.op.qubits[0])).toEqual([1, 1, 0]);
  });

  it('simultaneous readout: a measure step starts all its measurements together', () => {
    const text = (simultaneous: boolean) => `qubits: 2
noise:
  gates:
    h: { duration: 20ns }
    measure: { duration: 500ns, simultaneous: ${simultaneous} }
steps:
  - h: 0
  - measure: [0, 1]
`;
    const starts = (s: boolean) => timelineOf(text(s)).schedule.items.filter((it) => it.op.kind === 'measure').map((it) => it.start);
    expect(starts(false)).toEqual([20, 0]);
    expect(starts(true)).toEqual([20, 20]);
    // the barrier placed for it is not an item of the schedule
    expect(timelineOf(text(true)).schedule.items.map((it) => it.op.kind)).toEqual(['gate', 'measure', 'measure']);
  });
});
