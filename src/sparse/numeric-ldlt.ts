/**
 * Supernodal left-looking LDLᵀ of A = P(K − σM)Pᵀ on a fixed supernodal structure, no pivoting.
 *
 * For each supernode S (columns f..l−1, rows R, block B = L(R, f..l−1) nr × nc column-major):
 *   1. B ← A(R, f..l−1), formed as K − σM from the permuted pair;
 *   2. for every earlier supernode Dn with rows in f..l−1 ("descendant"), with L_D the rows of Dn
 *      from the first one ≥ f down, and L_1 the rows inside f..l−1:
 *        B(rows, cols) −= L_D · D_Dn · L_1ᵀ  (dense product, then scattered by relative indices);
 *      descendants wait in linked lists keyed by the next supernode they update;
 *   3. dense LDLᵀ of B's diagonal block and L21 = A21 L11⁻ᵀ D⁻¹, in panels of PANEL columns:
 *      each panel is first updated by the panels left of it (same dense product, in place),
 *      then factored column by column.
 * Pivots go through PivotMonitor (inertia, tiny pivots, zero-pivot substitution).
 */
import { scaledRowsKMajor, updateLowerProduct } from './dense-block-kernels.js';
import type { PivotMonitor } from './pivot-monitor.js';
import type { SupernodalStructure } from './symbolic.js';

/** Panel width of the in-supernode blocking (columns factored together). */
const PANEL = 48;
/** Target columns per dense product when a descendant updates a supernode (bounds the workspace). */
const CHUNK = 64;

export interface SupernodalFactor {
  structure: SupernodalStructure;
  /** Supernode blocks, unit diagonal stored as 1. */
  values: Float64Array;
  d: Float64Array;
}

/** a_jj = k_jj − σ m_jj in pivot order. */
export function shiftedDiagonal(s: SupernodalStructure, shift: number): Float64Array {
  const { pair } = s;
  const diag = new Float64Array(s.n);
  // the diagonal is the first stored entry of its column
  for (let j = 0; j < s.n; j++) {
    const p = pair.colPtr[j];
    if (p < pair.colPtr[j + 1] && pair.rowIdx[p] === j) diag[j] = pair.stiffness[p] - shift * pair.mass[p];
  }
  return diag;
}

export function supernodalLdlt(s: SupernodalStructure, shift: number, monitor: PivotMonitor): SupernodalFactor {
  const values = new Float64Array(s.valuePtr[s.supernodes]);
  const d = new Float64Array(s.n);
  const nextRow = new Int32Array(s.supernodes);
  factorSupernodes(s, shift, monitor, { values, d, nextRow }, [[0, s.supernodes - 1]]);
  return { structure: s, values, d };
}

/** The arrays one factorization writes; shared between threads when the work is split. */
export interface FactorArrays {
  values: Float64Array;
  d: Float64Array;
  /**
   * nextRow[sn]: position in sn's row list of its first row not yet applied to an ancestor.
   * After a subtree is factored, its supernodes' entries point at the ancestors outside it.
   */
  nextRow: Int32Array;
}

/**
 * Factors the supernodes of `ranges` (inclusive [first, last] pairs, ascending, each closed under
 * descendants — a postordered subtree or forest — or ancestor-closed "top" supernodes), in order.
 * Descendants in earlier-factored supernodes outside the ranges (other threads' subtrees) are
 * found through their `nextRow` entries when `pendingFrom` lists them; a supernode queues itself
 * only on ancestors inside the ranges.
 */
export function factorSupernodes(
  s: SupernodalStructure,
  shift: number,
  monitor: PivotMonitor,
  out: FactorArrays,
  ranges: [number, number][],
  pendingFrom: [number, number][] = [],
): void {
  const { n, supernodes: ns, superStart, superOf, rowPtr, rows, valuePtr, pair } = s;
  const { values, d, nextRow } = out;
  const diag = shiftedDiagonal(s, shift);
  const map = new Int32Array(n);
  const rel = new Int32Array(s.maxRows);
  const w = new Float64Array(Math.max(CHUNK, PANEL) * s.maxRows + 1);
  const c = new Float64Array(CHUNK * s.maxRows + 1);
  const head = new Int32Array(ns).fill(-1);
  const link = new Int32Array(ns).fill(-1);
  const inRanges = new Uint8Array(ns);
  for (const [lo, hi] of ranges) inRanges.fill(1, lo, hi + 1);
  // queue sn on the supernode of its next unapplied row, when that one is factored here
  const enqueue = (sn: number): void => {
    const q = nextRow[sn];
    if (q >= rowPtr[sn + 1] - rowPtr[sn]) return;
    const t = superOf[rows[rowPtr[sn] + q]];
    if (inRanges[t] === 0) return;
    link[sn] = head[t];
    head[t] = sn;
  };
  // supernodes factored elsewhere that still owe updates to ours
  for (const [lo, hi] of pendingFrom) for (let sn = lo; sn <= hi; sn++) enqueue(sn);
  // supernodes in order: assemble, apply descendants, factor, queue for its first ancestor
  for (const [lo, hi] of ranges) {
    for (let sn = lo; sn <= hi; sn++) {
      const f = superStart[sn];
      const l = superStart[sn + 1];
      const nc = l - f;
      const r0 = rowPtr[sn];
      const nr = rowPtr[sn + 1] - r0;
      const v0 = valuePtr[sn];
      // local position of each row of S
      for (let i = 0; i < nr; i++) map[rows[r0 + i]] = i;
      // B ← A(R, f..l−1) = K − σM
      for (let j = f; j < l; j++) {
        const base = v0 + (j - f) * nr;
        for (let p = pair.colPtr[j]; p < pair.colPtr[j + 1]; p++) {
          values[base + map[pair.rowIdx[p]]] = pair.stiffness[p] - shift * pair.mass[p];
        }
      }
      // updates from every descendant queued on S
      let dn = head[sn];
      head[sn] = -1;
      while (dn !== -1) {
        const after = link[dn];
        nextRow[dn] = applyDescendant(s, dn, sn, nextRow[dn], values, d, map, rel, w, c);
        // queue dn on the next supernode its remaining rows touch
        enqueue(dn);
        dn = after;
      }
      factorBlock(values, v0, nr, nc, f, d, diag, monitor, w);
      // S's own first row below its columns
      nextRow[sn] = nc;
      enqueue(sn);
    }
  }
}

/**
 * B_S(rows, cols) −= L_D D L_1ᵀ for descendant dn of supernode sn, whose rows from position
 * `start` on are ≥ f. Returns the position of dn's first row beyond S's columns.
 */
function applyDescendant(
  s: SupernodalStructure,
  dn: number,
  sn: number,
  start: number,
  values: Float64Array,
  d: Float64Array,
  map: Int32Array,
  rel: Int32Array,
  w: Float64Array,
  c: Float64Array,
): number {
  const { superStart, rowPtr, rows, valuePtr } = s;
  const f = superStart[sn];
  const l = superStart[sn + 1];
  const nrS = rowPtr[sn + 1] - rowPtr[sn];
  const vS = valuePtr[sn];
  const fd = superStart[dn];
  const ncd = superStart[dn + 1] - fd;
  const rd = rowPtr[dn];
  const nrd = rowPtr[dn + 1] - rd;
  let stop = start;
  while (stop < nrd && rows[rd + stop] < l) stop++;
  const m1 = stop - start; // rows of dn inside S's columns
  const m2 = nrd - start; // those rows and all below
  const vd = valuePtr[dn] + start;
  // relative positions in S of dn's rows
  for (let i = 0; i < m2; i++) rel[i] = map[rows[rd + start + i]];
  // target columns in chunks: W = L_1(chunk) D (k-major), C = L_D(chunk:) Wᵀ, scatter −C
  for (let j0 = 0; j0 < m1; j0 += CHUNK) {
    const bw = Math.min(CHUNK, m1 - j0);
    const mr = m2 - j0;
    scaledRowsKMajor(bw, ncd, values, vd + j0, nrd, d, fd, w);
    c.fill(0, 0, mr * bw);
    updateLowerProduct(mr, bw, ncd, values, vd + j0, nrd, w, c, 0, mr);
    // C holds −L_D D L_1ᵀ on and below the chunk's diagonal
    for (let j = 0; j < bw; j++) {
      const base = vS + (rows[rd + start + j0 + j] - f) * nrS;
      const cj = j * mr;
      for (let i = j; i < mr; i++) values[base + rel[j0 + i]] += c[cj + i];
    }
  }
  return stop;
}

/**
 * Dense LDLᵀ of one supernode block in place (nr × nc at values[v0], column-major, ld nr):
 * L11 D L11ᵀ = B11, L21 = B21 L11⁻ᵀ D⁻¹; pivots d[f + j]. Panels of PANEL columns: a panel
 * is updated by all columns left of it with one dense product, then factored column by column.
 */
function factorBlock(
  values: Float64Array,
  v0: number,
  nr: number,
  nc: number,
  f: number,
  d: Float64Array,
  diag: Float64Array,
  monitor: PivotMonitor,
  w: Float64Array,
): void {
  // panels left to right
  for (let c0 = 0; c0 < nc; c0 += PANEL) {
    const c1 = Math.min(nc, c0 + PANEL);
    const bw = c1 - c0;
    if (c0 > 0) {
      // B(c0:, c0:c1) −= L(c0:, 0:c0) D L(c0:c1, 0:c0)ᵀ
      scaledRowsKMajor(bw, c0, values, v0 + c0, nr, d, f, w);
      updateLowerProduct(nr - c0, bw, c0, values, v0 + c0, nr, w, values, v0 + c0 + c0 * nr, nr);
    }
    factorPanel(values, v0, nr, c0, c1, f, d, diag, monitor);
  }
}

/** Columns c0..c1−1 of a block whose columns left of c0 are already applied: left-looking inside the panel. */
function factorPanel(
  values: Float64Array,
  v0: number,
  nr: number,
  c0: number,
  c1: number,
  f: number,
  d: Float64Array,
  diag: Float64Array,
  monitor: PivotMonitor,
): void {
  // each column j: apply the panel's earlier columns, take the pivot, scale
  for (let j = c0; j < c1; j++) {
    const cj = v0 + j * nr;
    let t = c0;
    // L(j:, j) −= Σ_t L(j:, t) d_t L(j, t), four columns t at a time
    for (; t + 4 <= j; t += 4) {
      const q0 = v0 + t * nr;
      const q1 = q0 + nr;
      const q2 = q1 + nr;
      const q3 = q2 + nr;
      const a0 = values[q0 + j] * d[f + t];
      const a1 = values[q1 + j] * d[f + t + 1];
      const a2 = values[q2 + j] * d[f + t + 2];
      const a3 = values[q3 + j] * d[f + t + 3];
      for (let i = j; i < nr; i++) {
        values[cj + i] -= a0 * values[q0 + i] + a1 * values[q1 + i] + a2 * values[q2 + i] + a3 * values[q3 + i];
      }
    }
    for (; t < j; t++) {
      const q0 = v0 + t * nr;
      const a0 = values[q0 + j] * d[f + t];
      for (let i = j; i < nr; i++) values[cj + i] -= a0 * values[q0 + i];
    }
    const pivot = monitor.accept(f + j, values[cj + j], diag[f + j]);
    d[f + j] = pivot;
    values[cj + j] = 1;
    const inv = 1 / pivot;
    // L(j+1:, j) = B(j+1:, j) / d_j
    for (let i = j + 1; i < nr; i++) values[cj + i] *= inv;
  }
}
