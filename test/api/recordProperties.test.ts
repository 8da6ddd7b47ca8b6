import { describe, expect, it } from 'vitest';
import { simulateLoaded, type RunResult } from '../../src/api/simulate.js';
import { loadText } from '../helpers/load.js';
import { mulberry32 } from '../helpers/random.js';

/**
 * Seeded random record-mode circuits (2–4 qubits, 1–4 mid-circuit measurements, conditions,
 * latency, readout error, drift, both schedules) run through the whole path on the fast
 * (fused plan) and the reference engine. Checked: the two agree to 1e-12 (the engines are
 * independent implementations of the same instruction semantics), every distribution sums
 * to 1, and the figures stay in range (definitions in the README's Results).
 */
const AGREE = 1e-12;

function randomCircuit(seed: number): string {
  const rng = mulberry32(seed);
  const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(rng() * xs.length)]!;
  const n = 2 + Math.floor(rng() * 3);
  const bits = ['a', 'b', 'c'];
  const written: string[] = [];
  const steps: string[] = [];
  const gate = (): string => {
    const q = Math.floor(rng() * n);
    if (n > 1 && rng() < 0.35) {
      const r = (q + 1 + Math.floor(rng() * (n - 1))) % n;
      return `  - ${pick(['cx', 'cz'])}: [${q}, ${r}]\n`;
    }
    return rng() < 0.5 ? `  - ${pick(['h', 'x', 's'])}: ${q}\n` : `  - ry: ${q}\n    angle: ${(rng() * 3).toFixed(3)}\n`;
  };
  const measurements = 1 + Math.floor(rng() * 4);
  for (let m = 0; m < measurements; m++) {
    steps.push(gate(), gate());
    const bit = pick(bits);
    steps.push(`  - measure: ${Math.floor(rng() * n)}\n    into: ${bit}\n`);
    if (!written.includes(bit)) written.push(bit);
    const cond = rng() < 0.5 ? pick(written) : `{ ${written.map((b) => `${b}: ${rng() < 0.5 ? 0 : 1}`).join(', ')} }`;
    const kind = rng();
    if (kind < 0.6) steps.push(gate().replace(/\n$/, `\n    if: ${cond}\n`));
    else if (kind < 0.8) steps.push(`  - reset: ${Math.floor(rng() * n)}\n    if: ${cond}\n`);
    else steps.push(`  - noise: { bit_flip: ${(rng() * 0.3).toFixed(3)} }\n    on: ${Math.floor(rng() * n)}\n    if: ${cond}\n`);
  }
  steps.push(gate());
  const schedule = rng() < 0.5 ? 'asap' : 'alap';
  return `qubits: ${n}
noise:
  qubits:
    all: { t1: ${20 + Math.floor(rng() * 40)}us, t2: ${15 + Math.floor(rng() * 20)}us, excited: 0.01, detuning: ${Math.floor(rng() * 50)}kHz, readout: { zero_as_one: ${(rng() * 0.05).toFixed(3)}, one_as_zero: ${(rng() * 0.08).toFixed(3)} } }
  couplings: { "0 1": { zz: ${Math.floor(rng() * 100)}kHz } }
  gates:
    all: { duration: 40ns, depolarizing: 0.01 }
    cx: { duration: 250ns, error: 0.01 }
    cz: { duration: 200ns, error: 0.01 }
    reset: { duration: 300ns }
    measure: { duration: ${200 + Math.floor(rng() * 800)}ns, latency: ${Math.floor(rng() * 300)}ns }
  schedule: ${schedule}
steps:
${steps.join('')}`;
}

function compare(a: RunResult, b: RunResult): number {
  let worst = 0;
  for (const w of ['ideal', 'noisy', 'measured'] as const) {
    for (const k of new Set([...Object.keys(a.probabilities[w]), ...Object.keys(b.probabilities[w])])) {
      worst = Math.max(worst, Math.abs((a.probabilities[w][k] ?? 0) - (b.probabilities[w][k] ?? 0)));
    }
  }
  return Math.max(worst, Math.abs(a.fidelity.state - b.fidelity.state), Math.abs(a.purity - b.purity));
}

describe('random record-mode circuits through the whole path', () => {
  for (let seed = 1; seed <= 8; seed++) {
    it(`seed ${seed}: fast and reference engines agree; distributions sum to 1; figures in range`, () => {
      const text = randomCircuit(seed);
      const loaded = loadText(text);
      const fast = simulateLoaded(loaded).result;
      const reference = simulateLoaded(loaded, { engine: 'reference' }).result;
      expect(compare(fast, reference), text).toBeLessThan(AGREE);
      for (const w of ['ideal', 'noisy', 'measured'] as const) {
        expect(Math.abs(Object.values(fast.probabilities[w]).reduce((x, y) => x + y, 0) - 1), `${w}\n${text}`).toBeLessThan(1e-12);
      }
      expect(fast.fidelity.state).toBeGreaterThan(0);
      expect(fast.fidelity.state).toBeLessThanOrEqual(1 + 1e-12);
      expect(fast.purity).toBeLessThanOrEqual(1 + 1e-12);
      expect(fast.measured).toEqual([]);
    });
  }
});
