import { Command, CommanderError, Option } from 'commander';
import { InputError } from '../format/problem.js';
import type { ChannelCommandOptions } from './channelCommand.js';
import { makeStyle, wantColor } from './style.js';
import { parseInstances, parseScales } from './mitigateOptions.js';
import { FIT_KINDS } from '../mitigation/extrapolate.js';
import { READOUT_METHODS } from '../mitigation/readoutCorrection.js';
import { DECOUPLING_SEQUENCES } from '../transforms/sequences.js';
import { renderProblems } from './problems.js';
import { parseWholeNumber } from './wholeNumber.js';
import { MAX_SHOTS } from '../results/sampling.js';
import { addFormatCommands } from './formatCommands.js';
import { isQasmPath, loadQasmToolkit } from '../format/qasm/index.js';
import { settleOptionalValues } from './optionalValues.js';
import { addTargetOptions, collect, collectLayout, parseLayout, parseNoiseScale, parsePositiveInt } from './options.js';

/** Exit statuses of the fray command: success, internal error, input error, a failed `--require`. */
export const EXIT = { ok: 0, internal: 1, input: 2, requirement: 3 } as const;

/** Thrown by option parsers for a bad command-line value (reported with exit status 2). */
export class UsageError extends Error {}

/** Where the CLI writes; tests pass their own sinks. */
export interface CliIO {
  readonly stdout: { write(s: string): unknown; isTTY?: boolean };
  readonly stderr: { write(s: string): unknown; isTTY?: boolean };
}

/** fray's version (printed by --version and written in reports). */
export const VERSION = '0.1.0';

/** Runs the fray command line with `argv` (without node and script) and returns the exit status. */
export async function main(argv: readonly string[], io: CliIO = { stdout: process.stdout, stderr: process.stderr }): Promise<number> {
  let status: number = EXIT.ok;
  // a run of one subcommand (not `fray help …`, `fray --help` or a typo) defines only that one
  const only = COMMAND_NAMES.includes(argv[0] ?? '') ? argv[0] : undefined;
  const program = buildProgram(io, (code) => (status = code), only);
  try {
    // the OpenQASM parser toolkit loads only for commands given a .qasm file (see src/format/qasm/toolkit.ts)
    if (argv.some(isQasmPath)) await loadQasmToolkit();
    await program.parseAsync(settleOptionalValues(argv), { from: 'user' });
    return status;
  } catch (e) {
    return reportFailure(e, io);
  }
}

function reportFailure(e: unknown, io: CliIO): number {
  if (e instanceof CommanderError) {
    if (e.code === 'commander.helpDisplayed' || e.code === 'commander.version' || e.code === 'commander.help') return EXIT.ok;
    // commander already printed its message; usage errors are input errors.
    return EXIT.input;
  }
  if (e instanceof InputError) {
    const tty = io.stderr.isTTY === true;
    io.stderr.write(renderProblems(e.problems, makeStyle(tty && wantColor(process.stderr, true)), tty));
    return EXIT.input;
  }
  if (e instanceof UsageError) {
    io.stderr.write(`fray: ${e.message}\n`);
    return EXIT.input;
  }
  const err = e as Error;
  io.stderr.write(`fray: internal error: ${err?.message ?? String(e)}\n`);
  if (process.env['FRAY_DEBUG']) io.stderr.write(`${err?.stack ?? ''}\n`);
  else io.stderr.write('fray: this is a bug in fray, not in your input; set FRAY_DEBUG=1 for details\n');
  return EXIT.internal;
}

/** The subcommands buildProgram defines (each block below is guarded by its name). */
const COMMAND_NAMES = ['run', 'channel', 'compare', 'sweep', 'merge', 'threshold', 'budget', 'mitigate', 'check', 'transform', 'convert', 'export', 'schema'];

/**
 * The command line's parser. With `only` (the subcommand argv starts with), just that subcommand
 * is defined: the others' options and help texts are never built (a few ms of every start-up).
 */
function buildProgram(io: CliIO, exitWith: (code: number) => void, only?: string): Command {
  const wanted = (name: string): boolean => only === undefined || only === name;
  const program = new Command();
  program
    .name('fray')
    .description(
      'Exact density-matrix simulation of short, noisy quantum circuits. Reads a circuit and a ' +
        'device noise profile in YAML, schedules the circuit in time so idle qubits decay, and ' +
        'reports how far the noisy run lands from the ideal one.',
    )
    .version(VERSION, '-V, --version', 'print the version')
    .helpOption('-h, --help', 'show help')
    .exitOverride()
    .showSuggestionAfterError(true)
    .configureOutput({
      writeOut: (s) => io.stdout.write(s),
      writeErr: (s) => io.stderr.write(s),
    })
    .addHelpText(
      'after',
      '\nExamples:\n' +
        '  fray run circuits/ghz5.yaml                 report for a circuit and its device\n' +
        '  fray run circuits/ghz5.yaml --json          the same as one JSON object\n' +
        '  fray run --help                             every option of run\n' +
        "  fray compare circuits/variants/*.yaml --require 'state>=0.95'   rank variants, gate CI\n" +
        '  fray sweep circuits/ghz5.yaml --vary noise-scale=0..2:9 --plot s.svg      a figure against a knob\n' +
        "  fray threshold circuits/ghz5.yaml --target 'state>=0.9' --vary gates.cx.error=0.0001..0.05\n" +
        '  fray budget circuits/ghz5.yaml                 where the infidelity comes from\n' +
        '  fray mitigate circuits/mitigation/ghz-line.yaml --zne 1,3,5 --fold --readout inverse\n' +
        '  fray check circuits/mitigation/ghz-line.yaml --junit check.xml   expectations for CI\n' +
        '\nExit status: 0 success, 2 input error (FILE:LINE:COL: message), 3 a requirement not met\n' +
        '(compare --require, check; threshold: the target met nowhere), 1 internal error.',
    );

  if (wanted('run')) {
    const run = program
      .command('run')
      .description('simulate one circuit file: ideal and noisy runs, fidelities, outcome table')
      .argument('<file>', 'circuit file (YAML, or an OpenQASM 2.0/3 program ending in .qasm)')
      .option('--json', 'print one JSON object instead of the report')
      .option('--device <file>', "noise profile to use instead of the circuit's 'device:'")
      .addOption(new Option('--set <key=value...>', 'override a parameter or a profile field (repeatable), e.g. --set theta=0.4 --set qubits.all.t1=50us --set gates.cx.error=none'))
      .option('--noise-scale <c>', 'multiply every noise strength by C ≥ 0 (rates 1/T1 and 1/T2, probabilities, error, readout)', parseNoiseScale)
      .option('--layout <p0,p1,...>', 'place circuit qubit i on device qubit P_i: the device profile is read at those qubits', parseLayout)
      .option('--shots <n>', 'also sample this many shots from the measured distribution (a whole number up to 2^53, e.g. 1e6)', parseShots)
      .option('--seed <s>', 'seed of the shot sampler (default: 1); the same seed gives the same counts everywhere', parseSeed)
      .addOption(new Option('--observe <pauli...>', 'report ⟨P⟩ for Pauli strings, qubit 0 leftmost (repeatable or comma-separated), e.g. --observe ZZI,XXX'))
      .option('--top <k>', 'how many outcomes the report lists', parseTop, 8)
      .option('--state', 'print per-qubit Bloch vectors (and ρ for up to 3 qubits); in record mode each branch\'s weight')
      .option('--schedule', 'print the time schedule, idle windows and drift (detuning, zz) per qubit and pair; in record mode which measurement feeds which step')
      .option('--html <file>', 'also write a self-contained HTML report: schedule timeline, outcome bars, Bloch lengths, observables')
      .option('--max-memory <size>', 'refuse runs needing more memory than this, e.g. 2GiB (default: half the machine)')
      .option('--plan', 'print the plan of kernel calls (what is fused into each pass over the density matrix) instead of running')
      .option('--threads <n>', 'threads sharing each pass on 9+ qubits (default: the machine\'s cores; 1 = off)', parseThreads)
      .option('--no-fuse', 'apply every gate and channel as its own pass (slower; for comparison)')
      .addOption(
        new Option('--kernels <family>', 'kernels of the fused passes: wasm (WebAssembly SIMD, up to 13 qubits) or js (same results); default wasm from 8 qubits').choices([
          'wasm',
          'js',
        ]),
      )
      .option('--no-color', 'plain text even on a terminal (NO_COLOR is respected too)')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray run circuits/ghz5.yaml\n' +
          '  fray run circuits/ghz5.yaml --device circuits/devices/bench-line5.yaml --top 4\n' +
          '  fray run circuits/ramsey-echo.yaml --set detune=0.025 --schedule\n' +
          '  fray run circuits/ghz5.yaml --set qubits.all.t1=50us --set gates.cx.error=none\n' +
          '  fray run circuits/ghz5.yaml --noise-scale 2 --layout 4,3,2,1,0\n' +
          '  fray run circuits/ghz5.yaml --shots 1000 --seed 7 --observe ZZIII,XXXXX --json\n' +
          '  fray run circuits/teleport.yaml --schedule --state   mid-circuit measurement and feed-forward\n' +
          '  fray run circuits/qpe3-asap.yaml --html report.html   the timeline and charts in one page\n' +
          '  fray run circuits/bench/layers10x20.yaml --plan      what each pass over ρ fuses\n' +
          '  fray run circuits/bench/layers10x20.yaml --threads 1 one thread (or --no-fuse: one pass per operation)\n' +
          '\nReport figures: state fidelity is Uhlmann–Jozsa, squared; classical fidelity and total\n' +
          'variation distance compare ideal probabilities with measured ones (readout error included).',
      )
      .action(async (file: string, opts: Record<string, unknown>) => {
        // every command loads its own modules when it runs (one bundle: scripts/bundle.mjs makes each import() lazy)
        const { runCommand } = await import('./runCommand.js');
        await runCommand(file, opts, io);
      });
    run.exitOverride();
  }

  if (wanted('channel')) {
    const channel = program
      .command('channel')
      .description('inspect quantum channels: physicality, minimal Kraus form, fidelities, diamond distance')
      .argument('<file>', "YAML file with a 'channels:' map (a circuit file works too)")
      .argument('[name]', 'report only this channel')
      .option('--as <form>', 'also print this representation: kraus, choi, superoperator, ptm, stinespring')
      .option('--against <target>', "compare with a channel of the file or a built-in gate, e.g. cx or 'rz(pi/4)' (default: identity)")
      .option('--json', 'print one JSON object instead of the report')
      .option('--no-color', 'plain text even on a terminal (NO_COLOR is respected too)')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray channel circuits/channels/tomography-fit.yaml\n' +
          '  fray channel circuits/channels/swap-environment.yaml partial_swap --as stinespring\n' +
          "  fray channel circuits/channels/long-gate.yaml --against 'rx(pi)' --json\n" +
          '\nConventions: Choi matrix input factor first and unnormalised; superoperator on column-stacked\n' +
          'vec(ρ); PTM R_ij = Tr(P_i E(P_j))/d with Paulis I, X, Y, Z and qubit 0 leftmost; Stinespring\n' +
          'V = Σ K_k ⊗ |k⟩ with the environment last. Diamond distances range over [0, 2].',
      )
      .action(async (file: string, name: string | undefined, opts: ChannelCommandOptions) => {
        const { channelCommand } = await import('./channelCommand.js');
        await channelCommand(file, name, opts, io);
      });
    channel.exitOverride();
  }

  if (wanted('compare')) {
    const compare = program
      .command('compare')
      .description('run circuit variants (× devices × layouts) and rank them by a metric')
      .argument('<files...>', 'circuit files (YAML), each a variant')
      .addOption(new Option('--device <file>', 'a device profile instead of each circuit\'s own (repeatable: every circuit runs on every device)').argParser(collect))
      .addOption(new Option('--layout <p0,p1,...>', 'a placement on the device (repeatable: each one a variant)').argParser(collectLayout))
      .option('--by <metric>', 'rank by state (default), classical, tvd, purity, duration or observable:P (|⟨P⟩noisy − ⟨P⟩ideal|)')
      .addOption(new Option('--require <cond>', 'a condition every variant must meet, METRIC OP NUMBER, e.g. state>=0.9 (repeatable; exit status 3 when one fails)').argParser(collect))
      .addOption(new Option('--set <key=value...>', 'override a parameter or profile field in every variant (as in run)'))
      .option('--noise-scale <c>', 'multiply every noise strength by C in every variant', parseNoiseScale)
      .option('--json', 'print one JSON object instead of the table')
      .option('--csv <file>', 'also write the table as CSV')
      .option('--plot <file.svg>', 'also draw the ranking metric per variant as an SVG bar chart')
      .option('--html <file>', 'also write a self-contained HTML report: the verdict, the ranking chart and the ranked table')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray compare circuits/variants/*.yaml\n' +
          '  fray compare circuits/ghz5.yaml --layout 0,1,2,3,4 --layout 4,3,2,1,0 --by classical\n' +
          '  fray compare circuits/qpe3-asap.yaml circuits/qpe3-alap.yaml --require \'state>=0.78\' --json\n' +
          '  fray compare circuits/qpe3-asap.yaml circuits/qpe3-alap.yaml --html compare.html   chart and table in one page\n' +
          '\nHigher is better for state, classical and purity; lower for tvd, duration and observable:P.\n' +
          'Exit status 3 when any variant fails a --require (the table marks it).',
      )
      .action(async (files: string[], opts: Record<string, unknown>) => {
        // each study command loads its modules (plots, worker pools, CSV) only when it runs
        const { compareCommand } = await import('./compareCommand.js');
        exitWith(await compareCommand(files, opts, io));
      });
    compare.exitOverride();
  }

  if (wanted('sweep')) {
    const sweep = program
      .command('sweep')
      .description('run one circuit over a grid of parameter or noise values: CSV/JSONL rows, a plot, shards for batch jobs')
      .argument('<file>', 'circuit file (YAML)')
      .addOption(new Option('--vary <key=range>', 'a key and its values: A..B:N, A..B:log:N or v1,v2,… with units where needed, e.g. qubits.all.t1=20us..200us:log:10, noise-scale=0..3:13 (repeatable: the Cartesian product, first outermost)').argParser(collect))
      .addOption(new Option('--metric <metric>', 'what the table and plot show: state (default), classical, tvd, purity, duration, observable:P (repeatable)').argParser(collect))
      .option('--out <file>', 'write one row per point as it finishes: FILE.csv or FILE.jsonl (each row equals fray run --set … --json)')
      .option('--plot <file.svg>', 'draw the metrics against the varied key (two keys: a heat map of the first metric)')
      .option('--target <cond>', 'draw this condition as a line on the plot, e.g. state>=0.95')
      .option('--html <file>', 'also write a self-contained HTML report: the plot (one or two varied keys) and every point as a table')
      .option('--jobs <n>', "worker threads, whole points each (default: the machine's cores); the output is the same for any n", parsePositiveInt('--jobs'))
      .option('--shard <i/n>', 'compute only points with index ≡ I (mod N) — for batch array jobs; join the parts with fray merge')
      .option('--resume', 'continue --out FILE: skip the points already in it')
      .option('--quiet', 'no progress on stderr')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray sweep circuits/ghz5.yaml --vary noise-scale=0..3:13 --plot scale.svg\n' +
          '  fray sweep circuits/ghz5.yaml --vary gates.cx.error=0.001..0.03:log:12 --out cx.csv --target \'state>=0.9\' --plot cx.svg\n' +
          '  fray sweep circuits/ghz5.yaml --vary qubits.3.t1=10us..100us:8 --vary gates.cx.error=0.002,0.008,0.02 --plot heat.svg\n' +
          '  fray sweep circuits/ghz5.yaml --vary noise-scale=0..3:13 --target \'state>=0.9\' --html sweep.html   plot and table in one page\n' +
          '  fray sweep circuits/ghz5.yaml --vary noise-scale=0..3:100 --out part-$I.csv --shard $I/4   (then: fray merge part-*.csv --out all.csv)\n' +
          '\nKeys are the --set keys (params, qubits.…, gates.…, couplings.…, idle, schedule) and noise-scale. CSV columns: point, the keys in base\n' +
          'units (ns, Hz, probabilities), duration_ns, fidelity_state, fidelity_classical, tvd, purity, observable_<P>_noisy/_ideal.',
      )
      .action(async (file: string, opts: Record<string, unknown>) => {
        const { sweepCommand } = await import('./sweepCommand.js');
        await sweepCommand(file, opts, io);
      });
    // the options shared with run, listed after the command's own
    addTargetOptions(sweep, 'a fixed noise scale (unless noise-scale is varied)');
    sweep.exitOverride();
  }

  if (wanted('merge')) {
    const merge = program
      .command('merge')
      .description("join a sweep's shard files in grid order (refuses parts of other sweeps, missing or doubled points)")
      .argument('<parts...>', 'shard output files (.csv or .jsonl)')
      .requiredOption('--out <file>', 'the whole sweep\'s file')
      .option('--quiet', 'no summary on stderr')
      .addHelpText('after', '\nExample:\n  fray merge part-0.csv part-1.csv part-2.csv part-3.csv --out sweep.csv')
      .action(async (parts: string[], opts: Record<string, unknown>) => {
        const { mergeCommand } = await import('./mergeCommand.js');
        await mergeCommand(parts, opts, io);
      });
    merge.exitOverride();
  }

  if (wanted('threshold')) {
    const threshold = program
      .command('threshold')
      .description('find the value of one key at which a condition is just met (bracketing and bisection)')
      .argument('<file>', 'circuit file (YAML)')
      .requiredOption('--target <cond>', 'the condition, METRIC OP NUMBER, e.g. state>=0.95')
      .requiredOption('--vary <key=a..b>', 'the key and its range, e.g. gates.cx.error=0.0001..0.05, qubits.all.t1=10us..200us, noise-scale=0..5')
      .option('--tol <x>', 'stop when the bracket is this narrow, in the range\'s unit (default: a millionth of the range)')
      .option('--json', 'print one JSON object instead of the report')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray threshold circuits/ghz5.yaml --target \'state>=0.95\' --vary gates.cx.error=0.0001..0.05\n' +
          '  fray threshold circuits/ghz5.yaml --target \'state>=0.9\' --vary noise-scale=0..5 --tol 0.001\n' +
          '  fray threshold circuits/ghz5.yaml --target \'classical>=0.8\' --vary qubits.all.t1=10us..500us --json\n' +
          '\nExit status 3 when the target is met nowhere in the range.',
      )
      .action(async (file: string, opts: Record<string, unknown>) => {
        const { thresholdCommand } = await import('./thresholdCommand.js');
        exitWith(await thresholdCommand(file, opts, io));
      });
    // the options shared with run, listed after the command's own
    addTargetOptions(threshold, 'a fixed noise scale (unless noise-scale is the varied key)');
    threshold.exitOverride();
  }

  if (wanted('budget')) {
    const budget = program
      .command('budget')
      .description('where the infidelity comes from: each noise source alone, each left out, the remainder, per qubit')
      .argument('<file>', 'circuit file (YAML)')
      .option('--by <metric>', 'split the loss of state (default: 1 − F), classical, tvd, purity or observable:P')
      .option('--json', 'print one JSON object instead of the tables')
      .option('--plot <file.svg>', 'draw each source\'s loss as bars')
      .option('--html <file>', 'also write a self-contained HTML report: the bars and every table')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray budget circuits/ghz5.yaml\n' +
          '  fray budget circuits/ghz5.yaml --by classical --plot budget.svg\n' +
          '  fray budget circuits/ghz5.yaml --layout 0,1,2,4,3 --json\n' +
          '  fray budget circuits/ghz5.yaml --html budget.html          bars and tables in one page\n' +
          '\nSources: relaxation (T1) and pure dephasing (T2 beyond T1), each gate name\'s noise kinds (a calibrated\n' +
          "error: counts as the depolarizing it solves to in the full run), each custom channel, steps' own noise,\n" +
          'readout. The remainder is the total minus the single-source losses: the sources\' interaction.',
      )
      .action(async (file: string, opts: Record<string, unknown>) => {
        const { budgetCommand } = await import('./budgetCommand.js');
        await budgetCommand(file, opts, io);
      });
    // the options shared with run, listed after the command's own
    addTargetOptions(budget, 'multiply every noise strength by C first');
    budget.exitOverride();
  }

  if (wanted('mitigate')) {
    const mitigateCmd = addTargetOptions(program
      .command('mitigate')
      .description('apply error mitigation (dynamical decoupling, Pauli twirling, zero-noise extrapolation by folding, readout correction) and compare with the ideal answer')
      .argument('<file>', 'circuit file (YAML)')
      .option('--zne <scales>', 'extrapolate to zero noise from these noise scales, e.g. 1,2,3 (each ≥ 1; the uniform noise scale unless --fold)', parseScales)
      .option('--fit <model>', `extrapolation: ${FIT_KINDS.join(', ')} (default richardson)`)
      .option('--fold [order]', 'amplify --zne by unitary folding instead; fractional scales fold the last gates once more (end, default) or random ones')
      .option('--twirl [instances]', 'Pauli-twirl the 2-qubit Clifford gates: exactly, or averaged over this many seeded random instances', parseInstances)
      .option('--seed <s>', 'seed of --fold random and of --twirl instances (default 1)', parseSeed)
      .option('--readout <method>', `correct the readout: ${READOUT_METHODS.join(', ')}`)
      .option('--dd <sequence>', `fill idle windows with a decoupling sequence first: ${DECOUPLING_SEQUENCES.join(', ')}`)
      .option('--min-idle <duration>', 'shortest idle window --dd fills, e.g. 200ns (default: every window its pulses fit in)')
      .addOption(new Option('--observe <pauli...>', 'observables to extrapolate, qubit 0 leftmost (repeatable or comma-separated), besides the circuit\'s observe:'))
      .option('--json', 'print one JSON object instead of the tables')
      .option('--html <file>', 'also write a self-contained HTML report: observables and distributions as bars and tables')
      .option('--threads <n>', 'threads sharing each pass on 9+ qubits (default: the machine\'s cores; 1 = off)', parseThreads)
      .option('--no-color', 'plain text even on a terminal (NO_COLOR is respected too)')
      .addHelpText(
        'after',
        '\nExamples:\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --zne 1,2,3 --fit richardson --observe ZZII\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --zne 1,3,5 --fold            as a device would\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --zne 1,1.5,2 --fold random --seed 4 --fit linear\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --readout bounded --json\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --zne 1,3,5 --fold --readout bounded --html mitigate.html\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --dd xy4 --min-idle 200ns --zne 1,3,5 --fold\n' +
          '  fray mitigate circuits/mitigation/ghz-line.yaml --twirl 50 --seed 2 --zne 1,3,5 --fold --fit exponential\n' +
          '\nThe noise scale multiplies every noise strength (as --noise-scale does). Folding turns each gate G into\n' +
          'G (G†G)^k, G† taking G\'s profile entry (duration and noise); the ideal run is unchanged.\n' +
          'See docs/mitigation.md for the fits and the readout correction.',
      ), 'multiply every noise strength by C ≥ 0 before mitigating (the device as run; folding scales on top)')
      .action(async (file: string, opts: Record<string, unknown>) => {
        const { mitigateCommand } = await import('./mitigateCommand.js');
        await mitigateCommand(file, opts, io);
      });
    mitigateCmd.exitOverride();
  }

  if (wanted('check')) {
    const checkCmd = addTargetOptions(
      program
        .command('check')
        .description("evaluate every file's expect: conditions (and a baseline of all figures) for CI: exit 0 all hold, 3 any fails")
        .argument('<files...>', 'circuit files (YAML) with expect: blocks')
        .option('--json', 'print one JSON object instead of the table')
        .option('--junit <file>', 'also write JUnit XML (one test case per expectation) to this file')
        .option('--baseline <file>', 'also fail every figure that moved from this baseline by more than --tolerance')
        .option('--write-baseline <file>', 'write every figure of this run as a baseline')
        .option('--tolerance <x>', 'largest absolute move from the baseline that passes (default 1e-9)')
        .option('--html <file>', 'also write a self-contained HTML report: the verdict, the values as bars, every expectation as a table')
        .option('--no-color', 'plain text even on a terminal (NO_COLOR is respected too)')
        .addHelpText(
          'after',
          '\nExamples:\n' +
            '  fray check circuits/mitigation/ghz-line.yaml\n' +
            '  fray check circuits/mitigation/*.yaml --junit check.xml --baseline base.json --tolerance 1e-6\n' +
            '  fray check circuits/mitigation/ghz-line.yaml --write-baseline base.json\n' +
            '  fray check circuits/mitigation/*.yaml --html check.html\n' +
            "\nConditions: METRIC OP NUMBER as for compare --require, and mitigated.observable:P, mitigated.tvd,\n" +
            "mitigated.classical after the file's mitigation: recipe. A file with no expect: is reported, not passed.\n" +
            'Exit status: 0 all hold, 3 any fails (or a file checks nothing), 2 input error.',
        ),
      'multiply every noise strength by C ≥ 0 in every file checked',
    ).action(async (files: string[], opts: Record<string, unknown>) => {
      const { checkCommand } = await import('./checkCommand.js');
      exitWith(await checkCommand(files, opts, io));
    });
    checkCmd.exitOverride();
  }

  if (wanted('transform')) {
    const transformCmd = addTargetOptions(
      program
        .command('transform')
        .description('write a transformed circuit file: dynamical decoupling inserted, or gates folded (what fray mitigate runs)')
        .argument('<file>', 'circuit file (YAML)')
        .option('--dd <sequence>', `fill idle windows with a decoupling sequence: ${DECOUPLING_SEQUENCES.join(', ')}`)
        .option('--min-idle <duration>', 'shortest idle window --dd fills, e.g. 200ns (default: every window its pulses fit in)')
        .option('--fold <scale>', 'fold the gates to this noise scale (G -> G (G†G)^k, fractional by the last gates)')
        .option('--order <order>', 'which gates fold once more for a fractional --fold: end (default) or random')
        .option('--seed <s>', 'seed of --order random (default 1)', parseSeed)
        .option('--out <file>', 'write the new circuit here (default: standard output)')
        .addHelpText(
          'after',
          '\nExamples:\n' +
            '  fray transform circuits/mitigation/ghz-line.yaml --dd xy4 --min-idle 200ns --out ghz-dd.yaml\n' +
            '  fray transform circuits/ghz5.yaml --fold 3\n' +
            '\nThe new file keeps every section of the old one but its steps, with a header comment saying what\n' +
            "was inserted where. Steps with their own noise: cannot be written yet (run fray mitigate instead).",
        ),
      'multiply every noise strength by C ≥ 0 when scheduling (it changes no durations)',
    ).action(async (file: string, opts: Record<string, unknown>) => {
      const { transformCommand } = await import('./transformCommand.js');
      await transformCommand(file, opts, io);
    });
    transformCmd.exitOverride();
  }
  if (wanted('convert') || wanted('export')) addFormatCommands(program, io);

  if (wanted('schema')) {
    program
      .command('schema')
      .description('print the JSON Schema of a file kind, for editors that complete keys and flag typos as you type')
      .argument('<kind>', 'circuit, profile (a device file) or channels (a channel file of fray channel)')
      .addHelpText('after', '\nExample:\n  fray schema circuit > circuit.schema.json\n\nThe same schemas ship as docs/schemas/*.schema.json; docs/editors.md shows how to use them.')
      .action(async (kind: string) => {
        const { schemaCommand } = await import('./schemaCommand.js');
        schemaCommand(kind, io);
      })
      .exitOverride();
  }
  return program;
}

/** --shots: a whole number from 1 to 2^53 (MAX_SHOTS) in any integer notation of parseWholeNumber, e.g. 1e6. */
function parseShots(v: string): number {
  const n = parseWholeNumber(v);
  if (n === undefined || n < 1n || n > BigInt(MAX_SHOTS)) {
    throw new UsageError(`--shots ${v}: expected a whole number of shots from 1 to 2^53, e.g. 1000, 1e6 or 0x100000`);
  }
  return Number(n);
}

function parseSeed(v: string): number {
  const n = Number(v);
  if (!/^-?\d+$/.test(v) || !Number.isSafeInteger(n)) throw new UsageError(`--seed ${v}: expected a whole number`);
  return n;
}

/** Most threads --threads accepts: each is a worker with its own heap, started at once. */
export const MAX_THREADS = 256;

function parseThreads(v: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v) || !Number.isSafeInteger(n) || n < 1 || n > MAX_THREADS) {
    throw new UsageError(`--threads ${v}: expected a whole number of threads from 1 to ${MAX_THREADS}`);
  }
  return n;
}

function parseTop(v: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v) || n < 1) throw new UsageError(`--top ${v}: expected a whole number, 1 or more`);
  return n;
}
