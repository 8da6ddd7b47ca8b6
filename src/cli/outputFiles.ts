import { openSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { UsageError } from './main.js';

/**
 * Files the commands write (--out, --plot, --csv): a path that cannot be written is the
 * user's input error (exit status 2, naming the option), not a bug in fray.
 */

/** Why a write failed, in words. */
function why(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  return code === 'ENOENT' ? 'its folder does not exist' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message);
}

/** Writes `text` to `path` given with `option`. */
export function writeOutput(option: string, path: string, text: string): void {
  try {
    writeFileSync(path, text);
  } catch (e) {
    throw new UsageError(`${option} ${path}: cannot write it: ${why(e)}`);
  }
}

/** Opens `path` given with `option` for writing ('w') or appending ('a'); returns the descriptor. */
export function openOutput(option: string, path: string, flags: 'w' | 'a'): number {
  try {
    return openSync(path, flags);
  } catch (e) {
    throw new UsageError(`${option} ${path}: cannot write it: ${why(e)}`);
  }
}

/**
 * Writes `text` to `path` given with `option` whole or not at all: into a temporary file
 * beside it, then renamed over it (reports and files other tools read back).
 */
export function writeOutputFile(option: string, path: string, text: string): void {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  try {
    writeFileSync(tmp, text);
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw new UsageError(`${option} ${path}: cannot write it: ${why(e)}`);
  }
}
