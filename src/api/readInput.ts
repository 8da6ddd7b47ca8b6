/**
 * Reading a file the user named (a circuit, OpenQASM program, device profile, channel file,
 * sweep output or part, baseline) from disk, bounded: only regular files are read, never more
 * than the limit + 1 bytes, and opening never waits for a writer (a FIFO is refused, not
 * read). Problems are recorded, never thrown. Every user-named input goes through here.
 */
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import type { ProblemList, SourcePosition } from '../format/problem.js';
import { MAX_INPUT_BYTES, recordTooLarge } from '../format/yamlTree.js';

/**
 * Largest machine-written data file read back (sweep outputs for --resume, sweep parts for
 * `fray merge`, --baseline files): 256 MiB, about a million sweep rows of a few figures each.
 * Hand-written inputs keep the far smaller MAX_INPUT_BYTES.
 */
export const MAX_DATA_FILE_BYTES = 256 << 20;

/** Bytes read per call after the first (which asks for the size fstat gives); the buffer grows only as the file does. */
const READ_CHUNK = 1 << 16;

/** The outcome of a bounded read: the text, or why there is none (one line, no path). */
export type BoundedRead = { readonly text: string } | { readonly error: string; readonly tooLarge?: boolean };

/** The UTF-8 text of the regular file at `path` if it has at most `limit` bytes; otherwise why not. */
export function readBounded(path: string, limit: number): BoundedRead {
  let fd: number | undefined;
  try {
    // O_NONBLOCK: opening a FIFO for reading would otherwise block until a writer appears
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
    const st = fstatSync(fd);
    if (st.isDirectory()) return { error: 'it is a folder' };
    if (!st.isFile()) return { error: 'it is not a regular file (a device, pipe or socket)' };
    const chunks: Buffer[] = [];
    let size = 0;
    for (;;) {
      // first the size fstat gives and one byte more (a file that does not grow is read in one
      // call), then chunks; only the bytes read are used, so the buffers need no zero-filling
      const want = Math.min(chunks.length === 0 ? st.size + 1 : READ_CHUNK, limit + 1 - size);
      const buf = Buffer.allocUnsafe(want);
      const got = readSync(fd, buf, 0, want, null);
      if (got === 0) break;
      chunks.push(got === want ? buf : buf.subarray(0, got));
      size += got;
      if (size > limit) return { error: `it is larger than ${sizeText(limit)}`, tooLarge: true };
    }
    return { text: Buffer.concat(chunks, size).toString('utf8') };
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    return { error: code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message) };
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

/**
 * The text of the file at `path` (UTF-8), or undefined after recording why it cannot be read at
 * `at`. `what` names the file in the message ("circuit file", "sweep part"); `limit` defaults to
 * MAX_INPUT_BYTES, the limit of hand-written inputs.
 */
export function readInputFile(path: string, at: SourcePosition, what: string, problems: ProblemList, limit: number = MAX_INPUT_BYTES): string | undefined {
  const r = readBounded(path, limit);
  if ('text' in r) return r.text;
  if (r.tooLarge === true && limit === MAX_INPUT_BYTES) recordTooLarge(at, problems);
  else problems.error(at, r.tooLarge === true ? 'file-too-large' : 'cannot-read', `cannot read ${what} '${path}': ${r.error}`);
  return undefined;
}

function sizeText(bytes: number): string {
  return bytes >= 1 << 20 ? `${bytes / (1 << 20)} MiB` : `${bytes / 1024} KiB`;
}
