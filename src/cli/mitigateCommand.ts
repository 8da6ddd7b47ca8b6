import { loadCircuit } from '../api/loadCircuit.js';
import { mitigate, type MitigateOptions } from '../mitigation/mitigate.js';
import { FIT_KINDS, type FitKind } from '../mitigation/extrapolate.js';
import { READOUT_METHODS, type ReadoutMethod } from '../mitigation/readoutCorrection.js';
import type { FoldOrder } from '../transforms/fold.js';
import { DECOUPLING_SEQUENCES, type DecouplingSequence } from '../transforms/decouple.js';
import { parseDuration } from '../format/duration.js';
import { fileStart, InputError, type SourcePosition } from '../format/problem.js';
import { renderMitigationReport } from './mitigateReport.js';
import { toJson } from '../results/json.js';
import { makeStyle, wantColor } from './style.js';
import { UsageError, VERSION, type CliIO } from './main.js';
import { writeHtmlReport } from './htmlReport.js';
import { mitigatePage } from '../html/index.js';
import { parseObserveOptions, targetOf } from './options.js';
import { recipeOptions } from '../mitigation/recipe.js';

/** `fray mitigate FILE`: parses the options, runs the mitigation, writes the table or JSON in one piece. */
export async function mitigateCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const zne = opts['zne'] as number[] | undefined;
  const readout = opts['readout'] as string | undefined;
  const dd = opts['dd'] as string | undefined;
  const twirl = opts['twirl'] as true | number | undefined;
  const fromCommandLine = zne !== undefined || readout !== undefined || dd !== undefined || twirl !== undefined;
  const fit = (opts['fit'] as string | undefined) ?? 'richardson';
  if (!FIT_KINDS.includes(fit as FitKind)) throw new UsageError(`--fit ${fit}: expected one of ${FIT_KINDS.join(', ')}`);
  const fold = opts['fold'] as true | string | undefined;
  const order = fold === undefined || fold === true ? 'end' : fold;
  if (order !== 'end' && order !== 'random') throw new UsageError(`--fold ${order}: expected end or random (or --fold alone: from the end)`);
  if (zne === undefined && (opts['fit'] !== undefined || opts['fold'] !== undefined)) throw new UsageError('--fit and --fold shape a zero-noise extrapolation: give --zne SCALES too');
  if (readout !== undefined && !READOUT_METHODS.includes(readout as ReadoutMethod)) throw new UsageError(`--readout ${readout}: expected one of ${READOUT_METHODS.join(', ')}`);
  if (dd !== undefined && !DECOUPLING_SEQUENCES.includes(dd as DecouplingSequence)) throw new UsageError(`--dd ${dd}: expected one of ${DECOUPLING_SEQUENCES.join(', ')}`);
  if (dd === undefined && opts['minIdle'] !== undefined) throw new UsageError('--min-idle shapes dynamical decoupling: give --dd SEQUENCE too');
  let minIdle = 0;
  if (opts['minIdle'] !== undefined) {
    const parsed = parseDuration(String(opts['minIdle']));
    if ('error' in parsed) throw new UsageError(`--min-idle ${String(opts['minIdle'])}: ${parsed.error}`);
    minIdle = parsed.ns;
  }
  const observe = parseObserveOptions(opts['observe']);
  const { file: _file, ...target } = targetOf(file, opts);
  const loaded = loadCircuit(file, target);
  const recipe = loaded.circuit.mitigation;
  // What the circuit file lacks is located at it: its 'mitigation:' block when that is the recipe, else its start.
  const refuse = (at: SourcePosition, code: string, message: string) => new InputError([{ ...at, severity: 'error', code, message }]);
  if (!fromCommandLine && recipe === undefined) {
    throw refuse(fileStart(loaded.circuit.file), 'nothing-to-mitigate', "nothing to mitigate: give --zne SCALES, --readout METHOD, --dd SEQUENCE, --twirl [N], or several (or a 'mitigation:' block in the circuit file)");
  }
  const seed = opts['seed'] as number | undefined;
  const chosen: MitigateOptions = fromCommandLine
    ? {
        ...(zne !== undefined
          ? { zne: { scales: zne, fit: fit as FitKind, ...(fold !== undefined ? { amplify: 'fold' as const, order: order as FoldOrder, ...(seed !== undefined ? { seed } : {}) } : { amplify: 'scale' as const }) } }
          : {}),
        ...(readout !== undefined ? { readout: readout as ReadoutMethod } : {}),
        ...(dd !== undefined ? { dd: { sequence: dd as DecouplingSequence, minIdle } } : {}),
        ...(twirl !== undefined ? { twirl: twirl === true ? {} : { instances: twirl, ...(seed !== undefined ? { seed } : {}) } } : {}),
      }
    : recipeOptions(recipe!);
  const hasObservables = observe.length > 0 || loaded.circuit.observe.length > 0;
  const where = fromCommandLine ? '' : " (the file's 'mitigation:' block)";
  const at = fromCommandLine ? fileStart(loaded.circuit.file) : recipe!.at;
  if (chosen.zne !== undefined && !hasObservables) {
    throw refuse(at, 'no-observables', `zero-noise extrapolation${where} extrapolates Pauli observables: give --observe P (or list them under 'observe:' in the circuit)`);
  }
  if (chosen.zne === undefined && chosen.readout === undefined && !hasObservables) {
    throw refuse(at, 'no-observables', `decoupling and twirling${where} are judged by Pauli observables: give --observe P (or list them under 'observe:'), or a readout correction to compare distributions`);
  }
  const options: MitigateOptions = {
    ...chosen,
    observe,
    ...(opts['threads'] !== undefined ? { run: { threads: opts['threads'] as number } } : {}),
  };
  const result = mitigate(loaded, options);
  await writeHtmlReport(opts, io, () => mitigatePage(result, VERSION));
  if (opts['json']) {
    io.stdout.write(toJson(result) + '\n');
    return;
  }
  const color = wantColor(process.stdout, opts['color'] !== false) && io.stdout === process.stdout;
  io.stdout.write(renderMitigationReport(result, makeStyle(color)));
}
