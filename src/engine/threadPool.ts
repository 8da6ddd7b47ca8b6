/**
 * A reusable pool of worker threads that split each pass over a shared density matrix with
 * the main thread (see ./partition.ts for who owns which rows). The main thread hands out a
 * kernel call by bumping a generation counter in a shared control block (./threadControl.ts),
 * runs its own part, then blocks until every worker reported done, so a whole run stays
 * synchronous. Workers are unref'd: they never keep the process alive.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { MessageChannel, Worker, type MessagePort } from 'node:worker_threads';
import { runCalls } from './kernelCall.js';
import { shareView } from './sharedView.js';
import {
  CMD_ATTACH,
  CMD_DETACH,
  CMD_QUIT,
  CMD_RUN,
  CTRL_AT,
  CTRL_CMD,
  CTRL_COUNT,
  CTRL_DONE,
  CTRL_ERROR,
  CTRL_GEN,
  CTRL_N,
  CTRL_PARTS,
  CTRL_READY,
  CTRL_SLOTS,
} from './threadControl.js';
import { bindWasm, type WasmBinding, type WasmRegisterHandle } from './wasmKernels.js';

/** How long (ms) the pool waits for its workers to start and warm up before running single-threaded. */
export const WORKER_START_TIMEOUT_MS = 20_000;

/** The default number of threads: the machine's available parallelism (os.availableParallelism()). */
export function defaultThreads(): number {
  return Math.max(1, availableParallelism());
}

/** The compiled worker script: next to this module when running from dist/, else dist/engine/ of the project (running from sources). */
function workerScript(): URL | undefined {
  const sibling = new URL('./threadWorker.js', import.meta.url);
  if (existsSync(fileURLToPath(sibling))) return sibling;
  const dist = new URL('../../dist/engine/threadWorker.js', import.meta.url);
  return existsSync(fileURLToPath(dist)) ? dist : undefined;
}

/** Worker threads plus the main thread, splitting every kernel call into `parts` parts. */
export class ThreadPool {
  private readonly ctrl: Int32Array;
  private readonly workers: Worker[] = [];
  private readonly ports: MessagePort[] = [];
  private attached: { data: Float64Array; arena: Float64Array; words: Int32Array; wasm: WasmBinding | undefined } | undefined;
  /** Number of parts a pass is split into: the workers that started plus the main thread (final after ready()). */
  parts = 1;
  private pending = 0;
  /** Why the pool runs with fewer threads than asked, if it does. */
  note: string | undefined;

  /**
   * Starts threads − 1 workers without waiting for them (they boot, and warm up the JS kernels
   * when `warmJs`, else the WebAssembly ones, while the caller goes on); the first attach() waits. Falls back to 1 thread
   * when they cannot start.
   */
  constructor(
    readonly threads: number,
    warmJs = true,
  ) {
    this.ctrl = new Int32Array(new SharedArrayBuffer(4 * CTRL_SLOTS));
    const want = Math.max(0, Math.floor(threads) - 1);
    if (want === 0) return;
    const script = workerScript();
    if (script === undefined) {
      this.note = 'the compiled worker script (dist/engine/threadWorker.js) is missing; run `npm run build`';
      return;
    }
    for (let i = 0; i < want; i++) {
      const { port1, port2 } = new MessageChannel();
      const w = new Worker(script, { workerData: { ctrl: this.ctrl.buffer, part: i + 1, port: port2, warmJs }, transferList: [port2] });
      w.unref();
      port1.unref();
      w.on('error', () => undefined);
      this.workers.push(w);
      this.ports.push(port1);
    }
    this.pending = want;
  }

  /** Blocks until the workers started (at most WORKER_START_TIMEOUT_MS); afterwards `parts` is final. Idempotent. */
  ready(): void {
    const want = this.pending;
    if (want === 0) return;
    const deadline = Date.now() + WORKER_START_TIMEOUT_MS;
    let ready: number;
    while ((ready = Atomics.load(this.ctrl, CTRL_READY)) < want) {
      const left = deadline - Date.now();
      if (left <= 0) break;
      Atomics.wait(this.ctrl, CTRL_READY, ready, left);
    }
    if (!this.started()) {
      this.note = `worker threads did not start within ${WORKER_START_TIMEOUT_MS} ms`;
      this.close();
    }
  }

  /**
   * Non-blocking ready(): true once every worker has started and warmed up (then `parts` is
   * final, as after ready()), false while some are still booting. applyCompiled runs the first
   * passes on the main thread alone until this turns true, instead of waiting for the workers.
   */
  tryReady(): boolean {
    return this.started();
  }

  /** Whether every worker has reported ready; the first time they all have, `parts` becomes final. */
  private started(): boolean {
    const want = this.pending;
    if (want === 0) return true;
    if (Atomics.load(this.ctrl, CTRL_READY) < want) return false;
    this.pending = 0;
    this.parts = want + 1;
    return true;
  }

  /**
   * The threads this pool splits passes over: `parts` once the workers are ready (or have
   * failed), and while they are still starting the threads they will make (what a run reports
   * as its threads, the same however fast the workers started).
   */
  get splitThreads(): number {
    return this.started() ? this.parts : this.pending + 1;
  }

  /** Number of worker threads (parts − 1). */
  get workerCount(): number {
    return this.parts - 1;
  }

  /**
   * Hands the shared register, arena and words to the workers (all three must be
   * SharedArrayBuffer-backed); with `wasm` (the register's WebAssembly memory, arena loaded)
   * every thread runs the real-form calls on the WebAssembly kernels.
   */
  attach(data: Float64Array, arena: Float64Array, words: Int32Array, wasm?: WasmRegisterHandle): void {
    this.ready();
    if (this.parts === 1) return;
    const a = this.attached;
    if (a !== undefined && a.data === data && a.arena === arena && a.words === words) return;
    // the buffers, not the views: a posted view over ≥ 4 GiB arrives with a wrong length (./sharedView.ts)
    const message = { data: shareView(data), arena: shareView(arena), words: shareView(words), wasm };
    for (const p of this.ports) p.postMessage(message);
    this.command(CMD_ATTACH);
    this.attached = { data, arena, words, wasm: wasm !== undefined ? bindWasm(wasm) : undefined };
  }

  /**
   * Runs the attached call at words[at] on the n-qubit attached register, split over every
   * thread; with `count` > 1 the `count` consecutive calls from there, each thread going through
   * all of them on its own rows before the threads meet (only for runs of row-local calls,
   * rowLocalCall in ./kernelCall.ts: no thread reads rows another one writes).
   */
  run(n: number, at: number, count = 1): void {
    const a = this.attached;
    if (a === undefined) throw new Error('ThreadPool.run: nothing attached');
    const ctrl = this.ctrl;
    ctrl[CTRL_N] = n;
    ctrl[CTRL_AT] = at;
    ctrl[CTRL_COUNT] = count;
    ctrl[CTRL_PARTS] = this.parts;
    this.start(CMD_RUN);
    let mainError: unknown;
    try {
      runCalls(a.data, n, a.words, at, count, a.arena, 0, this.parts, a.wasm);
    } catch (e) {
      mainError = e;
    }
    this.finish();
    if (mainError !== undefined) throw mainError;
  }

  /** Drops the references to the last attached buffers (so a finished run's ρ can be collected). */
  detach(): void {
    if (this.attached === undefined) return;
    this.attached = undefined;
    if (this.parts > 1) this.command(CMD_DETACH);
  }

  /** Stops the workers; the pool then runs single-threaded. */
  close(): void {
    this.pending = 0;
    if (this.workers.length > 0) {
      this.ctrl[CTRL_CMD] = CMD_QUIT;
      Atomics.add(this.ctrl, CTRL_GEN, 1);
      Atomics.notify(this.ctrl, CTRL_GEN);
    }
    for (const w of this.workers) void w.terminate();
    for (const p of this.ports) p.close();
    this.workers.length = 0;
    this.ports.length = 0;
    this.parts = 1;
    this.attached = undefined;
  }

  private start(cmd: number): void {
    const ctrl = this.ctrl;
    ctrl[CTRL_CMD] = cmd;
    Atomics.store(ctrl, CTRL_DONE, 0);
    Atomics.add(ctrl, CTRL_GEN, 1);
    Atomics.notify(ctrl, CTRL_GEN);
  }

  private finish(): void {
    const ctrl = this.ctrl;
    const want = this.parts - 1;
    let done: number;
    while ((done = Atomics.load(ctrl, CTRL_DONE)) < want) Atomics.wait(ctrl, CTRL_DONE, done);
    if (Atomics.exchange(ctrl, CTRL_ERROR, 0) !== 0) throw new Error('a worker thread failed while running a kernel');
  }

  private command(cmd: number): void {
    this.start(cmd);
    this.finish();
  }
}

let shared: ThreadPool | undefined;

/**
 * The process-wide pool for `threads` threads (created on first use, replaced when the count
 * changes; reusable across runs); a new pool's workers warm the JS kernels when `warmJs`, else the WebAssembly ones.
 */
export function sharedThreadPool(threads: number, warmJs = true): ThreadPool {
  if (shared !== undefined && shared.threads === threads) return shared;
  shared?.close();
  shared = new ThreadPool(threads, warmJs);
  return shared;
}

/** Stops the process-wide pool, if any (workers are unref'd, so this is optional before exit). */
export function closeSharedThreadPool(): void {
  shared?.close();
  shared = undefined;
}
