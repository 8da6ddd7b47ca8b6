import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { UsageError } from './main.js';

/**
 * Writes `text` to `path` whole or not at all: into a temporary file beside it, then
 * renamed over it. A path that cannot be written is a usage error naming the option.
 */
export function writeOutputFile(option: string, path: string, text: string): void {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  try {
    writeFileSync(tmp, text);
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    const err = e as NodeJS.ErrnoException;
    const why = err.code === 'ENOENT' ? 'its folder does not exist' : err.code === 'EACCES' ? 'permission denied' : err.code === 'EISDIR' ? 'it is a folder' : (err.message ?? String(e));
    throw new UsageError(`${option} ${path}: cannot write the file: ${why}`);
  }
}
