import { readFileSync } from 'node:fs';
import { evaluateReal, RESERVED_NAMES } from '../circuit/expression.js';
import { suggest } from '../circuit/suggest.js';
import { Channel } from '../channels/channel.js';
import { CHANNEL_FORMS, type ChannelForm } from '../channels/conventions.js';
import type { MetricsTarget } from '../channels/metrics.js';
import { readChannelDefinitions, type ChannelDefinition } from '../format/channelDefinitions.js';
import { CIRCUIT_KEYS } from '../format/circuitFile.js';
import { parseGateCall } from '../format/gateCall.js';
import { fileStart, InputError, ProblemList } from '../format/problem.js';
import { asMap, checkKeys, entryOf, offsetInto } from '../format/read.js';
import { describe, parseYamlTree, type YNode } from '../format/yamlTree.js';
import { buildChannelReport, channelReportJson, renderChannelReport, REPORT_DIGITS, ZERO_BELOW } from './channelReport.js';
import { toJson } from '../results/json.js';
import { UsageError, type CliIO } from './main.js';
import { makeStyle, wantColor } from './style.js';

/** Options of `fray channel` as commander hands them over. */
export interface ChannelCommandOptions {
  readonly as?: string;
  readonly against?: string;
  readonly json?: boolean;
  readonly color?: boolean;
}

/** Reads a channel file (a `channels:` map, optionally `name:` and `params:`; a circuit file works too) into its definitions. */
export function readChannelFile(text: string, file: string): Map<string, ChannelDefinition> {
  const problems = new ProblemList();
  const root = parseYamlTree(text, file, problems);
  let defs = new Map<string, ChannelDefinition>();
  if (root !== undefined) {
    const map = asMap(root, 'a channel file', problems);
    if (map !== undefined) {
      checkKeys(map, CIRCUIT_KEYS, 'the channel file', problems);
      const env = readParams(entryOf(map, 'params')?.value, problems);
      const ce = entryOf(map, 'channels');
      if (ce === undefined) problems.error(fileStart(file), 'missing-key', "the file has no 'channels:' map of channel definitions");
      else {
        defs = readChannelDefinitions(ce.value, env, problems);
        if (problems.ok && defs.size === 0) problems.error(ce.value.at, 'bad-channel', "'channels' defines no channel");
      }
    }
  }
  problems.throwIfErrors();
  return defs;
}

/** `params:` as numbers or expressions of the params above them (the circuit format's rule). */
function readParams(node: YNode | undefined, problems: ProblemList): Record<string, number> {
  const params: Record<string, number> = Object.create(null) as Record<string, number>;
  if (node === undefined) return params;
  const map = asMap(node, "'params'", problems);
  if (map === undefined) return params;
  for (const e of map.entries) {
    if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(e.key) || RESERVED_NAMES.includes(e.key)) {
      problems.error(e.keyAt, 'bad-param-name', `parameter name '${e.key}' must be a word other than ${RESERVED_NAMES.join(', ')}`);
      continue;
    }
    const v = e.value;
    if (v.kind === 'scalar' && typeof v.value === 'number' && Number.isFinite(v.value)) params[e.key] = v.value;
    else if (v.kind === 'scalar' && typeof v.value === 'string') {
      const r = evaluateReal(v.value, params);
      if ('error' in r) problems.error(offsetInto(v, r.error.offset), 'bad-param', `parameter '${e.key}': ${r.error.message}`);
      else params[e.key] = r.value;
    } else problems.error(v.at, 'bad-param', `parameter '${e.key}' must be a number or an expression, not ${describe(v)}`);
  }
  return { ...params };
}

function readText(file: string): string {
  try {
    return readFileSync(file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message);
    const problems = new ProblemList();
    problems.error(fileStart(file), 'cannot-read', `cannot read channel file '${file}': ${why}`);
    throw new InputError(problems.errors);
  }
}

/** The --against target: a channel of the file by name, else a built-in gate call such as cx or rz(pi/4). */
function resolveTarget(text: string, defs: ReadonlyMap<string, ChannelDefinition>, file: string): MetricsTarget {
  const own = defs.get(text);
  if (own !== undefined) return { label: `channel '${text}'`, channel: own.channel };
  const g = parseGateCall(text, {});
  if ('error' in g) {
    const near = suggest(text, [...defs.keys()]);
    const hint = near !== undefined ? ` (did you mean the channel '${near}'?)` : '';
    throw new UsageError(`--against ${text}: not a channel of ${file} nor a built-in gate: ${g.error}${hint}`);
  }
  return { label: `gate ${text.trim()}`, channel: Channel.fromUnitary(g.matrix) };
}

/** `fray channel FILE [NAME]`: physicality, minimal Kraus form, metrics (and a representation) of each channel of a file. */
export async function channelCommand(file: string, name: string | undefined, opts: ChannelCommandOptions, io: CliIO): Promise<void> {
  let as: ChannelForm | undefined;
  if (opts.as !== undefined) {
    if (!(CHANNEL_FORMS as readonly string[]).includes(opts.as)) {
      const near = suggest(opts.as, CHANNEL_FORMS);
      throw new UsageError(`--as ${opts.as}: expected one of ${CHANNEL_FORMS.join(', ')}${near !== undefined ? `; did you mean '${near}'?` : ''}`);
    }
    as = opts.as as ChannelForm;
  }
  const defs = readChannelFile(readText(file), file);
  let chosen = [...defs.values()];
  if (name !== undefined) {
    const def = defs.get(name);
    if (def === undefined) {
      const near = suggest(name, [...defs.keys()]);
      throw new UsageError(`${file} has no channel '${name}'${near !== undefined ? `; did you mean '${near}'?` : `; it has: ${[...defs.keys()].join(', ')}`}`);
    }
    chosen = [def];
  }
  const target = opts.against === undefined ? undefined : resolveTarget(opts.against, defs, file);
  const reports = chosen.map((def) => buildChannelReport(def, target, as));
  if (opts.json) {
    io.stdout.write(toJson({ file, zeroBelow: ZERO_BELOW, channels: reports.map(channelReportJson) }) + '\n');
    return;
  }
  const color = wantColor(process.stdout, opts.color !== false) && io.stdout === process.stdout;
  const style = makeStyle(color);
  const text = reports.map((r) => renderChannelReport(r, style)).join('\n');
  io.stdout.write(text + style.dim(`\n(${REPORT_DIGITS} significant digits; matrix entries below ${ZERO_BELOW} print as 0)\n`));
}
