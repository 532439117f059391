/**
 * WebAssembly SIMD kernels for the triangular sweeps, reading the factor L where it lives.
 *
 * The factor's values are allocated inside a shared WebAssembly memory (`factorStorage`), after
 * one scratch region per thread that works on it (helper-thread.ts: N threads), which hold the gathered right-hand sides of one
 * supernode. The kernels then read L in place — no packing copy, which for a handful of
 * right-hand sides would cost as much as the arithmetic.
 *
 * Two products, for g ≤ 4 right-hand sides at a time (KERNEL_GROUP; one function per g, generated
 * below; the sweeps call them in groups of at most four, RHS_GROUPS in triangular-solve.ts):
 *
 *   columns  Y(i, c) −= Σ_{t<cols} L(i, t) X(t, c)     rows in strips of 4 (two f64x2 lanes),
 *            the forward sweep's update  y_below −= L21 y_own  and the same inside L11;
 *            per step t: two loads of L's column, g broadcasts of X(t, ·), 2g multiply-adds
 *            into 2g accumulators (2g + 3 ≤ 11 vector values for g = 4);
 *   dots     Y(t, c) −= Σ_{i<rows} L(i, t) G(i, c)     columns in pairs (or one), rows in pairs,
 *            the backward sweep's  y_own −= L21ᵀ x_below ; per row pair: one or two loads of L,
 *            g loads of G, g or 2g multiply-adds; lanes summed at the end.
 *
 * All addresses are byte offsets into the memory; every matrix is column-major with its own
 * leading dimension in bytes. Row tails (under 4 rows for `columns`, an odd row for `dots`) go
 * through two scalar tail functions, and the unit triangle of each panel of L11 (forward and
 * transposed) through two more, each for up to KERNEL_RHS right-hand sides per call and in the
 * order of the TypeScript loops they replaced (same bits). The module is assembled here byte by
 * byte (as wasm-tile-kernel.ts).
 * Returns null where WebAssembly, its SIMD or shared memory is unavailable, or the factor does
 * not fit in 4 GiB; the sweeps then use the plain TypeScript loops.
 */

import { addTo, assembleModule, countdown, Locals, mulAddTo, op } from '../wasm/wasm-bytes.js';
import { switchableModule, instantiate, MAX_PAGES, PAGE_BYTES, sharedMemory, type WasmMemory } from '../wasm/wasm-runtime.js';

/** Most right-hand sides a sweep step gathers (the scratch regions hold KERNEL_RHS columns). */
export const KERNEL_RHS = 6;
/**
 * Most right-hand sides one kernel call serves: the sweeps call the kernels in groups of at most
 * four (triangular-solve.ts, RHS_GROUPS), so only g = 1 … 4 are generated.
 */
const KERNEL_GROUP = 4;

type Kernel = (pL: number, ld: number, count: number, cols: number, pX: number, ldx: number, pY: number, ldy: number) => void;

/** Where a factor's values sit in its memory, and the scratch regions (one per thread) before them. */
export interface FactorStorage {
  memory: WasmMemory;
  /** Tells factors apart in a helper thread, where each job brings a fresh copy of this object. */
  id: number;
  /** Doubles per scratch region (region r starts at double r · scratchDoubles). */
  scratchDoubles: number;
  /** Scratch regions: thread t of a factorization or solve on this factor uses region t < regions. */
  regions: number;
  /** First double of the values. */
  valuesOffset: number;
}

export interface SweepKernels {
  /** The whole memory as doubles (scratch regions and values). */
  heap: Float64Array;
  storage: FactorStorage;
  /** Indexed by g = 1 … KERNEL_GROUP. */
  columns: Kernel[];
  dots2: Kernel[];
  dots1: Kernel[];
  /** The unit triangle of one panel of L11, forward and transposed, for g ≤ KERNEL_RHS right-hand sides. */
  triangleForward: Triangle;
  triangleBackward: Triangle;
  /** The rows after the last strip of `columns`, for g ≤ KERNEL_RHS right-hand sides (the extra last parameter). */
  columnsTail: (pL: number, ld: number, rows: number, cols: number, pX: number, ldx: number, pY: number, ldy: number, g: number) => void;
  /** An odd last row of `dots`, for g ≤ KERNEL_RHS right-hand sides (count = columns, cols = g). */
  dotsTail: Kernel;
}

type Triangle = (pL: number, ld: number, width: number, g: number, pY: number, ldy: number) => void;

const { localGet: get, localSet: set, i32Const: i32, i32Add: ADD, i32Mul: MUL } = op;
const { v128Load: vload, v128Splat64: vsplat, v128Store: vstore, v128Zero: vzero, f64x2Sub: vsub, f64x2ExtractLane: lane } = op;
const { f64Load: fload, f64Store: fstore, f64Add: F_ADD, f64Sub: F_SUB, f64Mul: F_MUL, f64Zero: F_ZERO, i32Sub: SUB } = op;

/**
 * triangleForward(pL, ldL, width, g, pY, ldY): for each of g right-hand sides,
 * Y(i, c) −= L(i, j) Y(j, c) for j < width, j < i < width (the unit lower triangle of one panel
 * of L11, column by column; scalar, in the order of the plain loop it replaces).
 */
function triangleForwardBody(): number[] {
  const locals = new Locals(6);
  const [pL, ldL, width, g, pY, ldY] = locals.params;
  const pl = locals.i32();
  const py = locals.i32();
  const j = locals.i32();
  const i = locals.i32();
  const pa = locals.i32();
  const pb = locals.i32();
  const yv = locals.f64();
  // rows below the diagonal of column j: Y(i) −= L(i, j) · Y(j)
  const below = [...addTo(pa, i32(8)), ...addTo(pb, i32(8)), ...get(pb), ...get(pb), ...fload(0), ...get(pa), ...fload(0), ...get(yv), ...F_MUL, ...F_SUB, ...fstore(0)];
  // column j (j counts down from width: width − j is the column, j − 1 the rows below its diagonal)
  const column = [...get(py), ...fload(0), ...set(yv), ...get(j), ...i32(1), ...SUB, ...set(i), ...get(pl), ...set(pa), ...get(py), ...set(pb), ...countdown(i, below)];
  column.push(...addTo(pl, [...get(ldL), ...i32(8), ...ADD]), ...addTo(py, i32(8)));
  const rhs = [...get(pL), ...set(pl), ...get(pY), ...set(py), ...get(width), ...set(j), ...countdown(j, column), ...addTo(pY, get(ldY))];
  return locals.body(countdown(g, rhs));
}

/**
 * triangleBackward(pL, ldL, width, g, pY, ldY): for each of g right-hand sides, last column first,
 * Y(j, c) −= Σ_{j<i<width} L(i, j) Y(i, c) (the transposed unit triangle of one panel; the sum
 * from 0 in ascending i, as the plain loop it replaces).
 */
function triangleBackwardBody(): number[] {
  const locals = new Locals(6);
  const [pL, ldL, width, g, pY, ldY] = locals.params;
  const pl = locals.i32();
  const py = locals.i32();
  const j = locals.i32();
  const i = locals.i32();
  const pa = locals.i32();
  const pb = locals.i32();
  const sum = locals.f64();
  // sum += L(i, j) · Y(i)
  const below = [...addTo(pa, i32(8)), ...addTo(pb, i32(8)), ...get(sum), ...get(pa), ...fload(0), ...get(pb), ...fload(0), ...F_MUL, ...F_ADD, ...set(sum)];
  // column j = j' − 1 (j' counts down from width), width − j' rows below its diagonal
  const column = [...F_ZERO, ...set(sum), ...get(width), ...get(j), ...SUB, ...set(i), ...get(pl), ...set(pa), ...get(py), ...set(pb), ...countdown(i, below)];
  column.push(...get(py), ...get(py), ...fload(0), ...get(sum), ...F_SUB, ...fstore(0));
  column.push(...get(pl), ...get(ldL), ...i32(8), ...ADD, ...SUB, ...set(pl), ...get(py), ...i32(8), ...SUB, ...set(py));
  // the last column's diagonal: pL + (width − 1)(ldL + 8), pY + 8 (width − 1)
  const last = [...get(width), ...i32(1), ...SUB];
  const rhs = [...get(pL), ...last, ...get(ldL), ...i32(8), ...ADD, ...MUL, ...ADD, ...set(pl), ...get(pY), ...last, ...i32(8), ...MUL, ...ADD, ...set(py)];
  rhs.push(...get(width), ...set(j), ...countdown(j, column), ...addTo(pY, get(ldY)));
  return locals.body(countdown(g, rhs));
}

/** columns(pL, ldL, strips, cols, pX, ldX, pY, ldY), strides and addresses in bytes. */
function columnsBody(g: number): number[] {
  const locals = new Locals(8);
  const [pL, ldL, strips, cols, pX, ldX, pY, ldY] = locals.params;
  const pl = locals.i32();
  const px = locals.i32();
  const t = locals.i32();
  /** byte offsets of right-hand side c in X and Y at xo + c, yo + c (c ≥ 1; slot 0 unused) */
  const xo = locals.i32(g);
  const yo = locals.i32(g);
  const addr = locals.i32();
  const v = locals.v128(2 * g); // accumulators
  const a0 = locals.v128();
  const a1 = locals.v128();
  const b = locals.v128();
  const code: number[] = [];
  // byte offsets of right-hand side c in X and Y
  for (let c = 1; c < g; c++) code.push(...get(ldX), ...i32(c), ...MUL, ...set(xo + c), ...get(ldY), ...i32(c), ...MUL, ...set(yo + c));
  const inner: number[] = [...get(pl), ...vload(0), ...set(a0), ...get(pl), ...vload(16), ...set(a1)];
  // step t: L(i..i+3, t) times X(t, c) for every c
  for (let c = 0; c < g; c++) {
    inner.push(...get(px), ...(c > 0 ? [...get(xo + c), ...ADD] : []), ...vsplat(0), ...set(b));
    inner.push(...mulAddTo(v + 2 * c, a0, b), ...mulAddTo(v + 2 * c + 1, a1, b));
  }
  inner.push(...addTo(pl, get(ldL)), ...addTo(px, i32(8)));
  const strip: number[] = [];
  for (let q = 0; q < 2 * g; q++) strip.push(...vzero, ...set(v + q));
  strip.push(...get(pL), ...set(pl), ...get(pX), ...set(px), ...get(cols), ...set(t), ...countdown(t, inner));
  // Y(i..i+3, c) −= accumulators
  for (let c = 0; c < g; c++) {
    strip.push(...get(pY), ...(c > 0 ? [...get(yo + c), ...ADD] : []), ...set(addr));
    strip.push(...get(addr), ...get(addr), ...vload(0), ...get(v + 2 * c), ...vsub, ...vstore(0));
    strip.push(...get(addr), ...get(addr), ...vload(16), ...get(v + 2 * c + 1), ...vsub, ...vstore(16));
  }
  strip.push(...addTo(pL, i32(32)), ...addTo(pY, i32(32)));
  code.push(...countdown(strips, strip));
  return locals.body(code);
}

/** dots(pL, ldL, rowPairs, colGroups, pG, ldG, pY, ldY), in bytes; `width` columns per group (1 or 2). */
function dotsBody(g: number, width: 1 | 2): number[] {
  const locals = new Locals(8);
  const [pL, ldL, rowPairs, colGroups, pG, ldG, pY, ldY] = locals.params;
  const pl0 = locals.i32();
  const pl1 = locals.i32();
  const pg = locals.i32();
  const i = locals.i32();
  /** byte offsets of right-hand side c in G and Y at go + c, yo + c (c ≥ 1; slot 0 unused) */
  const go = locals.i32(g);
  const yo = locals.i32(g);
  const addr = locals.i32();
  const v = locals.v128(width * g); // accumulators
  const a0 = locals.v128();
  const a1 = locals.v128(); // (unused for width 1)
  const gv = locals.v128();
  const code: number[] = [];
  // byte offsets of right-hand side c in G and Y
  for (let c = 1; c < g; c++) code.push(...get(ldG), ...i32(c), ...MUL, ...set(go + c), ...get(ldY), ...i32(c), ...MUL, ...set(yo + c));
  const inner: number[] = [...get(pl0), ...vload(0), ...set(a0)];
  if (width === 2) inner.push(...get(pl1), ...vload(0), ...set(a1));
  // rows i, i+1 of the column(s) against G(i..i+1, c) for every c
  for (let c = 0; c < g; c++) {
    inner.push(...get(pg), ...(c > 0 ? [...get(go + c), ...ADD] : []), ...vload(0), ...set(gv));
    inner.push(...mulAddTo(v + c, a0, gv));
    if (width === 2) inner.push(...mulAddTo(v + g + c, a1, gv));
  }
  inner.push(...addTo(pl0, i32(16)), ...addTo(pl1, i32(16)), ...addTo(pg, i32(16)));
  const group: number[] = [];
  for (let q = 0; q < width * g; q++) group.push(...vzero, ...set(v + q));
  group.push(...get(pL), ...set(pl0), ...get(pL), ...get(ldL), ...ADD, ...set(pl1), ...get(pG), ...set(pg), ...get(rowPairs), ...set(i), ...countdown(i, inner));
  // Y(t, c) (and Y(t+1, c)) −= the two lanes' sum
  for (let c = 0; c < g; c++) {
    group.push(...get(pY), ...(c > 0 ? [...get(yo + c), ...ADD] : []), ...set(addr));
    for (let w = 0; w < width; w++) {
      const acc = v + w * g + c;
      group.push(...get(addr), ...get(addr), ...fload(8 * w), ...get(acc), ...lane(0), ...get(acc), ...lane(1), ...F_ADD, ...F_SUB, ...fstore(8 * w));
    }
  }
  group.push(...addTo(pL, get(ldL)), ...(width === 2 ? addTo(pL, get(ldL)) : []), ...addTo(pY, i32(8 * width)));
  code.push(...countdown(colGroups, group));
  return locals.body(code);
}

/**
 * columnsTail(pL, ldL, rows, cols, pX, ldX, pY, ldY, g): the rows after the last strip of
 * `columns` (rows < 4), scalar: Y(i, c) −= Σ_{t<cols} L(i, t) X(t, c), the sum from 0 in
 * ascending t, for c < g.
 */
function columnsTailBody(): number[] {
  const locals = new Locals(9);
  const [pL, ldL, rows, cols, pX, ldX, pY, ldY, g] = locals.params;
  const pl = locals.i32();
  const py = locals.i32();
  const r = locals.i32();
  const t = locals.i32();
  const pa = locals.i32();
  const pb = locals.i32();
  const sum = locals.f64();
  // sum += L(i, t) · X(t, c)
  const step = [...get(sum), ...get(pa), ...fload(0), ...get(pb), ...fload(0), ...F_MUL, ...F_ADD, ...set(sum), ...addTo(pa, get(ldL)), ...addTo(pb, i32(8))];
  const row = [...F_ZERO, ...set(sum), ...get(pl), ...set(pa), ...get(pX), ...set(pb), ...get(cols), ...set(t), ...countdown(t, step)];
  row.push(...get(py), ...get(py), ...fload(0), ...get(sum), ...F_SUB, ...fstore(0), ...addTo(pl, i32(8)), ...addTo(py, i32(8)));
  const rhs = [...get(pL), ...set(pl), ...get(pY), ...set(py), ...get(rows), ...set(r), ...countdown(r, row), ...addTo(pX, get(ldX)), ...addTo(pY, get(ldY))];
  return locals.body(countdown(g, rhs));
}

/**
 * dotsTail(pL, ldL, cols, g, pG, ldG, pY, ldY): one row's share of `dots` (an odd last row),
 * scalar: Y(t, c) −= L(i, t) G(i, c) for t < cols, c < g (pL, pG at row i).
 */
function dotsTailBody(): number[] {
  const locals = new Locals(8);
  const [pL, ldL, cols, g, pG, ldG, pY, ldY] = locals.params;
  const pa = locals.i32();
  const py = locals.i32();
  const t = locals.i32();
  const gv = locals.f64();
  // Y(t) −= L(i, t) · G(i)
  const step = [...get(py), ...get(py), ...fload(0), ...get(pa), ...fload(0), ...get(gv), ...F_MUL, ...F_SUB, ...fstore(0), ...addTo(pa, get(ldL)), ...addTo(py, i32(8))];
  const rhs = [...get(pG), ...fload(0), ...set(gv), ...get(pL), ...set(pa), ...get(pY), ...set(py), ...get(cols), ...set(t), ...countdown(t, step)];
  rhs.push(...addTo(pG, get(ldG)), ...addTo(pY, get(ldY)));
  return locals.body(countdown(g, rhs));
}

/** The module's bytes (compiled once below; exported for the disassembly snapshot test): columns, dots2, dots1 for each g, then the two panel triangles and the two row tails. */
export function sweepModuleBytes(): Uint8Array {
  const functions = [];
  for (let g = 1; g <= KERNEL_GROUP; g++) {
    functions.push({ params: 8, name: `c${g}`, body: columnsBody(g) }, { params: 8, name: `d${g}`, body: dotsBody(g, 2) }, { params: 8, name: `e${g}`, body: dotsBody(g, 1) });
  }
  functions.push({ params: 6, name: 'tf', body: triangleForwardBody() }, { params: 6, name: 'tb', body: triangleBackwardBody() });
  functions.push({ params: 9, name: 'ct', body: columnsTailBody() }, { params: 8, name: 'dt', body: dotsTailBody() });
  return assembleModule(MAX_PAGES, functions);
}

const kernelModule = switchableModule(sweepModuleBytes);
let storageCount = 0;

/**
 * Turns the SIMD sweep kernels on or off for factors allocated from now on (default on where
 * available); the plain TypeScript sweeps compute the same solves. Returns whether they are in
 * use. For tests and benchmarks of the fallback.
 */
export function useSimdSweepKernels(on: boolean): boolean {
  return kernelModule.use(on);
}

/**
 * `length` zeroed doubles for a factor's values in a shared WebAssembly memory, after `regions`
 * scratch regions (one per thread) of `scratchDoubles` each; null when the kernels are off or
 * unavailable, or the whole does not fit in 4 GiB.
 */
export function factorStorage(length: number, scratchDoubles: number, regions: number): { values: Float64Array; storage: FactorStorage } | null {
  if (!kernelModule.inUse()) return null;
  const scratch = Math.ceil(scratchDoubles / 8) * 8;
  // a few doubles past the values: the factor's strip kernels may read a whole strip of 4 rows at the end
  const pages = Math.ceil((8 * (regions * scratch + length + 4)) / PAGE_BYTES);
  if (pages > MAX_PAGES - 1) return null;
  try {
    const memory = sharedMemory(Math.max(1, pages));
    const storage = { memory, id: ++storageCount + Math.random(), scratchDoubles: scratch, regions, valuesOffset: regions * scratch };
    return { values: new Float64Array(memory.buffer, 8 * storage.valuesOffset, length), storage };
  } catch {
    return null;
  }
}

/** This thread's kernels over a factor's memory (an instance per call; cache the result). */
export function sweepKernels(storage: FactorStorage): SweepKernels | null {
  const mod = kernelModule.compiled();
  if (mod === null) return null;
  const exports = instantiate(mod, storage.memory);
  const pick = (kind: string) => [() => {}, ...Array.from({ length: KERNEL_GROUP }, (_, i) => exports[`${kind}${i + 1}`])] as Kernel[];
  return { heap: new Float64Array(storage.memory.buffer), storage, columns: pick('c'), dots2: pick('d'), dots1: pick('e'), triangleForward: exports.tf as Triangle, triangleBackward: exports.tb as Triangle, columnsTail: exports.ct as SweepKernels['columnsTail'], dotsTail: exports.dt as Kernel };
}
