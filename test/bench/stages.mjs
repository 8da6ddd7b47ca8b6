// Stage breakdown of one whole `fray run` process for `npm run bench`:
//   node test/bench/stages.mjs FILE THREADS FAMILY   (FAMILY: wasm | js)
// prints one JSON object of milliseconds per stage, in the order a run goes through them:
// Node's own start (until this script runs), loading the CLI bundle (as bin/fray.js does,
// through the code cache), reading and validating the YAML, schedule and program, plan (build and pack), waiting
// for kernels (the JIT wait of the JS kernels; worker threads that are still starting do not hold
// the run up: the first passes run on the main thread alone), the passes over ρ, and results (ideal run, figures, JSON text). The stages after the import call the
// library modules of dist/ the way src/api/simulate.ts does.
const start = performance.now();
const { loadCli } = await import('../../bin/loadCli.js');
loadCli();
const imported = performance.now();
const { loadCircuit } = await import('../../dist/api/loadCircuit.js');
const { measuredQubits, scheduleCircuit } = await import('../../dist/api/simulate.js');
const { buildProgram, hasDrift } = await import('../../dist/program/program.js');
const { ProblemList } = await import('../../dist/format/problem.js');
const { buildPlan } = await import('../../dist/plan/buildPlan.js');
const { compilePlan } = await import('../../dist/plan/compilePlan.js');
const { applyCompiled, createSharedDensityMatrix, THREADS_MIN_QUBITS } = await import('../../dist/engine/runCompiled.js');
const { sharedThreadPool } = await import('../../dist/engine/threadPool.js');
const { awaitOptimisedKernels, warmKernels } = await import('../../dist/engine/warmKernels.js');
const { runIdeal } = await import('../../dist/engine/run.js');
const { fastKernels } = await import('../../dist/engine/fastKernels.js');
const { computeFigures } = await import('../../dist/results/report.js');

const [file, threadsText, family] = process.argv.slice(2);
const threads = Number(threadsText);
const t = [performance.now()];
const lap = () => {
  t.push(performance.now());
  return t[t.length - 1] - t[t.length - 2];
};
const loaded = loadCircuit(file);
const n = loaded.circuit.register.n;
// as simulate: the workers start first and warm up while this thread reads and plans
const pool = threads > 1 && n >= THREADS_MIN_QUBITS ? sharedThreadPool(threads, family === 'js') : undefined;
if (family === 'js') warmKernels();
const read = lap();
const schedule = scheduleCircuit(loaded.circuit, loaded.profile);
const program = buildProgram(loaded.circuit, loaded.profile, schedule, new ProblemList());
const prog = lap();
// as simulate: programs with drift keep their diagonal zz terms apart (keepDiagonal)
const compiled = compilePlan(buildPlan(n, program.noisy, { keepDiagonal: hasDrift(loaded.profile) }));
const plan = lap();
const rho = createSharedDensityMatrix(n, family);
if (family === 'js') awaitOptimisedKernels();
const wait = lap();
applyCompiled(rho, compiled, pool);
const passes = lap();
const ideal = runIdeal(n, program.ideal, fastKernels);
const measured = measuredQubits(loaded.circuit);
const figures = computeFigures(rho, ideal, { n, measured, readout: measured.map((q) => loaded.profile.qubits[q].readout), observe: [] });
JSON.stringify(figures);
const results = lap();
console.log(JSON.stringify({ node: start, import: imported - start, read, program: prog, plan, wait, passes, results }));
process.exit(0);
