import { programAsYaml } from '../api/convert.js';
import { loadCircuit } from '../api/loadCircuit.js';
import { isQasmPath } from '../format/qasm/index.js';
import { readInputFile } from '../api/readInput.js';
import { fileStart, ProblemList } from '../format/problem.js';
import { formatDuration, parseDuration } from '../format/duration.js';
import { writeTransformedCircuit } from '../format/writeTransformed.js';
import { insertDecoupling, DECOUPLING_SEQUENCES, type DecouplingSequence } from '../transforms/decouple.js';
import { foldCircuit, MAX_FOLD_SCALE } from '../transforms/fold.js';
import { UsageError, type CliIO } from './main.js';
import { targetOf } from './options.js';
import { writeOutputFile } from './outputFiles.js';

/** `fray transform FILE`: decouple and/or fold the circuit and write it as a readable circuit file (to --out or standard output). */
export async function transformCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const dd = opts['dd'] as string | undefined;
  const fold = opts['fold'] as string | undefined;
  if (dd === undefined && fold === undefined) throw new UsageError('nothing to transform: give --dd SEQUENCE, --fold SCALE, or both');
  if (dd !== undefined && !DECOUPLING_SEQUENCES.includes(dd as DecouplingSequence)) throw new UsageError(`--dd ${dd}: expected one of ${DECOUPLING_SEQUENCES.join(', ')}`);
  let minIdle = 0;
  if (opts['minIdle'] !== undefined) {
    if (dd === undefined) throw new UsageError('--min-idle shapes dynamical decoupling: give --dd SEQUENCE too');
    const parsed = parseDuration(String(opts['minIdle']));
    if ('error' in parsed) throw new UsageError(`--min-idle ${String(opts['minIdle'])}: ${parsed.error}`);
    minIdle = parsed.ns;
  }
  const scale = fold === undefined ? undefined : Number(fold);
  if (scale !== undefined && (!Number.isFinite(scale) || scale < 1 || scale > MAX_FOLD_SCALE)) throw new UsageError(`--fold ${fold}: expected a noise scale from 1 to ${MAX_FOLD_SCALE}, e.g. --fold 3`);
  const { file: _f, ...target } = targetOf(file, opts);
  const loaded = loadCircuit(file, target);
  const header = [`transformed by fray from ${file}`];
  let circuit = loaded.circuit;
  if (dd !== undefined) {
    const r = insertDecoupling(circuit, loaded.profile, { sequence: dd as DecouplingSequence, minIdle });
    circuit = r.circuit;
    header.push(`dynamical decoupling ${dd} in idle windows of at least ${formatDuration(minIdle)} (times of the original schedule):`);
    for (const i of r.inserted) header.push(`  qubit ${i.qubit}, ${formatDuration(i.start)} to ${formatDuration(i.end)}: inserted ${i.pulses.join(' ')}`);
    for (const s of r.skipped) header.push(`  qubit ${s.qubit}, ${formatDuration(s.start)} to ${formatDuration(s.end)}: left, ${s.reason}`);
    if (r.inserted.length + r.skipped.length === 0) header.push('  no idle window long enough');
  }
  if (scale !== undefined) {
    const seed = opts['seed'] as number | undefined;
    const order = (opts['order'] as string | undefined) ?? 'end';
    if (order !== 'end' && order !== 'random') throw new UsageError(`--order ${order}: expected end or random`);
    const r = foldCircuit(circuit, { scale, order, ...(seed !== undefined ? { seed } : {}) });
    circuit = r.circuit;
    header.push(`unitary folding to scale ${r.scale} (G -> G (G^dagger G)^k; folds per gate application in order: ${r.folds.join(' ')})`);
  }
  // an OpenQASM program is not YAML: its steps go into the circuit file `fray convert` writes
  let original: string | undefined;
  if (isQasmPath(file)) original = programAsYaml(file, loaded.circuit);
  else {
    const read = new ProblemList();
    original = readInputFile(file, fileStart(file), 'circuit file', read);
    read.throwIfErrors();
  }
  const text = writeTransformedCircuit(original!, circuit, header);
  if (opts['out'] === undefined) {
    io.stdout.write(text);
    return;
  }
  writeOutputFile('--out', String(opts['out']), text);
  io.stdout.write(header.map((h) => `${h}\n`).join('') + `written to ${String(opts['out'])}\n`);
}
