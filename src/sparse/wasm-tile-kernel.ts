/**
 * A 4×4 rank-k tile product as a small WebAssembly module with 128-bit SIMD (two doubles per
 * lane pair), assembled here byte by byte so no build tool is needed.
 *
 * One tile, for byte offsets into the module's memory,
 *   out[ii + 4·jj] = Σ_{t<kb} A[pa + 8·(4t + ii)] · W[pw + 8·(4t + jj)]   (ii, jj < 4),
 * is the product of a 4-row panel and a 4-column panel, both stored t-major (4 doubles per
 * step). Per step: two 2-wide loads of A, four broadcasts of W, eight 2-wide multiply-adds into
 * eight accumulators (column jj rows 0–1 and rows 2–3). The result is stored column-major.
 * tiles(pa, pw, kb, out, count) computes a column of such tiles in one call (one JS→WebAssembly
 * crossing per column of tiles instead of per tile).
 *
 * Memory: PAGES pages of 64 KiB, laid out by the caller. Returns null where WebAssembly (or its
 * SIMD) is unavailable; callers then use the plain TypeScript kernel.
 */

import { leb, name, op, section } from './wasm-bytes.js';

/** The few WebAssembly names used here (the project's lib settings do not include them). */
declare const WebAssembly: {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object) => { exports: Record<string, unknown> };
};

export interface TileKernel {
  /** Float64 view of the module's memory. */
  memory: Float64Array;
  /** `count` tiles of consecutive A panels (32·kb bytes apart) against one W panel, their sums at out, out + 128, … */
  tiles: (pa: number, pw: number, kb: number, out: number, count: number) => void;
}

const PAGES = 32;

/**
 * tiles(pa, pw, kb, out, count): the tile for `count` A panels in a row (the A pointer
 * runs on from one panel into the next), each against the same W panel; sums to out + 128·t.
 * Params 0–4; locals 5 (end), 6 (W start), 7–14 (accumulators), 15–16 (A halves), 17 (W broadcast).
 */
function tilesBody(): number[] {
  const { localGet: get, localSet: set, v128Load: load, v128Splat64: splat, v128Store: store, v128Zero: zero, f64x2Add: add, f64x2Mul: mul } = op;
  const b: number[] = [];
  b.push(...get(1), ...set(6));
  // block { loop { if count = 0 break; one tile; count −= 1 } }
  b.push(0x02, 0x40, 0x03, 0x40, ...get(4), 0x45, 0x0d, 1);
  for (let q = 0; q < 8; q++) b.push(...zero, ...set(7 + q));
  // end = pa + 32·kb, W from its start
  b.push(...get(0), ...get(2), 0x41, 5, 0x74, 0x6a, ...set(5), ...get(6), ...set(1));
  b.push(0x02, 0x40, 0x03, 0x40, ...get(0), ...get(5), 0x4f, 0x0d, 1);
  b.push(...get(0), ...load(0), ...set(15), ...get(0), ...load(16), ...set(16));
  // the four columns of the W panel at this step
  for (let jj = 0; jj < 4; jj++) {
    b.push(...get(1), ...splat(8 * jj), ...set(17));
    b.push(...get(7 + 2 * jj), ...get(15), ...get(17), ...mul, ...add, ...set(7 + 2 * jj));
    b.push(...get(8 + 2 * jj), ...get(16), ...get(17), ...mul, ...add, ...set(8 + 2 * jj));
  }
  b.push(...get(0), 0x41, 0x20, 0x6a, ...set(0), ...get(1), 0x41, 0x20, 0x6a, ...set(1), 0x0c, 0, 0x0b, 0x0b);
  // this tile's 16 sums, column-major, then the next output slot
  for (let q = 0; q < 8; q++) b.push(...get(3), ...get(7 + q), ...store(16 * q));
  b.push(...get(3), 0x41, ...[0x80, 0x01], 0x6a, ...set(3), ...get(4), 0x41, 1, 0x6b, ...set(4), 0x0c, 0, 0x0b, 0x0b);
  b.push(0x0b);
  return [2, 2, 0x7f, 11, 0x7b, ...b];
}

function moduleBytes(): Uint8Array {
  const many = tilesBody();
  return new Uint8Array([
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, [1, 0x60, 5, 0x7f, 0x7f, 0x7f, 0x7f, 0x7f, 0]),
    ...section(3, [1, 0]),
    ...section(5, [1, 0, PAGES]),
    ...section(7, [2, ...name('tiles'), 0, 0, ...name('memory'), 2, 0]),
    ...section(10, [1, ...leb(many.length), ...many]),
  ]);
}

export function createTileKernel(): TileKernel | null {
  try {
    const instance = new WebAssembly.Instance(new WebAssembly.Module(moduleBytes()));
    const memory = new Float64Array((instance.exports.memory as { buffer: ArrayBuffer }).buffer);
    return { memory, tiles: instance.exports.tiles as TileKernel['tiles'] };
  } catch {
    return null;
  }
}
