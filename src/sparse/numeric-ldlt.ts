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
 * When the factor's values live in a WebAssembly memory (simd-sweep-kernels.ts), the products
 * of steps 2 and 3 read L where it is and write into this thread's scratch region there or
 * into the block itself (wasm-tile-kernel.ts strips), with no packing copies.
 */
import { factorStorage, KERNEL_RHS, type FactorStorage } from './simd-sweep-kernels.js';
import { inPlaceUpdate, scaledRowsKMajor, scaledRowsPanels, stripUpdate, updateLowerProduct, updateProduct } from './dense-block-kernels.js';
import { stripKernels, type StripKernels } from './wasm-tile-kernel.js';
import type { PivotMonitor } from './pivot-monitor.js';
import type { SupernodalStructure } from './symbolic.js';
import { shiftedEntry } from './permute.js';

/** Panel width of the in-supernode blocking (columns factored together). */
const PANEL = 48;
/** Target columns per dense product when a descendant updates a supernode (bounds the workspace). */
const CHUNK = 64;
/** Columns a panel's strip products treat together inside the panel (one strip panel wide). */
const GROUP = 4;

export interface SupernodalFactor {
  structure: SupernodalStructure;
  /** Supernode blocks, unit diagonal stored as 1. */
  values: Float64Array;
  d: Float64Array;
  /** The WebAssembly memory holding `values`, when they live in one (the sweeps' SIMD kernels then read L in place). */
  storage?: FactorStorage;
}

/**
 * Zeroed storage for a factor's values: in a shared WebAssembly memory with room for the
 * scratch of `threads` threads (simd-sweep-kernels.ts) when possible, else from `fallback`.
 */
function allocateFactorValues(s: SupernodalStructure, fallback: (length: number) => Float64Array, threads: number): { values: Float64Array; storage?: FactorStorage } {
  const length = s.valuePtr[s.supernodes];
  return factorStorage(length, Math.max(s.maxRows * KERNEL_RHS, inPlaceScratchDoubles(s)), threads) ?? { values: fallback(length) };
}

/** Widest target chunk or panel, rounded up to whole 4-column panels. */
const SCRATCH_COLUMNS = Math.ceil(Math.max(CHUNK, PANEL) / 4) * 4;

/**
 * One thread's scratch for the in-place products: W panels (SCRATCH_COLUMNS × a supernode's
 * columns), C (SCRATCH_COLUMNS columns of the largest row count rounded up to 4), then
 * applyDescendant's tables for the scatter kernel (two i32 per run, at most maxRows + 1, and
 * one i32 per target column of a chunk), then one double for factorPanel's column kernels.
 */
function inPlaceScratchDoubles(s: SupernodalStructure): number {
  return SCRATCH_COLUMNS * (s.maxColumns + s.maxRows + 4) + s.maxRows + 1 + SCRATCH_COLUMNS / 2 + 1;
}

/**
 * Bytes one thread that factors or sweeps holds as scratch, at most: its scratch region of the
 * factor's memory (or, without one, the update workspaces w and c of updateWorkspace and the
 * sweeps' three gathered blocks), the relative-index arrays, and the n-long position map and
 * shifted diagonal of factorSupernodes.
 */
export function threadScratchBytes(s: SupernodalStructure): number {
  const region = Math.max(s.maxRows * KERNEL_RHS, inPlaceScratchDoubles(s));
  const plain = (Math.max(CHUNK, PANEL) + CHUNK) * s.maxRows + 3 * KERNEL_RHS * s.maxRows;
  return 8 * Math.max(region, plain) + 8 * (s.maxRows + 1) + 12 * s.n;
}

/** a_jj = k_jj − σ m_jj in pivot order. */
function shiftedDiagonal(s: SupernodalStructure, shift: number): Float64Array {
  const { pair } = s;
  const diag = new Float64Array(s.n);
  // the diagonal is the first stored entry of its column
  for (let j = 0; j < s.n; j++) {
    const p = pair.colPtr[j];
    if (p < pair.colPtr[j + 1] && pair.rowIdx[p] === j) diag[j] = shiftedEntry(pair, p, shift);
  }
  return diag;
}

/** A released factor's values (and their memory), handed to the next factorization on the same structure. */
export interface RecycledValues {
  values: Float64Array;
  storage?: FactorStorage;
}

/**
 * The values of a new factor that `threads` threads work on: `recycled` when given and it has
 * their scratch (marked for zeroing), else fresh zeroed storage.
 */
export function factorValues(s: SupernodalStructure, recycled: RecycledValues | undefined, fallback: (length: number) => Float64Array, threads = 1): RecycledValues & { dirty: boolean } {
  if (recycled && recycled.values.length === s.valuePtr[s.supernodes] && (recycled.storage?.regions ?? threads) >= threads) return { ...recycled, dirty: true };
  return { ...allocateFactorValues(s, fallback, threads), dirty: false };
}

export function supernodalLdlt(s: SupernodalStructure, shift: number, monitor: PivotMonitor, recycled?: RecycledValues): SupernodalFactor {
  const { values, storage, dirty } = factorValues(s, recycled, (length) => new Float64Array(length));
  const d = new Float64Array(s.n);
  const nextRow = new Int32Array(s.supernodes);
  factorSupernodes(s, shift, monitor, { values, d, nextRow, dirty, ...(storage ? { storage } : {}) }, [[0, s.supernodes - 1]]);
  return { structure: s, values, d, ...(storage ? { storage } : {}) };
}

/** The arrays one factorization writes; shared between threads when the work is split. */
export interface FactorArrays {
  values: Float64Array;
  d: Float64Array;
  /** The WebAssembly memory holding `values`, when they live in one. */
  storage?: FactorStorage;
  /** `values` hold an earlier factor: each supernode's block is zeroed before it is assembled. */
  dirty?: boolean;
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
 * only on ancestors inside the ranges. `region` is this thread's scratch region of the factor's
 * memory (0 main thread, i + 1 helper i).
 */
export function factorSupernodes(
  s: SupernodalStructure,
  shift: number,
  monitor: PivotMonitor,
  out: FactorArrays,
  ranges: [number, number][],
  pendingFrom: [number, number][] = [],
  cooperation?: SupernodeCooperation,
  region = 0,
): void {
  const { n, supernodes: ns, superStart, superOf, rowPtr, rows, valuePtr, pair } = s;
  const { stiffnessAt, massAt, stiffnessValues, massValues } = pair;
  const { values, d, nextRow } = out;
  const diag = shiftedDiagonal(s, shift);
  const map = new Int32Array(n);
  const work = updateWorkspace(s, out.storage, region);
  let list: Int32Array = new Int32Array(0);
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
      if (out.dirty) values.fill(0, v0, v0 + nr * nc);
      // B ← A(R, f..l−1) = K − σM
      for (let j = f; j < l; j++) {
        const base = v0 + (j - f) * nr;
        for (let p = pair.colPtr[j]; p < pair.colPtr[j + 1]; p++) {
          const k = stiffnessAt[p];
          const m = massAt[p];
          values[base + map[pair.rowIdx[p]]] = (k >= 0 ? stiffnessValues[k] : 0) - shift * (m >= 0 ? massValues[m] : 0);
        }
      }
      const shared = cooperation?.wants(sn) === true;
      // updates from every descendant queued on S (with a large S, listed and shared out first)
      let dn = head[sn];
      head[sn] = -1;
      let count = 0;
      while (dn !== -1) {
        const after = link[dn];
        const start = nextRow[dn];
        const stop = rowsBefore(s, dn, start, l);
        nextRow[dn] = stop;
        if (shared) {
          if (list.length < 3 * (count + 1)) list = growTo(list, 6 * (count + 1));
          list[3 * count] = dn;
          list[3 * count + 1] = start;
          list[3 * count + 2] = stop;
          count++;
        } else {
          applyDescendant(s, dn, sn, start, stop, values, d, map, work);
          enqueue(dn);
        }
        dn = after;
      }
      if (shared) cooperation!.descendants(sn, list, count, map, work);
      // queue each descendant on the next supernode its remaining rows touch
      for (let t = 0; t < count; t++) enqueue(list[3 * t]);
      factorBlock(values, v0, nr, nc, f, d, diag, monitor, work, shared ? (c0, c1) => cooperation!.panel(sn, c0, c1, work) : undefined);
      // S's own first row below its columns
      nextRow[sn] = nc;
      enqueue(sn);
    }
  }
}

function growTo(a: Int32Array, length: number): Int32Array {
  const b = new Int32Array(length);
  b.set(a);
  return b;
}

/** Position (in dn's row list) of dn's first row at or beyond column `l`, searching from `start`. */
export function rowsBefore(s: SupernodalStructure, dn: number, start: number, l: number): number {
  const rd = s.rowPtr[dn];
  const nrd = s.rowPtr[dn + 1] - rd;
  let stop = start;
  while (stop < nrd && s.rows[rd + stop] < l) stop++;
  return stop;
}

/**
 * B_S(rows, cols) −= L_D D L_1ᵀ for descendant dn of supernode sn, whose rows from position
 * `start` on are ≥ f and up to `stop` inside S's columns, restricted to the target columns of
 * dn's row positions start + [from, to) (all of them by default). `map` holds S's local row
 * positions. Writes only those target columns of S.
 */
export function applyDescendant(
  s: SupernodalStructure,
  dn: number,
  sn: number,
  start: number,
  stop: number,
  values: Float64Array,
  d: Float64Array,
  map: Int32Array,
  work: UpdateWorkspace,
  from = 0,
  to = stop - start,
): void {
  const { superStart, rowPtr, rows, valuePtr } = s;
  const { rel, runAt, w, c, inPlace } = work;
  const f = superStart[sn];
  const nrS = rowPtr[sn + 1] - rowPtr[sn];
  const vS = valuePtr[sn];
  const fd = superStart[dn];
  const ncd = superStart[dn + 1] - fd;
  const rd = rowPtr[dn];
  const nrd = rowPtr[dn + 1] - rd;
  const m2 = nrd - start; // dn's rows inside S's columns and all below
  const vd = valuePtr[dn] + start;
  // relative positions in S of dn's rows, and where they run on consecutively (runs r: rows runAt[r] … runAt[r+1]−1)
  let runs = 0;
  for (let i = from; i < m2; i++) {
    rel[i] = map[rows[rd + start + i]];
    if (i === from || rel[i] !== rel[i - 1] + 1) runAt[runs++] = i;
  }
  runAt[runs] = m2;
  if (inPlace) {
    // the kernel's run table: start of run r and the byte shift of its rows into S (8·(rel − position)), then the end
    const { heap32, runsAt } = inPlace;
    for (let r = 0; r < runs; r++) {
      const a = runAt[r];
      heap32[runsAt + 2 * r] = a;
      heap32[runsAt + 2 * r + 1] = 8 * (rel[a] - a);
    }
    heap32[runsAt + 2 * runs] = m2;
  }
  // target columns in chunks: W = L_1(chunk) D (k-major), C = L_D(chunk:) Wᵀ, scatter −C
  for (let j0 = from; j0 < to; j0 += CHUNK) {
    const bw = Math.min(CHUNK, to - j0);
    const mr = m2 - j0;
    if (inPlace) {
      // C ← −L_D(chunk:) W in scratch (rows padded to whole strips), then scattered
      const { kernels, heap, wOff, cOff } = inPlace;
      const ldc = (mr + 3) & ~3;
      scaledRowsPanels(bw, ncd, values, vd + j0, nrd, d, fd, heap, wOff);
      stripUpdate(kernels, true, true, mr, bw, ncd, values.byteOffset + 8 * (vd + j0), 8 * nrd, 8 * wOff, 8 * cOff, 8 * ldc);
      // column by column, from its diagonal down, one contiguous add per run of rows (in the kernel)
      const { heap32, runsAt, columnsAt } = inPlace;
      for (let j = 0; j < bw; j++) heap32[columnsAt + j] = values.byteOffset + 8 * (vS + (rows[rd + start + j0 + j] - f) * nrS);
      kernels.scatterAdd(8 * (cOff - j0), 8 * ldc, bw, j0, 4 * runsAt, runs, 4 * columnsAt);
      continue;
    }
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
}

/** Scratch arrays of the update kernels, one set per thread. */
export interface UpdateWorkspace {
  rel: Int32Array;
  /** Starts of the runs of consecutive positions in `rel` (applyDescendant), and one past the last. */
  runAt: Int32Array;
  w: Float64Array;
  c: Float64Array;
  /**
   * With the factor in a WebAssembly memory: this thread's strip kernels over it, the memory
   * as doubles, and where W and C sit in this thread's scratch region (w and c are then unused).
   */
  inPlace?: {
    kernels: StripKernels;
    heap: Float64Array;
    wOff: number;
    cOff: number;
    /** The memory as i32, and where (in i32) applyDescendant's run table and target-column table sit in the scratch region. */
    heap32: Int32Array;
    runsAt: number;
    columnsAt: number;
    /** Double of the scratch region holding the column kernels' coefficient. */
    coefficientAt: number;
  };
}

/** Scratch for one thread; with `storage`, in scratch region `region` of the factor's memory (when it has that region). */
export function updateWorkspace(s: SupernodalStructure, storage?: FactorStorage, region = 0): UpdateWorkspace {
  const rel = new Int32Array(s.maxRows);
  const runAt = new Int32Array(s.maxRows + 1);
  const kernels = storage && region < storage.regions && storage.scratchDoubles >= inPlaceScratchDoubles(s) ? stripKernels(storage.memory) : null;
  if (storage && kernels) {
    const wOff = region * storage.scratchDoubles;
    const none = new Float64Array(0);
    const cOff = wOff + SCRATCH_COLUMNS * s.maxColumns;
    const tables = cOff + SCRATCH_COLUMNS * (s.maxRows + 4);
    const inPlace = { kernels, heap: new Float64Array(storage.memory.buffer), wOff, cOff, heap32: new Int32Array(storage.memory.buffer), runsAt: 2 * tables, columnsAt: 2 * tables + 2 * (s.maxRows + 1), coefficientAt: tables + s.maxRows + 1 + SCRATCH_COLUMNS / 2 };
    return { rel, runAt, w: none, c: none, inPlace };
  }
  return {
    rel,
    runAt,
    w: new Float64Array(Math.max(CHUNK, PANEL) * s.maxRows + 1),
    c: new Float64Array(CHUNK * s.maxRows + 1),
  };
}

/** B(c0 + from : c0 + to, c0:c1) −= L(·, 0:c0) D L(c0:c1, 0:c0)ᵀ: rows [from, to) of a panel's update, relative to c0. */
export function panelUpdateRows(
  values: Float64Array,
  v0: number,
  nr: number,
  c0: number,
  c1: number,
  f: number,
  d: Float64Array,
  work: UpdateWorkspace,
  from: number,
  to: number,
): void {
  const bw = c1 - c0;
  const r0 = c0 + from;
  const ip = work.inPlace;
  if (ip) {
    // in place: W panels in scratch, C is the block itself
    const base = values.byteOffset / 8;
    scaledRowsPanels(bw, c0, values, v0 + c0, nr, d, f, ip.heap, ip.wOff);
    inPlaceUpdate(ip.kernels, from === 0, to - from, bw, c0, base + v0 + r0, nr, ip.wOff, base + v0 + r0 + c0 * nr, nr);
    return;
  }
  const w = work.w;
  scaledRowsKMajor(bw, c0, values, v0 + c0, nr, d, f, w);
  // the rows starting at the panel's diagonal hold its lower triangle; rows further down are whole
  if (from === 0) updateLowerProduct(to - from, bw, c0, values, v0 + r0, nr, w, values, v0 + r0 + c0 * nr, nr);
  else updateProduct(to - from, bw, c0, values, v0 + r0, nr, w, values, v0 + r0 + c0 * nr, nr);
}

/**
 * Work another thread can take over inside one large supernode: its descendants' updates split
 * by target columns, and each panel's update split by rows (factorSupernodes calls these for
 * supernodes it judges large enough, `wants`).
 */
export interface SupernodeCooperation {
  wants(sn: number): boolean;
  /** Apply every (dn, start, stop) of `list` (flattened) to S; both threads' shares done on return. */
  descendants(sn: number, list: Int32Array, count: number, map: Int32Array, work: UpdateWorkspace): void;
  /** The update of panel c0..c1 of S; both threads' shares done on return. */
  panel(sn: number, c0: number, c1: number, work: UpdateWorkspace): void;
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
  work: UpdateWorkspace,
  panelUpdate?: (c0: number, c1: number) => void,
): void {
  // panels left to right
  for (let c0 = 0; c0 < nc; c0 += PANEL) {
    const c1 = Math.min(nc, c0 + PANEL);
    if (c0 > 0) {
      // B(c0:, c0:c1) −= L(c0:, 0:c0) D L(c0:c1, 0:c0)ᵀ
      if (panelUpdate) panelUpdate(c0, c1);
      else panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, nr - c0);
    }
    factorPanel(values, v0, nr, c0, c1, f, d, diag, monitor, work);
  }
}

/**
 * Columns c0..c1−1 of a block whose columns left of c0 are already applied: left-looking inside
 * the panel. With the in-place kernels the panel goes in groups of GROUP columns: a group is
 * first updated by the panel's columns left of it with one strip product (B(g:, g) −=
 * L(g:, c0:g) D L(g, c0:g)ᵀ), so the column loop below only applies the group's own columns.
 */
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
  work: UpdateWorkspace,
): void {
  const ip = work.inPlace;
  const group = ip ? GROUP : c1 - c0;
  for (let g0 = c0; g0 < c1; g0 += group) {
    const g1 = Math.min(c1, g0 + group);
    if (ip && g0 > c0) {
      const base = values.byteOffset / 8;
      scaledRowsPanels(g1 - g0, g0 - c0, values, v0 + g0 + c0 * nr, nr, d, f + c0, ip.heap, ip.wOff);
      inPlaceUpdate(ip.kernels, true, nr - g0, g1 - g0, g0 - c0, base + v0 + g0 + c0 * nr, nr, ip.wOff, base + v0 + g0 + g0 * nr, nr);
    }
    // each column j of the group: apply the group's earlier columns, take the pivot, scale
    for (let j = g0; j < g1; j++) {
      const cj = v0 + j * nr;
      if (ip) {
        // L(j:, j) −= L(j:, t) d_t L(j, t) for each earlier column t of the group, in the kernel
        const at = ip.coefficientAt;
        const bytes = values.byteOffset + 8 * j;
        for (let t = g0; t < j; t++) {
          const q0 = v0 + t * nr;
          ip.heap[at] = values[q0 + j] * d[f + t];
          ip.kernels.subScaled(bytes + 8 * cj, bytes + 8 * q0, nr - j, 8 * at);
        }
        const pivot = monitor.accept(f + j, values[cj + j], diag[f + j]);
        d[f + j] = pivot;
        values[cj + j] = 1;
        ip.heap[at] = 1 / pivot;
        // L(j+1:, j) = B(j+1:, j) / d_j
        ip.kernels.scale(bytes + 8 * (cj + 1), nr - j - 1, 8 * at);
        continue;
      }
      let t = g0;
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
}
