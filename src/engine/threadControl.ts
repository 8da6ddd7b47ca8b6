/**
 * The control block shared by the main thread and the worker threads of a ThreadPool: an
 * Int32Array over a SharedArrayBuffer, with these slots.
 */
/** Generation counter: the main thread increments it to hand out a command. */
export const CTRL_GEN = 0;
/** Number of workers that finished the current command. */
export const CTRL_DONE = 1;
/** Number of workers that started and warmed their kernels. */
export const CTRL_READY = 2;
/** The command: CMD_RUN, CMD_ATTACH, CMD_DETACH or CMD_QUIT. */
export const CTRL_CMD = 3;
/** Qubit count of the register of a CMD_RUN. */
export const CTRL_N = 4;
/** Index in the attached words of the kernel call to run. */
export const CTRL_AT = 5;
/** Number of parts the pass is split into (workers + main thread). */
export const CTRL_PARTS = 6;
/** Set to 1 by a worker whose command threw. */
export const CTRL_ERROR = 7;
/** Number of consecutive calls of a CMD_RUN, starting at CTRL_AT (a chain of row-local calls, ./kernelCall.ts). */
export const CTRL_COUNT = 8;
/** Length of the control block in 32-bit slots. */
export const CTRL_SLOTS = 9;

/** Run the CTRL_COUNT kernel calls from CTRL_AT on the attached register. */
export const CMD_RUN = 0;
/** Take the register, arena and words posted on the worker's port (read synchronously). */
export const CMD_ATTACH = 1;
/** Leave the worker loop. */
export const CMD_QUIT = 2;
/** Drop the attached buffers (so a finished run's ρ can be collected). */
export const CMD_DETACH = 3;
