/**
 * The memory a solve will need, predicted from the symbolic analysis before any numeric work,
 * and the error raised when it exceeds the limit a CI administrator set (`--max-memory`).
 *
 * One factor at a time is alive (factors are recycled), so the numeric phase holds
 *   8 · (stored entries of the supernode blocks) + 8 n (D) + 4 · (row indices)
 * plus, for each of the `threads` threads that factor (the N parts of the split), the scratch it
 * is given (numeric-ldlt.ts threadScratchBytes: its region of the factor's memory, a few
 * maxRows- and n-long arrays); the caller adds what it keeps beside the factor (an iteration
 * basis, the mode shapes).
 */
import type { SupernodalStructure } from './symbolic.js';
import { threadScratchBytes } from './numeric-ldlt.js';

export function predictedFactorBytes(s: SupernodalStructure, threads: number): number {
  return 8 * s.storedEntries + 8 * s.n + 4 * s.rows.length + threads * threadScratchBytes(s);
}

export class MemoryLimitError extends Error {
  constructor(
    readonly predictedBytes: number,
    readonly limitBytes: number,
    readonly nnzL: number,
  ) {
    super(`the solve would need about ${formatBinaryBytes(predictedBytes)} (a factor with ${nnzL.toExponential(2)} nonzeros, predicted before any numeric work), above the memory limit of ${formatBinaryBytes(limitBytes)} (--max-memory)`);
    this.name = 'MemoryLimitError';
  }
}

/**
 * "6.0 GiB": binary units, as `--max-memory 6G` is read (src/cli/limits.ts), so the limit a
 * refusal names is the number the user gave.
 */
export function formatBinaryBytes(bytes: number): string {
  if (bytes >= 1024 ** 3) return `${(bytes / 1024 ** 3).toFixed(1)} GiB`;
  if (bytes >= 1024 ** 2) return `${(bytes / 1024 ** 2).toFixed(1)} MiB`;
  return `${Math.round(bytes / 1024)} KiB`;
}

/** "12.3 GB" (decimal units: 1 GB = 10⁹ bytes): the Matrix Market readers' memory messages. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1e9) return `${(bytes / 1e9).toFixed(1)} GB`;
  if (bytes >= 1e6) return `${(bytes / 1e6).toFixed(1)} MB`;
  return `${Math.round(bytes / 1e3)} kB`;
}
