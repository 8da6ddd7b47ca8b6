import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main.js';

/** Runs the fray command line in-process with captured standard output and error. */
export async function fray(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { stdout: { write: (s: string) => (out += s) }, stderr: { write: (s: string) => (err += s) } });
  return { code, out, err };
}

/** Writes `text` to a new file `name` in a fresh temporary folder and returns its path. */
export function tempFile(name: string, text: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'fray-test-'));
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

/** A problem line as the contract prints it: FILE:LINE:COL: message. */
export const LOCATED = /^[^\s:][^:]*:\d+:\d+: \S/;
