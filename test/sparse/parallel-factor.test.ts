/**
 * The two-thread factorization and block solve (src/sparse/split-factor.ts, split-solve.ts) run their helper
 * from the compiled worker file, so this test loads the compiled modules from dist/ (built by
 * `npm test` before vitest runs) and skips with a message when they are absent. Checks: the
 * two-thread factor has the same inertia and pivots as the serial one, and its solves meet the
 * residual bound of the serial tests; the reference for the pivots is the serial factorization,
 * itself checked against ml-matrix in supernodal.test.ts.
 */
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { diagonalOf, maxAbsEntry, symMultiplyBlock } from '../../src/sparse/csc.js';
import { hexGridPair } from './fe-like-matrices.js';
import { ensureBuilt } from '../cli/built-cli.js';

const dist = path.resolve(import.meta.dirname, '../../dist/src/sparse');
// the helper thread runs from the compiled files only: build them when missing or older than the sources
ensureBuilt();

describe('two-thread LDLᵀ from the compiled modules', () => {
  it('matches the serial factor (inertia, pivot ratio) and solves to the serial residual bound', async () => {
    const { createShiftedSolver } = (await import(pathToFileURL(path.join(dist, 'shifted-solver.js')).href)) as typeof import('../../src/sparse/shifted-solver.js');
    const { stiffness, mass } = hexGridPair(14, 13, 12, 3);
    const n = stiffness.n;
    const diagK = diagonalOf(stiffness).reduce((a, v) => a + v, 0);
    const diagM = diagonalOf(mass).reduce((a, v) => a + v, 0);
    const shift = (0.5 * diagK) / diagM; // inside the spectrum: an indefinite K − σM with negative pivots
    const serial = createShiftedSolver(stiffness, mass, { ordering: 'nested-dissection', threads: 1 }).factor(shift);
    const parallel = createShiftedSolver(stiffness, mass, { ordering: 'nested-dissection', threads: 2 }).factor(shift);
    expect(parallel.diagnostics.threads).toBe(2);
    expect(serial.diagnostics.threads).toBe(1);
    expect(parallel.inertia).toEqual(serial.inertia);
    expect(parallel.inertia.negative).toBeGreaterThan(0);
    expect(Math.abs(parallel.diagnostics.maxDiagonalToPivotRatio / serial.diagnostics.maxDiagonalToPivotRatio - 1)).toBeLessThan(1e-8);
    const k = 6;
    const b = new Float64Array(n * k).map((_, i) => Math.sin(0.37 * i) + 0.1);
    const x = parallel.solveBlock(b, k);
    const xs = serial.solveBlock(b, k);
    // residual of (K − σM) x = b per column, relative to (max|K| + σ max|M|)·‖x‖∞
    const kx = symMultiplyBlock(stiffness, x, k, new Float64Array(n * k));
    const mx = symMultiplyBlock(mass, x, k, new Float64Array(n * k));
    const scale = maxAbsEntry(stiffness) + shift * maxAbsEntry(mass);
    let worst = 0;
    let diff = 0;
    for (let c = 0; c < k; c++) {
      let r = 0, xn = 0;
      for (let i = c * n; i < (c + 1) * n; i++) {
        r = Math.max(r, Math.abs(kx[i] - shift * mx[i] - b[i]));
        xn = Math.max(xn, Math.abs(x[i]));
        diff = Math.max(diff, Math.abs(x[i] - xs[i]));
      }
      worst = Math.max(worst, r / (scale * xn));
    }
    expect(worst).toBeLessThan(1e-12);
    expect(diff).toBeLessThan(1e-6 * Math.max(...Array.from(xs, Math.abs)));
  });

  it('refactors into a released factor\'s memory with the same result as a fresh two-thread factor', async () => {
    const { createShiftedSolver } = (await import(pathToFileURL(path.join(dist, 'shifted-solver.js')).href)) as typeof import('../../src/sparse/shifted-solver.js');
    const { stiffness, mass } = hexGridPair(14, 13, 12, 3);
    const options = { ordering: 'nested-dissection', threads: 2 } as const;
    const solver = createShiftedSolver(stiffness, mass, options);
    const first = solver.factor(0);
    expect(first.diagnostics.threads).toBe(2);
    first.release();
    const again = solver.factor(1e3);
    const fresh = createShiftedSolver(stiffness, mass, options).factor(1e3);
    const b = new Float64Array(stiffness.n).map((_, i) => Math.cos(0.11 * i));
    const x1 = again.solve(b);
    const x2 = fresh.solve(b);
    for (let i = 0; i < x1.length; i++) expect(x1[i]).toBe(x2[i]);
    expect(again.inertia).toEqual(fresh.inertia);
  });
});

const eigenDist = path.resolve(import.meta.dirname, '../../dist/src/eigen/shared-block-products.js');

describe('basis products split between threads, from the compiled modules', () => {
  it('equal the one-thread block kernels (src/dense/block-ops.ts) on a shared basis', async () => {
    const shared = (await import(pathToFileURL(eigenDist).href)) as typeof import('../../src/eigen/shared-block-products.js');
    const { addTimesSmall, transposeTimes } = await import('../../src/dense/block-ops.js');
    const [rows, p, q] = [20_011, 40, 6];
    const basis = shared.basisBlock(rows * p);
    expect(basis.buffer instanceof SharedArrayBuffer).toBe(true);
    basis.set(Float64Array.from({ length: rows * p }, (_, i) => Math.sin(0.013 * i)));
    const x = Float64Array.from({ length: rows * q }, (_, i) => Math.cos(0.007 * i));
    const s = Float64Array.from({ length: p * q }, (_, i) => 0.1 * i - 1);
    const p1 = shared.basisTransposeTimes(basis, x, rows, p, q);
    const p0 = transposeTimes(basis, x, rows, p, q);
    for (let i = 0; i < p * q; i++) expect(Math.abs(p1[i] - p0[i])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(p0[i])));
    const c1 = x.slice();
    const c0 = x.slice();
    shared.basisAddTimesSmall(c1, basis, rows, p, s, q, -1);
    addTimesSmall(c0, basis, rows, p, s, q, -1);
    // each row is computed by one thread with the same kernel: the results are identical
    expect(Array.from(c1)).toEqual(Array.from(c0));
  });
});

describe('ordering with the multilevel dissection on the helper thread, from the compiled modules', () => {
  it('gives the same ordering as on one thread (the dissection is deterministic)', async () => {
    const { chooseOrdering } = (await import(pathToFileURL(path.join(dist, 'ordering/choose-ordering.js')).href)) as typeof import('../../src/sparse/ordering/choose-ordering.js');
    const { stiffness, mass } = hexGridPair(18, 17, 16, 5);
    const one = chooseOrdering(stiffness, mass, { ordering: 'nested-dissection', threads: 1 });
    const two = chooseOrdering(stiffness, mass, { ordering: 'nested-dissection', threads: 2 });
    expect(two.predictedNnzL).toBe(one.predictedNnzL);
    expect(Array.from(two.perm)).toEqual(Array.from(one.perm));
  });
});
