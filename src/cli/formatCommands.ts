import { existsSync, writeFileSync } from 'node:fs';
import type { Command } from 'commander';
import type { Converted } from '../api/convert.js';
import { formatProblem } from '../format/problem.js';
import { UsageError, type CliIO } from './main.js';

/** `fray convert` and `fray export`: circuits between YAML and OpenQASM (src/api/convert.ts). */
export function addFormatCommands(program: Command, io: CliIO): void {
  program
    .command('convert')
    .description('write an OpenQASM program as a YAML circuit file (to annotate it with noise)')
    .argument('<file>', 'OpenQASM 2.0 or 3 program (.qasm)')
    .option('--out <file>', 'write the YAML here instead of to standard output')
    .option('--force', 'overwrite the --out file if it exists')
    .addHelpText('after', '\nExamples:\n  fray convert circuits/qasm/qft4.qasm --out qft4.yaml\n')
    .action(async (file: string, opts: { out?: string; force?: boolean }) => {
      const { convertToYaml } = await import('../api/convert.js');
      emit(convertToYaml(file), opts, io);
    })
    .exitOverride();

  program
    .command('export')
    .description('write a circuit file as an OpenQASM 2.0 or 3 program')
    .argument('<file>', 'circuit file (YAML or .qasm)')
    .requiredOption('--qasm <version>', 'OpenQASM version: 2 or 3', parseVersion)
    .option('--out <file>', 'write the program here instead of to standard output')
    .option('--force', 'overwrite the --out file if it exists')
    .option('--device <file>', "noise profile named in the header comment instead of the circuit's 'device:'")
    .addHelpText('after', '\nExamples:\n  fray export circuits/ghz5.yaml --qasm 3\n  fray export circuits/qpe3-asap.yaml --qasm 2 --out qpe3.qasm\n\nNoise is not part of OpenQASM: the header comment names the profile; noise steps are dropped with a warning.\n')
    .action(async (file: string, opts: { qasm: 2 | 3; out?: string; force?: boolean; device?: string }) => {
      const { exportQasm } = await import('../api/convert.js');
      emit(exportQasm(file, opts.qasm, opts.device !== undefined ? { device: opts.device } : {}), opts, io);
    })
    .exitOverride();
}

function parseVersion(v: string): 2 | 3 {
  if (v === '2' || v === '2.0') return 2;
  if (v === '3' || v === '3.0') return 3;
  throw new UsageError(`--qasm ${v}: expected 2 or 3`);
}

/** Writes the converted text (whole, after success) and its warnings on standard error. */
function emit(c: Converted, opts: { out?: string; force?: boolean }, io: CliIO): void {
  for (const w of c.warnings) io.stderr.write(`${formatProblem(w)}\n`);
  if (opts.out === undefined) {
    io.stdout.write(c.text);
    return;
  }
  if (existsSync(opts.out) && opts.force !== true) throw new UsageError(`--out ${opts.out}: the file exists; add --force to overwrite it`);
  writeFileSync(opts.out, c.text);
  io.stderr.write(`wrote ${opts.out}\n`);
}
