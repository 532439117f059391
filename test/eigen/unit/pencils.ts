/**
 * Small pencils (K, M) and their outside references for the unit tests of src/eigen:
 *
 *  - spring–mass chains with closed-form spectra (standard results of the discrete wave
 *    equation, docs/sources.md §7):
 *      fixed–free, n equal masses m and n springs k (the first to ground):
 *        λ_j = (4k/m) sin²((2j − 1)π / (2(2n + 1))),   j = 1..n
 *      free–free, n equal masses and n − 1 springs:
 *        λ_j = (4k/m) sin²((j − 1)π / (2n)),           j = 1..n  (λ₁ = 0, the rigid-body mode)
 *  - dense generalized eigenpairs from ml-matrix (a general-purpose library, devDependency):
 *    Cholesky M = LLᵀ and the symmetric L⁻¹ K L⁻ᵀ; for a singular M the reversed pencil
 *    M φ = μ K φ through the Cholesky factor of K (μ = 1/λ, μ = 0 for the infinite eigenvalues
 *    of massless DOFs).
 *
 * Test helpers only: the dense copies are for tens of DOFs.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { TripletList, assembleSymmetric } from '../../../src/sparse/assemble.js';
import { symMultiplyBlock, type SymmetricCsc } from '../../../src/sparse/csc.js';
import { createShiftedSolver } from '../../../src/sparse/shifted-solver.js';
import { createShiftInvertOperator, type ShiftInvertOperator } from '../../../src/eigen/shift-invert-operator.js';
import type { EigenSearch } from '../../../src/eigen/search-types.js';
import { symOneNorm } from '../../../src/sparse/csc.js';
import { denseOf } from '../../sparse/fe-like-matrices.js';

export { denseOf };

export interface Pencil {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
}

/** Sparse symmetric matrix from (i, j, v) entries, lower or upper given once each. */
export function sparseOf(n: number, entries: [number, number, number][]): SymmetricCsc {
  const t = new TripletList(entries.length);
  for (const [i, j, v] of entries) t.push(Math.max(i, j), Math.min(i, j), v);
  return assembleSymmetric(n, t).matrix;
}

/** Diagonal sparse matrix. */
export function diagonalMatrix(d: number[]): SymmetricCsc {
  return sparseOf(d.length, d.map((v, i) => [i, i, v] as [number, number, number]));
}

/**
 * n equal masses m in a line joined by springs k; `fixed` adds a spring k from DOF 0 to ground
 * (fixed–free chain), otherwise the chain is free–free.
 */
export function chain(n: number, k: number, m: number, fixed: boolean): Pencil {
  const entries: [number, number, number][] = [];
  // K = Σ k (e_i − e_{i+1})(e_i − e_{i+1})ᵀ (+ k e₀e₀ᵀ)
  for (let i = 0; i < n; i++) {
    const diag = (i > 0 ? k : fixed ? k : 0) + (i + 1 < n ? k : 0);
    entries.push([i, i, diag]);
    if (i + 1 < n) entries.push([i + 1, i, -k]);
  }
  return { stiffness: sparseOf(n, entries), mass: diagonalMatrix(new Array<number>(n).fill(m)) };
}

/** Closed form, fixed–free chain (module comment). */
export function fixedFreeEigenvalues(n: number, k: number, m: number): number[] {
  return Array.from({ length: n }, (_, t) => (4 * k / m) * Math.sin(((2 * (t + 1) - 1) * Math.PI) / (2 * (2 * n + 1))) ** 2);
}

/** Closed form, free–free chain (module comment). */
export function freeFreeEigenvalues(n: number, k: number, m: number): number[] {
  return Array.from({ length: n }, (_, t) => (4 * k / m) * Math.sin((t * Math.PI) / (2 * n)) ** 2);
}

/** Two uncoupled copies of a pencil: every eigenvalue doubled (a cluster of multiplicity 2). */
export function twoCopies(p: Pencil): Pencil {
  const n = p.stiffness.n;
  const copy = (a: SymmetricCsc): SymmetricCsc => {
    const entries: [number, number, number][] = [];
    for (let j = 0; j < n; j++) {
      for (let q = a.colPtr[j]; q < a.colPtr[j + 1]; q++) {
        entries.push([a.rowIdx[q], j, a.values[q]]);
        entries.push([a.rowIdx[q] + n, j + n, a.values[q]]);
      }
    }
    return sparseOf(2 * n, entries);
  };
  return { stiffness: copy(p.stiffness), mass: copy(p.mass) };
}

export interface DenseModes {
  values: number[];
  /** Columns: M-orthonormal eigenvectors, ascending λ. */
  vectors: number[][];
}

/** Generalized eigenpairs of (K, M), M positive definite (ml-matrix: Cholesky of M, symmetric eigen). */
export function denseGeneralized(p: Pencil): DenseModes {
  const l = new CholeskyDecomposition(new Matrix(denseOf(p.mass))).lowerTriangularMatrix;
  const li = inverse(l);
  const a = li.mmul(new Matrix(denseOf(p.stiffness))).mmul(li.transpose());
  const sym = a.add(a.transpose()).mul(0.5);
  const eig = new EigenvalueDecomposition(sym, { assumeSymmetric: true });
  const order = eig.realEigenvalues.map((v, i) => [v, i]).sort((x, y) => x[0] - y[0]);
  const phi = li.transpose().mmul(eig.eigenvectorMatrix);
  return { values: order.map(([v]) => v), vectors: order.map(([, i]) => phi.getColumn(i)) };
}

/**
 * Finite eigenvalues of (K, M) for K positive definite and M only semi-definite (massless DOFs):
 * the reversed pencil M φ = μ K φ (ml-matrix: Cholesky of K), λ = 1/μ over μ above `relZero`·max μ.
 */
export function denseFiniteEigenvaluesReversed(p: Pencil, relZero = 1e-12): number[] {
  const l = new CholeskyDecomposition(new Matrix(denseOf(p.stiffness))).lowerTriangularMatrix;
  const li = inverse(l);
  const a = li.mmul(new Matrix(denseOf(p.mass))).mmul(li.transpose());
  const mu = new EigenvalueDecomposition(a.add(a.transpose()).mul(0.5), { assumeSymmetric: true }).realEigenvalues;
  const top = Math.max(...mu);
  return mu.filter((v) => v > relZero * top).map((v) => 1 / v).sort((x, y) => x - y);
}

/** The shift-invert operator at σ, factored on one thread. */
export function operatorAt(p: Pencil, sigma: number): ShiftInvertOperator {
  const solver = createShiftedSolver(p.stiffness, p.mass, { threads: 1 });
  return createShiftInvertOperator(p.stiffness, p.mass, solver.factor(sigma));
}

/** An EigenSearch for the `count` pairs nearest σ with the defaults the front door uses. */
export function searchAt(p: Pencil, sigma: number, count: number, extra: Partial<EigenSearch> = {}): EigenSearch {
  return {
    operator: operatorAt(p, sigma),
    count,
    tolerance: 1e-12,
    maxBasis: p.stiffness.n,
    stiffnessNorm: symOneNorm(p.stiffness),
    ...extra,
  };
}

/** Column-major n×k block from column arrays. */
export function blockOf(cols: number[][]): Float64Array {
  const n = cols[0].length;
  const x = new Float64Array(n * cols.length);
  cols.forEach((c, j) => x.set(c, j * n));
  return x;
}

/** AᵀB for column-major n×a and n×b blocks, as nested arrays [i][j]. */
export function crossProducts(a: Float64Array, ca: number, b: Float64Array, cb: number, n: number): number[][] {
  const out = Array.from({ length: ca }, () => new Array<number>(cb).fill(0));
  for (let i = 0; i < ca; i++) {
    for (let j = 0; j < cb; j++) {
      let s = 0;
      for (let r = 0; r < n; r++) s += a[i * n + r] * b[j * n + r];
      out[i][j] = s;
    }
  }
  return out;
}

/** max |XᵀMX − I| and, when `l` is given, max |LᵀMX|. */
export function massOrthonormality(mass: SymmetricCsc, x: Float64Array, k: number, l?: { v: Float64Array; count: number }): { self: number; against: number } {
  const n = mass.n;
  const mx = symMultiplyBlock(mass, x, k, new Float64Array(n * k));
  const g = crossProducts(x, k, mx, k, n);
  let self = 0;
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) self = Math.max(self, Math.abs(g[i][j] - (i === j ? 1 : 0)));
  let against = 0;
  if (l) for (const row of crossProducts(l.v, l.count, mx, k, n)) for (const v of row) against = Math.max(against, Math.abs(v));
  return { self, against };
}

/** max_i |a_i − b_i| / max(|b_i|, floor). */
export function maxRelativeError(a: ArrayLike<number>, b: ArrayLike<number>, floor = 0): number {
  let worst = 0;
  for (let i = 0; i < b.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]) / Math.max(Math.abs(b[i]), floor));
  return worst;
}

/** Deterministic block with entries in [−0.5, 0.5). */
export function pseudoRandomBlock(n: number, k: number, seed: number): Float64Array {
  let s = seed >>> 0;
  const x = new Float64Array(n * k);
  // a linear congruential sequence is enough for test data
  for (let i = 0; i < x.length; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    x[i] = s / 4294967296 - 0.5;
  }
  return x;
}
