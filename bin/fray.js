#!/usr/bin/env node
// Thin launcher: the CLI lives in src/cli, bundled into dist/bundle/cli.js by `npm install` (prepare).
import { main } from '../dist/bundle/cli.js';

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
