import type { Figures } from './report.js';

/**
 * The k most likely outcomes of a run, ranked by the larger of their ideal and measured
 * probabilities (ties in ascending bit-string order), so an outcome that noise creates and
 * one that noise drains both appear. Bit strings as in Figures (measured[0] leftmost).
 */
export function topOutcomes(probabilities: Figures['probabilities'], k: number): string[] {
  return Object.keys(probabilities.measured)
    .map((key) => ({ key, p: Math.max(probabilities.ideal[key] ?? 0, probabilities.measured[key] ?? 0) }))
    .sort((a, b) => b.p - a.p || (a.key < b.key ? -1 : 1))
    .slice(0, k)
    .map((o) => o.key);
}
