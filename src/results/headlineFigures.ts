import type { RunResult } from '../api/simulate.js';

/** One headline figure of a run: its name, how to read it off the result, and its definition. */
export interface HeadlineFigure {
  /** Stable key (the HTML report's data-figure attribute). */
  readonly key: 'state-fidelity' | 'classical-fidelity' | 'tvd' | 'purity';
  readonly name: string;
  readonly value: (r: RunResult) => number;
  readonly definition: string;
}

/** The fidelity block of every report, in order (definitions as in the README's Results section). */
export const HEADLINE_FIGURES: readonly HeadlineFigure[] = [
  { key: 'state-fidelity', name: 'state fidelity', value: (r) => r.fidelity.state, definition: 'Uhlmann–Jozsa, squared: (Tr√(√σρ√σ))²' },
  { key: 'classical-fidelity', name: 'classical fidelity', value: (r) => r.fidelity.classical, definition: '(Σ√(p_ideal·p_measured))², readout included' },
  { key: 'tvd', name: 'total variation distance', value: (r) => r.tvd, definition: '½Σ|p_ideal − p_measured|' },
  { key: 'purity', name: 'purity', value: (r) => r.purity, definition: 'Tr ρ² of the noisy state' },
];
