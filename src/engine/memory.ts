/**
 * Memory budget of one simulation run, checked before any large allocation.
 *
 * Formula (bytes), with densityMatrixBytes(n) = 16·4^n and stateVectorBytes(n) = 16·2^n
 * from ./layout.ts:
 *   estimateRunBytes(n, idealPure) = densityMatrixBytes(n)                     (noisy run)
 *                                  + (idealPure ? stateVectorBytes(n)           (ideal run on state vectors)
 *                                               : densityMatrixBytes(n))        (ideal run on a density matrix)
 *                                  + RUN_OVERHEAD_BYTES                          (constant)
 */
import { totalmem } from 'node:os';
import { densityMatrixBytes, stateVectorBytes } from './layout.js';

/**
 * Constant allowance for everything besides the registers: kernel scratch (a few 4^k-sized
 * buffers), gate and Kraus matrices, result tables and the runtime's own baseline growth.
 * A rounded allowance (common practice), not a measurement.
 */
export const RUN_OVERHEAD_BYTES = 32 * 1024 * 1024;

/** Bytes one run needs: noisy density matrix + ideal state vector (or density matrix if not pure) + RUN_OVERHEAD_BYTES. */
export function estimateRunBytes(n: number, idealPure: boolean): number {
  return densityMatrixBytes(n) + (idealPure ? stateVectorBytes(n) : densityMatrixBytes(n)) + RUN_OVERHEAD_BYTES;
}

/**
 * Bytes a record-mode run needs (format version 2, part B): `branches` noisy density matrices
 * (the most the record can hold at once), as many ideal records of at most `idealBytesPerBranch`
 * each, one more density matrix for Σ_r ρ_r, and RUN_OVERHEAD_BYTES.
 */
export function estimateRecordRunBytes(n: number, branches: number, idealBytesPerBranch: number): number {
  return (branches + 1) * densityMatrixBytes(n) + branches * idealBytesPerBranch + RUN_OVERHEAD_BYTES;
}

/** Throws MemoryLimitError when estimateRecordRunBytes exceeds limitBytes; the message counts the branches. */
export function checkRecordMemory(n: number, branches: number, idealBytesPerBranch: number, limitBytes: number): void {
  const needed = estimateRecordRunBytes(n, branches, idealBytesPerBranch);
  if (needed <= limitBytes) return;
  const message =
    `${n} qubit${n === 1 ? '' : 's'} with up to ${branches} record branches need about ${formatBytes(needed)} ` +
    `(${branches} noisy density matrices of ${formatBytes(densityMatrixBytes(n))}, their sum, ideal branches up to ${formatBytes(branches * idealBytesPerBranch)}, overhead ${formatBytes(RUN_OVERHEAD_BYTES)}) ` +
    `but the limit is ${formatBytes(limitBytes)}; raise it with --max-memory, or record into fewer distinct bits`;
  throw new MemoryLimitError(message, needed, limitBytes);
}

/** The default memory limit in bytes: half of the machine's total memory (os.totalmem()). */
export function defaultMemoryLimit(): number {
  return Math.floor(totalmem() / 2);
}

/** A run would need more memory than allowed; carries both amounts in bytes. */
export class MemoryLimitError extends Error {
  /** Estimated bytes the run needs (estimateRunBytes). */
  readonly neededBytes: number;
  /** The limit in bytes that it exceeds. */
  readonly limitBytes: number;

  constructor(message: string, neededBytes: number, limitBytes: number) {
    super(message);
    this.name = 'MemoryLimitError';
    this.neededBytes = neededBytes;
    this.limitBytes = limitBytes;
  }
}

const KIB = 1024;
const MIB = 1024 * KIB;
const GIB = 1024 * MIB;
const TIB = 1024 * GIB;

/** A byte count for people, in binary units (B, KiB, MiB, GiB, TiB), rounded to at most 3 significant digits. */
export function formatBytes(bytes: number): string {
  const units: ReadonlyArray<readonly [number, string]> = [
    [TIB, 'TiB'],
    [GIB, 'GiB'],
    [MIB, 'MiB'],
    [KIB, 'KiB'],
  ];
  for (const [size, name] of units) {
    if (bytes >= size) return `${Number((bytes / size).toPrecision(3))} ${name}`;
  }
  return `${bytes} B`;
}

/** Throws MemoryLimitError when estimateRunBytes(n, idealPure) exceeds limitBytes; the message breaks the estimate down. */
export function checkMemory(n: number, idealPure: boolean, limitBytes: number): void {
  const needed = estimateRunBytes(n, idealPure);
  if (needed <= limitBytes) return;
  const ideal = idealPure
    ? `ideal state vector ${formatBytes(stateVectorBytes(n))}`
    : `ideal density matrix ${formatBytes(densityMatrixBytes(n))}`;
  const message =
    `${n} qubit${n === 1 ? '' : 's'} need about ${formatBytes(needed)} ` +
    `(noisy density matrix ${formatBytes(densityMatrixBytes(n))} + ${ideal} + overhead ${formatBytes(RUN_OVERHEAD_BYTES)}) ` +
    `but the limit is ${formatBytes(limitBytes)}; raise it with --max-memory or use fewer qubits`;
  throw new MemoryLimitError(message, needed, limitBytes);
}

const UNIT_FACTORS: ReadonlyMap<string, number> = new Map([
  ['', 1],
  ['b', 1],
  ['kib', KIB],
  ['mib', MIB],
  ['gib', GIB],
  ['tib', TIB],
  ['kb', 1e3],
  ['mb', 1e6],
  ['gb', 1e9],
  ['tb', 1e12],
]);

/**
 * Parses a byte size: a non-negative decimal number with an optional unit, case-insensitive,
 * optional space between — binary KiB/MiB/GiB/TiB (powers of 1024), decimal KB/MB/GB/TB
 * (powers of 1000), B or no unit for bytes. Rounded to whole bytes. Undefined when invalid.
 * Examples: "512MiB", "2GiB", "1.5GB", "800MB", "1000000".
 */
export function parseByteSize(text: string): number | undefined {
  const match = /^\s*(\d+(?:\.\d+)?|\.\d+)\s*([a-z]*)\s*$/i.exec(text);
  if (!match) return undefined;
  const value = Number(match[1]);
  const unit = match[2]!.toLowerCase();
  const factor = UNIT_FACTORS.get(unit);
  if (factor === undefined || !Number.isFinite(value)) return undefined;
  const bytes = Math.round(value * factor);
  return Number.isSafeInteger(bytes) ? bytes : undefined;
}
