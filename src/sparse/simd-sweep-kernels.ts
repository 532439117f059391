/**
 * WebAssembly SIMD kernels for the triangular sweeps, reading the factor L where it lives.
 *
 * The factor's values are allocated inside a shared WebAssembly memory (`factorStorage`), after
 * two scratch regions (one per thread) that hold the gathered right-hand sides of one
 * supernode. The kernels then read L in place — no packing copy, which for a handful of
 * right-hand sides would cost as much as the arithmetic.
 *
 * Two products, for g ≤ 6 right-hand sides at a time (one function per g, generated below):
 *
 *   columns  Y(i, c) −= Σ_{t<cols} L(i, t) X(t, c)     rows in strips of 4 (two f64x2 lanes),
 *            the forward sweep's update  y_below −= L21 y_own  and the same inside L11;
 *            per step t: two loads of L's column, g broadcasts of X(t, ·), 2g multiply-adds
 *            into 2g accumulators (2g + 3 ≤ 15 vector registers for g = 6);
 *   dots     Y(t, c) −= Σ_{i<rows} L(i, t) G(i, c)     columns in pairs (or one), rows in pairs,
 *            the backward sweep's  y_own −= L21ᵀ x_below ; per row pair: one or two loads of L,
 *            g loads of G, g or 2g multiply-adds; lanes summed at the end.
 *
 * All addresses are byte offsets into the memory; every matrix is column-major with its own
 * leading dimension in bytes. Row tails (under 4 rows for `columns`, an odd row for `dots`)
 * are left to the caller. The module is assembled here byte by byte (as wasm-tile-kernel.ts).
 * Returns null where WebAssembly, its SIMD or shared memory is unavailable, or the factor does
 * not fit in 4 GiB; the sweeps then use the plain TypeScript loops.
 */

import { addTo, compileOnce, countdown, leb, name, op, section } from './wasm-bytes.js';

/** The few WebAssembly names used here (the project's lib settings do not include them). */
declare const WebAssembly: {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number; maximum: number; shared: boolean }) => WasmMemory;
};

export interface WasmMemory {
  buffer: ArrayBuffer | SharedArrayBuffer;
}

/** Most right-hand sides one kernel call serves. */
export const KERNEL_RHS = 6;
const PAGE_BYTES = 65536;
const MAX_PAGES = 65536;

type Kernel = (pL: number, ld: number, count: number, cols: number, pX: number, ldx: number, pY: number, ldy: number) => void;

/** Where a factor's values sit in its memory, and the two scratch regions before them. */
export interface FactorStorage {
  memory: WasmMemory;
  /** Tells factors apart in a helper thread, where each job brings a fresh copy of this object. */
  id: number;
  /** Doubles per scratch region (region r starts at double r · scratchDoubles). */
  scratchDoubles: number;
  /** First double of the values. */
  valuesOffset: number;
}

export interface SweepKernels {
  /** The whole memory as doubles (scratch regions and values). */
  heap: Float64Array;
  storage: FactorStorage;
  /** Indexed by g = 1 … KERNEL_RHS. */
  columns: Kernel[];
  dots2: Kernel[];
  dots1: Kernel[];
}

const { localGet: get, localSet: set, i32Const: i32, simd } = op;
const ADD = 0x6a;
const MUL = 0x6c;
const { v128Load: vload, v128Splat64: vsplat, v128Store: vstore, v128Zero: vzero, f64x2Add: vadd, f64x2Sub: vsub, f64x2Mul: vmul } = op;
const lane = (l: number) => simd(33, l);
const fload = (off: number) => [0x2b, 3, ...leb(off)];
const fstore = (off: number) => [0x39, 3, ...leb(off)];
const F_ADD = 0xa0;
const F_SUB = 0xa1;

/** acc ← acc + a·b on v128 locals. */
const fma = (acc: number, a: number, b: number) => [...get(acc), ...get(a), ...get(b), ...vmul, ...vadd, ...set(acc)];

/** Params: pL 0, ldL 1, strips 2, cols 3, pX 4, ldX 5, pY 6, ldY 7 (bytes). */
function columnsBody(g: number): number[] {
  const pl = 8, px = 9, t = 10, xo = 11, yo = 11 + g, addr = 11 + 2 * g;
  const v = 12 + 2 * g; // accumulators v … v+2g−1, then a0, a1, b
  const a0 = v + 2 * g, a1 = a0 + 1, b = a0 + 2;
  const code: number[] = [];
  // byte offsets of right-hand side c in X and Y
  for (let c = 1; c < g; c++) code.push(...get(5), ...i32(c), MUL, ...set(xo + c), ...get(7), ...i32(c), MUL, ...set(yo + c));
  const inner: number[] = [...get(pl), ...vload(0), ...set(a0), ...get(pl), ...vload(16), ...set(a1)];
  // step t: L(i..i+3, t) times X(t, c) for every c
  for (let c = 0; c < g; c++) {
    inner.push(...get(px), ...(c > 0 ? [...get(xo + c), ADD] : []), ...vsplat(0), ...set(b));
    inner.push(...fma(v + 2 * c, a0, b), ...fma(v + 2 * c + 1, a1, b));
  }
  inner.push(...addTo(pl, get(1)), ...addTo(px, i32(8)));
  const strip: number[] = [];
  for (let q = 0; q < 2 * g; q++) strip.push(...vzero, ...set(v + q));
  strip.push(...get(0), ...set(pl), ...get(4), ...set(px), ...get(3), ...set(t), ...countdown(t, inner));
  // Y(i..i+3, c) −= accumulators
  for (let c = 0; c < g; c++) {
    strip.push(...get(6), ...(c > 0 ? [...get(yo + c), ADD] : []), ...set(addr));
    strip.push(...get(addr), ...get(addr), ...vload(0), ...get(v + 2 * c), ...vsub, ...vstore(0));
    strip.push(...get(addr), ...get(addr), ...vload(16), ...get(v + 2 * c + 1), ...vsub, ...vstore(16));
  }
  strip.push(...addTo(0, i32(32)), ...addTo(6, i32(32)));
  code.push(...countdown(2, strip), 0x0b);
  return [2, ...leb(4 + 2 * g), 0x7f, ...leb(2 * g + 3), 0x7b, ...code];
}

/** Params: pL 0, ldL 1, rowPairs 2, colGroups 3, pG 4, ldG 5, pY 6, ldY 7 (bytes); `width` columns per group (1 or 2). */
function dotsBody(g: number, width: 1 | 2): number[] {
  const pl0 = 8, pl1 = 9, pg = 10, i = 11, go = 12, yo = 12 + g, addr = 12 + 2 * g;
  const v = 13 + 2 * g; // accumulators v … v+width·g−1, then a0, a1, gv
  const a0 = v + width * g, a1 = a0 + 1, gv = a0 + 2;
  const code: number[] = [];
  // byte offsets of right-hand side c in G and Y
  for (let c = 1; c < g; c++) code.push(...get(5), ...i32(c), MUL, ...set(go + c), ...get(7), ...i32(c), MUL, ...set(yo + c));
  const inner: number[] = [...get(pl0), ...vload(0), ...set(a0)];
  if (width === 2) inner.push(...get(pl1), ...vload(0), ...set(a1));
  // rows i, i+1 of the column(s) against G(i..i+1, c) for every c
  for (let c = 0; c < g; c++) {
    inner.push(...get(pg), ...(c > 0 ? [...get(go + c), ADD] : []), ...vload(0), ...set(gv));
    inner.push(...fma(v + c, a0, gv));
    if (width === 2) inner.push(...fma(v + g + c, a1, gv));
  }
  inner.push(...addTo(pl0, i32(16)), ...addTo(pl1, i32(16)), ...addTo(pg, i32(16)));
  const group: number[] = [];
  for (let q = 0; q < width * g; q++) group.push(...vzero, ...set(v + q));
  group.push(...get(0), ...set(pl0), ...get(0), ...get(1), ADD, ...set(pl1), ...get(4), ...set(pg), ...get(2), ...set(i), ...countdown(i, inner));
  // Y(t, c) (and Y(t+1, c)) −= the two lanes' sum
  for (let c = 0; c < g; c++) {
    group.push(...get(6), ...(c > 0 ? [...get(yo + c), ADD] : []), ...set(addr));
    for (let w = 0; w < width; w++) {
      const acc = v + w * g + c;
      group.push(...get(addr), ...get(addr), ...fload(8 * w), ...get(acc), ...lane(0), ...get(acc), ...lane(1), F_ADD, F_SUB, ...fstore(8 * w));
    }
  }
  group.push(...addTo(0, get(1)), ...(width === 2 ? addTo(0, get(1)) : []), ...addTo(6, i32(8 * width)));
  code.push(...countdown(3, group), 0x0b);
  return [2, ...leb(5 + 2 * g), 0x7f, ...leb(width * g + 3), 0x7b, ...code];
}

/** The module's bytes (compiled once below; exported for the disassembly snapshot test). */
export function sweepModuleBytes(): Uint8Array {
  const bodies: number[][] = [];
  const exports: number[] = [];
  // functions 0‥3·KERNEL_RHS−1: columns, dots2, dots1 for each g
  for (let g = 1; g <= KERNEL_RHS; g++) {
    for (const [kind, body] of [['c', columnsBody(g)], ['d', dotsBody(g, 2)], ['e', dotsBody(g, 1)]] as const) {
      exports.push(...name(`${kind}${g}`), 0, ...leb(bodies.length));
      bodies.push(body);
    }
  }
  const code = bodies.flatMap((b) => [...leb(b.length), ...b]);
  return new Uint8Array([
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, [1, 0x60, 8, ...new Array<number>(8).fill(0x7f), 0]),
    ...section(2, [1, ...name('k'), ...name('memory'), 0x02, 0x03, ...leb(1), ...leb(MAX_PAGES)]),
    ...section(3, [...leb(bodies.length), ...new Array<number>(bodies.length).fill(0)]),
    ...section(7, [...leb(bodies.length), ...exports]),
    ...section(10, [...leb(bodies.length), ...code]),
  ]);
}

const compiledModule = compileOnce(sweepModuleBytes);
let storageCount = 0;
let enabled = true;

/**
 * Turns the SIMD sweep kernels on or off for factors allocated from now on (default on where
 * available); the plain TypeScript sweeps compute the same solves. Returns whether they are in
 * use. For tests and benchmarks of the fallback.
 */
export function useSimdSweepKernels(on: boolean): boolean {
  enabled = on;
  return on && compiledModule() !== null;
}

/**
 * `length` zeroed doubles for a factor's values in a shared WebAssembly memory, after two
 * scratch regions of `scratchDoubles` each; null when the kernels are off or unavailable, or
 * the whole does not fit in 4 GiB.
 */
export function factorStorage(length: number, scratchDoubles: number): { values: Float64Array; storage: FactorStorage } | null {
  if (!enabled || compiledModule() === null) return null;
  const scratch = Math.ceil(scratchDoubles / 8) * 8;
  // a few doubles past the values: the factor's strip kernels may read a whole strip of 4 rows at the end
  const pages = Math.ceil((8 * (2 * scratch + length + 4)) / PAGE_BYTES);
  if (pages > MAX_PAGES - 1) return null;
  try {
    const memory = new WebAssembly.Memory({ initial: Math.max(1, pages), maximum: Math.max(1, pages), shared: true });
    const storage = { memory, id: ++storageCount + Math.random(), scratchDoubles: scratch, valuesOffset: 2 * scratch };
    return { values: new Float64Array(memory.buffer, 8 * storage.valuesOffset, length), storage };
  } catch {
    return null;
  }
}

/** This thread's kernels over a factor's memory (an instance per call; cache the result). */
export function sweepKernels(storage: FactorStorage): SweepKernels | null {
  const mod = compiledModule();
  if (mod === null) return null;
  const { exports } = new WebAssembly.Instance(mod, { k: { memory: storage.memory } });
  const pick = (kind: string) => [() => {}, ...Array.from({ length: KERNEL_RHS }, (_, i) => exports[`${kind}${i + 1}`])] as Kernel[];
  return { heap: new Float64Array(storage.memory.buffer), storage, columns: pick('c'), dots2: pick('d'), dots1: pick('e') };
}
