import type { RunResult } from '../api/simulate.js';
import { InputError, type Problem } from '../format/problem.js';
import { runPoint, type SweepSpec } from './sweep.js';
import type { VariantChoice } from './variant.js';
import { SourceCache } from './variant.js';

/**
 * The worker-thread entry of sweeps (loaded by piscina from dist/studies/sweepWorker.js;
 * kept a separate file so a bundle can add it as its own entry). Parses each circuit once
 * per worker and runs one whole point per task.
 */

/** One point to run. */
export interface PointTask {
  readonly file: string;
  readonly device?: string;
  readonly choice: VariantChoice;
  readonly observe: readonly string[];
}

/** The run's result, or the input problems that stopped it (InputError does not survive the thread boundary as a class). */
export type PointAnswer = { readonly result: RunResult } | { readonly problems: readonly Problem[] };

const cache = new SourceCache();

/** Runs one sweep point. */
export default function runTask(task: PointTask): PointAnswer {
  const spec: Pick<SweepSpec, 'file' | 'device'> = { file: task.file, ...(task.device !== undefined ? { device: task.device } : {}) };
  try {
    return { result: runPoint(cache, spec, task.choice, task.observe) };
  } catch (e) {
    if (e instanceof InputError) return { problems: e.problems };
    throw e;
  }
}
