/**
 * The SIMD product kernel Y = A X (src/sparse/sym-product-kernel.ts) against the plain loops of
 * src/sparse/csc.ts (which test/sparse/csc-products.test.ts checks against ml-matrix's dense
 * product): the same operations in the same order per entry as its three-column loop, so the
 * products agree bit for bit (−0 and 0 alike) when the column count is a multiple of three, and
 * to rounding otherwise (the plain loop of the columns left over sums y_j in another order) —
 * for every column count 1 … 7 and wider blocks, row counts of either parity, columns without a
 * stored diagonal or without any entry, and the product split over column ranges into separate
 * regions and added in region order as the helper threads do.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { symMultiplyColumns, type SymmetricCsc } from '../../src/sparse/csc.js';
import { gatherRegions, KERNEL_COLUMNS, kernelMatrix, regionProduct, stageColumns, useSimdProductKernels, type KernelMatrix } from '../../src/sparse/sym-product-kernel.js';
import { buildTetBox } from '../../fixtures/generator/tet-bracket.js';
import { hexGridPair, seededRandom } from './fe-like-matrices.js';

/** A random symmetric pattern (lower storage) of n rows: some diagonals and some whole columns missing. */
function randomLower(n: number, seed: number): SymmetricCsc {
  const rnd = seededRandom(seed);
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const values: number[] = [];
  for (let j = 0; j < n; j++) {
    if (rnd() < 0.1) {
      colPtr[j + 1] = rows.length;
      continue;
    }
    if (rnd() < 0.8) {
      rows.push(j);
      values.push(rnd() + 1);
    }
    for (let i = j + 1; i < n; i++) {
      if (rnd() < 0.2) {
        rows.push(i);
        values.push(rnd() - 0.5);
      }
    }
    colPtr[j + 1] = rows.length;
  }
  return { n, colPtr, rowIdx: Int32Array.from(rows), values: Float64Array.from(values) };
}

/** Y = A X through the kernel, the stored columns cut at `cuts` into one region each, regions added in order. */
function kernelProduct(home: KernelMatrix, x: Float64Array, k: number, cuts: number[]): Float64Array {
  const n = home.n;
  const y = new Float64Array(n * k);
  const bounds = [0, ...cuts, n];
  for (let c0 = 0; c0 < k; c0 += KERNEL_COLUMNS) {
    const w = Math.min(KERNEL_COLUMNS, k - c0);
    stageColumns(home, x, c0, w);
    for (let t = 0; t + 1 < bounds.length; t++) regionProduct(home, w, bounds[t], bounds[t + 1], t);
    gatherRegions(home, w, y, c0, bounds.slice(0, -1));
  }
  return y;
}

/** The plain product split the same way (csc.ts symMultiplyColumns into separate outputs, added in order). */
function plainProduct(a: SymmetricCsc, x: Float64Array, k: number, cuts: number[]): Float64Array {
  const n = a.n;
  const bounds = [0, ...cuts, n];
  const y = new Float64Array(n * k);
  for (let t = 0; t + 1 < bounds.length; t++) {
    const part = new Float64Array(n * k);
    symMultiplyColumns(a, x, k, part, bounds[t], bounds[t + 1]);
    for (let i = 0; i < n * k; i++) y[i] += part[i];
  }
  return y;
}

/** |A| |X| (entrywise absolute values), the scale of the rounding error of A X. */
function absProduct(a: SymmetricCsc, x: Float64Array, k: number): Float64Array {
  const abs: SymmetricCsc = { n: a.n, colPtr: a.colPtr, rowIdx: a.rowIdx, values: a.values.map(Math.abs) };
  return plainProduct(abs, x.map(Math.abs), k, []);
}

/** max |x − y| / scale over the entries (0 where the scale is 0 and they agree). */
function maxRelativeError(x: Float64Array, y: Float64Array, scale: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < x.length; i++) {
    const d = Math.abs(x[i] - y[i]);
    if (d > 0) worst = Math.max(worst, d / scale[i]);
  }
  return worst;
}

/** The first index where x and y differ as numbers (−0 equals 0), or −1. */
function firstDifference(x: Float64Array, y: Float64Array): number {
  if (x.length !== y.length) return Math.min(x.length, y.length);
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return i;
  return -1;
}

const matrices: { name: string; a: () => SymmetricCsc }[] = [
  { name: 'hex grid stiffness (3×3×2 cells, 144 rows)', a: () => hexGridPair(3, 3, 2, 9).stiffness },
  { name: 'hex grid lumped mass (diagonal only)', a: () => hexGridPair(3, 3, 2, 9).mass },
  { name: 'quadratic-tet box stiffness, shuffled numbering', a: () => buildTetBox({ sizeM: [0.03, 0.02, 0.02], cells: [3, 2, 2], order: 2, seed: 4 }).stiffness },
  { name: 'random pattern, 37 rows, diagonals and columns missing', a: () => randomLower(37, 5) },
];

describe('SIMD symmetric product kernel', () => {
  afterEach(() => {
    useSimdProductKernels(true);
  });

  it('is available on Node 20 and can be switched off', () => {
    const a = randomLower(10, 1);
    expect(useSimdProductKernels(true)).toBe(true);
    expect(kernelMatrix(a, 1)).not.toBeNull();
    // the product runs in the kernel: its row-major output region is written
    const placed = kernelMatrix(a, 1)!;
    const x = new Float64Array(10 * 3).fill(1);
    stageColumns(placed.home, x, 0, 3);
    regionProduct(placed.home, 3, 0, 10, 0);
    const memory = new Float64Array(placed.home.memory.buffer);
    expect(memory.subarray(placed.home.yAt / 8, placed.home.yAt / 8 + 40).some((v) => v !== 0)).toBe(true);
    useSimdProductKernels(false);
    expect(kernelMatrix(a, 1)).toBeNull();
  });

  it.each(matrices)('places the matrix once, as views of its memory: $name', ({ a }) => {
    const m = a();
    const placed = kernelMatrix(m, 2)!;
    expect(placed.matrix.values.buffer).toBe(placed.matrix.colPtr.buffer);
    expect(placed.matrix.values.buffer).toBe(placed.matrix.rowIdx.buffer);
    expect(Array.from(placed.matrix.colPtr)).toEqual(Array.from(m.colPtr));
    expect(Array.from(placed.matrix.rowIdx)).toEqual(Array.from(m.rowIdx));
    expect(firstDifference(placed.matrix.values, m.values)).toBe(-1);
  });

  it.each(matrices)('equals the plain product for 1 … 7, 9 and 13 columns (bit for bit for multiples of three), whole and split three ways: $name', ({ a }) => {
    const m = a();
    const n = m.n;
    const { home } = kernelMatrix(m, 3)!;
    const cuts = [Math.floor(n / 5), Math.floor((2 * n) / 3)];
    for (const k of [1, 2, 3, 4, 5, 6, 7, 9, 13]) {
      const x = Float64Array.from({ length: n * k }, (_, i) => Math.sin(0.37 * i + k) - 0.1);
      for (const split of [[], cuts]) {
        const kernel = kernelProduct(home, x, k, split);
        const plain = plainProduct(m, x, k, split);
        if (k % 3 === 0) expect(firstDifference(kernel, plain)).toBe(-1);
        // any order of summation: within (entries per row) · ε · Σ|a_ij||x_j| of the exact sum (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §3.1; from memory)
        else expect(maxRelativeError(kernel, plain, absProduct(m, x, k))).toBeLessThanOrEqual(64 * Number.EPSILON);
      }
    }
  });
});
