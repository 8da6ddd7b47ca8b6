import { planFile, simulate } from '../api/simulate.js';
import { formatPlan, formatRecordPlan, planToJson, recordPlanToJson } from '../plan/formatPlan.js';
import { parseByteSize } from '../engine/memory.js';
import type { KernelFamily } from '../engine/wasmKernels.js';
import { renderRunReport } from './runReport.js';
import { toJson } from '../results/json.js';
import { runJson } from './runJson.js';
import { makeStyle, wantColor } from './style.js';
import { UsageError, VERSION, type CliIO } from './main.js';
import { parseObserveOptions, parseSetOptions } from './options.js';

/** `fray run FILE`: parses the options, runs the simulation, writes the report or JSON in one piece. */
export async function runCommand(file: string, opts: Record<string, unknown>, io: CliIO): Promise<void> {
  const set = parseSetOptions(opts['set']);
  if (opts['device'] !== undefined && String(opts['device']).trim() === '') throw new UsageError('--device: expected the path of a noise profile file');
  const observe = parseObserveOptions(opts['observe']);
  let maxMemoryBytes: number | undefined;
  if (opts['maxMemory'] !== undefined) {
    maxMemoryBytes = parseByteSize(String(opts['maxMemory']));
    if (maxMemoryBytes === undefined) throw new UsageError(`--max-memory ${String(opts['maxMemory'])}: expected a size such as 512MiB, 2GiB or 1.5GB`);
  }
  const options = {
    set,
    ...(opts['device'] !== undefined ? { device: String(opts['device']) } : {}),
    observe,
    ...(opts['shots'] !== undefined ? { shots: opts['shots'] as number } : {}),
    ...(opts['seed'] !== undefined ? { seed: opts['seed'] as number } : {}),
    ...(maxMemoryBytes !== undefined ? { maxMemoryBytes } : {}),
    ...(opts['threads'] !== undefined ? { threads: opts['threads'] as number } : {}),
    ...(opts['noiseScale'] !== undefined ? { noiseScale: opts['noiseScale'] as number } : {}),
    ...(opts['layout'] !== undefined ? { layout: opts['layout'] as number[] } : {}),
    fuse: opts['fuse'] !== false,
    ...(opts['kernels'] !== undefined ? { kernelFamily: opts['kernels'] as KernelFamily } : {}),
  };
  const html = opts['html'] as string | undefined;
  if (html !== undefined && opts['plan'] === true) throw new UsageError('--html draws a run; --plan does not run the circuit: give one of them');
  if (opts['plan'] === true) {
    const planned = planFile(file, options);
    if (planned.segments !== undefined) {
      const bits = planned.bits ?? [];
      io.stdout.write(opts['json'] ? toJson(recordPlanToJson(planned.segments, bits)) + '\n' : formatRecordPlan(planned.segments, bits));
      return;
    }
    const origins = planned.program.origins;
    io.stdout.write(opts['json'] ? toJson(planToJson(planned.plan, origins, planned.kernels)) + '\n' : formatPlan(planned.plan, origins, planned.kernels));
    return;
  }
  const sim = simulate(file, options);
  if (opts['html'] !== undefined) {
    // the page's modules load only when asked for
    const [{ writeHtmlReport }, { runPage }] = await Promise.all([import('./htmlReport.js'), import('../html/index.js')]);
    await writeHtmlReport(opts, io, () => runPage(sim, { top: opts['top'] as number, version: VERSION }));
  }
  if (opts['json']) {
    io.stdout.write(toJson(runJson(sim, { showSchedule: opts['schedule'] === true, showState: opts['state'] === true })) + '\n');
    return;
  }
  const color = wantColor(process.stdout, opts['color'] !== false) && io.stdout === process.stdout;
  const text = renderRunReport(sim, { top: opts['top'] as number, showState: opts['state'] === true, showSchedule: opts['schedule'] === true }, makeStyle(color));
  io.stdout.write(text);
}
