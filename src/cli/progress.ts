import cliProgress from 'cli-progress';
import type { CliIO } from './main.js';

/**
 * Progress of a long study on stderr: a bar with points done/total, elapsed time and ETA
 * on a terminal (cli-progress), one plain line per 10% otherwise, nothing when quiet.
 */
export interface Progress {
  update(done: number, total: number): void;
  stop(): void;
}

/** A progress reporter for `what` (e.g. "sweep"). */
export function makeProgress(io: CliIO, what: string, quiet: boolean): Progress {
  if (quiet) return { update() {}, stop() {} };
  const started = Date.now();
  if (io.stderr.isTTY === true && io.stderr === process.stderr) {
    const bar = new cliProgress.SingleBar(
      { format: `${what} [{bar}] {value}/{total} points | {duration_formatted} elapsed | ETA {eta_formatted}`, hideCursor: true, clearOnComplete: true, stream: process.stderr },
      cliProgress.Presets.shades_classic,
    );
    let begun = false;
    return {
      update(done, total) {
        if (!begun) {
          bar.start(total, 0);
          begun = true;
        }
        bar.update(done);
      },
      stop() {
        if (begun) bar.stop();
      },
    };
  }
  let lastTenth = 0;
  return {
    update(done, total) {
      const tenth = total === 0 ? 10 : Math.floor((10 * done) / total);
      if (tenth > lastTenth) {
        lastTenth = tenth;
        const s = (Date.now() - started) / 1000;
        const eta = done > 0 ? (s * (total - done)) / done : 0;
        io.stderr.write(`${what}: ${done}/${total} points (${tenth * 10}%), ${s.toFixed(1)} s elapsed, about ${eta.toFixed(1)} s to go\n`);
      }
    },
    stop() {},
  };
}
