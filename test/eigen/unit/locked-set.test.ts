/**
 * src/eigen/locked-set.ts on its own: the bookkeeping of locked pairs (growth past the first
 * capacity, the M-orthonormal basis view, results sorted by eigenvalue, the merged picture of
 * locked and unlocked estimates). Reference: the pairs pushed in, by definition.
 */
import { describe, expect, it } from 'vitest';
import { LockedSet } from '../../../src/eigen/locked-set.js';
import type { RitzPairs } from '../../../src/eigen/rayleigh-ritz.js';

const n = 4;
/** Column i of a recognizable block: entries 10·i + r. */
const column = (i: number) => Float64Array.from({ length: n }, (_, r) => 10 * i + r);

describe('LockedSet', () => {
  it('grows past its capacity and keeps every vector, M-image, value and residual', () => {
    const set = new LockedSet(n, 2);
    const values = [5, 1, 4, 2, 3];
    values.forEach((v, i) => set.push(column(i), column(i).map((x) => -x), v, 1e-13 * (i + 1)));
    expect(set.count).toBe(5);
    expect(set.valuesView()).toEqual(values);
    const basis = set.basis();
    expect(basis.count).toBe(5);
    expect(basis.vectors.length).toBe(5 * n);
    for (let i = 0; i < 5; i++) {
      expect(Array.from(basis.vectors.subarray(i * n, (i + 1) * n))).toEqual(Array.from(column(i)));
      expect(Array.from(basis.massVectors.subarray(i * n, (i + 1) * n))).toEqual(Array.from(column(i).map((x) => -x)));
    }
  });

  it('returns the first `limit` pairs by ascending eigenvalue with their vectors and residuals', () => {
    const set = new LockedSet(n);
    [5, 1, 4, 2, 3].forEach((v, i) => set.push(column(i), column(i), v, i));
    const r = set.result(3);
    expect(r.count).toBe(3);
    expect(Array.from(r.values)).toEqual([1, 2, 3]);
    // λ = 1 was pushed second (i = 1), λ = 2 fourth (i = 3), λ = 3 fifth (i = 4)
    expect(Array.from(r.residuals)).toEqual([1, 3, 4]);
    expect(Array.from(r.vectors.subarray(0, n))).toEqual(Array.from(column(1)));
    expect(Array.from(r.vectors.subarray(2 * n, 3 * n))).toEqual(Array.from(column(4)));
    expect(set.result(10).count).toBe(5);
  });

  it('locks Ritz pair i from a RitzPairs block', () => {
    const ritz = {
      count: 2,
      values: Float64Array.from([7, 8]),
      vectors: Float64Array.from([...column(0), ...column(1)]),
      massVectors: Float64Array.from([...column(2), ...column(3)]),
    } as unknown as RitzPairs;
    const set = new LockedSet(n);
    set.add(ritz, 1, 1e-14);
    expect(set.valuesView()).toEqual([8]);
    expect(Array.from(set.basis().vectors)).toEqual(Array.from(column(1)));
    expect(Array.from(set.basis().massVectors)).toEqual(Array.from(column(3)));
  });

  it('merges locked and unlocked estimates in ascending order, each with its own vector', () => {
    const set = new LockedSet(n);
    set.push(column(0), column(0), 2, 0);
    set.push(column(1), column(1), 0.5, 0);
    const extra = Float64Array.from([...column(7), ...column(8)]);
    const e = set.estimates([1, 3], extra, 2);
    expect(e.estimateCount).toBe(4);
    expect(Array.from(e.estimates)).toEqual([0.5, 1, 2, 3]);
    const cols = [1, 7, 0, 8];
    cols.forEach((c, t) => expect(Array.from(e.estimateVectors.subarray(t * n, (t + 1) * n))).toEqual(Array.from(column(c))));
  });
});
