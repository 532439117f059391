/**
 * Resource limits a CI administrator sets on the command line: `--max-memory` (a byte size such
 * as 6G, 800M, 1.5GiB or a plain number of bytes) and `--time-limit` (seconds).
 */
import { memoryBudgetBytes } from '../io/matrix-market-memory.js';
import { InvalidArgumentError } from 'commander';

/** Share of the machine's memory a run may plan to use when --max-memory is not given (our choice). */
export const DEFAULT_MEMORY_SHARE = 0.8;

/** The default --max-memory: a share of the machine's memory, or of the container's limit when lower. */
export function defaultMemoryLimitBytes(): number {
  return Math.floor(DEFAULT_MEMORY_SHARE * memoryBudgetBytes());
}

const UNITS: Record<string, number> = { '': 1, b: 1, k: 1024, kb: 1024, kib: 1024, m: 1024 ** 2, mb: 1024 ** 2, mib: 1024 ** 2, g: 1024 ** 3, gb: 1024 ** 3, gib: 1024 ** 3, t: 1024 ** 4, tb: 1024 ** 4, tib: 1024 ** 4 };

/** "6G" → 6 GiB in bytes (K, M, G, T are binary multiples, with or without B / iB). */
export function parseMemorySize(value: string): number {
  const m = /^\s*(\d+(?:\.\d+)?)\s*([a-zA-Z]*)\s*$/.exec(value);
  const unit = m ? UNITS[m[2].toLowerCase()] : undefined;
  if (!m || unit === undefined || Number(m[1]) <= 0) throw new InvalidArgumentError('expected a memory size such as 6G, 800M or 1.5GiB.');
  return Math.floor(Number(m[1]) * unit);
}

export function parseSeconds(value: string): number {
  const v = Number(value);
  if (!Number.isFinite(v) || v <= 0) throw new InvalidArgumentError('expected a positive number of seconds.');
  return v;
}
