import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../src/api/simulate.js';
import { timelineData } from '../../src/html/timelineData.js';
import { renderSvg } from '../../src/plots/render.js';
import { timelineSpec } from '../../src/plots/timeline.js';
import { loadText } from '../helpers/load.js';

/** Closeness of two computations of the same idle cost (the formula vs the Kraus route). */
const COST_TOLERANCE = 1e-12;

const CIRCUIT = `
name: timeline sample
qubits: [a, b, c]
noise:
  qubits:
    all: { t1: 40us, t2: 30us }
  gates:
    all: { duration: 40ns }
    cx: { duration: 300ns }
    measure: { duration: 2us }
    reset: { duration: 200ns }
steps:
  - h: a
  - cx: [a, c]
  - barrier: all
  - reset: b
  - noise: { bit_flip: 0.01 }
    on: b
  - measure: [a, b, c]
`;

describe('timeline of a run', () => {
  const sim = simulateLoaded(loadText(CIRCUIT), { engine: 'reference' });
  const tl = timelineData(sim);

  it('has one lane per qubit and one box per operation on each of its qubits', () => {
    expect(tl.lanes).toEqual(['a', 'b', 'c']);
    // h(a), cx(a, c) on two lanes, reset(b), noise(b), 3 measurements; the barrier is not a box
    expect(tl.boxes.map((b) => `${b.label}@${tl.lanes[b.lane]}`)).toEqual(['h@a', 'cx@a', 'cx@c', 'R@b', 'N@b', 'M@a', 'M@b', 'M@c']);
    expect(tl.links).toEqual([{ at: expect.closeTo(0.04 + 0.15, 12), from: 0, to: 2 }]);
    expect(tl.barriers.map((b) => b.lane)).toEqual([0, 1, 2]);
    expect(tl.axisTitle).toBe('time (µs), ASAP schedule');
  });

  it('places boxes at their scheduled times (µs) and marks the end', () => {
    const cx = tl.boxes.find((b) => b.label === 'cx')!;
    expect(cx.start).toBeCloseTo(0.04, 12);
    expect(cx.end).toBeCloseTo(0.34, 12);
    expect(tl.end).toBeCloseTo(sim.schedule.duration / 1000, 12);
    // h 0–40 ns, cx 40–340 ns, the barrier lines all up at 340 ns, reset b 340–540 ns, measure b 540–2540 ns
    expect(tl.endLabel).toBe('end 2.54 µs');
    expect(cx.title).toContain('step 2: cx on a, c · 40 ns → 340 ns (300 ns)');
  });

  it('shades each idle window by 1 − F_avg of its relaxation, checked against the closed form', () => {
    // Thermal relaxation with p_e = 0 shrinks the Bloch vector's transverse part by e^{−t/T2}
    // and its z part by e^{−t/T1} (Nielsen & Chuang §8.3.5–8.3.6, from memory), so its Pauli
    // transfer matrix is diag(1, e^{−t/T2}, e^{−t/T2}, e^{−t/T1}); F_e = Tr R / 4 and
    // F_avg = (2 F_e + 1)/3 (Nielsen, Phys. Lett. A 303, 249 (2002)):
    // 1 − F_avg = (3 − 2e^{−t/T2} − e^{−t/T1}) / 6.
    const closed = (ns: number) => (3 - 2 * Math.exp(-ns / 30000) - Math.exp(-ns / 40000)) / 6;
    expect(tl.idle.length).toBe(sim.schedule.idleWindows.length);
    expect(tl.idle.length).toBeGreaterThan(0);
    for (const w of tl.idle) {
      const ns = (w.end - w.start) * 1000;
      expect(Math.abs(w.cost - closed(ns))).toBeLessThan(COST_TOLERANCE);
      expect(w.title).toContain(`1 − F_avg = ${w.cost.toExponential(3)}`);
    }
  });

  it('costs nothing under idle: none, and falls back to step order without durations', () => {
    const none = timelineData(simulateLoaded(loadText(CIRCUIT.replace('noise:\n', 'noise:\n  idle: none\n')), { engine: 'reference' }));
    expect(none.idle.every((w) => w.cost === 0)).toBe(true);
    expect(none.costTitle).toBe('idle window cost (idle: none)');
    const untimed = timelineData(simulateLoaded(loadText('qubits: 2\nsteps:\n  - h: 0\n  - cx: [0, 1]\n'), { engine: 'reference' }));
    expect(untimed.axisTitle).toBe('step (the profile gives no durations)');
    expect(untimed.boxes.map((b) => [b.start, b.end])).toEqual([[0, 0.8], [1, 1.8], [1, 1.8]]);
    expect(untimed.idle).toEqual([]);
  });

  it('renders to well-formed SVG with one hover title per box and idle window', async () => {
    const svg = await renderSvg(timelineSpec(tl));
    expect(XMLValidator.validate(svg)).toBe(true);
    const group = (name: string) => new RegExp(`<g class="mark-rect role-mark ${name}_marks"[^>]*>(.*?)</g>`).exec(svg)?.[1] ?? '';
    expect((group('boxes').match(/<path /g) ?? []).length).toBe(tl.boxes.length);
    expect((group('boxes').match(/<title>/g) ?? []).length).toBe(tl.boxes.length);
    expect((group('idle').match(/<title>/g) ?? []).length).toBe(tl.idle.length);
    expect(svg).toContain('<title>step 2: cx on a, c · 40 ns → 340 ns (300 ns)');
  });
});
