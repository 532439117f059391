import { describe, expect, it } from 'vitest';
import { CholeskyDecomposition } from 'ml-matrix';
import {
  cholesky,
  choleskyOrThrow,
  NotPositiveDefiniteError,
  solveLower,
  solveLowerTransposed,
  solveRightLowerTransposed,
} from '../../src/dense/cholesky.js';
import { svqbOrthonormalize } from '../../src/dense/svqb.js';
import { maxAbs, multiply, orthogonalityError, randomBlock, toMatrix, transposed } from './helpers.js';

function randomSpd(n: number, seed: number): Float64Array {
  const b = randomBlock(n, n, seed);
  const a = multiply(b, transposed(b, n, n), n, n, n);
  for (let i = 0; i < n; i++) a[i * n + i] += 0.5;
  for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) a[i * n + j] = a[j * n + i];
  return a;
}

describe('cholesky', () => {
  it.each([1, 2, 5, 50])('matches ml-matrix CholeskyDecomposition (n = %i)', (n) => {
    // Reference: ml-matrix CholeskyDecomposition (the factor is unique with a positive diagonal).
    const a = randomSpd(n, 100 + n);
    const l = choleskyOrThrow(a, n);
    const ref = new CholeskyDecomposition(toMatrix(a, n, n)).lowerTriangularMatrix;
    const scale = maxAbs(a);
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < n; i++) expect(Math.abs(l[j * n + i] - ref.get(i, j))).toBeLessThan(1e-12 * Math.sqrt(scale) * n);
    }
    const llt = multiply(l, transposed(l, n, n), n, n, n);
    for (let i = 0; i < n * n; i++) expect(Math.abs(llt[i] - a[i])).toBeLessThan(1e-14 * scale * n);
  });

  it('names the column where an indefinite matrix fails', () => {
    // Reference: leading minors of [[4,2,0],[2,1,0],[0,0,1]] are 4, 0 — the pivot of column 1 is 0.
    const a = new Float64Array([4, 2, 0, 2, 1, 0, 0, 0, 1]);
    const r = cholesky(a, 3);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.failedColumn).toBe(1);
      expect(Math.abs(r.pivot)).toBeLessThan(1e-15);
    }
    expect(() => choleskyOrThrow(a, 3, 'test matrix')).toThrow(NotPositiveDefiniteError);
    expect(cholesky(new Float64Array([-1]), 1).ok).toBe(false);
  });

  it('solves with L, Lᵀ and from the right', () => {
    // Reference: the defining identities L(L⁻¹B) = B, Lᵀ(L⁻ᵀB) = B, (XL⁻ᵀ)Lᵀ = X.
    const n = 8;
    const l = choleskyOrThrow(randomSpd(n, 4), n);
    const b = randomBlock(n, 3, 5);
    const y = Float64Array.from(b);
    solveLower(l, n, y, 3);
    const back = multiply(l, y, n, n, 3);
    expect(maxAbs(back.map((v, i) => v - b[i]))).toBeLessThan(1e-12);
    const z = Float64Array.from(b);
    solveLowerTransposed(l, n, z, 3);
    const back2 = multiply(transposed(l, n, n), z, n, n, 3);
    expect(maxAbs(back2.map((v, i) => v - b[i]))).toBeLessThan(1e-12);
    const rows = 30;
    const x = randomBlock(rows, n, 6);
    const w = Float64Array.from(x);
    solveRightLowerTransposed(w, rows, l, n);
    const back3 = multiply(w, transposed(l, n, n), rows, n, n);
    expect(maxAbs(back3.map((v, i) => v - x[i]))).toBeLessThan(1e-12);
  });
});


describe('svqbOrthonormalize', () => {
  it('keeps the rank of a block with a dependent column and a B-null column', () => {
    // Reference: constructed — B = diag(1, …, 1, 0, 0) (two massless DOFs), column 3 = 2·column 0,
    // column 4 lies in null(B): the B-rank of the 6 columns is 4 (definition of rank).
    const rows = 30;
    const k = 6;
    const b = new Float64Array(rows * rows);
    for (let i = 0; i < rows - 2; i++) b[i * rows + i] = 1;
    const x = randomBlock(rows, k, 21);
    for (let i = 0; i < rows; i++) {
      x[3 * rows + i] = 2 * x[i];
      x[4 * rows + i] = i >= rows - 2 ? 1 + i : 0;
    }
    const bx = multiply(b, x, rows, rows, k);
    const r = svqbOrthonormalize(x, bx, rows, k);
    expect(r.rank).toBe(4);
    expect(Array.from(r.zeroColumns)).toEqual([4]);
    expect(orthogonalityError(r.x, rows, r.rank, b)).toBeLessThan(1e-13 * rows);
    const bxCheck = multiply(b, r.x, rows, rows, r.rank);
    expect(maxAbs(bxCheck.map((v, i) => v - (r.bx as Float64Array)[i]))).toBeLessThan(1e-13);
    const plain = svqbOrthonormalize(randomBlock(rows, k, 22), null, rows, k);
    expect(plain.rank).toBe(k);
    expect(orthogonalityError(plain.x, rows, k)).toBeLessThan(1e-13 * rows);
  });
});
