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
 *   edgeStrips(pA, lda, kb, pW, pC, ldc, count, rows, cols)
 *                                   as subStrips, but only the first `cols` columns of C are
 *                                   written, and of the last strip only its first `rows` rows
 *                                   (A's rows past them are read, their sums dropped): the edge
 *                                   of a product whose C lies inside a factor block
 *   scatterAdd(pC, ldc, cols, g, pRuns, runs, pCols)
 *                                   column j < cols of C, rows g + j … on, added to a factor
 *                                   block by runs of consecutive target rows: run r starts at
 *                                   row i = runs[2r] (i32, one past the last at runs[2·runs]) and
 *                                   row i goes to pCols[j] (i32) + runs[2r + 1] + 8i
 *   subScaled(pY, pX, rows, pC)     y(i) −= c · x(i) for i < rows, c the double at pC
 *   scale(pY, rows, pC)             y(i) ← y(i) · c
 *                                   (a supernode's column loop inside a 4-column group)
 * W is always a packed panel (step t at pW + 32t). All addresses and strides are in bytes.
 *
 * Returns null where WebAssembly, its SIMD or shared memory is unavailable; callers then use
 * the plain TypeScript kernels.
 */

import { addTo, assembleModule, countdown, Locals, loopUntil, mulAddTo, op } from '../wasm/wasm-bytes.js';
import { compileOnce, instantiate as instantiateModule, MAX_PAGES, sharedMemory, type WasmMemory } from '../wasm/wasm-runtime.js';

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
  edgeStrips: (pA: number, lda: number, kb: number, pW: number, pC: number, ldc: number, count: number, rows: number, cols: number) => void;
  scatterAdd: (pC: number, ldc: number, cols: number, g: number, pRuns: number, runs: number, pCols: number) => void;
  subScaled: (pY: number, pX: number, rows: number, pC: number) => void;
  scale: (pY: number, rows: number, pC: number) => void;
}

/** Pages of the private memory (2 MiB: packed A block, W panels and sums, see dense-block-kernels). */
const PAGES = 32;

const { localGet: get, localSet: set, i32Const: i32, v128Load: load, v128Splat64: splat, v128Store: store, v128Zero: zero, f64x2Sub: sub, f64x2Neg: neg } = op;
const { i32Load: iload, i32GeU: GEU, i32Sub: ISUB, i32Add: IADD, i32Shl: SHL, f64Load: fload, f64Store: fstore, f64Sub: FSUB, f64Add: FADD, f64x2Add: vadd, f64x2ExtractLane: lane } = op;

/** The 4×4 step: accumulators acc … acc+7 += (a0, a1) ⊗ W(·, t) with W's step at local pw. */
function tileStep(pw: number, acc: number, a0: number, a1: number, b: number): number[] {
  const code: number[] = [];
  // the four columns of the W panel at this step
  for (let jj = 0; jj < 4; jj++) {
    code.push(...get(pw), ...splat(8 * jj), ...set(b));
    code.push(...mulAddTo(acc + 2 * jj, a0, b), ...mulAddTo(acc + 2 * jj + 1, a1, b));
  }
  return code;
}

/**
 * One strip's sums: acc … acc+7 ← 0, then kb steps of (a0, a1) = A's four rows at a (from pA,
 * a += lda) against W's panel at w (from pW, w += 32); the strips of strips and edgeStrips.
 */
function stripSums(l: { pA: number; lda: number; kb: number; pW: number; a: number; w: number; left: number; acc: number; a0: number; a1: number; b: number }): number[] {
  const { pA, lda, kb, pW, a, w, left, acc, a0, a1, b } = l;
  const step = [...get(a), ...load(0), ...set(a0), ...get(a), ...load(16), ...set(a1), ...tileStep(w, acc, a0, a1, b), ...addTo(a, get(lda)), ...addTo(w, i32(32))];
  const code: number[] = [];
  for (let q = 0; q < 8; q++) code.push(...zero, ...set(acc + q));
  code.push(...get(pA), ...set(a), ...get(pW), ...set(w), ...get(kb), ...set(left), ...countdown(left, step));
  return code;
}

/** tiles(pa, pw, kb, out, count) */
function tilesBody(): number[] {
  const locals = new Locals(5);
  const [pa, pw, kb, out, count] = locals.params;
  const end = locals.i32();
  const wStart = locals.i32();
  const acc = locals.v128(8);
  const a0 = locals.v128();
  const a1 = locals.v128();
  const b = locals.v128();
  const code: number[] = [...get(pw), ...set(wStart)];
  const step = [...get(pa), ...load(0), ...set(a0), ...get(pa), ...load(16), ...set(a1), ...tileStep(pw, acc, a0, a1, b), ...addTo(pa, i32(32)), ...addTo(pw, i32(32))];
  const tile: number[] = [];
  for (let q = 0; q < 8; q++) tile.push(...zero, ...set(acc + q));
  // end = pa + 32·kb, W from its start; then the steps until pa reaches end
  tile.push(...get(pa), ...get(kb), ...i32(5), ...op.i32Shl, ...op.i32Add, ...set(end), ...get(wStart), ...set(pw));
  tile.push(...loopUntil([...get(pa), ...get(end), ...op.i32GeU], step));
  // this tile's 16 sums, column-major, then the next output slot
  for (let q = 0; q < 8; q++) tile.push(...get(out), ...get(acc + q), ...store(16 * q));
  tile.push(...addTo(out, i32(128)));
  code.push(...countdown(count, tile));
  return locals.body(code);
}

/** subStrips / putStrips(pA, lda, kb, pW, pC, ldc, count) */
function stripsBody(put: boolean): number[] {
  const locals = new Locals(7);
  const [pA, lda, kb, pW, pC, ldc, count] = locals.params;
  const a = locals.i32();
  const w = locals.i32();
  /** steps left, then the address in C */
  const left = locals.i32();
  const c = left;
  const acc = locals.v128(8);
  const a0 = locals.v128();
  const a1 = locals.v128();
  const b = locals.v128();
  const strip = stripSums({ pA, lda, kb, pW, a, w, left, acc, a0, a1, b });
  // C's four columns of this strip: −= sums, or ← −sums
  strip.push(...get(pC), ...set(c));
  for (let jj = 0; jj < 4; jj++) {
    for (let h = 0; h < 2; h++) {
      const sum = acc + 2 * jj + h;
      if (put) strip.push(...get(c), ...get(sum), ...neg, ...store(16 * h));
      else strip.push(...get(c), ...get(c), ...load(16 * h), ...get(sum), ...sub, ...store(16 * h));
    }
    if (jj < 3) strip.push(...addTo(c, get(ldc)));
  }
  strip.push(...addTo(pA, i32(32)), ...addTo(pC, i32(32)));
  return locals.body(countdown(count, strip));
}

/** edgeStrips(pA, lda, kb, pW, pC, ldc, count, rows, cols) */
function edgeStripsBody(): number[] {
  const locals = new Locals(9);
  const [pA, lda, kb, pW, pC, ldc, count, rows, cols] = locals.params;
  const a = locals.i32();
  const w = locals.i32();
  const left = locals.i32();
  const c = locals.i32();
  const live = locals.i32();
  const acc = locals.v128(8);
  const a0 = locals.v128();
  const a1 = locals.v128();
  const b = locals.v128();
  const strip = stripSums({ pA, lda, kb, pW, a, w, left, acc, a0, a1, b });
  // rows written: 4, or `rows` in the last strip
  strip.push(...i32(4), ...set(live), ...op.block, ...get(count), ...i32(1), ...op.i32Ne, ...op.brIf(0), ...get(rows), ...set(live), ...op.end);
  // C(ii, jj) −= sum for jj < cols, ii < live, one double at a time
  strip.push(...get(pC), ...set(c), ...op.block);
  for (let jj = 0; jj < 4; jj++) {
    strip.push(...i32(jj), ...get(cols), ...GEU, ...op.brIf(0), ...op.block);
    for (let ii = 0; ii < 4; ii++) {
      const sum = acc + 2 * jj + (ii >> 1);
      strip.push(...i32(ii), ...get(live), ...GEU, ...op.brIf(0));
      strip.push(...get(c), ...get(c), ...fload(8 * ii), ...get(sum), ...lane(ii & 1), ...FSUB, ...fstore(8 * ii));
    }
    strip.push(...op.end, ...addTo(c, get(ldc)));
  }
  strip.push(...op.end, ...addTo(pA, i32(32)), ...addTo(pC, i32(32)));
  return locals.body(countdown(count, strip));
}

/** scatterAdd(pC, ldc, cols, g, pRuns, runs, pCols) */
function scatterAddBody(): number[] {
  const locals = new Locals(7);
  const [pC, ldc, cols, g, pRuns, runs, pCols] = locals.params;
  const run = locals.i32();
  const r = locals.i32();
  const start = locals.i32();
  const end = locals.i32();
  const dst = locals.i32();
  const src = locals.i32();
  const len = locals.i32();
  const base = locals.i32();
  /** byte address of run q's entry (pRuns + 8q) */
  const entry = (q: number) => [...get(pRuns), ...get(q), ...i32(3), ...SHL, ...IADD];
  // one run of len rows: dst += src, two rows at a time, then an odd last row
  const pair = [...get(dst), ...get(dst), ...load(0), ...get(src), ...load(0), ...vadd, ...store(0), ...addTo(dst, i32(16)), ...addTo(src, i32(16)), ...get(len), ...i32(2), ...ISUB, ...set(len)];
  const oneRun: number[] = [
    ...entry(r), ...iload(8), ...set(end),
    ...get(base), ...entry(r), ...iload(4), ...IADD, ...get(start), ...i32(3), ...SHL, ...IADD, ...set(dst),
    ...get(pC), ...get(start), ...i32(3), ...SHL, ...IADD, ...set(src),
    ...get(end), ...get(start), ...ISUB, ...set(len),
    ...loopUntil([...i32(1), ...get(len), ...GEU], pair),
    ...op.block, ...get(len), ...op.i32Eqz, ...op.brIf(0),
    ...get(dst), ...get(dst), ...fload(0), ...get(src), ...fload(0), ...FADD, ...fstore(0), ...op.end,
    ...get(end), ...set(start), ...addTo(r, i32(1)),
  ];
  const column: number[] = [
    // the run holding row g: advance while the next run starts at or before g
    ...loopUntil([...get(g), ...entry(run), ...iload(8), ...GEU, ...op.i32Eqz], addTo(run, i32(1))),
    ...get(pCols), ...iload(0), ...set(base), ...get(run), ...set(r), ...get(g), ...set(start),
    ...loopUntil([...get(r), ...get(runs), ...GEU], oneRun),
    ...addTo(pCols, i32(4)), ...addTo(pC, get(ldc)), ...addTo(g, i32(1)),
  ];
  return locals.body(countdown(cols, column));
}

/**
 * subScaled(pY, pX, rows, pC) (with x) or scale(pY, rows, pC): two rows per step, then an odd
 * last row (its product taken in lane 0), each entry rounded as the plain loop rounds it.
 */
function columnBody(withX: boolean): number[] {
  const locals = new Locals(withX ? 4 : 3);
  const [pY, pX, rows, pC] = withX ? locals.params : [locals.params[0], -1, locals.params[1], locals.params[2]];
  const c = locals.v128();
  const term = (vload: number[]) => (withX ? [...get(pX), ...vload, ...get(c), ...op.f64x2Mul] : []);
  const pairStep = withX
    ? [...get(pY), ...get(pY), ...load(0), ...term(load(0)), ...sub, ...store(0), ...addTo(pX, i32(16))]
    : [...get(pY), ...get(pY), ...load(0), ...get(c), ...op.f64x2Mul, ...store(0)];
  pairStep.push(...addTo(pY, i32(16)), ...get(rows), ...i32(2), ...ISUB, ...set(rows));
  const last = withX
    ? [...get(pY), ...get(pY), ...fload(0), ...term(splat(0)), ...lane(0), ...FSUB, ...fstore(0)]
    : [...get(pY), ...get(pY), ...splat(0), ...get(c), ...op.f64x2Mul, ...lane(0), ...fstore(0)];
  const code = [...get(pC), ...splat(0), ...set(c), ...loopUntil([...i32(1), ...get(rows), ...GEU], pairStep)];
  code.push(...op.block, ...get(rows), ...op.i32Eqz, ...op.brIf(0), ...last, ...op.end);
  return locals.body(code);
}

/** The module's bytes (compiled once below; exported for the disassembly snapshot test). */
export function tileModuleBytes(): Uint8Array {
  return assembleModule(MAX_PAGES, [
    { params: 5, name: 'tiles', body: tilesBody() },
    { params: 7, name: 'sub', body: stripsBody(false) },
    { params: 7, name: 'put', body: stripsBody(true) },
    { params: 9, name: 'edge', body: edgeStripsBody() },
    { params: 7, name: 'scatter', body: scatterAddBody() },
    { params: 4, name: 'subScaled', body: columnBody(true) },
    { params: 3, name: 'scale', body: columnBody(false) },
  ]);
}

const compiledModule = compileOnce(tileModuleBytes);

function instantiate(memory: WasmMemory): Record<string, unknown> | null {
  const mod = compiledModule();
  if (mod === null) return null;
  try {
    return instantiateModule(mod, memory);
  } catch {
    return null;
  }
}

/** The packed-tile kernel over a private memory of its own. */
export function createTileKernel(): TileKernel | null {
  try {
    const memory = sharedMemory(PAGES);
    const exports = instantiate(memory);
    if (exports === null) return null;
    return { memory: new Float64Array(memory.buffer), tiles: exports.tiles as TileKernel['tiles'] };
  } catch {
    return null;
  }
}

/** The in-place strip kernels over `memory` (a shared WebAssembly memory); one instance per call, so cache it. */
export function stripKernels(memory: WasmMemory): StripKernels | null {
  const exports = instantiate(memory);
  if (exports === null) return null;
  return {
    subStrips: exports.sub as Strips,
    putStrips: exports.put as Strips,
    edgeStrips: exports.edge as StripKernels['edgeStrips'],
    scatterAdd: exports.scatter as StripKernels['scatterAdd'],
    subScaled: exports.subScaled as StripKernels['subScaled'],
    scale: exports.scale as StripKernels['scale'],
  };
}

/** Whether the tile and strip kernels compile here (WebAssembly with SIMD and shared memory). */
export function tileKernelsAvailable(): boolean {
  return compiledModule() !== null;
}
