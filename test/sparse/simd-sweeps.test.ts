/**
 * The SIMD sweep kernels (src/sparse/simd-sweep-kernels.ts) against the plain TypeScript sweeps
 * and against the residual of the shifted matrix itself: every block width from one right-hand
 * side to more than two kernel groups, natural order (wide supernodes: several L11 panels,
 * column blocks and row tails) and the automatic ordering (many small supernodes).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { createShiftedSolver } from '../../src/sparse/shifted-solver.js';
import { factorStorage, KERNEL_RHS, useSimdSweepKernels } from '../../src/sparse/simd-sweep-kernels.js';
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
});
