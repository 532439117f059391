/**
 * The SIMD basis-product kernels (src/dense/simd-block-kernels.ts, driven from block-ops.ts)
 * against block-ops.ts's plain loops, which test/dense/block-ops.test.ts checks against ml-matrix:
 * the kernels do the same operations in the same order per entry, so every product must agree
 * bit for bit (−0 and 0 alike) — column counts 1 … 7 and wider, row counts of either parity and
 * around the 512-row chunks, row ranges (the helper threads' shares) and staging regions, on
 * random blocks and on a block of a real small matrix's products.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { addTimesSmall, timesSmall, timesSmallInPlace, transposeTimes } from '../../src/dense/block-ops.js';
import { homeOf, kernelBlock, kernelPlace, useSimdBlockKernels } from '../../src/dense/simd-block-kernels.js';
import { symMultiplyBlock } from '../../src/sparse/csc.js';
import { hexGridPair, seededRandom } from '../sparse/fe-like-matrices.js';

/** The first index where x and y differ as numbers (−0 equals 0), or −1. */
function firstDifference(x: Float64Array, y: Float64Array): number {
  if (x.length !== y.length) return Math.min(x.length, y.length);
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return i;
  return -1;
}

/** `values` copied into a kernel block with `regions` staging regions. */
function inKernelBlock(values: Float64Array, regions = 3): Float64Array {
  const a = kernelBlock(values.length, regions)!;
  a.set(values);
  return a;
}

/**
 * Every product of A (rows×p) with B (rows×q) and S (p×q), plain (kernels off) against the
 * kernels, whole and on a row range in region 2; A in a kernel block, and A a plain array (staged).
 */
function checkAll(values: Float64Array, rows: number, p: number, b: Float64Array, q: number, s: Float64Array): void {
  checkOn(inKernelBlock(values), values, rows, p, b, q, s);
  checkOn(values.slice(), values, rows, p, b, q, s);
}

/** Products that ran in the kernels (kernelPlace found them a place), so a test can show it compared the kernels at all. */
let kernelRuns = 0;

/** The products of `a` (kernels on) against those of `values` (kernels off): bit for bit. */
function checkOn(a: Float64Array, values: Float64Array, rows: number, p: number, b: Float64Array, q: number, s: Float64Array): void {
  const plain = <T>(f: () => T): T => {
    useSimdBlockKernels(false);
    try {
      return f();
    } finally {
      useSimdBlockKernels(true);
    }
  };
  const ranges: [number, number, number][] = [[0, rows, 0], [Math.floor(rows / 3), rows, 2]];
  for (const [from, to, region] of ranges) {
    const where = `rows ${rows} (${from}…${to}), p ${p}, q ${q}`;
    if (kernelPlace(a, region, to - from, p, q, 'dots') !== null) kernelRuns++;
    if (kernelPlace(a, region, to - from, p, q, 'combine') !== null) kernelRuns++;
    const plainP = plain(() => transposeTimes(values, b, rows, p, q, undefined, from, to));
    expect(firstDifference(transposeTimes(a, b, rows, p, q, undefined, from, to, region), plainP), `VᵀX ${where}`).toBe(-1);
    const c0 = b.slice();
    const c1 = b.slice();
    plain(() => addTimesSmall(c0, values, rows, p, s, q, -0.75, from, to));
    addTimesSmall(c1, a, rows, p, s, q, -0.75, from, to, region);
    expect(firstDifference(c1, c0), `X − V S ${where}`).toBe(-1);
    if (q <= p) {
      const v0 = values.slice();
      const v1 = homeOf(a) ? inKernelBlock(values) : values.slice();
      plain(() => timesSmallInPlace(v0, rows, p, s, q, from, to));
      timesSmallInPlace(v1, rows, p, s, q, from, to, region);
      expect(firstDifference(v1, v0), `V ← V S ${where}`).toBe(-1);
    }
  }
  expect(firstDifference(timesSmall(a, rows, p, s, q), plain(() => timesSmall(values, rows, p, s, q))), `V S rows ${rows}, p ${p}, q ${q}`).toBe(-1);
}

describe('SIMD basis-product kernels', () => {
  afterEach(() => {
    useSimdBlockKernels(true);
  });
  beforeEach(() => {
    kernelRuns = 0;
  });

  it('are available on Node 20, find a block and its parts by their buffer, and can be switched off', () => {
    expect(useSimdBlockKernels(true)).toBe(true);
    const a = kernelBlock(100, 2)!;
    expect(homeOf(a)).toBeDefined();
    expect(homeOf(a.subarray(10, 20))).toBe(homeOf(a));
    expect(homeOf(new Float64Array(100))).toBeUndefined();
    // a product large enough runs in the kernels: its staging region (after the block) is written
    const [rows, p, q] = [1000, 10, 6];
    const v = kernelBlock(rows * p, 1)!;
    v.fill(1);
    const out = transposeTimes(v, new Float64Array(rows * q).fill(2), rows, p, q);
    expect(out[0]).toBe(2000);
    const memory = new Float64Array(v.buffer);
    expect(memory.subarray(rows * p).some((x) => x !== 0)).toBe(true);
    useSimdBlockKernels(false);
    expect(kernelBlock(100, 2)).toBeNull();
  });

  it('equal the plain loops bit for bit on random blocks (1 … 7 and wider columns, row counts around the chunks)', () => {
    const rnd = seededRandom(17);
    const random = (length: number) => Float64Array.from({ length }, () => rnd() - 0.5);
    for (const rows of [1, 2, 3, 511, 512, 513, 1025, 2047]) {
      for (const [p, q] of [[1, 1], [2, 3], [3, 2], [4, 4], [5, 5], [6, 6], [7, 7], [7, 3], [13, 6], [40, 7], [40, 12], [13, 13], [5, 14], [9, 1]]) {
        // enough work for the kernels: below KERNEL_MIN_WORK the plain loops run on both sides
        // (rows = 3 is kept as such a case: the switch must not change the small products either)
        if (rows * p * q < 20_000 && rows !== 3) continue;
        checkAll(random(rows * p), rows, p, random(rows * q), q, random(p * q));
      }
    }
    expect(kernelRuns).toBeGreaterThan(100);
  });

  it('equal the plain loops bit for bit on a block of a real matrix (hex grid: X, K X, K² X …)', () => {
    const { stiffness } = hexGridPair(5, 4, 4, 2);
    const n = stiffness.n; // 450 rows: not a multiple of the chunk, even
    const p = 24;
    const values = new Float64Array(n * p);
    const rnd = seededRandom(3);
    for (let i = 0; i < n * 6; i++) values[i] = rnd() - 0.5;
    // each group of six columns is K times the one before (a Krylov-like block), scaled to unit size
    for (let g = 1; g < p / 6; g++) {
      const next = symMultiplyBlock(stiffness, values.subarray((g - 1) * 6 * n, g * 6 * n), 6);
      const scale = Math.max(...Array.from(next, Math.abs));
      values.set(next.map((v) => v / scale), g * 6 * n);
    }
    for (const q of [1, 2, 3, 5, 6, 7]) checkAll(values, n, p, values.slice(0, n * q).map((v) => v * 0.5 + 0.01), q, Float64Array.from({ length: p * q }, (_, i) => Math.cos(i)));
    // an odd row count (the last row in the plain expression)
    const odd = n - 1;
    checkAll(values.subarray(0, odd * p), odd, p, values.slice(0, odd * 5), 5, Float64Array.from({ length: p * 5 }, (_, i) => Math.sin(i)));
    expect(kernelRuns).toBeGreaterThan(0);
  });
});
