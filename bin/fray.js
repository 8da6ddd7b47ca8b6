#!/usr/bin/env node
// Thin launcher: the CLI lives in src/cli, bundled into dist/bundle/cli.cjs by `npm install`
// (prepare; scripts/bundle.mjs) and started through V8's code cache (./loadCli.js).
'use strict';
const { loadCli } = require('./loadCli.js');

// A reader that stops early (`fray run --json | head`) closes the pipe: end quietly, as
// line-oriented tools do, instead of dying on an unhandled EPIPE with a stack trace.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (e) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw e;
  });
}

const writeCache = process.env.FRAY_WRITE_CODE_CACHE === '1';
const cli = loadCli(writeCache);
cli.main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
  if (writeCache) cli.saveCache();
});
