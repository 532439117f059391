/**
 * The SIMD sweep kernels (src/sparse/simd-sweep-kernels.ts) against the plain TypeScript sweeps
 * and against the residual of the shifted matrix itself: every block width from one right-hand
 * side to more than two kernel groups, natural order (wide supernodes: several L11 panels,
 * column blocks and row tails) and the automatic ordering (many small supernodes).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { createShiftedSolver } from '../../src/sparse/shifted-solver.js';
import { factorStorage, KERNEL_RHS, sweepKernels, useSimdSweepKernels } from '../../src/sparse/simd-sweep-kernels.js';
import { hexGridPair, seededRandom } from './fe-like-matrices.js';
import { shiftedResidual } from './residual.js';

describe('SIMD triangular sweeps', () => {
  afterEach(() => {
    useSimdSweepKernels(true);
  });

  it('are available on Node 20 (WebAssembly SIMD and shared memory)', () => {
    expect(useSimdSweepKernels(true)).toBe(true);
    expect(factorStorage(10, 6, 2)).not.toBeNull();
  });

  it('solve every block width to the plain sweeps and to a residual ≤ 1e-12 (hex grid pair, both orderings)', () => {
    const pair = hexGridPair(6, 5, 7, 29);
    const n = pair.stiffness.n;
    const shift = 0.3;
    const rnd = seededRandom(41);
    for (const ordering of ['natural', 'auto'] as const) {
      const solver = createShiftedSolver(pair.stiffness, pair.mass, { ordering });
      useSimdSweepKernels(false);
      const plain = solver.factor(shift);
      useSimdSweepKernels(true);
      const simd = solver.factor(shift);
      // the diagnostics say which kernels each factor's products run in
      expect(plain.diagnostics.kernels).toEqual({ factor: 'simd', sweeps: 'plain' });
      expect(simd.diagnostics.kernels).toEqual({ factor: 'simd', sweeps: 'simd' });
      for (const k of [1, 2, 3, 4, 5, KERNEL_RHS, KERNEL_RHS + 1, KERNEL_RHS + 4, 2 * KERNEL_RHS + 1]) {
        const b = new Float64Array(n * k).map(() => rnd() - 0.5);
        const xs = simd.solveBlock(b, k);
        const xp = plain.solveBlock(b, k);
        let diff = 0;
        let size = 0;
        for (let i = 0; i < n * k; i++) {
          diff = Math.max(diff, Math.abs(xs[i] - xp[i]));
          size = Math.max(size, Math.abs(xp[i]));
        }
        expect(diff / size).toBeLessThan(1e-12);
        // each column against K − σM itself: normwise relative residual of test/sparse/residual.ts (common practice)
        for (let c = 0; c < k; c++) {
          const col = (a: Float64Array) => a.subarray(c * n, (c + 1) * n);
          expect(shiftedResidual(pair.stiffness, pair.mass, shift, col(xs), col(b))).toBeLessThan(1e-12);
        }
      }
    }
  });

  it('panel triangles and row tails match the scalar loops they replace, bit for bit', () => {
    // the loops are the definitions (unit lower triangle, its transpose, products over a few rows)
    const made = factorStorage(4096, 1024, 1)!;
    const kern = sweepKernels(made.storage)!;
    const heap = kern.heap;
    const rnd = seededRandom(7);
    const ld = 23; // leading dimension of L and of Y in the scratch region (rows of a supernode)
    const lAt = made.storage.valuesOffset;
    made.values.set(Array.from({ length: 40 * ld }, () => rnd() - 0.5));
    const fresh = () => Float64Array.from({ length: KERNEL_RHS * ld }, () => rnd() - 0.5);
    const L = (i: number, t: number) => heap[lAt + i + t * ld];
    for (let g = 1; g <= KERNEL_RHS; g++) {
      for (let w = 1; w <= 8; w++) {
        // forward: Y(i, c) −= L(i, j) Y(j, c), j < i < w
        const y0 = fresh();
        const want = y0.slice();
        for (let c = 0; c < g; c++) for (let j = 0; j < w; j++) for (let i = j + 1; i < w; i++) want[c * ld + i] -= L(i, j) * want[c * ld + j];
        heap.set(y0, 0);
        kern.triangleForward(8 * lAt, 8 * ld, w, g, 0, 8 * ld);
        expect(heap.slice(0, y0.length)).toEqual(want);
        // backward: Y(j, c) −= Σ_{j<i<w} L(i, j) Y(i, c), last column first
        const wantB = y0.slice();
        for (let c = 0; c < g; c++) {
          for (let j = w - 1; j >= 0; j--) {
            let sum = 0;
            for (let i = j + 1; i < w; i++) sum += L(i, j) * wantB[c * ld + i];
            wantB[c * ld + j] -= sum;
          }
        }
        heap.set(y0, 0);
        kern.triangleBackward(8 * lAt, 8 * ld, w, g, 0, 8 * ld);
        expect(heap.slice(0, y0.length)).toEqual(wantB);
      }
      for (let rows = 1; rows <= 3; rows++) {
        // columns tail: Y(i, c) −= Σ_t L(i, t) X(t, c); X at rows 10.. of the same block
        const cols = 5 + rows;
        const y0 = fresh();
        const want = y0.slice();
        for (let c = 0; c < g; c++) {
          for (let i = 0; i < rows; i++) {
            let sum = 0;
            for (let t = 0; t < cols; t++) sum += L(i, t) * want[c * ld + 10 + t];
            want[c * ld + i] -= sum;
          }
        }
        heap.set(y0, 0);
        kern.columnsTail(8 * lAt, 8 * ld, rows, cols, 8 * 10, 8 * ld, 0, 8 * ld, g);
        expect(heap.slice(0, y0.length)).toEqual(want);
      }
      // dots tail: Y(t, c) −= L(i, t) G(i, c) for the row i = 4, G at rows 12.. of the block
      const y0 = fresh();
      const want = y0.slice();
      for (let t = 0; t < 7; t++) for (let c = 0; c < g; c++) want[c * ld + t] -= L(4, t) * want[c * ld + 12 + 4];
      heap.set(y0, 0);
      kern.dotsTail(8 * (lAt + 4), 8 * ld, 7, g, 8 * (12 + 4), 8 * ld, 0, 8 * ld);
      expect(heap.slice(0, y0.length)).toEqual(want);
    }
  });
});
