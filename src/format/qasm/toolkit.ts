/**
 * The parser toolkit (chevrotain), loaded on first use. fray loads chevrotain's own
 * self-contained bundle (lib/chevrotain.mjs) rather than its module tree: the tree pulls in
 * some 600 lodash-es modules, which cost about a second of start-up on a slow machine for
 * every fray command, OpenQASM or not; the bundle loads only when a program is read.
 */
import type * as Chevrotain from 'chevrotain';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';

/** The chevrotain API. */
export type Toolkit = typeof Chevrotain;

let loaded: Toolkit | undefined;

/** The bundle's path, found from the package's own entry point (lib/src/api.js → lib/chevrotain.mjs). */
function bundlePath(): string {
  return join(dirname(createRequire(import.meta.url).resolve('chevrotain')), '..', 'chevrotain.mjs');
}

/** Loads the toolkit ahead of use (works on every Node 20; the CLI calls it before reading a .qasm file). */
export async function loadQasmToolkit(): Promise<void> {
  loaded ??= (await import(pathToFileURL(bundlePath()).href)) as Toolkit;
}

/** The toolkit: loaded already, or now through require of an ES module (Node 20.19 and later). */
export function qasmToolkit(): Toolkit {
  if (loaded === undefined) {
    try {
      loaded = createRequire(import.meta.url)(bundlePath()) as Toolkit;
    } catch (e) {
      throw new Error(`reading OpenQASM without 'await loadQasmToolkit()' first needs Node 20.19 or later (${(e as Error).message})`);
    }
  }
  return loaded;
}
