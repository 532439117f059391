/**
 * src/eigen/subspace-iteration.ts on its own (given an operator, not through solveModes):
 *  - the pairs nearest σ of spring chains match the closed forms (discrete wave equation,
 *    pencils.ts), for σ below the spectrum and σ inside it;
 *  - clusters (two uncoupled equal chains: every eigenvalue twice) come out with their
 *    multiplicity; rigid-body (zero) eigenvalues of free–free chains too;
 *  - locking: progress reports a count of locked pairs that never decreases, and the result is
 *    M-orthonormal;
 *  - deflation: vectors handed in are not found again; warm start from exact vectors;
 *  - the checkpoint stops it (abandoned); an iteration limit leaves it unconverged with a warning;
 *  - an unreachable tolerance still ends through the "stagnated at rounding level" test;
 *  - singular M (massless DOFs): with the basis capped at rank(M) it finds the finite
 *    eigenvalues (reversed-pencil reference through ml-matrix).
 */
import { describe, expect, it } from 'vitest';
import { nearestFirst, subspaceIteration, subspaceSize } from '../../../src/eigen/subspace-iteration.js';
import { massRankBound } from '../../../src/eigen/shift-invert-operator.js';
import { IndefiniteMassError } from '../../../src/eigen/modes-types.js';
import {
  blockOf,
  chain,
  denseFiniteEigenvaluesReversed,
  diagonalMatrix,
  fixedFreeEigenvalues,
  freeFreeEigenvalues,
  massOrthonormality,
  maxRelativeError,
  searchAt,
  twoCopies,
  type Pencil,
} from './pencils.js';
import { denseGeneralized } from './pencils.js';

describe('subspaceSize and nearestFirst', () => {
  it('takes q = max(2p, p + 8) capped by the basis limit (header)', () => {
    expect(subspaceSize(3, 100)).toBe(11);
    expect(subspaceSize(10, 100)).toBe(20);
    expect(subspaceSize(10, 15)).toBe(15);
  });

  it('orders by distance to σ, ties by value', () => {
    expect(nearestFirst(Float64Array.from([5, 1, 3, 2, 4]), 3)).toEqual([2, 3, 4, 1, 0]);
  });
});

describe('subspace iteration on spring chains (closed-form spectra)', () => {
  const n = 60;
  const fixed = chain(n, 3, 1.5, true);
  const exactFixed = fixedFreeEigenvalues(n, 3, 1.5);

  it('finds the lowest 6 pairs of the fixed–free chain, M-orthonormal, and locks progressively', () => {
    const locked: number[] = [];
    const r = subspaceIteration(searchAt(fixed, -1e-6 * 2, 6, { onProgress: (m) => locked.push(Number(/: (\d+) of/.exec(m)?.[1])) }));
    expect(r.converged).toBe(true);
    expect(r.count).toBe(6);
    expect(r.warnings).toEqual([]);
    expect(r.abandoned).toBe(false);
    // λ_j = (4k/m) sin²((2j−1)π/(2(2n+1))) (pencils.ts)
    expect(maxRelativeError(r.values, exactFixed.slice(0, 6))).toBeLessThan(1e-11);
    expect(Math.max(...r.residuals)).toBeLessThanOrEqual(1e-12);
    expect(massOrthonormality(fixed.mass, r.vectors, 6).self).toBeLessThan(1e-12);
    // locking: the locked count never goes down and ends at 6
    for (let i = 1; i < locked.length; i++) expect(locked[i]).toBeGreaterThanOrEqual(locked[i - 1]);
    expect(locked[locked.length - 1]).toBe(6);
  });

  it('finds the pairs nearest an interior shift', () => {
    const sigma = 0.5 * (exactFixed[20] + exactFixed[21]) + 0.1 * (exactFixed[21] - exactFixed[20]);
    const r = subspaceIteration(searchAt(fixed, sigma, 4));
    const nearest = [...exactFixed].sort((a, b) => Math.abs(a - sigma) - Math.abs(b - sigma)).slice(0, 4).sort((a, b) => a - b);
    expect(r.converged).toBe(true);
    expect(maxRelativeError(r.values, nearest)).toBeLessThan(1e-10);
  });

  it('returns the rigid-body mode of a free–free chain (λ₁ = 0) with the elastic ones', () => {
    const free = chain(40, 1, 1, false);
    const exact = freeFreeEigenvalues(40, 1, 1);
    const r = subspaceIteration(searchAt(free, -0.01 * exact[1], 4));
    expect(r.converged).toBe(true);
    expect(Math.abs(r.values[0])).toBeLessThan(1e-12 * exact[39]);
    expect(maxRelativeError(r.values.subarray(1), exact.slice(1, 4))).toBeLessThan(1e-10);
  });

  it('returns each eigenvalue of two equal chains twice (clusters)', () => {
    const doubled = twoCopies(chain(25, 1, 1, true));
    const single = fixedFreeEigenvalues(25, 1, 1);
    const r = subspaceIteration(searchAt(doubled, -1e-6, 6));
    expect(r.converged).toBe(true);
    expect(maxRelativeError(r.values, [single[0], single[0], single[1], single[1], single[2], single[2]])).toBeLessThan(1e-10);
    expect(massOrthonormality(doubled.mass, r.vectors, 6).self).toBeLessThan(1e-12);
  });
});

describe('subspace iteration: deflation, start vectors, checkpoint and limits', () => {
  const n = 40;
  const p = chain(n, 1, 1, true);
  const exact = fixedFreeEigenvalues(n, 1, 1);
  const ref = denseGeneralized(p);

  it('stays M-orthogonal to deflated vectors and finds the next pairs', () => {
    const v = blockOf(ref.vectors.slice(0, 3));
    const search = searchAt(p, -1e-6, 3);
    const deflation = { vectors: v, massVectors: search.operator.massTimes(v, 3), count: 3 };
    const r = subspaceIteration({ ...search, deflation });
    expect(r.converged).toBe(true);
    expect(maxRelativeError(r.values, exact.slice(3, 6))).toBeLessThan(1e-10);
    expect(massOrthonormality(p.mass, r.vectors, 3, { v, count: 3 }).against).toBeLessThan(1e-10);
  });

  it('converges in two iterations from the exact eigenvectors (the least the settle test allows)', () => {
    const start = blockOf(ref.vectors.slice(0, 3));
    const r = subspaceIteration(searchAt(p, -1e-6, 3, { start, startCount: 3 }));
    expect(r.converged).toBe(true);
    expect(r.iterations).toBe(2);
  });

  it('stops when the checkpoint says so (abandoned), from iteration 2 on, with estimates', () => {
    const seen: Float64Array[] = [];
    const r = subspaceIteration(searchAt(p, -1e-6, 5, { checkpoint: (e) => (seen.push(e), false) }));
    expect(r.abandoned).toBe(true);
    expect(r.iterations).toBe(2);
    expect(seen.length).toBe(1);
    // the estimates handed over are ascending and bound the eigenvalues from above (minimax)
    for (let i = 1; i < seen[0].length; i++) expect(seen[0][i]).toBeGreaterThanOrEqual(seen[0][i - 1]);
    expect(seen[0][0]).toBeGreaterThanOrEqual(exact[0] * (1 - 1e-12));
    expect(r.estimateCount).toBeGreaterThanOrEqual(5);
  });

  it('reports an iteration limit as not converged, with a warning', () => {
    const r = subspaceIteration(searchAt(p, -1e-6, 5, { maxIterations: 1 }));
    expect(r.converged).toBe(false);
    expect(r.warnings[0]).toMatch(/stopped after 1 iterations with 0 of 5 modes converged/);
  });

  it('ends through the stagnation test when the tolerance cannot be met (1e-30)', () => {
    const r = subspaceIteration(searchAt(p, -1e-6, 3, { tolerance: 1e-30 }));
    expect(r.converged).toBe(true);
    expect(Math.max(...r.residuals)).toBeLessThanOrEqual(1e-8);
    expect(maxRelativeError(r.values, exact.slice(0, 3))).toBeLessThan(1e-10);
  });
});

describe('subspace iteration with massless DOFs (singular M)', () => {
  it('finds the finite eigenvalues with the basis capped at rank(M) (reversed pencil, ml-matrix)', () => {
    const base = chain(30, 1, 1, true);
    const masses = Array.from({ length: 30 }, (_, i) => (i % 2 === 1 ? 0 : 1));
    const p: Pencil = { stiffness: base.stiffness, mass: diagonalMatrix(masses) };
    const rank = massRankBound(p.mass);
    expect(rank).toBe(15);
    const finite = denseFiniteEigenvaluesReversed(p);
    expect(finite.length).toBe(15);
    const r = subspaceIteration(searchAt(p, -1e-6, 4, { maxBasis: rank }));
    expect(r.converged).toBe(true);
    expect(maxRelativeError(r.values, finite.slice(0, 4))).toBeLessThan(1e-9);
  });
});

describe('subspace iteration with a badly scaled M', () => {
  it('matches the reversed pencil (ml-matrix) on a chain whose masses span six decades', () => {
    const n = 24;
    const masses = Array.from({ length: n }, (_, i) => 10 ** (-6 * ((i * 7) % n) / (n - 1)));
    const p: Pencil = { stiffness: chain(n, 1, 1, true).stiffness, mass: diagonalMatrix(masses) };
    const reference = denseFiniteEigenvaluesReversed(p, 0);
    const r = subspaceIteration(searchAt(p, -1e-6 * reference[0], 4));
    expect(r.converged).toBe(true);
    expect(maxRelativeError(r.values, reference.slice(0, 4))).toBeLessThan(1e-9);
  });
});

describe('subspace iteration refuses an indefinite M', () => {
  it('throws IndefiniteMassError for M = diag(1, …, 1, −1) (e_nᵀ M e_n = −1)', () => {
    const masses = Array.from({ length: 20 }, (_, i) => (i === 19 ? -1 : 1));
    const p: Pencil = { stiffness: chain(20, 1, 1, true).stiffness, mass: diagonalMatrix(masses) };
    expect(() => subspaceIteration(searchAt(p, -1e-6, 3))).toThrow(IndefiniteMassError);
  });
});

describe('subspace iteration: convergence rate (header)', () => {
  it('reduces the error of λ_i by about ((λ_i − σ)/(λ_{q+1} − σ))² per iteration', () => {
    // Ritz vector i converges like ((λ_i − σ)/(λ_{q+1} − σ))^k (Bathe, Finite Element Procedures
    // §11.6, as the header cites); a Rayleigh quotient's error goes with the square of the
    // vector's (common practice). Fixed–free chain of 60 (closed form), i = 6, q = 14.
    const n = 60;
    const p = chain(n, 1, 1, true);
    const exact = fixedFreeEigenvalues(n, 1, 1);
    const sigma = -1e-6;
    const q = subspaceSize(6, n);
    expect(q).toBe(14);
    const rate = ((exact[5] - sigma) / (exact[q] - sigma)) ** 2;
    const errors = [2, 3, 4, 5].map((k) => {
      const r = subspaceIteration(searchAt(p, sigma, 6, { maxIterations: k }));
      return (r.estimates[5] - exact[5]) / exact[5];
    });
    for (let k = 1; k < errors.length; k++) {
      const ratio = errors[k] / errors[k - 1];
      expect(ratio).toBeGreaterThan(0.5 * rate);
      expect(ratio).toBeLessThan(2.5 * rate);
    }
  });
});
