/**
 * A 4×4 rank-k tile product as a small WebAssembly module with 128-bit SIMD (two doubles per
 * lane pair), assembled here byte by byte so no build tool is needed.
 *
 * tile(pa, pw, kb, out) computes, for byte offsets into the module's memory,
 *   out[ii + 4·jj] = Σ_{t<kb} A[pa + 8·(4t + ii)] · W[pw + 8·(4t + jj)]   (ii, jj < 4),
 * i.e. the product of a 4-row panel and a 4-column panel, both stored t-major (4 doubles per
 * step). Per step: two 2-wide loads of A, four broadcasts of W, eight 2-wide multiply-adds into
 * eight accumulators (column jj rows 0–1 and rows 2–3). The result is stored column-major.
 *
 * Memory: 16 pages of 64 KiB, laid out by the caller. Returns null where WebAssembly (or its
 * SIMD) is unavailable; callers then use the plain TypeScript kernel.
 */

import { leb, name, section } from './wasm-bytes.js';

/** The few WebAssembly names used here (the project's lib settings do not include them). */
declare const WebAssembly: {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object) => { exports: Record<string, unknown> };
};

export interface TileKernel {
  /** Float64 view of the module's memory. */
  memory: Float64Array;
  tile: (pa: number, pw: number, kb: number, out: number) => void;
}

const PAGES = 32;

/** Function body: locals 4 (end, i32), 5–12 (accumulators), 13–14 (A halves), 15 (W broadcast). */
function tileBody(): number[] {
  const get = (i: number) => [0x20, i];
  const set = (i: number) => [0x21, i];
  const simd = (op: number, ...rest: number[]) => [0xfd, ...leb(op), ...rest];
  const load = (off: number) => simd(0, 3, ...leb(off));
  const splat = (off: number) => simd(10, 3, ...leb(off));
  const store = (off: number) => simd(11, 3, ...leb(off));
  const add = simd(240);
  const mul = simd(242);
  const b: number[] = [];
  // end = pa + 32·kb
  b.push(...get(0), ...get(2), 0x41, 5, 0x74, 0x6a, ...set(4));
  // block { loop { if pa ≥ end break; ... } }
  b.push(0x02, 0x40, 0x03, 0x40, ...get(0), ...get(4), 0x4f, 0x0d, 1);
  b.push(...get(0), ...load(0), ...set(13), ...get(0), ...load(16), ...set(14));
  // the four columns of the W panel at this step
  for (let jj = 0; jj < 4; jj++) {
    b.push(...get(1), ...splat(8 * jj), ...set(15));
    b.push(...get(5 + 2 * jj), ...get(13), ...get(15), ...mul, ...add, ...set(5 + 2 * jj));
    b.push(...get(6 + 2 * jj), ...get(14), ...get(15), ...mul, ...add, ...set(6 + 2 * jj));
  }
  b.push(...get(0), 0x41, 0x20, 0x6a, ...set(0), ...get(1), 0x41, 0x20, 0x6a, ...set(1), 0x0c, 0, 0x0b, 0x0b);
  // the 16 sums, column-major
  for (let q = 0; q < 8; q++) b.push(...get(3), ...get(5 + q), ...store(16 * q));
  b.push(0x0b);
  return [2, 1, 0x7f, 11, 0x7b, ...b];
}

function moduleBytes(): Uint8Array {
  const fn = tileBody();
  return new Uint8Array([
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, [1, 0x60, 4, 0x7f, 0x7f, 0x7f, 0x7f, 0]),
    ...section(3, [1, 0]),
    ...section(5, [1, 0, PAGES]),
    ...section(7, [2, ...name('tile'), 0, 0, ...name('memory'), 2, 0]),
    ...section(10, [1, ...leb(fn.length), ...fn]),
  ]);
}

export function createTileKernel(): TileKernel | null {
  try {
    const instance = new WebAssembly.Instance(new WebAssembly.Module(moduleBytes()));
    const memory = new Float64Array((instance.exports.memory as { buffer: ArrayBuffer }).buffer);
    return { memory, tile: instance.exports.tile as TileKernel['tile'] };
  } catch {
    return null;
  }
}
