/**
 * The suite hunts for the next bug (issue 13): a few hundred seeded mutations of the demo
 * circuits (version 1, record mode, OpenQASM, the mitigation demo under `fray mitigate`), their
 * device profiles and channel files go through the command line in-process,
 * and each must keep the contract — exit 0 with finite figures in their ranges, or exit 2
 * with every stderr line `FILE:LINE:COL: message` and nothing on stdout; never exit 1 or a
 * stack trace. A failure prints its seed, its base file and the mutated file.
 * FRAY_FUZZ_SEED=<n> runs another series (the default series is fixed, so CI repeats).
 */
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fray, LOCATED } from '../helpers/cli.js';
import { mutateText, mutateYaml } from '../helpers/mutate.js';
import { mulberry32 } from '../helpers/random.js';

/** First seed of the series; case i uses SERIES + i. */
const SERIES = Number(process.env['FRAY_FUZZ_SEED'] ?? 13_000);

/** Cases per kind of input. */
const CASES = { circuit: 180, device: 60, channel: 50, record: 36, qasm: 45, mitigate: 24 } as const;

/** Largest |sum of a probability map − 1| accepted (the listed outcomes drop below 1e-15 each; rounding). */
const SUM_TOLERANCE = 1e-9;

const CIRCUITS = [
  'ghz5.yaml',
  'qpe3-asap.yaml',
  'qpe3-alap.yaml',
  'ramsey-echo.yaml',
  'coupler-swap.yaml',
  'coherent-overrotation.yaml',
  'detuned-ramsey-echo.yaml',
  'zz-spectator-a.yaml',
  'zz-spectator-b.yaml',
];
/** Record-mode demos (format version 2, part B). */
const RECORD_CIRCUITS = ['active-reset.yaml', 'teleport.yaml', 'repetition-code.yaml'];
/** OpenQASM demos, run on the device their headers name. */
const QASM_PROGRAMS = ['ghz-wait.qasm', 'qft4.qasm', 'teleport.qasm'];
const QASM_DEVICE = 'ring4-qasm.yaml';
/** The mitigation demo, under `fray mitigate` with these options (ZNE at two scales, bounded readout correction). */
const MITIGATION_DEMO = 'ghz-line.yaml';
const MITIGATE_FLAGS = ['--zne', '1,3', '--readout', 'bounded', '--json'];
const DEVICES: readonly [device: string, circuit: string][] = [
  ['bench-line5.yaml', 'ghz5.yaml'],
  ['quad-square.yaml', 'qpe3-alap.yaml'],
  ['zz-line4.yaml', 'zz-spectator-a.yaml'],
];

/** One-qubit channels in every form (invented figures), so a channel run stays fast. */
const CHANNEL_FILE = `name: one-qubit forms
params: { g: 0.2 }
channels:
  k: { kraus: [ [[1, 0], [0, "sqrt(1-g)"]], [[0, "sqrt(g)"], [0, 0]] ] }
  c: { choi: [[1, 0, 0, 0.9], [0, 0, 0, 0], [0, 0, 0, 0], [0.9, 0, 0, 1]] }
  p: { ptm: [[1, 0, 0, 0], [0, 0.9, 0, 0], [0, 0, 0.9, 0], [0.05, 0, 0, 0.9]] }
  s: { stinespring: [[1, 0], [0, 0.6], [0, 0.8], [0, 0]] }
  u: { unitary: "rz(pi/8)" }
  t: { thermal: { t1: 40us, t2: 30us, time: 2us, excited: 0.01 } }
  q: { pauli: { x: 0.01, y: 0.02, z: 0.03 } }
  both: { sequence: [k, { phase_damping: 0.1 }] }
`;

/** A fresh copy of circuits/ (circuits and devices) to mutate in. */
function workspace(): string {
  const dir = mkdtempSync(join(tmpdir(), 'fray-fuzz-'));
  mkdirSync(join(dir, 'devices'));
  for (const c of CIRCUITS) copyFileSync(join('circuits', c), join(dir, c));
  for (const [d] of DEVICES) copyFileSync(join('circuits', 'devices', d), join(dir, 'devices', d));
  copyFileSync(join('circuits', 'devices', QASM_DEVICE), join(dir, 'devices', QASM_DEVICE));
  return dir;
}

/** Why a run result breaks the contract, or undefined when it keeps it. */
function breach(r: { code: number; out: string; err: string }, kind: 'run' | 'channel' | 'mitigate'): string | undefined {
  if (r.code === 2) {
    if (r.out !== '') return 'exit 2 with output on stdout';
    const lines = r.err.trimEnd().split('\n');
    const bad = lines.find((l) => !LOCATED.test(l));
    return bad === undefined ? undefined : `exit 2 with a line that is not FILE:LINE:COL: message: ${JSON.stringify(bad)}`;
  }
  if (r.code !== 0) return `exit ${r.code}`;
  if (r.err !== '') return `exit 0 with stderr: ${r.err}`;
  let j: Record<string, unknown>;
  try {
    j = JSON.parse(r.out) as Record<string, unknown>;
  } catch {
    return 'exit 0 without valid JSON on stdout';
  }
  return kind === 'run' ? runFiguresBreach(j) : kind === 'mitigate' ? mitigationBreach(j) : channelBreach(j);
}

const inRange = (x: unknown, lo: number, hi: number): boolean => typeof x === 'number' && Number.isFinite(x) && x >= lo && x <= hi;

/** Figures of `fray run --json` outside their ranges (definitions: README, Results). */
function runFiguresBreach(j: Record<string, unknown>): string | undefined {
  const fid = j['fidelity'] as Record<string, unknown>;
  for (const [k, v] of [['fidelity.state', fid['state']], ['fidelity.classical', fid['classical']], ['tvd', j['tvd']], ['purity', j['purity']]] as const) {
    if (!inRange(v, 0, 1)) return `${k} = ${String(v)} is not in [0, 1]`;
  }
  if (!inRange(j['duration_ns'], 0, Number.MAX_VALUE)) return `duration_ns = ${String(j['duration_ns'])}`;
  const probs = j['probabilities'] as Record<string, Record<string, unknown>>;
  for (const which of ['ideal', 'noisy', 'measured']) {
    const values = Object.values(probs[which]!);
    if (!values.every((p) => inRange(p, 0, 1))) return `a ${which} probability is not in [0, 1]`;
    const sum = values.reduce((a: number, b) => a + (b as number), 0);
    if (!(Math.abs(sum - 1) <= SUM_TOLERANCE)) return `${which} probabilities sum to ${sum}`;
  }
  const bloch = j['bloch'] as Record<string, number[][]>;
  for (const v of [...bloch['ideal']!, ...bloch['noisy']!]) if (!v.every((x) => inRange(x, -1, 1))) return `Bloch vector ${JSON.stringify(v)} out of [−1, 1]`;
  for (const [p, o] of Object.entries((j['observables'] ?? {}) as Record<string, { ideal: unknown; noisy: unknown }>)) {
    if (!inRange(o.ideal, -1, 1) || !inRange(o.noisy, -1, 1)) return `⟨${p}⟩ out of [−1, 1]`;
  }
  return undefined;
}

/** Figures of `fray mitigate --json` (bounded readout correction) outside their ranges (definitions: docs/mitigation.md). */
function mitigationBreach(j: Record<string, unknown>): string | undefined {
  const d = j['distribution'] as Record<string, unknown>;
  for (const k of ['tvd_before', 'tvd_after', 'classical_before', 'classical_after']) if (!inRange(d[k], 0, 1)) return `distribution.${k} = ${String(d[k])} is not in [0, 1]`;
  for (const [p, o] of Object.entries(j['observables'] as Record<string, { ideal: unknown; noisy: unknown; mitigated: unknown }>)) {
    if (!inRange(o.ideal, -1, 1) || !inRange(o.noisy, -1, 1)) return `⟨${p}⟩ out of [−1, 1]`;
    // extrapolation may leave [−1, 1]; it must stay a number
    if (!inRange(o.mitigated, -Number.MAX_VALUE, Number.MAX_VALUE)) return `mitigated ⟨${p}⟩ = ${String(o.mitigated)}`;
  }
  const readout = j['readout'] as Record<string, Record<string, unknown>> | undefined;
  for (const which of ['ideal', 'measured', 'mitigated'] as const) {
    if (readout !== undefined && !Object.values(readout[which]!).every((x) => inRange(x, 0, 1))) return `a readout.${which} probability is not in [0, 1]`;
  }
  return undefined;
}

/** Channel figures that did not survive as numbers (JSON writes NaN as null). */
function channelBreach(j: Record<string, unknown>): string | undefined {
  const channels = j['channels'] as Record<string, unknown>[] | undefined;
  if (!Array.isArray(channels) || channels.length === 0) return 'no channels in the JSON';
  for (const c of channels) {
    const ev = c['choiEigenvalues'] as unknown[];
    if (!Array.isArray(ev) || !ev.every((x) => typeof x === 'number' && Number.isFinite(x))) return `channel ${String(c['name'])}: Choi eigenvalues ${JSON.stringify(ev)}`;
  }
  return undefined;
}

/** Runs `args` and fails with the seed, the mutated file and the output when the contract is broken. */
async function expectContract(label: string, text: string, kind: 'run' | 'channel' | 'mitigate', args: string[]): Promise<void> {
  const r = await fray(...args);
  const why = breach(r, kind);
  if (why !== undefined) expect.fail(`fuzz ${label}: ${why}\n--- mutated file ---\n${text}\n--- stderr ---\n${r.err}`);
}

const RUN_FLAGS = ['--json', '--threads', '1', '--max-memory', '40MiB'];

describe(`fuzz: mutated inputs keep the exit-status contract (series ${SERIES})`, () => {
  it(`${CASES.circuit} mutated circuits`, async () => {
    const dir = workspace();
    for (let i = 0; i < CASES.circuit; i++) {
      const seed = SERIES + i;
      const rng = mulberry32(seed);
      const base = CIRCUITS[i % CIRCUITS.length]!;
      const text = mutateYaml(readFileSync(join('circuits', base), 'utf8'), rng);
      const path = join(dir, `m-${base}`);
      writeFileSync(path, text);
      await expectContract(`seed ${seed} (mulberry32), mutating circuits/${base}`, text, 'run', ['run', path, ...RUN_FLAGS]);
    }
  }, 120_000);

  it(`${CASES.record} mutated record-mode circuits`, async () => {
    const dir = workspace();
    for (let i = 0; i < CASES.record; i++) {
      const seed = SERIES + 300_000 + i;
      const base = RECORD_CIRCUITS[i % RECORD_CIRCUITS.length]!;
      const text = mutateYaml(readFileSync(join('circuits', base), 'utf8'), mulberry32(seed));
      const path = join(dir, `m-${base}`);
      writeFileSync(path, text);
      // the record branches of repetition-code.yaml need ≈40 MiB
      await expectContract(`seed ${seed} (mulberry32), mutating circuits/${base}`, text, 'run', ['run', path, ...RUN_FLAGS, '--max-memory', '128MiB']);
    }
  }, 120_000);

  it(`${CASES.qasm} mutated OpenQASM programs`, async () => {
    const dir = workspace();
    for (let i = 0; i < CASES.qasm; i++) {
      const seed = SERIES + 400_000 + i;
      const base = QASM_PROGRAMS[i % QASM_PROGRAMS.length]!;
      const text = mutateText(readFileSync(join('circuits', 'qasm', base), 'utf8'), mulberry32(seed));
      const path = join(dir, `m-${base}`);
      writeFileSync(path, text);
      await expectContract(`seed ${seed} (mulberry32), mutating circuits/qasm/${base}`, text, 'run', ['run', path, '--device', join(dir, 'devices', QASM_DEVICE), ...RUN_FLAGS]);
    }
  }, 120_000);

  it(`${CASES.mitigate} mutated mitigation circuits under fray mitigate`, async () => {
    const dir = workspace();
    for (let i = 0; i < CASES.mitigate; i++) {
      const seed = SERIES + 500_000 + i;
      const text = mutateYaml(readFileSync(join('circuits', 'mitigation', MITIGATION_DEMO), 'utf8'), mulberry32(seed));
      const path = join(dir, `m-${MITIGATION_DEMO}`);
      writeFileSync(path, text);
      await expectContract(`seed ${seed} (mulberry32), mutating circuits/mitigation/${MITIGATION_DEMO}`, text, 'mitigate', ['mitigate', path, ...MITIGATE_FLAGS]);
    }
  }, 120_000);

  it(`${CASES.device} mutated device profiles`, async () => {
    const dir = workspace();
    for (let i = 0; i < CASES.device; i++) {
      const seed = SERIES + 100_000 + i;
      const rng = mulberry32(seed);
      const [device, circuit] = DEVICES[i % DEVICES.length]!;
      const text = mutateYaml(readFileSync(join('circuits', 'devices', device), 'utf8'), rng);
      writeFileSync(join(dir, 'devices', device), text);
      await expectContract(`seed ${seed} (mulberry32), mutating circuits/devices/${device} under ${circuit}`, text, 'run', ['run', join(dir, circuit), ...RUN_FLAGS]);
    }
  }, 120_000);

  it(`${CASES.channel} mutated channel files`, async () => {
    const dir = workspace();
    for (let i = 0; i < CASES.channel; i++) {
      const seed = SERIES + 200_000 + i;
      const text = mutateYaml(CHANNEL_FILE, mulberry32(seed));
      const path = join(dir, 'channels.yaml');
      writeFileSync(path, text);
      await expectContract(`seed ${seed} (mulberry32), mutating the channel file of this test`, text, 'channel', ['channel', path, '--json']);
    }
  }, 120_000);
});
