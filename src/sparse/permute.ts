/**
 * Symmetric permutation C = P A Pᵀ of matrices stored as their lower triangle.
 *
 * Convention (shared with the orderings): `perm[k]` is the original index of the k-th pivot,
 * and `pinv[perm[k]] = k`, so C(pinv[i], pinv[j]) = A(i, j). An entry (i, j) of A lands in the
 * lower triangle of C at (max(pinv i, pinv j), min(pinv i, pinv j)).
 */
import type { SymmetricCsc } from './csc.js';

/** pinv[perm[k]] = k. */
export function inversePermutation(perm: Int32Array): Int32Array {
  const pinv = new Int32Array(perm.length);
  // pinv is the inverse map: original index -> pivot position
  for (let k = 0; k < perm.length; k++) pinv[perm[k]] = k;
  return pinv;
}

/** A pattern in compressed column form (no values). */
export interface Pattern {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
}

/**
 * Upper triangle of C = P A Pᵀ by columns (equivalently: the lower triangle by rows), rows in
 * each column unsorted. `src[q]` is the stored index in `a` of the entry that went to slot q.
 */
export function permutedUpper(a: Pattern, pinv: Int32Array): { upper: Pattern; src: Int32Array } {
  const { n, colPtr, rowIdx } = a;
  const nnz = colPtr[n];
  const ptr = new Int32Array(n + 1);
  // count entries per column of the upper triangle: column = max(pinv i, pinv j)
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      ptr[(pi > pj ? pi : pj) + 1]++;
    }
  }
  for (let c = 0; c < n; c++) ptr[c + 1] += ptr[c];
  const next = ptr.slice(0, n);
  const rows = new Int32Array(nnz);
  const src = new Int32Array(nnz);
  // place each entry at (min, max) in the upper triangle
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      const hi = pi > pj ? pi : pj;
      const q = next[hi]++;
      rows[q] = pi > pj ? pj : pi;
      src[q] = p;
    }
  }
  return { upper: { n, colPtr: ptr, rowIdx: rows }, src };
}

/**
 * Transpose of an upper pattern: the lower triangle by columns, rows sorted ascending within each
 * column (a counting transpose visits columns of the upper part in increasing order).
 * `map[q]` is the slot in the input that produced output slot q.
 */
export function transposePattern(u: Pattern): { lower: Pattern; map: Int32Array } {
  const { n, colPtr, rowIdx } = u;
  const nnz = colPtr[n];
  const ptr = new Int32Array(n + 1);
  // count entries per row of the upper part = per column of the lower part
  for (let p = 0; p < nnz; p++) ptr[rowIdx[p] + 1]++;
  for (let c = 0; c < n; c++) ptr[c + 1] += ptr[c];
  const next = ptr.slice(0, n);
  const rows = new Int32Array(nnz);
  const map = new Int32Array(nnz);
  // scatter (i, j) of the upper part to (j, i) of the lower part
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const q = next[rowIdx[p]]++;
      rows[q] = j;
      map[q] = p;
    }
  }
  return { lower: { n, colPtr: ptr, rowIdx: rows }, map };
}

/** Lower triangle of P A Pᵀ with sorted rows, values carried along. */
export function permuteSymmetric(a: SymmetricCsc, perm: Int32Array): SymmetricCsc {
  const pinv = inversePermutation(perm);
  const { upper, src } = permutedUpper(a, pinv);
  const { lower, map } = transposePattern(upper);
  const values = new Float64Array(map.length);
  // values follow their entries through both passes
  for (let q = 0; q < map.length; q++) values[q] = a.values[src[map[q]]];
  return { n: a.n, colPtr: lower.colPtr, rowIdx: lower.rowIdx, values };
}

/**
 * The permuted pair on the union pattern of K and M: lower triangle of P(K + M)Pᵀ with rows
 * sorted, and the values of K and of M on that pattern (zero where one of them has no entry).
 * A = K − σM is then formed entry by entry at factor time without a new structure.
 */
export interface PermutedPair {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
  stiffness: Float64Array;
  mass: Float64Array;
}

/**
 * K and M on the union of their patterns in their own numbering: per column, the two sorted row
 * lists merged, each matrix's value carried (zero where it has no entry). FE mass patterns
 * usually lie inside the stiffness pattern, so the union is about K's size.
 */
export function unionPair(stiffness: SymmetricCsc, mass: SymmetricCsc): PermutedPair {
  const n = stiffness.n;
  const colPtr = new Int32Array(n + 1);
  // size of the union of the two sorted row lists of each column
  for (let j = 0; j < n; j++) {
    let p = stiffness.colPtr[j];
    let q = mass.colPtr[j];
    const pe = stiffness.colPtr[j + 1];
    const qe = mass.colPtr[j + 1];
    let c = 0;
    while (p < pe || q < qe) {
      const rk = p < pe ? stiffness.rowIdx[p] : n;
      const rm = q < qe ? mass.rowIdx[q] : n;
      if (rk <= rm) p++;
      if (rm <= rk) q++;
      c++;
    }
    colPtr[j + 1] = colPtr[j] + c;
  }
  const nnz = colPtr[n];
  const rowIdx = new Int32Array(nnz);
  const kv = new Float64Array(nnz);
  const mv = new Float64Array(nnz);
  // merge the two sorted row lists of each column, carrying each matrix's value
  for (let j = 0; j < n; j++) {
    let p = stiffness.colPtr[j];
    let q = mass.colPtr[j];
    const pe = stiffness.colPtr[j + 1];
    const qe = mass.colPtr[j + 1];
    let o = colPtr[j];
    while (p < pe || q < qe) {
      const rk = p < pe ? stiffness.rowIdx[p] : n;
      const rm = q < qe ? mass.rowIdx[q] : n;
      if (rk <= rm) kv[o] = stiffness.values[p++];
      if (rm <= rk) mv[o] = mass.values[q++];
      rowIdx[o++] = rk < rm ? rk : rm;
    }
  }
  return { n, colPtr, rowIdx, stiffness: kv, mass: mv };
}

/** The union pair (unionPair) permuted symmetrically, rows sorted, both value arrays carried along. */
export function permuteUnion(u: PermutedPair, perm: Int32Array): PermutedPair {
  const { upper, src } = permutedUpper(u, inversePermutation(perm));
  const { lower, map } = transposePattern(upper);
  const kv = new Float64Array(map.length);
  const mv = new Float64Array(map.length);
  // values follow their entries through both passes
  for (let q = 0; q < map.length; q++) {
    const from = src[map[q]];
    kv[q] = u.stiffness[from];
    mv[q] = u.mass[from];
  }
  return { n: u.n, colPtr: lower.colPtr, rowIdx: lower.rowIdx, stiffness: kv, mass: mv };
}

/**
 * Principal sub-matrix A(S, S) for DOFs S = `dofs` (strictly ascending), renumbered 0…|S|−1 and
 * still stored as its lower triangle by columns (ascending S keeps every row below its column).
 */
export function principalSubmatrix(a: SymmetricCsc, dofs: Int32Array): SymmetricCsc {
  const position = new Int32Array(a.n).fill(-1);
  // position[d] = place of DOF d in the subset
  for (let s = 0; s < dofs.length; s++) position[dofs[s]] = s;
  const colPtr = new Int32Array(dofs.length + 1);
  // count the kept entries of each kept column
  for (let s = 0; s < dofs.length; s++) {
    const j = dofs[s];
    let c = 0;
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) if (position[a.rowIdx[p]] >= 0) c++;
    colPtr[s + 1] = colPtr[s] + c;
  }
  const rowIdx = new Int32Array(colPtr[dofs.length]);
  const values = new Float64Array(colPtr[dofs.length]);
  // copy them with renumbered rows (order preserved: rows ascend, diagonal first)
  for (let s = 0, q = 0; s < dofs.length; s++) {
    const j = dofs[s];
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const r = position[a.rowIdx[p]];
      if (r < 0) continue;
      rowIdx[q] = r;
      values[q++] = a.values[p];
    }
  }
  return { n: dofs.length, colPtr, rowIdx, values };
}
