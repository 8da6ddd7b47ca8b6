import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import type { RunResult } from '../api/simulate.js';
import { InputError, type Problem } from '../format/problem.js';
import type { SweepPlan, SweepPoint } from './sweep.js';
import type { PointTask, PointAnswer } from './sweepWorker.js';

/**
 * Sweep points on a pool of worker threads (piscina), whole points per worker: each worker
 * parses the circuit once and runs the points it is handed with one engine thread.
 */

/** The compiled worker script: next to this module when running from dist/, else dist/studies/ of the project (running from sources). */
function workerScript(): string {
  const sibling = new URL('./sweepWorker.js', import.meta.url);
  if (existsSync(fileURLToPath(sibling))) return fileURLToPath(sibling);
  const dist = new URL('../../dist/studies/sweepWorker.js', import.meta.url);
  if (existsSync(fileURLToPath(dist))) return fileURLToPath(dist);
  throw new Error('sweep: the compiled worker script dist/studies/sweepWorker.js is missing; run npm run build');
}

/** Runs `points` on `jobs` worker threads; `done` is called as each finishes (in any order). */
export async function runPointsInPool(plan: SweepPlan, points: readonly SweepPoint[], jobs: number, done: (p: SweepPoint, r: RunResult) => void): Promise<void> {
  const pool = new Piscina({ filename: workerScript(), minThreads: jobs, maxThreads: jobs, idleTimeout: 1000 });
  let failure: unknown;
  try {
    await Promise.all(
      points.map(async (p) => {
        if (failure !== undefined) return;
        const task: PointTask = { file: plan.spec.file, ...(plan.spec.device !== undefined ? { device: plan.spec.device } : {}), choice: p.choice, observe: plan.observe };
        const answer = (await pool.run(task)) as PointAnswer;
        if ('problems' in answer) {
          failure ??= new InputError(answer.problems as Problem[]);
          return;
        }
        if (failure === undefined) done(p, answer.result);
      }),
    );
  } catch (e) {
    failure ??= e;
  } finally {
    await pool.destroy();
  }
  if (failure !== undefined) throw failure;
}
