import { Command, CommanderError, Option } from 'commander';
import { InputError } from '../format/problem.js';
import { runCommand } from './runCommand.js';
import { channelCommand, type ChannelCommandOptions } from './channelCommand.js';
import { schemaCommand } from './schemaCommand.js';
import { makeStyle, wantColor } from './style.js';
import { renderProblems } from './problems.js';

/** Exit statuses of the fray command (the contract's): success, internal error, input error. */
export const EXIT = { ok: 0, internal: 1, input: 2 } as const;

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
  const program = buildProgram(io);
  try {
    await program.parseAsync([...argv], { from: 'user' });
    return EXIT.ok;
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

function buildProgram(io: CliIO): Command {
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
        '\nExit status: 0 success, 2 input error (FILE:LINE:COL: message), 1 internal error.',
    );

  const run = program
    .command('run')
    .description('simulate one circuit file: ideal and noisy runs, fidelities, outcome table')
    .argument('<file>', 'circuit file (YAML)')
    .option('--json', 'print one JSON object instead of the report')
    .option('--device <file>', "noise profile to use instead of the circuit's 'device:'")
    .addOption(new Option('--set <name=value...>', 'override a circuit parameter (repeatable), e.g. --set theta=0.4 --set "phi=pi/8"'))
    .option('--shots <n>', 'also sample this many shots from the measured distribution', parseShots)
    .option('--seed <s>', 'seed of the shot sampler (default 1); the same seed gives the same counts everywhere', parseSeed)
    .addOption(new Option('--observe <pauli...>', 'report ⟨P⟩ for Pauli strings, qubit 0 leftmost (repeatable or comma-separated), e.g. --observe ZZI,XXX'))
    .option('--top <k>', 'how many outcomes the report lists (default 8)', parseTop, 8)
    .option('--state', 'print per-qubit Bloch vectors (and ρ for up to 3 qubits)')
    .option('--schedule', 'print the time schedule, idle windows and drift (detuning, zz) per qubit and pair')
    .option('--html <file>', 'also write a self-contained HTML report: schedule timeline, outcome bars, Bloch lengths, observables')
    .option('--max-memory <size>', 'refuse runs needing more memory than this, e.g. 2GiB (default: half the machine)')
    .option('--plan', 'print the plan of kernel calls (what is fused into each pass over the density matrix) instead of running')
    .option('--threads <n>', 'threads sharing each pass on 9+ qubits (default: the machine\'s cores; 1 = off)', parseThreads)
    .option('--no-fuse', 'apply every gate and channel as its own pass (slower; for comparison)')
    .option('--no-color', 'plain text even on a terminal (NO_COLOR is respected too)')
    .addHelpText(
      'after',
      '\nExamples:\n' +
        '  fray run circuits/ghz5.yaml\n' +
        '  fray run circuits/ghz5.yaml --device circuits/devices/bench-line5.yaml --top 4\n' +
        '  fray run circuits/ramsey-echo.yaml --set detune=0.025 --schedule\n' +
        '  fray run circuits/ghz5.yaml --shots 1000 --seed 7 --observe ZZIII,XXXXX --json\n' +
        '  fray run circuits/qpe3-asap.yaml --html report.html   the timeline and charts in one page\n' +
        '  fray run circuits/bench/layers10x20.yaml --plan      what each pass over ρ fuses\n' +
        '  fray run circuits/bench/layers10x20.yaml --threads 1 one thread (or --no-fuse: one pass per operation)\n' +
        '\nReport figures: state fidelity is Uhlmann–Jozsa, squared; classical fidelity and total\n' +
        'variation distance compare ideal probabilities with measured ones (readout error included).',
    )
    .action(async (file: string, opts: Record<string, unknown>) => {
      await runCommand(file, opts, io);
    });
  run.exitOverride();

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
      await channelCommand(file, name, opts, io);
    });
  channel.exitOverride();

  program
    .command('schema')
    .description('print the JSON Schema of a file kind, for editors that complete keys and flag typos as you type')
    .argument('<kind>', 'circuit, profile (a device file) or channels (a channel file of fray channel)')
    .addHelpText('after', '\nExample:\n  fray schema circuit > circuit.schema.json\n\nThe same schemas ship as docs/schemas/*.schema.json; docs/editors.md shows how to use them.')
    .action((kind: string) => schemaCommand(kind, io))
    .exitOverride();
  return program;
}

function parseShots(v: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v) || !Number.isSafeInteger(n) || n < 1) throw new UsageError(`--shots ${v}: expected a whole number of shots, 1 or more`);
  return n;
}

function parseSeed(v: string): number {
  const n = Number(v);
  if (!/^-?\d+$/.test(v) || !Number.isSafeInteger(n)) throw new UsageError(`--seed ${v}: expected a whole number`);
  return n;
}

function parseThreads(v: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v) || !Number.isSafeInteger(n) || n < 1) throw new UsageError(`--threads ${v}: expected a whole number of threads, 1 or more`);
  return n;
}

function parseTop(v: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v) || n < 1) throw new UsageError(`--top ${v}: expected a whole number, 1 or more`);
  return n;
}
