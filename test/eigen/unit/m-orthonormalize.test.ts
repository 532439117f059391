/**
 * src/eigen/m-orthonormalize.ts on its own: the statements of its header,
 *
 *     QᵀMQ = I,   LᵀMQ = 0,   X = L P + Q R,
 *
 * with dependent directions dropped (columns inside span(X's other columns), inside span(L), or
 * in null(M)), and a negative xᵀMx refused (IndefiniteMassError). The checks recompute every
 * product from the sparse M directly (definitions, no reference library needed), and the rank
 * that must remain is known by construction.
 */
import { describe, expect, it } from 'vitest';
import { mOrthonormalize, type MassBasis } from '../../../src/eigen/m-orthonormalize.js';
import { IndefiniteMassError } from '../../../src/eigen/modes-types.js';
import { symMultiplyBlock, type SymmetricCsc } from '../../../src/sparse/csc.js';
import { blockOf, diagonalMatrix, massOrthonormality, pseudoRandomBlock, sparseOf, chain } from './pencils.js';

const massTimesOf = (m: SymmetricCsc) => (x: Float64Array, k: number) => symMultiplyBlock(m, x, k, new Float64Array(m.n * k));

/** ‖X − Σ B_i P_i − Q R‖_max: the decomposition the header promises. */
function reconstructionError(x: Float64Array, k: number, n: number, against: MassBasis[], r: ReturnType<typeof mOrthonormalize>): number {
  let worst = 0;
  for (let j = 0; j < k; j++) {
    for (let row = 0; row < n; row++) {
      let s = x[j * n + row];
      against.forEach((b, bi) => {
        for (let t = 0; t < b.count; t++) s -= b.vectors[t * n + row] * r.projections[bi][t + j * b.count];
      });
      for (let t = 0; t < r.count; t++) s -= r.vectors[t * n + row] * r.coefficients[t + j * r.count];
      worst = Math.max(worst, Math.abs(s));
    }
  }
  return worst;
}

describe('mOrthonormalize: the header statements', () => {
  // a consistent-mass-like M: the spring chain's K plus a diagonal (positive definite, non-diagonal)
  const n = 40;
  const m = (() => {
    const kc = chain(n, 1, 1, true).stiffness;
    const entries: [number, number, number][] = [];
    for (let j = 0; j < n; j++) for (let p = kc.colPtr[j]; p < kc.colPtr[j + 1]; p++) entries.push([kc.rowIdx[p], j, 0.1 * kc.values[p] + (kc.rowIdx[p] === j ? 1 : 0)]);
    return sparseOf(n, entries);
  })();
  const massTimes = massTimesOf(m);

  it('gives QᵀMQ = I, LᵀMQ = 0 and X = L P + Q R for a full-rank block against a locked block', () => {
    const l0 = mOrthonormalize(pseudoRandomBlock(n, 3, 11), 3, n, massTimes);
    const locked: MassBasis = { vectors: l0.vectors, massVectors: l0.massVectors, count: l0.count };
    const x = pseudoRandomBlock(n, 5, 12);
    const q = mOrthonormalize(x, 5, n, massTimes, { against: [locked] });
    expect(q.count).toBe(5);
    const o = massOrthonormality(m, q.vectors, q.count, { v: locked.vectors, count: locked.count });
    expect(o.self).toBeLessThan(1e-13);
    expect(o.against).toBeLessThan(1e-13);
    expect(reconstructionError(x, 5, n, [locked], q)).toBeLessThan(1e-12);
    // MQ returned is M times Q
    const mq = massTimes(q.vectors, q.count);
    let d = 0;
    for (let i = 0; i < mq.length; i++) d = Math.max(d, Math.abs(mq[i] - q.massVectors[i]));
    expect(d).toBeLessThan(1e-13);
  });

  it('drops a column that is a combination of the others (rank-deficient block) and still reconstructs X', () => {
    const x = pseudoRandomBlock(n, 4, 21);
    // column 3 = 2·column 0 − column 2: rank 3
    for (let r = 0; r < n; r++) x[3 * n + r] = 2 * x[r] - x[2 * n + r];
    const q = mOrthonormalize(x, 4, n, massTimes);
    expect(q.count).toBe(3);
    expect(massOrthonormality(m, q.vectors, q.count).self).toBeLessThan(1e-13);
    expect(reconstructionError(x, 4, n, [], q)).toBeLessThan(1e-12);
  });

  it('drops a repeated column and a zero column', () => {
    const x = pseudoRandomBlock(n, 4, 31);
    x.copyWithin(2 * n, 0, n);
    x.fill(0, 3 * n, 4 * n);
    const q = mOrthonormalize(x, 4, n, massTimes);
    expect(q.count).toBe(2);
    expect(reconstructionError(x, 4, n, [], q)).toBeLessThan(1e-12);
  });

  it('drops columns that lie inside span(L) (already locked directions)', () => {
    const l0 = mOrthonormalize(pseudoRandomBlock(n, 3, 41), 3, n, massTimes);
    const locked: MassBasis = { vectors: l0.vectors, massVectors: l0.massVectors, count: 3 };
    const x = pseudoRandomBlock(n, 3, 42);
    // column 1 = L·(1, −2, 0.5)ᵀ exactly inside span(L)
    for (let r = 0; r < n; r++) x[n + r] = l0.vectors[r] - 2 * l0.vectors[n + r] + 0.5 * l0.vectors[2 * n + r];
    const q = mOrthonormalize(x, 3, n, massTimes, { against: [locked] });
    expect(q.count).toBe(2);
    const o = massOrthonormality(m, q.vectors, q.count, { v: locked.vectors, count: 3 });
    expect(o.self).toBeLessThan(1e-13);
    expect(o.against).toBeLessThan(1e-13);
    expect(reconstructionError(x, 3, n, [locked], q)).toBeLessThan(1e-12);
    // the projection of that column onto L is its coefficients (1, −2, 0.5)
    expect(Array.from(q.projections[0].subarray(3, 6))).toEqual([expect.closeTo(1, 12), expect.closeTo(-2, 12), expect.closeTo(0.5, 12)]);
  });

  it('returns nothing when every column lies in span(L)', () => {
    const l0 = mOrthonormalize(pseudoRandomBlock(n, 2, 51), 2, n, massTimes);
    const locked: MassBasis = { vectors: l0.vectors, massVectors: l0.massVectors, count: 2 };
    const x = l0.vectors.slice();
    const q = mOrthonormalize(x, 2, n, massTimes, { against: [locked] });
    expect(q.count).toBe(0);
    expect(reconstructionError(x, 2, n, [locked], q)).toBeLessThan(1e-13);
  });
});

describe('mOrthonormalize with a singular M (massless DOFs)', () => {
  // M = diag(1, 0, 2, 0, 1, 0): rank 3, null(M) = span(e₁, e₃, e₅)
  const m = diagonalMatrix([1, 0, 2, 0, 1, 0]);
  const massTimes = massTimesOf(m);

  it('drops a column in null(M) and keeps at most rank(M) = 3 directions', () => {
    const nullColumn = [0, 1, 0, -3, 0, 2];
    const x = blockOf([[1, 0.3, 0, 0, 0, 0], nullColumn, [0, 0, 1, 0.2, 0, 0], [0.4, 0, 0.1, 0, 1, 0.7], [1, 1, 1, 1, 1, 1]]);
    const q = mOrthonormalize(x, 5, 6, massTimes);
    // five columns but only three M-independent directions (rank(M) = 3)
    expect(q.count).toBe(3);
    expect(massOrthonormality(m, q.vectors, q.count).self).toBeLessThan(1e-14);
  });
});

describe('mOrthonormalize refuses an indefinite M (IndefiniteMassError)', () => {
  // M = [[1, .9, −.9], [.9, 1, .9], [−.9, .9, 1]]: every 2×2 minor is positive but x = (1, −1, 1)
  // gives xᵀMx = 3 − 5.4 = −2.4 (worked by hand, as in test/eigen/indefinite-mass.test.ts)
  const m = sparseOf(3, [[0, 0, 1], [1, 0, 0.9], [2, 0, -0.9], [1, 1, 1], [2, 1, 0.9], [2, 2, 1]]);

  it('throws with the negative cosine xᵀMx / (‖x‖‖Mx‖)', () => {
    const x = Float64Array.from([1, -1, 1]);
    let caught: unknown;
    try {
      mOrthonormalize(x, 1, 3, massTimesOf(m));
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(IndefiniteMassError);
    // Mx = (−0.8, −0.8, −0.8) by hand: cosine = −2.4 / (√3 · √1.92) = −1.0
    expect((caught as IndefiniteMassError).cosine).toBeCloseTo(-2.4 / (Math.sqrt(3) * Math.sqrt(3 * 0.64)), 12);
  });

  it('accepts the same M for a vector with positive xᵀMx (no false refusal)', () => {
    const q = mOrthonormalize(Float64Array.from([1, 1, 1]), 1, 3, massTimesOf(m));
    expect(q.count).toBe(1);
  });
});

describe('mOrthonormalize: the second pass ("twice is enough") and a badly scaled M', () => {
  it('keeps LᵀMQ at rounding level for X lying almost inside span(L)', () => {
    const n = 50;
    const m = diagonalMatrix(Array.from({ length: n }, (_, i) => 1 + (i % 7)));
    const massTimes = massTimesOf(m);
    const l0 = mOrthonormalize(pseudoRandomBlock(n, 6, 61), 6, n, massTimes);
    const locked: MassBasis = { vectors: l0.vectors, massVectors: l0.massVectors, count: 6 };
    // X = L C + 1e-7 · E: after one projection pass the remainder carries a rounding error of
    // about ε relative to X, ε / 1e-7 once normalized (the usual cancellation argument, from memory)
    const c = pseudoRandomBlock(6, 3, 62);
    const e = pseudoRandomBlock(n, 3, 63);
    const x = new Float64Array(n * 3);
    for (let j = 0; j < 3; j++) {
      for (let r = 0; r < n; r++) {
        let s = 1e-7 * e[j * n + r];
        for (let t = 0; t < 6; t++) s += l0.vectors[t * n + r] * c[t + j * 6];
        x[j * n + r] = s;
      }
    }
    const q = mOrthonormalize(x, 3, n, massTimes, { against: [locked] });
    expect(q.count).toBe(3);
    const o = massOrthonormality(m, q.vectors, 3, { v: locked.vectors, count: 6 });
    expect(o.self).toBeLessThan(1e-13);
    expect(o.against).toBeLessThan(1e-14);
    expect(reconstructionError(x, 3, n, [locked], q)).toBeLessThan(1e-13);
  });

  it('gives QᵀMQ = I for lumped masses spanning eight decades', () => {
    const n = 30;
    const m = diagonalMatrix(Array.from({ length: n }, (_, i) => 10 ** (-8 * (i / (n - 1)))));
    const q = mOrthonormalize(pseudoRandomBlock(n, 8, 71), 8, n, massTimesOf(m));
    expect(q.count).toBe(8);
    expect(massOrthonormality(m, q.vectors, 8).self).toBeLessThan(1e-13);
  });
});
