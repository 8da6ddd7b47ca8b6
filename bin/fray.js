#!/usr/bin/env node
// Thin launcher: the CLI lives in src/cli, bundled into dist/bundle/cli.cjs by `npm install`
// (prepare; scripts/bundle.mjs) and started through V8's code cache (./loadCli.js).
import { loadCli } from './loadCli.js';

const writeCache = process.env.FRAY_WRITE_CODE_CACHE === '1';
const cli = loadCli(writeCache);
cli.main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
  if (writeCache) cli.saveCache();
});
