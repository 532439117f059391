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
  const { lower, from } = permutedLower(a, inversePermutation(perm));
  // values follow their entries through both passes
  const values = new Float64Array(from.length);
  for (let q = 0; q < from.length; q++) values[q] = a.values[from[q]];
  return { n: a.n, colPtr: lower.colPtr, rowIdx: lower.rowIdx, values };
}

/**
 * The shifted pair's pattern in pivot order: the lower triangle of P(K + M)Pᵀ (the union of the
 * two patterns), rows sorted, and per entry where its values come from — the stored index in
 * K's values and in M's values, −1 where that matrix has no entry. The values themselves are
 * not copied: A = K − σM is formed entry by entry at factor time (shiftedEntry) from K's and
 * M's own arrays, so the pattern work is done once per model and no second copy of K and M is
 * held. `stiffnessValues` / `massValues` are the arrays the indices point into (K's and M's
 * values, or copies of them in shared memory that helper threads can read).
 */
export interface PermutedPair {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
  stiffnessAt: Int32Array;
  massAt: Int32Array;
  stiffnessValues: Float64Array;
  massValues: Float64Array;
}

/** Entry p of A = K − σM on the pair's pattern (a matrix without the entry contributes 0). */
export function shiftedEntry(pair: PermutedPair, p: number, shift: number): number {
  const k = pair.stiffnessAt[p];
  const m = pair.massAt[p];
  return (k >= 0 ? pair.stiffnessValues[k] : 0) - shift * (m >= 0 ? pair.massValues[m] : 0);
}

/** The union of the patterns of a and b (both lower storage, rows sorted), rows sorted. */
export function unionPattern(a: Pattern, b: Pattern): Pattern {
  const n = a.n;
  const colPtr = new Int32Array(n + 1);
  let rowIdx = new Int32Array(a.colPtr[n] + b.colPtr[n]);
  let o = 0;
  // merge the two sorted row lists of each column
  for (let j = 0; j < n; j++) {
    let p = a.colPtr[j];
    let q = b.colPtr[j];
    const pe = a.colPtr[j + 1];
    const qe = b.colPtr[j + 1];
    while (p < pe || q < qe) {
      const ra = p < pe ? a.rowIdx[p] : n;
      const rb = q < qe ? b.rowIdx[q] : n;
      if (ra <= rb) p++;
      if (rb <= ra) q++;
      rowIdx[o++] = ra < rb ? ra : rb;
    }
    colPtr[j + 1] = o;
  }
  if (o < rowIdx.length) rowIdx = rowIdx.slice(0, o);
  return { n, colPtr, rowIdx };
}

/**
 * Lower triangle of P A Pᵀ by columns, rows sorted, with `from[q]` the stored index in `a` of
 * the entry in slot q (permutedUpper, then its counting transpose; the two index maps composed
 * in place).
 */
function permutedLower(a: Pattern, pinv: Int32Array): { lower: Pattern; from: Int32Array } {
  const { upper, src } = permutedUpper(a, pinv);
  const { lower, map } = transposePattern(upper);
  // slot q of the lower part came from upper slot map[q], which came from a's entry src[map[q]]
  for (let q = 0; q < map.length; q++) map[q] = src[map[q]];
  return { lower, from: map };
}

/**
 * The pair (K, M) permuted symmetrically (perm[k] = original DOF of pivot k): per column the
 * sorted row lists of P K Pᵀ and P M Pᵀ merged, each entry pointing at its source in K and M.
 * FE mass patterns usually lie inside the stiffness pattern, so the union is about K's size.
 * `allocate` makes the pair's index arrays (e.g. in shared memory, for helper threads).
 */
export function permutedPair(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  perm: Int32Array,
  allocate: (length: number) => Int32Array = (length) => new Int32Array(length),
): PermutedPair {
  const n = stiffness.n;
  const pinv = inversePermutation(perm);
  const k = permutedLower(stiffness, pinv);
  const m = permutedLower(mass, pinv);
  const kp = k.lower.colPtr;
  const kr = k.lower.rowIdx;
  const mp = m.lower.colPtr;
  const mr = m.lower.rowIdx;
  const colPtr = allocate(n + 1);
  // size of the union of the two sorted row lists of each column
  for (let j = 0; j < n; j++) {
    let p = kp[j];
    let q = mp[j];
    const pe = kp[j + 1];
    const qe = mp[j + 1];
    let c = pe - p + qe - q;
    while (p < pe && q < qe) {
      const rk = kr[p];
      const rm = mr[q];
      if (rk <= rm) p++;
      if (rm <= rk) q++;
      if (rk === rm) c--;
    }
    colPtr[j + 1] = colPtr[j] + c;
  }
  const nnz = colPtr[n];
  const rowIdx = allocate(nnz);
  const stiffnessAt = allocate(nnz);
  const massAt = allocate(nnz);
  // merge them, recording each entry's source in K and in M (−1: none)
  for (let j = 0; j < n; j++) {
    let p = kp[j];
    let q = mp[j];
    const pe = kp[j + 1];
    const qe = mp[j + 1];
    let o = colPtr[j];
    while (p < pe || q < qe) {
      const rk = p < pe ? kr[p] : n;
      const rm = q < qe ? mr[q] : n;
      stiffnessAt[o] = rk <= rm ? k.from[p++] : -1;
      massAt[o] = rm <= rk ? m.from[q++] : -1;
      rowIdx[o++] = rk < rm ? rk : rm;
    }
  }
  return { n, colPtr, rowIdx, stiffnessAt, massAt, stiffnessValues: stiffness.values, massValues: mass.values };
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
