/**
 * What a declared Matrix Market size implies before anything is allocated: the most distinct
 * entries an n × n matrix can hold, and a lower bound of the memory a model of that order
 * needs to be read and solved here. Readers refuse a size line whose bound exceeds the
 * memory of the machine (or of its container), with the figure, instead of finding out by
 * running out of memory.
 *
 * The bound (our own accounting of this tool's data layout, deliberately low so no model
 * that fits is refused):
 *   reading    16 bytes per kept entry (row and column Int32, value Float64) + 4(n + 1)
 *              bytes of column starts, where kept entries ≤ min(declared, distinct bound);
 *   solving    8 n bytes per iteration vector, at least SOLVER_VECTORS of them (the
 *              eigensolver's block basis, its mass products and the locked modes).
 */
import { totalmem } from 'node:os';

/** Bytes of one (row, column, value) triplet while reading. */
const TRIPLET_BYTES = 16;
/** Fewest n-vectors of doubles any solve keeps (a lower bound, not a typical figure). */
const SOLVER_VECTORS = 16;

/** Most distinct entries of an n × n matrix: n(n+1)/2 for one triangle, n² for both. */
export function distinctEntryBound(n: number, oneTriangle: boolean): number {
  return oneTriangle ? (n * (n + 1)) / 2 : n * n;
}

/** Lower bound in bytes for reading one matrix of order n with `declared` entries. */
export function readingBytes(n: number, declared: number, oneTriangle: boolean): number {
  return TRIPLET_BYTES * Math.min(declared, distinctEntryBound(n, oneTriangle)) + 4 * (n + 1);
}

/** Lower bound in bytes for the solve of a model of order n (beyond its two matrices). */
export function solvingBytes(n: number): number {
  return 8 * n * SOLVER_VECTORS;
}

/** Memory available to this process: physical memory, or the container's limit when lower. */
export function memoryBudgetBytes(): number {
  let budget = totalmem();
  const constrained = (process as { constrainedMemory?: () => number | undefined }).constrainedMemory?.();
  if (constrained !== undefined && constrained > 0 && constrained < budget) budget = constrained;
  return budget;
}

/** One byte format for the readers' messages and --max-memory (src/sparse/memory-limit.ts). */
export { formatBytes } from '../sparse/memory-limit.js';
