#!/usr/bin/env node
// Thin launcher: the CLI lives in src/cli (compiled to dist/ by `npm install`).
import { main } from '../dist/cli/main.js';

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
