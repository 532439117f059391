/**
 * The basis products of src/eigen/shared-block-products.ts when the basis is in shared memory but
 * no helper thread runs (as here, under the test runner): every row must still be computed on this
 * thread. Reference: the one-thread kernels of src/dense/block-ops.ts, themselves checked against
 * ml-matrix in test/dense/block-ops.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { addTimesSmall, timesSmallInPlace, transposeTimes } from '../../src/dense/block-ops.js';
import { basisAddTimesSmall, basisTimesSmallInPlace, basisTransposeTimes } from '../../src/eigen/shared-block-products.js';

/** Entries where two arrays differ (0 when identical); cheaper to report than a full diff. */
function mismatches(a: Float64Array, b: Float64Array): number {
  let count = a.length === b.length ? 0 : 1;
  for (let i = 0; i < Math.min(a.length, b.length); i++) if (a[i] !== b[i]) count++;
  return count;
}

describe('basis products on a shared basis without a helper thread', () => {
  const [rows, p, q] = [20_011, 40, 6];
  const basis = new Float64Array(new SharedArrayBuffer(8 * rows * p));
  basis.set(Float64Array.from({ length: rows * p }, (_, i) => Math.sin(0.013 * i)));
  const x = Float64Array.from({ length: rows * q }, (_, i) => Math.cos(0.007 * i));
  const s = Float64Array.from({ length: p * q }, (_, i) => 0.1 * i - 1);

  it('VᵀX, X − V S and V ← V S equal the one-thread kernels on every row', () => {
    expect(mismatches(basisTransposeTimes(basis, x, rows, p, q), transposeTimes(basis, x, rows, p, q))).toBe(0);
    const c1 = x.slice();
    const c0 = x.slice();
    basisAddTimesSmall(c1, basis, rows, p, s, q, -1);
    addTimesSmall(c0, basis, rows, p, s, q, -1);
    expect(mismatches(c1, c0)).toBe(0);
    const v1 = basis.slice();
    const v0 = basis.slice();
    const shared = new Float64Array(new SharedArrayBuffer(8 * v1.length));
    shared.set(v1);
    basisTimesSmallInPlace(shared, rows, p, s, q);
    timesSmallInPlace(v0, rows, p, s, q);
    expect(mismatches(shared, v0)).toBe(0);
  });
});
