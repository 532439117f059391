import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it, onTestFinished } from 'vitest';
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import { countFactorNonzeros } from '../../src/sparse/column-counts.js';
import { permuteSymmetric } from '../../src/sparse/permute.js';
import { createShiftedSolver } from '../../src/sparse/shifted-solver.js';
import { useSimdSweepKernels } from '../../src/sparse/simd-sweep-kernels.js';
import { denseOf, denseShifted, hexGridPair, seededRandom } from './fe-like-matrices.js';
import { readMatrixMarket } from '../../src/io/matrix-market-reader.js';
import { shiftedResidual } from './residual.js';
import { structuralFile, structuralPairs } from '../reference/reference-data.js';


function randomVector(n: number, seed: number): Float64Array {
  const r = seededRandom(seed);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) v[i] = r() - 0.5;
  return v;
}

describe('countFactorNonzeros', () => {
  it('equals the nonzero count of a dense Cholesky factor (ml-matrix CholeskyDecomposition)', () => {
    const { stiffness } = hexGridPair(2, 2, 2, 3);
    const rnd = seededRandom(9);
    const perm = Int32Array.from({ length: stiffness.n }, (_, i) => i);
    // random ordering so the count is not just a band
    for (let i = perm.length - 1; i > 0; i--) {
      const j = Math.floor(rnd() * (i + 1));
      [perm[i], perm[j]] = [perm[j], perm[i]];
    }
    for (const p of [Int32Array.from({ length: stiffness.n }, (_, i) => i), perm]) {
      const c = permuteSymmetric(stiffness, p);
      // reference: ml-matrix dense Cholesky of P K Pᵀ; random values leave no exact cancellation
      const l = new CholeskyDecomposition(new Matrix(denseOf(c))).lowerTriangularMatrix;
      let nnz = 0;
      for (let i = 0; i < c.n; i++) for (let j = 0; j <= i; j++) if (l.get(i, j) !== 0) nnz++;
      expect(countFactorNonzeros(stiffness, p)).toBe(nnz);
    }
  });
});

describe('createShiftedSolver on generated hexahedral grids', () => {
  const { stiffness, mass } = hexGridPair(4, 3, 3, 7);
  const n = stiffness.n;
  const solver = createShiftedSolver(stiffness, mass);

  it('solves (K − σM)x = b to a relative residual ≤ 1e-12', () => {
    for (const shift of [0, -0.5, 3]) {
      const f = solver.factor(shift);
      const b = randomVector(n, 11);
      const x = f.solve(b);
      expect(shiftedResidual(stiffness, mass, shift, x, b)).toBeLessThan(1e-12);
    }
  });

  it('solves a larger grid (wide supernodes, several panels) to a relative residual ≤ 1e-12', () => {
    const big = hexGridPair(7, 6, 6, 13);
    for (const ordering of ['auto', 'natural'] as const) {
      const f = createShiftedSolver(big.stiffness, big.mass, { ordering }).factor(0.25);
      const b = randomVector(big.stiffness.n, 17);
      expect(shiftedResidual(big.stiffness, big.mass, 0.25, f.solve(b), b)).toBeLessThan(1e-12);
      expect(f.diagnostics.supernodes).toBeLessThan(big.stiffness.n);
    }
  });

  it('counts negative pivots equal to the negative eigenvalues of K − σM (ml-matrix EigenvalueDecomposition)', () => {
    const small = hexGridPair(2, 2, 1, 5);
    const s = createShiftedSolver(small.stiffness, small.mass);
    for (const shift of [-1, 0.7, 2.5, 6]) {
      // reference: dense symmetric eigenvalues from ml-matrix
      const ev = new EigenvalueDecomposition(new Matrix(denseShifted(small.stiffness, small.mass, shift)), {
        assumeSymmetric: true,
      }).realEigenvalues;
      const inertia = s.factor(shift).inertia;
      expect(inertia.negative).toBe(ev.filter((v) => v < 0).length);
      expect(inertia.negative + inertia.zero + inertia.positive).toBe(small.stiffness.n);
    }
  });

  it('block solve equals column-by-column solves', () => {
    const f = solver.factor(1.5);
    const k = 7; // above the dense-product threshold, with leftover columns
    const b = randomVector(n * k, 4);
    const xb = f.solveBlock(b, k);
    for (let c = 0; c < k; c++) {
      const xc = f.solve(b.slice(c * n, (c + 1) * n));
      // the block path sums in another order: agreement to rounding, relative to ‖x‖∞
      const scale = xc.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
      for (let i = 0; i < n; i++) expect(Math.abs(xb[c * n + i] - xc[i])).toBeLessThanOrEqual(1e-12 * scale);
    }
  });

  it('refactoring for a new shift gives the same result as a fresh solver', () => {
    solver.factor(0.3);
    const again = solver.factor(2.2);
    const fresh = createShiftedSolver(stiffness, mass).factor(2.2);
    const b = randomVector(n, 8);
    const x1 = again.solve(b);
    const x2 = fresh.solve(b);
    for (let i = 0; i < n; i++) expect(x1[i]).toBe(x2[i]);
    expect(again.inertia).toEqual(fresh.inertia);
  });

  it.each([
    ['in WebAssembly memory', true],
    ['in plain arrays', false],
  ])('a released factor (values %s) refuses to solve, and its memory serves the next factorization with the same result as a fresh solver', (_label, simd) => {
    useSimdSweepKernels(simd);
    onTestFinished(() => {
      useSimdSweepKernels(true);
    });
    const big = hexGridPair(7, 6, 6, 13);
    const s = createShiftedSolver(big.stiffness, big.mass);
    const first = s.factor(0.1);
    const b = randomVector(big.stiffness.n, 21);
    first.solve(b);
    first.release();
    first.release();
    expect(() => first.solve(b)).toThrow(/released/);
    expect(first.inertia.negative + first.inertia.zero + first.inertia.positive).toBe(big.stiffness.n);
    // the refactor overwrites the old values (zeroed supernode by supernode): equal to a fresh factor bit for bit
    const again = s.factor(0.9);
    const fresh = createShiftedSolver(big.stiffness, big.mass).factor(0.9);
    const x1 = again.solve(b);
    const x2 = fresh.solve(b);
    for (let i = 0; i < x1.length; i++) expect(x1[i]).toBe(x2[i]);
    expect(again.inertia).toEqual(fresh.inertia);
  });

  it('reports an exact zero pivot with its DOF, substitutes a finite value and counts it as zero', () => {
    // K = [[1, 1], [1, 1]] is singular: in natural order d_2 = 1 − 1·1 = 0 exactly (hand computation)
    const t = new TripletList(4);
    t.push(0, 0, 1);
    t.push(1, 0, 1);
    t.push(1, 1, 1);
    const kk = assembleSymmetric(2, t).matrix;
    const mt = new TripletList(2);
    mt.push(0, 0, 1);
    mt.push(1, 1, 1);
    const f = createShiftedSolver(kk, assembleSymmetric(2, mt).matrix, { ordering: 'natural' }).factor(0);
    expect(f.inertia).toMatchObject({ negative: 0, zero: 1, positive: 1 });
    expect(f.diagnostics.tinyPivots.map((p) => p.dof)).toEqual([1]);
    const x = f.solve(new Float64Array([1, 2]));
    expect(Number.isFinite(x[0]) && Number.isFinite(x[1])).toBe(true);
  });
});

interface ReferencePair {
  name: string;
  K_file: string;
  M_file: string;
  n: number;
  eigenvalues?: number[];
  [key: string]: unknown;
}

describe('reference structural matrices (Harwell-Boeing BCSSTRUC, test/reference/structural)', () => {
  const pairs = structuralPairs() as ReferencePair[];

  it.each(pairs.map((p) => [p.name, p] as const))('%s: residual ≤ 1e-12 and inertia matches reference eigenvalue counts', async (_name, p) => {
    const stiffness = (await readMatrixMarket(structuralFile(p.K_file))).matrix;
    const mass = (await readMatrixMarket(structuralFile(p.M_file))).matrix;
    const solver = createShiftedSolver(stiffness, mass);
    // residual of K x = b (σ = 0)
    const f0 = solver.factor(0);
    const b = randomVector(stiffness.n, 21);
    expect(shiftedResidual(stiffness, mass, 0, f0.solve(b), b)).toBeLessThan(1e-12);
    // source: SciPy ARPACK eigenvalues in reference-eigenvalues.json (see the README there)
    const lambda = referenceEigenvalues(p);
    const shifts = [lambda[0] / 2, (lambda[9] + lambda[10]) / 2, (lambda[18] + lambda[19]) / 2];
    const expected = [0, 10, 19];
    shifts.forEach((shift, i) => {
      const f = solver.factor(shift);
      expect(f.inertia.negative).toBe(expected[i]);
      const x = f.solve(b);
      expect(shiftedResidual(stiffness, mass, shift, x, b)).toBeLessThan(1e-10);
    });
  });
});

function referenceEigenvalues(p: ReferencePair): number[] {
  if (!Array.isArray(p.eigenvalues)) throw new Error(`no eigenvalue list in ${p.name}`);
  return p.eigenvalues;
}
