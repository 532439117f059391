/**
 * Y = A X for a symmetric A stored as its lower triangle (csc.ts), X of up to six columns, as a
 * WebAssembly SIMD kernel (two doubles per vector) over a shared memory that holds A itself.
 *
 * Mathematics (the same as csc.ts symMultiplyColumns): A = L + Lᵀ − diag(A) with L the stored
 * lower triangle, so every stored a_ij of the columns j ∈ [colFrom, colTo) adds
 *
 *     y_i += a_ij x_j   and, off the diagonal,   y_j += a_ij x_i,
 *
 * and disjoint column ranges into separate outputs sum to A X. Per column j the kernel keeps
 * x_j and the running sum s_j = Σ_i a_ij x_i in vector locals, takes the diagonal first when
 * it is stored (csc.ts: the first entry of its column), then for every other entry reads x_i
 * and adds into y_i; y_j += s_j at the end. Per entry: one index load, one broadcast of a_ij,
 * w loads of x_i, w loads and stores of y_i, 2w multiply-adds, with w = ⌈k/2⌉ ≤ 3 vectors per
 * row (at most 3 + 3 + 3 live vector values: no spilling, see DEVELOPERS.md "SIMD"). The
 * operations and their order per entry are those of csc.ts threeColumns, so when k is a
 * multiple of three the products are bit-identical to the plain loops; the plain loop of the
 * one or two columns left over adds into y_j entry by entry instead, so those columns agree
 * to rounding (block-product-jobs.ts gives such columns to that plain loop).
 *
 * Layout of a matrix's memory (`kernelMatrix`, byte offsets, each part 16-byte aligned):
 *
 *     colPtr (n + 1 int32) | rowIdx (nnz int32) | values (nnz f64) | X | Y_0 | Y_1 | … | Y_{regions−1}
 *
 * X and each Y_t are row-major n × 2w doubles (row i at 16·w·i bytes; an odd k leaves a pad
 * column that is zero in X, and whose sums in Y are ignored): X is written once per product by
 * the thread that posts it (the column-major block transposed, `stageColumns`), Y_t is thread
 * t's own partial product (0 = the posting thread, t = helper t − 1), zeroed from row colFrom
 * on before its columns run. The matrix's arrays handed to the solver (`matrix`) are views of
 * that memory, so the one copy serves the kernels, the plain kernels and the helper threads
 * (its buffer is a SharedArrayBuffer): it replaces the shared copy made for the helpers.
 *
 * kernelMatrix returns null where WebAssembly, its SIMD or shared memory is missing, when the
 * kernels are switched off (useSimdProductKernels), or when the memory would pass 4 GiB; the
 * plain loops of csc.ts then run.
 */
import type { SymmetricCsc } from './csc.js';
import { addTo, assembleModule, countdown, Locals, loopUntil, mulAddTo, op } from '../wasm/wasm-bytes.js';
import { switchableModule, instantiate, MAX_PAGES, PAGE_BYTES, sharedMemory, type WasmMemory } from '../wasm/wasm-runtime.js';

/** Most columns of X per kernel pass (three vectors per row). */
export const KERNEL_COLUMNS = 6;

/** A matrix placed in a shared WebAssembly memory with the row-major work areas of its products. */
export interface KernelMatrix {
  memory: WasmMemory;
  /** Tells memories apart in a helper thread, where each job brings a fresh copy of this object. */
  id: number;
  n: number;
  /** Byte offsets of colPtr, rowIdx, values, X and Y_0 in the memory, and bytes per Y region. */
  colPtrAt: number;
  rowIdxAt: number;
  valuesAt: number;
  xAt: number;
  yAt: number;
  regionBytes: number;
  /** Y regions (threads that may take a share of a product). */
  regions: number;
}

type Columns = (pColPtr: number, pRowIdx: number, pValues: number, colFrom: number, colTo: number, pX: number, pY: number) => void;

const { localGet: get, localSet: set, i32Const: i32, i32Add: ADD, i32Mul: MUL, i32Load: iload } = op;
const { v128Load: vload, v128Splat64: vsplat, v128Store: vstore, v128Zero: vzero, f64x2Add: vadd, f64x2Mul: vmul } = op;

/** columns(pColPtr, pRowIdx, pValues, colFrom, colTo, pX, pY) with w vectors per row of X and Y. */
function columnsBody(w: number): number[] {
  const locals = new Locals(7);
  const [pColPtr, pRowIdx, pValues, colFrom, colTo, pX, pY] = locals.params;
  const stride = 16 * w;
  const j = locals.i32();
  const pc = locals.i32(); // address of colPtr[j]
  const pr = locals.i32(); // address of the current rowIdx entry
  const prEnd = locals.i32(); // address of rowIdx[colPtr[j + 1]]
  const pv = locals.i32(); // address of the current value
  const xj = locals.i32(); // address of row j in X (then in Y)
  const ri = locals.i32(); // byte offset of row i
  const left = locals.i32(); // columns left
  const x = locals.v128(w); // x_j
  const s = locals.v128(w); // s_j
  const a = locals.v128(); // a_ij broadcast
  const t = locals.v128();
  const code: number[] = [];
  // j = colFrom, its colPtr entry and its row of X
  code.push(...get(colFrom), ...set(j), ...get(pColPtr), ...get(j), ...i32(4), ...MUL, ...ADD, ...set(pc));
  code.push(...get(colTo), ...get(colFrom), ...op.i32Sub, ...set(left));
  const column: number[] = [];
  // the entries of column j: rowIdx[colPtr[j] .. colPtr[j+1]), values alike
  column.push(...get(pRowIdx), ...get(pc), ...iload(0), ...i32(4), ...MUL, ...ADD, ...set(pr));
  column.push(...get(pRowIdx), ...get(pc), ...iload(4), ...i32(4), ...MUL, ...ADD, ...set(prEnd));
  column.push(...get(pValues), ...get(pc), ...iload(0), ...i32(8), ...MUL, ...ADD, ...set(pv));
  column.push(...get(pX), ...get(j), ...i32(stride), ...MUL, ...ADD, ...set(xj));
  for (let h = 0; h < w; h++) column.push(...get(xj), ...vload(16 * h), ...set(x + h), ...vzero, ...set(s + h));
  // the diagonal, when stored (first in its column): s_j += a_jj x_j
  const diagonal: number[] = [...get(pr), ...get(prEnd), ...op.i32GeU, ...op.brIf(0), ...get(pr), ...iload(0), ...get(j), ...op.i32Ne, ...op.brIf(0)];
  diagonal.push(...get(pv), ...vsplat(0), ...set(a));
  for (let h = 0; h < w; h++) diagonal.push(...mulAddTo(s + h, a, x + h));
  diagonal.push(...addTo(pr, i32(4)), ...addTo(pv, i32(8)));
  column.push(...op.block, ...diagonal, ...op.end);
  // below the diagonal: y_i += a_ij x_j, s_j += a_ij x_i
  const entry: number[] = [...get(pr), ...iload(0), ...i32(stride), ...MUL, ...set(ri), ...get(pv), ...vsplat(0), ...set(a)];
  for (let h = 0; h < w; h++) {
    entry.push(...get(pY), ...get(ri), ...ADD, ...get(pY), ...get(ri), ...ADD, ...vload(16 * h), ...get(a), ...get(x + h), ...vmul, ...vadd, ...vstore(16 * h));
    entry.push(...get(pX), ...get(ri), ...ADD, ...vload(16 * h), ...set(t), ...mulAddTo(s + h, a, t));
  }
  entry.push(...addTo(pr, i32(4)), ...addTo(pv, i32(8)));
  column.push(...loopUntil([...get(pr), ...get(prEnd), ...op.i32GeU], entry));
  // y_j += s_j
  column.push(...get(pY), ...get(j), ...i32(stride), ...MUL, ...ADD, ...set(xj));
  for (let h = 0; h < w; h++) column.push(...get(xj), ...get(xj), ...vload(16 * h), ...get(s + h), ...vadd, ...vstore(16 * h));
  column.push(...addTo(pc, i32(4)), ...addTo(j, i32(1)));
  code.push(...countdown(left, column));
  return locals.body(code);
}

/** The module's bytes (compiled once below; exported for the disassembly snapshot test): s1, s2, s3 for 1, 2, 3 vectors per row. */
export function symProductModuleBytes(): Uint8Array {
  const functions = [];
  for (let w = 1; w <= KERNEL_COLUMNS / 2; w++) functions.push({ params: 7, name: `s${w}`, body: columnsBody(w) });
  return assembleModule(MAX_PAGES, functions);
}

const kernelModule = switchableModule(symProductModuleBytes);
let matrixCount = 0;

/**
 * Turns the SIMD product kernels on or off for matrices placed from now on (default on where
 * available); the plain loops of csc.ts compute the same products. Returns whether they are in
 * use. For tests and benchmarks of the fallback.
 */
export function useSimdProductKernels(on: boolean): boolean {
  return kernelModule.use(on);
}

const align16 = (bytes: number) => Math.ceil(bytes / 16) * 16;

/**
 * `a` placed in a shared WebAssembly memory with `regions` Y regions (see the module comment):
 * the matrix as views of that memory, and where its parts sit; null when the kernels are off or
 * unavailable, or the memory would pass 4 GiB.
 */
export function kernelMatrix(a: SymmetricCsc, regions: number): { matrix: SymmetricCsc; home: KernelMatrix } | null {
  if (!kernelModule.inUse()) return null;
  const n = a.n;
  const nnz = a.colPtr[n];
  const colPtrAt = 0;
  const rowIdxAt = align16(4 * (n + 1));
  const valuesAt = rowIdxAt + align16(4 * nnz);
  const regionBytes = align16(8 * KERNEL_COLUMNS * n);
  const xAt = valuesAt + align16(8 * nnz);
  const yAt = xAt + regionBytes;
  const bytes = yAt + regions * regionBytes;
  const pages = Math.ceil(bytes / PAGE_BYTES);
  if (pages > MAX_PAGES - 1) return null;
  let memory: WasmMemory;
  try {
    memory = sharedMemory(Math.max(1, pages));
  } catch {
    return null;
  }
  const buffer = memory.buffer;
  const matrix: SymmetricCsc = {
    n,
    colPtr: new Int32Array(buffer, colPtrAt, n + 1),
    rowIdx: new Int32Array(buffer, rowIdxAt, nnz),
    values: new Float64Array(buffer, valuesAt, nnz),
  };
  (matrix.colPtr as Int32Array).set(a.colPtr);
  (matrix.rowIdx as Int32Array).set(a.rowIdx.subarray(0, nnz));
  (matrix.values as Float64Array).set(a.values.subarray(0, nnz));
  const home: KernelMatrix = { memory, id: ++matrixCount + Math.random(), n, colPtrAt, rowIdxAt, valuesAt, xAt, yAt, regionBytes, regions };
  return { matrix, home };
}

/** This thread's kernels over one matrix memory, with a Float64Array view of it. */
interface Bound {
  heap: Float64Array;
  columns: Columns[];
}

/**
 * Instances by memory id. Weakly held: a helper gets a fresh copy of the memory object with
 * every job, and must not keep a finished model's matrices alive; an instance costs ~25 µs.
 */
const bound = new Map<number, WeakRef<Bound>>();

function bind(home: KernelMatrix): Bound {
  const known = bound.get(home.id)?.deref();
  if (known !== undefined) return known;
  const exports = instantiate(kernelModule.compiled()!, home.memory);
  const b: Bound = { heap: new Float64Array(home.memory.buffer), columns: [() => {}, exports.s1 as Columns, exports.s2 as Columns, exports.s3 as Columns] };
  // forget the ids whose instances were collected
  if (bound.size > 16) for (const [id, ref] of bound) if (ref.deref() === undefined) bound.delete(id);
  bound.set(home.id, new WeakRef(b));
  return b;
}

/** Doubles per row of X and Y for `w` columns (an even count: the vectors are two wide). */
function rowStride(w: number): number {
  return 2 * Math.ceil(w / 2);
}

/** X (row-major, stride rowStride(w)) ← columns c0 … c0 + w − 1 of the column-major n×? block x; the pad column zero. */
export function stageColumns(home: KernelMatrix, x: Float64Array, c0: number, w: number): void {
  const { heap } = bind(home);
  const n = home.n;
  const stride = rowStride(w);
  const base = home.xAt / 8;
  // X(i, c) = x(i, c0 + c); six columns (the block size) row by row, a contiguous run per row (5× faster here)
  if (w === 6) {
    const x0 = c0 * n, x1 = x0 + n, x2 = x1 + n, x3 = x2 + n, x4 = x3 + n, x5 = x4 + n;
    for (let i = 0, q = base; i < n; i++, q += 6) {
      heap[q] = x[x0 + i];
      heap[q + 1] = x[x1 + i];
      heap[q + 2] = x[x2 + i];
      heap[q + 3] = x[x3 + i];
      heap[q + 4] = x[x4 + i];
      heap[q + 5] = x[x5 + i];
    }
    return;
  }
  for (let c = 0; c < w; c++) {
    const col = (c0 + c) * n;
    for (let i = 0, q = base + c; i < n; i++, q += stride) heap[q] = x[col + i];
  }
  if (w < stride) for (let i = 0, q = base + w; i < n; i++, q += stride) heap[q] = 0;
}

/**
 * Y_region ← the part of A X (X as staged, w columns) carried by the stored columns
 * [colFrom, colTo); rows before colFrom are left as they were (they receive nothing).
 */
export function regionProduct(home: KernelMatrix, w: number, colFrom: number, colTo: number, region: number): void {
  const { heap, columns } = bind(home);
  const stride = rowStride(w);
  const y = home.yAt + region * home.regionBytes;
  heap.fill(0, y / 8 + colFrom * stride, y / 8 + home.n * stride);
  columns[stride / 2](home.colPtrAt, home.rowIdxAt, home.valuesAt, colFrom, colTo, home.xAt, y);
}

/**
 * Columns c0 … c0 + w − 1 of the column-major block y ← Y_0 + Y_1 + … + Y_{regions−1}, added in
 * region order, where region t holds the columns from starts[t] on and so touches only the rows
 * from starts[t] on (starts[0] = 0, ascending): rows in [starts[s], starts[s + 1]) sum regions
 * 0 … s, in one pass over y.
 */
export function gatherRegions(home: KernelMatrix, w: number, y: Float64Array, c0: number, starts: number[]): void {
  const { heap } = bind(home);
  const n = home.n;
  const stride = rowStride(w);
  const regionDoubles = home.regionBytes / 8;
  const base = home.yAt / 8;
  const regions = starts.length;
  for (let c = 0; c < w; c++) {
    const col = (c0 + c) * n;
    for (let s = 0; s < regions; s++) {
      const to = s + 1 < regions ? starts[s + 1] : n;
      // y(i, c0 + c) = Y_0(i, c) + … + Y_s(i, c)
      for (let i = starts[s], q = base + starts[s] * stride + c; i < to; i++, q += stride) {
        let v = heap[q];
        for (let t = 1, o = q + regionDoubles; t <= s; t++, o += regionDoubles) v += heap[o];
        y[col + i] = v;
      }
    }
  }
}
