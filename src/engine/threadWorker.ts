/**
 * Entry point of a worker thread of ./threadPool.ts: warms its JS or WebAssembly kernels, reports
 * ready, then blocks on the control block and executes its part of each kernel call on the
 * shared ρ — on the WebAssembly kernels when the attached register lives in WebAssembly memory.
 */
import { receiveMessageOnPort, workerData, type MessagePort } from 'node:worker_threads';
import { runCalls } from './kernelCall.js';
import {
  CMD_ATTACH,
  CMD_DETACH,
  CMD_QUIT,
  CTRL_AT,
  CTRL_CMD,
  CTRL_COUNT,
  CTRL_DONE,
  CTRL_ERROR,
  CTRL_GEN,
  CTRL_N,
  CTRL_PARTS,
  CTRL_READY,
} from './threadControl.js';
import { awaitOptimisedKernels, warmKernels } from './warmKernels.js';
import { bindWasm, warmWasmKernels, type WasmBinding, type WasmRegisterHandle } from './wasmKernels.js';
import { openFloat64View, openInt32View, type SharedViewMessage } from './sharedView.js';

/** The buffers a worker works on, as posted by ThreadPool.attach (./sharedView.ts says why not as views). */
interface AttachMessage {
  readonly data: SharedViewMessage;
  readonly arena: SharedViewMessage;
  readonly words: SharedViewMessage;
  readonly wasm?: WasmRegisterHandle;
}

/** The views a worker works on, rebuilt from an AttachMessage with their lengths checked. */
interface Attachment {
  readonly data: Float64Array;
  readonly arena: Float64Array;
  readonly words: Int32Array;
  readonly wasm?: WasmRegisterHandle;
}

function workerLoop(): void {
  const ctrl = new Int32Array(workerData.ctrl as SharedArrayBuffer);
  const part = workerData.part as number;
  const port = workerData.port as MessagePort;
  // the kernels compile while the main thread reads and plans the circuit
  if (workerData.warmJs !== false) warmKernels();
  else warmWasmKernels();
  Atomics.add(ctrl, CTRL_READY, 1);
  Atomics.notify(ctrl, CTRL_READY);
  let current: Attachment | undefined;
  let wasm: WasmBinding | undefined;
  let gen = 0;
  for (;;) {
    Atomics.wait(ctrl, CTRL_GEN, gen);
    gen = Atomics.load(ctrl, CTRL_GEN);
    const cmd = ctrl[CTRL_CMD]!;
    if (cmd === CMD_QUIT) break;
    try {
      if (cmd === CMD_ATTACH) {
        const msg = receiveMessageOnPort(port);
        const posted = msg?.message as AttachMessage | undefined;
        current = undefined;
        if (posted === undefined) throw new Error('no attachment posted');
        current = {
          data: openFloat64View(posted.data, 'the density matrix'),
          arena: openFloat64View(posted.arena, 'the arena'),
          words: openInt32View(posted.words, 'the call words'),
          ...(posted.wasm !== undefined ? { wasm: posted.wasm } : {}),
        };
        wasm = current.wasm !== undefined ? bindWasm(current.wasm) : undefined;
        if (wasm === undefined) awaitOptimisedKernels();
      } else if (cmd === CMD_DETACH) {
        current = undefined;
        wasm = undefined;
      } else if (current !== undefined) {
        runCalls(current.data, ctrl[CTRL_N]!, current.words, ctrl[CTRL_AT]!, ctrl[CTRL_COUNT]!, current.arena, part, ctrl[CTRL_PARTS]!, wasm);
      }
    } catch {
      Atomics.store(ctrl, CTRL_ERROR, 1);
    }
    Atomics.add(ctrl, CTRL_DONE, 1);
    Atomics.notify(ctrl, CTRL_DONE);
  }
  port.close();
}

workerLoop();
