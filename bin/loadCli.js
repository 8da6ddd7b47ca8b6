// Loads the CLI bundle dist/bundle/cli.cjs (scripts/bundle.mjs) through V8's code cache
// dist/bundle/cli.cache when that exists and fits this Node (V8 checks; otherwise it compiles
// as usual). Used by bin/fray.js and the benchmark scripts.
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Script } from 'node:vm';

const file = fileURLToPath(new URL('../dist/bundle/cli.cjs', import.meta.url));
const cacheFile = fileURLToPath(new URL('../dist/bundle/cli.cache', import.meta.url));

/**
 * The CLI module's exports ({ main, … }); with `writeCache`, the cache is ignored and
 * `saveCache()` writes a new one (call it after a representative run).
 */
export function loadCli(writeCache = false) {
  const cachedData = !writeCache && existsSync(cacheFile) ? readFileSync(cacheFile) : undefined;
  const source = `(function (exports, require, module, __filename, __dirname, __frayImport) {${readFileSync(file, 'utf8')}\n})`;
  const script = new Script(source, { filename: file, ...(cachedData !== undefined ? { cachedData } : {}) });
  const cli = { exports: {} };
  // the bundle's import() of ES-module-only packages (scripts/bundle.mjs) comes here
  const frayImport = (specifier) => import(specifier);
  script.runInThisContext()(cli.exports, createRequire(file), cli, file, dirname(file), frayImport);
  return {
    ...cli.exports,
    cacheRejected: cachedData !== undefined && script.cachedDataRejected === true,
    saveCache: () => writeFileSync(cacheFile, script.createCachedData()),
  };
}
