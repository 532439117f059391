/**
 * Rank-k tile products as a small WebAssembly module with 128-bit SIMD (two doubles per
 * vector), assembled here byte by byte so no build tool is needed. The module imports its
 * memory, so one compiled module serves a private scratch memory (`createTileKernel`) and the
 * factor's own memory (`stripKernels`, simd-sweep-kernels.ts allocates it).
 *
 * Every product is of a 4-row panel of A and a 4-column panel of W, both entering 4 doubles
 * per step t; the 16 sums are C(ii, jj) = Σ_{t<kb} A(ii, t) · W(jj, t). Per step: two 2-wide
 * loads of A, four broadcasts of W, eight 2-wide multiplies and adds into eight accumulators
 * (column jj rows 0–1 and rows 2–3): 12 live vector values with each product's temporary,
 * within what runs without spilling (DEVELOPERS.md, SIMD).
 *
 *   tiles(pa, pw, kb, out, count)   A packed: the panel's step t at pa + 32t; `count` panels in
 *                                   a row (each 32·kb bytes on); sums column-major at out + 128·i
 *   subStrips(pA, lda, kb, pW, pC, ldc, count)
 *                                   A read in place, column-major: step t of the strip at
 *                                   pA + t·lda; `count` strips 4 rows (32 bytes) apart;
 *                                   C(4 rows × 4 columns at pC, column stride ldc) −= the sums
 *   putStrips(…)                    the same, but C ← −(the sums)
 * W is always a packed panel (step t at pW + 32t). All addresses and strides are in bytes.
 *
 * Returns null where WebAssembly, its SIMD or shared memory is unavailable; callers then use
 * the plain TypeScript kernels.
 */

import { addTo, compileOnce, countdown, leb, name, op, section } from './wasm-bytes.js';

/** The few WebAssembly names used here (the project's lib settings do not include them). */
declare const WebAssembly: {
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number; maximum: number; shared: boolean }) => { buffer: ArrayBuffer | SharedArrayBuffer };
};

export interface TileKernel {
  /** Float64 view of the kernel's private memory. */
  memory: Float64Array;
  /** `count` tiles of consecutive A panels (32·kb bytes apart) against one W panel, their sums at out, out + 128, … */
  tiles: (pa: number, pw: number, kb: number, out: number, count: number) => void;
}

type Strips = (pA: number, lda: number, kb: number, pW: number, pC: number, ldc: number, count: number) => void;

/** The in-place products over one memory (this thread's instance). */
export interface StripKernels {
  subStrips: Strips;
  putStrips: Strips;
}

/** Pages of the private memory (2 MiB: packed A block, W panels and sums, see dense-block-kernels). */
const PAGES = 32;
const MAX_PAGES = 65536;

const { localGet: get, localSet: set, i32Const: i32, v128Load: load, v128Splat64: splat, v128Store: store, v128Zero: zero, f64x2Add: add, f64x2Sub: sub, f64x2Mul: mul, f64x2Neg: neg } = op;

/** acc ← acc + a·b on v128 locals. */
const madd = (acc: number, a: number, b: number) => [...get(acc), ...get(a), ...get(b), ...mul, ...add, ...set(acc)];

/** The 4×4 step: accumulators acc … acc+7 += (a0, a1) ⊗ W(·, t) with W's step at local pw. */
function tileStep(pw: number, acc: number, a0: number, a1: number, b: number): number[] {
  const code: number[] = [];
  // the four columns of the W panel at this step
  for (let jj = 0; jj < 4; jj++) {
    code.push(...get(pw), ...splat(8 * jj), ...set(b));
    code.push(...madd(acc + 2 * jj, a0, b), ...madd(acc + 2 * jj + 1, a1, b));
  }
  return code;
}

/**
 * tiles(pa, pw, kb, out, count): params 0–4; locals 5 (end), 6 (W start), 7–14 (accumulators),
 * 15–16 (A halves), 17 (W broadcast).
 */
function tilesBody(): number[] {
  const b: number[] = [];
  b.push(...get(1), ...set(6));
  const step = [...get(0), ...load(0), ...set(15), ...get(0), ...load(16), ...set(16), ...tileStep(1, 7, 15, 16, 17), ...addTo(0, i32(32)), ...addTo(1, i32(32))];
  const tile: number[] = [];
  for (let q = 0; q < 8; q++) tile.push(...zero, ...set(7 + q));
  // end = pa + 32·kb, W from its start; block { loop { if pa ≥ end break; step } }
  tile.push(...get(0), ...get(2), ...i32(5), 0x74, 0x6a, ...set(5), ...get(6), ...set(1));
  tile.push(0x02, 0x40, 0x03, 0x40, ...get(0), ...get(5), 0x4f, 0x0d, 1, ...step, 0x0c, 0, 0x0b, 0x0b);
  // this tile's 16 sums, column-major, then the next output slot
  for (let q = 0; q < 8; q++) tile.push(...get(3), ...get(7 + q), ...store(16 * q));
  tile.push(...addTo(3, i32(128)));
  b.push(...countdown(4, tile), 0x0b);
  return [2, 2, 0x7f, 11, 0x7b, ...b];
}

/**
 * subStrips / putStrips(pA, lda, kb, pW, pC, ldc, count): params 0–6; locals 7 (A pointer),
 * 8 (W pointer), 9 (steps left, then C address), 10–17 (accumulators), 18–19 (A halves),
 * 20 (W broadcast).
 */
function stripsBody(put: boolean): number[] {
  const step = [...get(7), ...load(0), ...set(18), ...get(7), ...load(16), ...set(19), ...tileStep(8, 10, 18, 19, 20), ...addTo(7, get(1)), ...addTo(8, i32(32))];
  const strip: number[] = [];
  for (let q = 0; q < 8; q++) strip.push(...zero, ...set(10 + q));
  strip.push(...get(0), ...set(7), ...get(3), ...set(8), ...get(2), ...set(9), ...countdown(9, step));
  // C's four columns of this strip: −= sums, or ← −sums
  strip.push(...get(4), ...set(9));
  for (let jj = 0; jj < 4; jj++) {
    for (let h = 0; h < 2; h++) {
      const acc = 10 + 2 * jj + h;
      if (put) strip.push(...get(9), ...get(acc), ...neg, ...store(16 * h));
      else strip.push(...get(9), ...get(9), ...load(16 * h), ...get(acc), ...sub, ...store(16 * h));
    }
    if (jj < 3) strip.push(...addTo(9, get(5)));
  }
  strip.push(...addTo(0, i32(32)), ...addTo(4, i32(32)));
  return [2, 3, 0x7f, 11, 0x7b, ...countdown(6, strip), 0x0b];
}

/** The module's bytes (compiled once below; exported for the disassembly snapshot test). */
export function tileModuleBytes(): Uint8Array {
  const bodies = [tilesBody(), stripsBody(false), stripsBody(true)];
  const code = bodies.flatMap((b) => [...leb(b.length), ...b]);
  return new Uint8Array([
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    // types: 0 = five i32 params, 1 = seven i32 params; no results
    ...section(1, [2, 0x60, 5, ...new Array<number>(5).fill(0x7f), 0, 0x60, 7, ...new Array<number>(7).fill(0x7f), 0]),
    ...section(2, [1, ...name('k'), ...name('memory'), 0x02, 0x03, ...leb(1), ...leb(MAX_PAGES)]),
    ...section(3, [3, 0, 1, 1]),
    ...section(7, [3, ...name('tiles'), 0, 0, ...name('sub'), 0, 1, ...name('put'), 0, 2]),
    ...section(10, [3, ...code]),
  ]);
}

const compiledModule = compileOnce(tileModuleBytes);

function instantiate(memory: { buffer: ArrayBuffer | SharedArrayBuffer }): Record<string, unknown> | null {
  const mod = compiledModule();
  if (mod === null) return null;
  try {
    return new WebAssembly.Instance(mod, { k: { memory } }).exports;
  } catch {
    return null;
  }
}

/** The packed-tile kernel over a private memory of its own. */
export function createTileKernel(): TileKernel | null {
  try {
    const memory = new WebAssembly.Memory({ initial: PAGES, maximum: PAGES, shared: true });
    const exports = instantiate(memory);
    if (exports === null) return null;
    return { memory: new Float64Array(memory.buffer), tiles: exports.tiles as TileKernel['tiles'] };
  } catch {
    return null;
  }
}

/** The in-place strip kernels over `memory` (a shared WebAssembly memory); one instance per call, so cache it. */
export function stripKernels(memory: { buffer: ArrayBuffer | SharedArrayBuffer }): StripKernels | null {
  const exports = instantiate(memory);
  if (exports === null) return null;
  return { subStrips: exports.sub as Strips, putStrips: exports.put as Strips };
}
