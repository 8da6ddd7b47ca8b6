// Bundles the CLI and the worker-thread script into one file each (dist/bundle/), so a run
// loads two files instead of the ~150 modules of dist/, and builds V8's code cache for the CLI
// bundle (run by `npm run build` and `prepare`, after tsc).
//  - dist/bundle/cli.cjs: the CLI as one CommonJS script, because Node 20 can start a script,
//    not an ES module, from a code cache (vm.Script cachedData); bin/loadCli.js loads it. The
//    file holds the script inside its module wrapper function, which bin/loadCli.js calls.
//  - dist/bundle/cli.cache: V8's code cache of cli.cjs after one small run (the functions a run
//    needs come compiled). Measured on the 2-vCPU bench machine: a trivial run's CPU time
//    0.29 s → 0.24 s (node -e 0: 0.15 s); a cache made right after loading, without the run, is
//    half the size and ~9% slower overall. V8 rejects a cache from another Node or V8 build, or
//    when Node runs with other V8 flags, and bin/fray.js then compiles as usual.
//    docs/engine.md "Start-up" has what else a start costs and what was cut.
//  - dist/bundle/threadWorker.js: the worker script (an ES module, started by path).
// Both bundles sit two directories below the package root, as dist/engine/ does, so
// wasm/kernels.wasm resolves the same way from either (src/engine/wasmKernels.ts), and the
// worker script is the CLI bundle's sibling, where src/engine/threadPool.ts looks first.
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../', import.meta.url));
// minified and ASCII only: this machine reads a file at ~4 ms per MB and turns UTF-8 into a
// string at ~7 ms per MB more (a single non-ASCII character makes V8 decode the whole file the
// slow way), so the 1.4 MB bundle of plain esbuild output cost ~25 ms before any code ran
const common = { bundle: true, platform: 'node', target: 'node20', logLevel: 'warning', minify: true, charset: 'ascii', legalComments: 'none' };
/**
 * Modules a run may never use that take milliseconds each to load (child_process for commander's
 * external subcommands, crypto for sweep fingerprints, worker_threads and piscina for threads,
 * v8 for a WebAssembly flag, readline for progress bars): the CLI bundle requires each on first
 * use, through a proxy (__frayLazy below); test/cli/run.test.ts checks a run loads none of them.
 */
const LAZY = ['node:child_process', 'node:crypto', 'node:worker_threads', 'node:v8', 'readline', 'piscina'];
/** ES-module-only packages the CLI import()s lazily; left out of the CommonJS bundle. */
const EXTERNAL_ESM = ['vega', 'vega-lite'];
rmSync(root + 'dist/bundle', { recursive: true, force: true });

await build({
  ...common,
  entryPoints: [root + 'src/cli/main.ts'],
  outfile: root + 'dist/bundle/cli.cjs',
  format: 'cjs',
  // the plotting libraries are ES modules with top-level await that only plotting commands
  // import(); they stay in node_modules, imported by bin/loadCli.js for the bundle (below)
  // piscina starts its workers from files next to its own code, so it stays in node_modules too
  external: [...EXTERNAL_ESM, 'piscina'],
  // the sources locate files relative to import.meta.url: give them the bundle's own URL
  define: { 'import.meta.url': '__frayModuleUrl' },
  banner: {
    js:
      "const __frayModuleUrl = require('node:url').pathToFileURL(__filename).href;" +
      'const __frayLazy = (id) => { let m; return new Proxy({}, { get: (_, key) => (m ??= require(id))[key] }); };',
  },
});
// a script started by vm.Script cannot import() reliably once it comes from a code cache, so the
// bundle asks bin/loadCli.js to do every dynamic import() for it
const cliFile = root + 'dist/bundle/cli.cjs';
let cli = readFileSync(cliFile, 'utf8');
// (the external packages above, and chevrotain's own bundle, loaded by path in src/format/qasm/toolkit.ts)
cli = cli.replace(/(?<![\w$.])import\(/g, '__frayImport(');
for (const id of LAZY) {
  const call = `require("${id}")`;
  if (!cli.includes(call)) throw new Error(`bundle: no ${call} left to defer; update LAZY`);
  cli = cli.replaceAll(call, `__frayLazy("${id}")`);
}
// esbuild leaves a few characters such as µ in regular expressions: escape them too
cli = cli.replace(/[^\x00-\x7f]/g, (c) => '\\u' + c.charCodeAt(0).toString(16).padStart(4, '0'));
// written out as the function bin/loadCli.js compiles (CommonJS's module wrapper, plus the import()
// function): V8 then compiles the file's string as read, ~4 ms sooner than a string joined at start-up
writeFileSync(cliFile, `(function (exports, require, module, __filename, __dirname, __frayImport) {${cli}\n})`);

await build({
  ...common,
  entryPoints: [root + 'src/engine/threadWorker.ts'],
  outfile: root + 'dist/bundle/threadWorker.js',
  format: 'esm',
  // CommonJS dependencies call require(); give the ES module bundle one
  banner: { js: "import { createRequire as __frayCreateRequire } from 'node:module'; const require = __frayCreateRequire(import.meta.url);" },
});

// the code cache, from one small run of the CLI (bin/fray.js writes it when asked)
const run = spawnSync(process.execPath, [root + 'bin/fray.js', 'run', root + 'circuits/bench/one-qubit.yaml', '--json'], {
  env: { ...process.env, FRAY_WRITE_CODE_CACHE: '1' },
  encoding: 'utf8',
});
if (run.status !== 0) console.warn(`bundle: no code cache (the sample run failed: ${run.stderr.trim()})`);
