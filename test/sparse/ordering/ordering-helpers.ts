/** Small helpers shared by the ordering tests. */
import { expect } from 'vitest';

/** perm is a bijection of 0..n−1. */
export function expectPermutation(perm: Int32Array, n: number): void {
  expect(perm.length).toBe(n);
  const seen = new Uint8Array(n);
  let bad = 0;
  for (const v of perm) {
    if (v < 0 || v >= n || seen[v]) bad++;
    else seen[v] = 1;
  }
  expect(bad).toBe(0);
}

export function naturalPerm(n: number): Int32Array {
  return Int32Array.from({ length: n }, (_, k) => k);
}
