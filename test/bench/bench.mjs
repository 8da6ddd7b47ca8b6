// `npm run bench`: the performance table of fray (not part of `npm test`; no assertions).
//  1. kernels: for 8, 10 and 12 qubits, each kernel's median time per pass and its ratio to a
//     streaming pass over the same array written in WebAssembly (the memory floor), both kernel
//     families (WebAssembly SIMD and JS), with 1 thread and split over 2 threads;
//  2. the reference circuit circuits/bench/layers10x20.yaml (10 qubits × 20 layers) side by side:
//     fray's whole process (`fray run --json`) with 2 and 1 threads and with --kernels js, fray
//     --no-fuse, the same runs of a baseline checkout (--baseline DIR, e.g. the previous release,
//     built), and the numpy peer of test/bench/numpyPeer.py (practitioner / hand-fused /
//     hand-folded) when python3 with numpy is available;
//  2b. the drift variant circuits/bench/drift10x20.yaml against it (issue 7's 1.3× bound);
//  3. the stage breakdown of that whole process (test/bench/stages.mjs);
//  4. start-up: a trivial 1-qubit circuit's whole process against `node -e 0`;
//  5. the same circuit shape on 12 and 13 qubits (time, peak resident memory);
//  6. the issue-12 targets, measured.
// Flags: --quick (fewer repetitions; skips --no-fuse and the practitioner numpy run),
//        --skip-large (skips section 5), --baseline DIR, --kernels-only (section 1 only,
//        written to test/bench/last-run-kernels.md).
// The machine may be shared: medians of several runs are reported, with the load average.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadCircuit } from '../../dist/api/loadCircuit.js';
import { planLoaded } from '../../dist/api/simulate.js';
import { runCompiled } from '../../dist/engine/runCompiled.js';
import { sharedThreadPool, closeSharedThreadPool } from '../../dist/engine/threadPool.js';
import { awaitOptimisedKernels } from '../../dist/engine/warmKernels.js';
import { compilePlan } from '../../dist/plan/compilePlan.js';
import { kernelTimes, median } from './kernelTimes.mjs';

const root = fileURLToPath(new URL('../../', import.meta.url));
const quick = process.argv.includes('--quick');
const skipLarge = process.argv.includes('--skip-large');
const kernelsOnly = process.argv.includes('--kernels-only');
const baselineAt = process.argv.indexOf('--baseline');
const baseline = baselineAt > 0 ? process.argv[baselineAt + 1] : undefined;
const load = () => loadavg().map((x) => x.toFixed(1)).join(', ');
const cores = availableParallelism();
const fmtMs = (ms) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(ms < 10 ? 2 : 1)} ms`);
const fmtX = (x) => `${x.toFixed(x < 10 ? 2 : 1)}×`;
const out = [];
const print = (s = '') => {
  out.push(s);
  console.log(s);
};

/** Wall time (ms) of a child process; throws when it fails. */
function timeProcess(cmd, args, env = process.env) {
  const t = performance.now();
  const r = spawnSync(cmd, args, { cwd: root, env, encoding: 'utf8', maxBuffer: 1 << 26 });
  const ms = performance.now() - t;
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed: ${r.stderr}`);
  return { ms, stdout: r.stdout, stderr: r.stderr };
}

function medianOf(k, f) {
  const v = Array.from({ length: k }, f).sort((a, b) => a - b);
  return v[k >> 1];
}

print(`# fray bench — ${new Date().toISOString().slice(0, 10)}`);
print();
print(`machine: ${cpus()[0]?.model ?? 'unknown cpu'}, ${cores} core${cores === 1 ? '' : 's'} (os.availableParallelism), Node ${process.version}`);
print(`load average (1, 5, 15 min) at the start: ${load()}`);
print();

// ---- 1. kernels -----------------------------------------------------------------------------
const kernelRows = {};
const pool = sharedThreadPool(2);
pool.ready();
awaitOptimisedKernels();
print('## Kernels: one pass over ρ (ms: fastest per target position, median over positions; ratio to the WebAssembly streaming pass)');
print();
print('| qubits | kernel | 1 thread | ÷ floor | 1 thread, CPU time | ÷ floor (CPU) | 2 threads | speed-up |');
print('|---:|---|---:|---:|---:|---:|---:|---:|');
for (const [n, reps] of [
  [8, quick ? 15 : 41],
  [10, quick ? 10 : 30],
  [12, quick ? 4 : 12],
]) {
  const rowsN = kernelTimes(n, reps, pool);
  kernelRows[n] = rowsN;
  for (const r of rowsN) {
    const two = r.ms2 !== undefined ? `${fmtMs(r.ms2)} | ${fmtX(r.ms / r.ms2)}` : '– | –';
    print(`| ${n} | ${r.kernel} | ${fmtMs(r.ms)} | ${fmtX(r.ratio)} | ${fmtMs(r.cpu)} | ${fmtX(r.cpuRatio)} | ${two} |`);
  }
}
print();
print('(CPU time: process.cpuUsage around a 1-thread pass, fastest per position; it leaves out the time other processes held the core.)');
print();
if (kernelsOnly) {
  closeSharedThreadPool();
  writeFileSync(join(root, 'test/bench/last-run-kernels.md'), out.join('\n') + '\n');
  console.log('(table also written to test/bench/last-run-kernels.md)');
  process.exit(0);
}

// ---- 2. the reference circuit ---------------------------------------------------------------
const circuit10 = 'circuits/bench/layers10x20.yaml';
const fray = (file, ...extra) => ['bin/fray.js', 'run', file, '--json', ...extra];
const rounds = quick ? 3 : 5;
print(`## Reference circuit ${circuit10} (10 qubits × 20 layers; median of ${rounds} runs unless noted)`);
print();
// the whole-process runs are interleaved round by round, so that load from other work on a
// shared machine hits every variant (and the baseline) alike
const variants = {
  whole: fray(circuit10, '--threads', '2'),
  whole1: fray(circuit10, '--threads', '1'),
  wholeJs: fray(circuit10, '--threads', '2', '--kernels', 'js'),
};
if (baseline !== undefined) {
  const base = (...extra) => [join(baseline, 'bin/fray.js'), 'run', join(root, circuit10), '--json', ...extra];
  variants.base = base('--threads', '2');
  variants.base1 = base('--threads', '1');
}
const times = Object.fromEntries(Object.keys(variants).map((k) => [k, []]));
for (let i = 0; i < rounds; i++) for (const [k, args] of Object.entries(variants)) times[k].push(timeProcess('node', args).ms);
const medianTime = (k) => [...times[k]].sort((a, b) => a - b)[rounds >> 1];
const whole = medianTime('whole');
const whole1 = medianTime('whole1');
const wholeJs = medianTime('wholeJs');
const baseRows = [];
const baseWhole = baseline !== undefined ? medianTime('base') : undefined;
if (baseline !== undefined) {
  baseRows.push([`baseline \`${baseline}\`, whole process, 2 threads`, baseWhole]);
  baseRows.push(['baseline, whole process, `--threads 1`', medianTime('base1')]);
}
const loaded = loadCircuit(join(root, circuit10));
const planned = planLoaded(loaded);
const engine = (threads) =>
  median(rounds, () => {
    const compiled = compilePlan(planLoaded(loaded).plan);
    runCompiled(compiled, threads > 1 ? pool : undefined);
  });
const engine2 = engine(2);
const engine1 = engine(1);
const rows = [
  [`fray, whole process (\`fray run --json --threads 2\`; WebAssembly kernels)`, whole],
  ['fray, whole process, `--threads 1`', whole1],
  ['fray, whole process, `--threads 2 --kernels js` (the JS kernels)', wholeJs],
  ...baseRows,
  [`fray engine alone (plan + ${planned.plan.steps.length} passes, in-process, warm, 2 threads)`, engine2],
  ['fray engine alone, 1 thread', engine1],
];
const numpyTimes = {};
if (!quick) rows.push(['fray, whole process, `--no-fuse` (one general pass per instruction; 1 run)', timeProcess('node', fray(circuit10, '--no-fuse')).ms]);

// the numpy peer reads fray's instruction list of the same circuit
const py = spawnSync('python3', ['-c', 'import numpy; print(numpy.__version__)'], { encoding: 'utf8' });
let numpyNote = '';
if (py.status === 0) {
  const dir = mkdtempSync(join(tmpdir(), 'fray-bench-'));
  const opsFile = join(dir, 'ops.json');
  const m = (c) => Array.from({ length: c.rows }, (_, i) => Array.from({ length: c.cols }, (_, j) => [c.data[2 * (i * c.cols + j)], c.data[2 * (i * c.cols + j) + 1]]));
  const prog = planned.program;
  const ops = prog.noisy.map((ins, i) => {
    const step = prog.origins[i].step;
    if (ins.op === 'unitary') return { op: 'unitary', qubits: ins.qubits, step, matrix: m(ins.matrix) };
    if (ins.op === 'channel') return { op: 'channel', qubits: ins.qubits, step, kraus: ins.kraus.map(m) };
    return { op: 'reset', qubits: [ins.qubit], step };
  });
  writeFileSync(opsFile, JSON.stringify({ n: prog.n, ops }));
  // OPENBLAS_CORETYPE / OPENBLAS_L2_SIZE may be set on this machine and slow numpy: unset for numpy only
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  const peer = (variant) => JSON.parse(timeProcess('python3', [join(root, 'test/bench/numpyPeer.py'), opsFile, variant], env).stdout);
  const variants = quick ? ['fused', 'folded'] : ['practitioner', 'fused', 'folded'];
  const labels = {
    practitioner: 'numpy practitioner (tensordot + moveaxis per operation, K ρ K† per Kraus operator; 1 run)',
    fused: 'numpy, gate + its noise fused by hand into one superoperator per gate',
    folded: 'numpy, fused and folded by hand into 2-qubit superoperators (what fray\'s plan does)',
  };
  const purityFray = (() => {
    const rho = runCompiled(compilePlan(planned.plan));
    let p = 0;
    for (let i = 0; i < rho.data.length; i++) p += rho.data[i] * rho.data[i];
    return p;
  })();
  for (const v of variants) {
    const k = v === 'practitioner' ? 1 : rounds;
    const results = Array.from({ length: k }, () => peer(v)).sort((a, b) => a.seconds - b.seconds);
    const r = results[k >> 1];
    if (Math.abs(r.purity - purityFray) > 1e-9) numpyNote += `\n(numpy ${v} purity ${r.purity} differs from fray's ${purityFray}!)`;
    rows.push([labels[v] + ' — simulation only, no interpreter start-up', r.seconds * 1000]);
    numpyTimes[v] = r.seconds * 1000;
  }
  numpyNote += `\nnumpy ${py.stdout.trim()} agrees with fray on the purity Tr ρ² of the final state (to 1e-9).`;
} else {
  numpyNote = '\nnumpy peer skipped: python3 with numpy is not available on this machine.';
}
print(`| run | time | time ÷ fray whole process |`);
print('|---|---:|---:|');
for (const [label, ms] of rows) print(`| ${label} | ${fmtMs(ms)} | ${fmtX(ms / whole)} |`);
print(numpyNote.trim());
print();

// ---- 2b. drift ----------------------------------------------------------------------------------
// Issue 7: the same circuit with a detuning on every qubit and zz on every coupled pair of the line
// must stay within 1.3× of the circuit without drift (whole process). Interleaved runs, so that load
// from other work hits both alike.
{
  const drift10 = 'circuits/bench/drift10x20.yaml';
  const base = [];
  const drift = [];
  for (let i = 0; i < rounds; i++) {
    base.push(timeProcess('node', fray(circuit10)).ms);
    drift.push(timeProcess('node', fray(drift10)).ms);
  }
  const mid = (v) => [...v].sort((a, b) => a - b)[v.length >> 1];
  const driftPlan = planLoaded(loadCircuit(join(root, drift10))).plan;
  const kinds = {};
  for (const st of driftPlan.steps) kinds[st.kernel] = (kinds[st.kernel] ?? 0) + 1;
  print(`## Drift: ${drift10} against ${circuit10} (whole process, median of ${rounds} interleaved runs)`);
  print();
  print('| circuit | kernel calls | time | ÷ without drift |');
  print('|---|---|---:|---:|');
  print(`| without drift | ${planned.plan.steps.length} | ${fmtMs(mid(base))} | 1.00× |`);
  print(`| detuning on every qubit, zz on every pair of the line | ${driftPlan.steps.length} (${Object.entries(kinds).map(([k, c]) => `${k} ${c}`).join(', ')}) | ${fmtMs(mid(drift))} | ${fmtX(mid(drift) / mid(base))} |`);
  print();
}

// ---- 3. stage breakdown ------------------------------------------------------------------------
const stageRounds = quick ? 3 : 5;
print(`## Stages of the whole process on ${circuit10} (median ms of ${stageRounds} processes; test/bench/stages.mjs)`);
print();
const stageNames = {
  node: 'Node itself (until the first line of the script)',
  import: 'loading the CLI bundle (code cache)',
  read: 'YAML reading and validation',
  program: 'schedule and program',
  plan: 'plan building and packing',
  wait: 'waiting for worker threads / kernel warm-up',
  passes: `the ${planned.plan.steps.length} fused passes`,
  results: 'results (ideal run, figures, JSON)',
};
const stageConfigs = [
  ['WebAssembly, 2 threads', '2', 'wasm'],
  ['WebAssembly, 1 thread', '1', 'wasm'],
  ['JS kernels, 2 threads', '2', 'js'],
];
const stageMedians = stageConfigs.map(([, threads, family]) => {
  const runs = Array.from({ length: stageRounds }, () => JSON.parse(timeProcess('node', [join(root, 'test/bench/stages.mjs'), circuit10, threads, family]).stdout));
  const med = {};
  for (const k of Object.keys(stageNames)) med[k] = runs.map((r) => r[k]).sort((a, b) => a - b)[stageRounds >> 1];
  return med;
});
print(`| stage | ${stageConfigs.map((c) => c[0]).join(' | ')} |`);
print(`|---|${stageConfigs.map(() => '---:').join('|')}|`);
for (const [k, label] of Object.entries(stageNames)) print(`| ${label} | ${stageMedians.map((m) => fmtMs(m[k])).join(' | ')} |`);
print(`| sum | ${stageMedians.map((m) => fmtMs(Object.values(m).reduce((a, b) => a + b, 0))).join(' | ')} |`);
print();

// ---- 4. start-up --------------------------------------------------------------------------------
const trivial = 'circuits/bench/one-qubit.yaml';
const startRounds = quick ? 7 : 15;
const nodeAlone = [];
const frayTrivial = [];
for (let i = 0; i < startRounds; i++) {
  // interleaved, so that load from other work hits both alike
  nodeAlone.push(timeProcess('node', ['-e', '0']).ms);
  frayTrivial.push(timeProcess('node', fray(trivial)).ms);
}
const med = (v) => [...v].sort((a, b) => a - b)[v.length >> 1];
print(`## Start-up: ${trivial} (one gate on one qubit), median of ${startRounds} interleaved processes`);
print();
print('| process | time | ÷ `node -e 0` |');
print('|---|---:|---:|');
print(`| \`node -e 0\` | ${fmtMs(med(nodeAlone))} | 1.00× |`);
print(`| \`fray run ${trivial} --json\` | ${fmtMs(med(frayTrivial))} | ${fmtX(med(frayTrivial) / med(nodeAlone))} |`);
print();

// ---- 5. scaling -------------------------------------------------------------------------------
print('## Same circuit shape on more qubits (whole process `fray run --json`)');
print();
print('| circuit | threads | time | ÷ 10-qubit time (same threads) | peak resident memory | ÷ density matrix |');
print('|---|---:|---:|---:|---:|---:|');
const rss = (file, threads) => {
  const r = timeProcess('node', [join(root, 'test/bench/peakMemory.mjs'), file, '--threads', String(threads)]);
  return { ms: r.ms, rss: Number(r.stdout.trim().split('\n').pop()) };
};
const medianRun = (runs) => [...runs].sort((a, b) => a.ms - b.ms)[runs.length >> 1];
if (!skipLarge) {
  // 12 qubits with 2 and 1 threads, interleaved so that load from other work hits both alike
  const k = quick ? 1 : 3;
  const two = [];
  const one = [];
  for (let i = 0; i < k; i++) {
    two.push(rss('circuits/bench/layers12x20.yaml', 2));
    one.push(rss('circuits/bench/layers12x20.yaml', 1));
  }
  const r13 = rss('circuits/bench/layers13x20.yaml', 2);
  const lines = [
    [12, 2, medianRun(two), whole, `median of ${k}`],
    [12, 1, medianRun(one), whole1, `median of ${k}`],
    [13, 2, r13, whole, '1 run'],
  ];
  for (const [n, threads, r, base, note] of lines) {
    const rhoBytes = 16 * 4 ** n;
    print(`| circuits/bench/layers${n}x20.yaml (${note}) | ${threads} | ${fmtMs(r.ms)} | ${fmtX(r.ms / base)} | ${(r.rss / 2 ** 20).toFixed(0)} MiB | ${fmtX(r.rss / rhoBytes)} |`);
  }
  print();
  print(`Two threads against one on 12 qubits (whole process): ${fmtX(medianRun(one).ms / medianRun(two).ms)}.`);
}
print();

// ---- 6. targets ---------------------------------------------------------------------------------
const pick = (n, prefix) => kernelRows[n]?.find((r) => r.kernel.startsWith(prefix));
const two10 = pick(10, '2-qubit fused channel, WebAssembly');
const one10 = pick(10, '1-qubit fused channel, WebAssembly (real1tp');
print('## Issue-12 targets, as measured in this run');
print();
print('| target | measured | reached |');
print('|---|---:|---|');
const yes = (ok) => (ok ? 'yes' : 'no');
const both = (r, limit) => `wall ${yes(r.ratio <= limit)}, CPU ${yes(r.cpuRatio <= limit)}`;
print(`| 2-qubit fused pass ≤ 8× the WebAssembly floor at 10 qubits | ${fmtX(two10.ratio)} wall, ${fmtX(two10.cpuRatio)} CPU | ${both(two10, 8)} |`);
print(`| 1-qubit fused pass ≤ 3× the floor at 10 qubits | ${fmtX(one10.ratio)} wall, ${fmtX(one10.cpuRatio)} CPU | ${both(one10, 3)} |`);
if (baseWhole !== undefined) print(`| whole process, 10 × 20, 2 threads ≥ 2.2× faster than the baseline | ${fmtX(baseWhole / whole)} | ${yes(baseWhole / whole >= 2.2)} |`);
if (numpyTimes.fused !== undefined) print(`| whole process no slower than hand-fused numpy alone | ${fmtMs(whole)} vs ${fmtMs(numpyTimes.fused)} | ${yes(whole <= numpyTimes.fused)} |`);
print(`| trivial circuit's whole process ≤ 1.6× \`node -e 0\` | ${fmtX(med(frayTrivial) / med(nodeAlone))} | ${yes(med(frayTrivial) / med(nodeAlone) <= 1.6)} |`);
print();
print(`load average (1, 5, 15 min) at the end: ${load()}`);
print();
closeSharedThreadPool();
writeFileSync(join(root, 'test/bench/last-run.md'), out.join('\n') + '\n');
console.log('(table also written to test/bench/last-run.md)');
