// Bundles the CLI and the worker-thread script into one file each (dist/bundle/), so a run
// loads two files instead of the ~150 modules of dist/ (run by `npm run build` and `prepare`,
// after tsc). Both bundles sit two directories below the package root, as dist/engine/ does,
// so wasm/kernels.wasm resolves the same way from either (src/engine/wasmKernels.ts), and the
// worker script is the CLI bundle's sibling, where src/engine/threadPool.ts looks first.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../', import.meta.url));

await build({
  entryPoints: { cli: root + 'src/cli/main.ts', threadWorker: root + 'src/engine/threadWorker.ts' },
  outdir: root + 'dist/bundle',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  // CommonJS dependencies call require(); give the ES module bundle one
  banner: { js: "import { createRequire as __frayCreateRequire } from 'node:module'; const require = __frayCreateRequire(import.meta.url);" },
  logLevel: 'warning',
});
