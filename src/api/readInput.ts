/**
 * Reading an input file (a circuit, device profile or channel file) from disk, bounded: only
 * regular files are read, never more than MAX_INPUT_BYTES + 1 bytes, and opening never waits
 * for a writer (a FIFO is refused, not read). Problems are recorded, never thrown.
 */
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import type { ProblemList, SourcePosition } from '../format/problem.js';
import { MAX_INPUT_BYTES, recordTooLarge } from '../format/yamlTree.js';

/** The text of the file at `path` (UTF-8), or undefined after recording why it cannot be read at `at`. */
export function readInputFile(path: string, at: SourcePosition, what: string, problems: ProblemList): string | undefined {
  let fd: number | undefined;
  try {
    // O_NONBLOCK: opening a FIFO for reading would otherwise block until a writer appears
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
    const st = fstatSync(fd);
    if (st.isDirectory()) {
      problems.error(at, 'cannot-read', `cannot read ${what} '${path}': it is a folder`);
      return undefined;
    }
    if (!st.isFile()) {
      problems.error(at, 'cannot-read', `cannot read ${what} '${path}': it is not a regular file (a device, pipe or socket); give the path of a YAML file`);
      return undefined;
    }
    const buf = Buffer.alloc(MAX_INPUT_BYTES + 1);
    let size = 0;
    for (;;) {
      const got = readSync(fd, buf, size, buf.length - size, null);
      if (got === 0) break;
      size += got;
      if (size === buf.length) break;
    }
    if (size > MAX_INPUT_BYTES) {
      recordTooLarge(at, problems);
      return undefined;
    }
    return buf.toString('utf8', 0, size);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message);
    problems.error(at, 'cannot-read', `cannot read ${what} '${path}': ${why}`);
    return undefined;
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}
