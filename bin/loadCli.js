// Loads the CLI bundle dist/bundle/cli.cjs (scripts/bundle.mjs) through V8's code cache
// dist/bundle/cli.cache when that exists and fits this Node (V8 checks; otherwise it compiles
// as usual). Used by bin/fray.js and the benchmark scripts. CommonJS (bin/package.json), like
// bin/fray.js: Node starts a CommonJS main script ~10 ms sooner than an ES module one.
'use strict';
const { existsSync, readFileSync, writeFileSync } = require('node:fs');
const { createRequire } = require('node:module');
const { join } = require('node:path');
const { Script } = require('node:vm');

const dir = join(__dirname, '..', 'dist', 'bundle');
const file = join(dir, 'cli.cjs');
const cacheFile = join(dir, 'cli.cache');

/**
 * The CLI module's exports ({ main, … }); with `writeCache`, the cache is ignored and
 * `saveCache()` writes a new one (call it after a representative run).
 */
function loadCli(writeCache = false) {
  const cachedData = !writeCache && existsSync(cacheFile) ? readFileSync(cacheFile) : undefined;
  // the file is one function expression, (function (exports, require, module, __filename,
  // __dirname, __frayImport) { … }), and ASCII only (scripts/bundle.mjs escapes every other
  // character), so latin1 reads the same string as utf8, ~2 ms sooner for its 0.7 MB
  const source = readFileSync(file, 'latin1');
  const script = new Script(source, { filename: file, ...(cachedData !== undefined ? { cachedData } : {}) });
  const cli = { exports: {} };
  // the bundle's import() of ES-module-only packages (scripts/bundle.mjs) comes here
  const frayImport = (specifier) => import(specifier);
  script.runInThisContext()(cli.exports, createRequire(file), cli, file, dir, frayImport);
  return {
    ...cli.exports,
    cacheRejected: cachedData !== undefined && script.cachedDataRejected === true,
    saveCache: () => writeFileSync(cacheFile, script.createCachedData()),
  };
}

module.exports = { loadCli };
