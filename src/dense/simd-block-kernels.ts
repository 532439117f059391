/**
 * The thin-block products of block-ops.ts with a large block A (the Krylov basis, rows × p,
 * column-major, p up to a few hundred) as WebAssembly SIMD kernels (two doubles per vector),
 * over a shared memory that holds A itself (`kernelBlock` allocates the basis there).
 *
 * Two products, each with the operations of block-ops.ts's plain loops in the same order for
 * every entry, so the results are bit-identical to them (and thread shares by rows change
 * nothing but where the rows are computed):
 *
 *   dots     out(h, j) += Σ_{r ∈ chunk} A(r, h) B(r, j)   (transposeTimes)
 *            The chunk of B (at most ROW_CHUNK rows, the chunks of block-ops.ts) is staged
 *            row-major with its columns paired, so B(r, j), B(r, j+1) is one vector; each lane
 *            sums one (h, j) over the chunk's rows in order from zero, as dots3x3's scalar sums
 *            do, and the sums are added to out after the chunk. Tiles of u ≤ 4 columns of A and
 *            v ≤ 2 column pairs of B: per row, u broadcasts of A(r, h), v loads of B, u·v
 *            multiply-adds into u·v accumulators (≤ 8 + 2 + 2 live vector values).
 *   combine  C(r, j) += Σ_{v<6} T(v, j) A(r, l_v)           (addTimesSmall, timesSmallInPlace)
 *            One panel of six columns of A (block-ops.ts panelCoefficients: the columns l_v are
 *            passed one by one, so the last panel's overlap and a repeated column need nothing
 *            here) against every column j of the staged chunk of C (column-major, rows in pairs):
 *            the six coefficients of column j broadcast into locals, then per row pair the
 *            six-term sum (((T0 A0 + T1 A1) + T2 A2) + …) + C, as the panel6x6 expression.
 *            An odd last row of a chunk is left to the caller.
 *
 * Memory (`kernelBlock`, byte offsets): the block (its `length` doubles) from 0, then one staging
 * region of STAGE_DOUBLES per thread that may take a row share (region 0: the thread that owns
 * the block; region t: helper t − 1): the staged chunk of B or C, the coefficients T and the
 * sums out. Untouched pages of a region cost no resident memory. The registry maps a block's
 * buffer to its memory, so block-ops.ts finds the kernels from the array alone; a helper thread
 * registers the buffer its job brought (`adoptHome`). A product whose A is not in a kernel block
 * (the M- and K-images of a Rayleigh–Ritz basis, a thin block against itself) runs in this
 * thread's own scratch memory with A's rows staged too, when p and q are wide enough
 * (STAGED_MIN_COLUMNS; copying a row of A costs about p multiply-adds' time, the product p·q).
 *
 * kernelBlock returns null where WebAssembly, its SIMD or shared memory is missing, when the
 * kernels are switched off (useSimdBlockKernels), or past 4 GiB; the plain loops then run.
 */
import { addTo, assembleModule, countdown, Locals, loopUntil, mulAddTo, op } from '../wasm/wasm-bytes.js';
import { switchableModule, instantiate, MAX_PAGES, PAGE_BYTES, sharedMemory, type WasmMemory } from '../wasm/wasm-runtime.js';

/** Doubles of one thread's staging region (2 MiB; only what a product uses is touched). */
const STAGE_DOUBLES = 1 << 18;

/** A block in a shared WebAssembly memory, with its staging regions. */
export interface BlockHome {
  memory: WasmMemory;
  /** Tells memories apart in a helper thread, where each job brings a fresh copy of this object. */
  id: number;
  /** First double of staging region 0 (after the block). */
  stageAt: number;
  regions: number;
}

type Dots = (pA: number, ldA: number, groups: number, pB: number, ldB: number, rows: number, pOut: number, ldOut: number) => void;
type Combine = (a0: number, a1: number, a2: number, a3: number, a4: number, a5: number, pairs: number, pT: number, q: number, pC: number, ldC: number) => void;

/** This thread's kernels over one block's memory. */
interface BoundKernels {
  heap: Float64Array;
  /** dots[u][v]: u = 1 … 4 columns of A, v = 1 … 2 column pairs of B. */
  dots: Dots[][];
  combine: Combine;
}

const { localGet: get, localSet: set, i32Const: i32, i32Add: ADD, i32Mul: MUL } = op;
const { v128Load: vload, v128Splat64: vsplat, v128Zero: vzero, v128Store: vstore, f64x2Add: vadd, f64x2Mul: vmul, f64x2ExtractLane: lane } = op;

/** dots(pA, ldA, groups, pB, ldB, rows, pOut, ldOut), addresses and strides in bytes. */
function dotsBody(u: number, v: number): number[] {
  const locals = new Locals(8);
  const [pA, ldA, groups, pB, ldB, rows, pOut, ldOut] = locals.params;
  const pa = locals.i32(u); // A(r, h) of the current row
  const pb = locals.i32();
  const left = locals.i32();
  const addr = locals.i32();
  const acc = locals.v128(u * v); // acc[h·v + e]: lanes (h, 2e), (h, 2e + 1)
  const b = locals.v128(v);
  const s = locals.v128();
  const group: number[] = [];
  for (let q = 0; q < u * v; q++) group.push(...vzero, ...set(acc + q));
  for (let h = 0; h < u; h++) group.push(...get(pA), ...(h > 0 ? [...get(ldA), ...i32(h), ...MUL, ...ADD] : []), ...set(pa + h));
  group.push(...get(pB), ...set(pb), ...get(rows), ...set(left));
  // one row: B(r, 2e … 2e+1) for each pair, then each A(r, h) against them
  const row: number[] = [];
  for (let e = 0; e < v; e++) row.push(...get(pb), ...vload(16 * e), ...set(b + e));
  for (let h = 0; h < u; h++) {
    row.push(...get(pa + h), ...vsplat(0), ...set(s));
    for (let e = 0; e < v; e++) row.push(...mulAddTo(acc + h * v + e, s, b + e));
    row.push(...addTo(pa + h, i32(8)));
  }
  row.push(...addTo(pb, get(ldB)));
  group.push(...countdown(left, row));
  // out(h, 2e + l) += lane l of acc[h][e]
  for (let e = 0; e < v; e++) {
    for (let l = 0; l < 2; l++) {
      group.push(...get(pOut), ...get(ldOut), ...i32(2 * e + l), ...MUL, ...ADD, ...set(addr));
      for (let h = 0; h < u; h++) group.push(...get(addr), ...get(addr), ...op.f64Load(8 * h), ...get(acc + h * v + e), ...lane(l), ...op.f64Add, ...op.f64Store(8 * h));
    }
  }
  // the next group of u columns of A and rows of out
  group.push(...addTo(pA, [...get(ldA), ...i32(u), ...MUL]), ...addTo(pOut, i32(8 * u)));
  return locals.body(countdown(groups, group));
}

/** combine(a0 … a5, pairs, pT, q, pC, ldC), addresses and strides in bytes. */
function combineBody(): number[] {
  const locals = new Locals(11);
  const params = locals.params;
  const pa = params.slice(0, 6);
  const [pairs, pT, q, pC, ldC] = params.slice(6);
  const o = locals.i32(); // byte offset of the row pair
  const end = locals.i32();
  const c = locals.i32();
  const t = locals.v128(6);
  const acc = locals.v128();
  const x = locals.v128();
  const column: number[] = [];
  // T(0 … 5, j) broadcast
  for (let w = 0; w < 6; w++) column.push(...get(pT), ...vsplat(8 * w), ...set(t + w));
  column.push(...i32(0), ...set(o));
  // C(r, j) += (((T0 A(r, l0) + T1 A(r, l1)) + …) + T5 A(r, l5)), two rows at a time
  const pair: number[] = [...get(pa[0]), ...get(o), ...ADD, ...vload(0), ...get(t), ...vmul, ...set(acc)];
  for (let w = 1; w < 6; w++) pair.push(...get(pa[w]), ...get(o), ...ADD, ...vload(0), ...set(x), ...mulAddTo(acc, x, t + w));
  pair.push(...get(pC), ...get(o), ...ADD, ...set(c), ...get(c), ...get(c), ...vload(0), ...get(acc), ...vadd, ...vstore(0));
  pair.push(...addTo(o, i32(16)));
  column.push(...loopUntil([...get(o), ...get(end), ...op.i32GeU], pair));
  column.push(...addTo(pT, i32(48)), ...addTo(pC, get(ldC)));
  return locals.body([...get(pairs), ...i32(16), ...MUL, ...set(end), ...countdown(q, column)]);
}

/** The module's bytes (compiled once below; exported for the disassembly snapshot test). */
export function blockModuleBytes(): Uint8Array {
  const functions = [{ params: 11, name: 'combine', body: combineBody() }];
  for (let u = 1; u <= 4; u++) for (let v = 1; v <= 2; v++) functions.push({ params: 8, name: `d${u}${v}`, body: dotsBody(u, v) });
  return assembleModule(MAX_PAGES, functions);
}

const kernelModule = switchableModule(blockModuleBytes);
let blockCount = 0;

/**
 * Turns the SIMD block kernels on or off for blocks allocated from now on (default on where
 * available); the plain loops of block-ops.ts compute the same bits. Returns whether they are
 * in use. For tests and benchmarks of the fallback.
 */
export function useSimdBlockKernels(on: boolean): boolean {
  return kernelModule.use(on);
}

/** Each kernel block's memory, by its buffer (this thread's registry). */
const homes = new WeakMap<ArrayBufferLike, BlockHome>();

/** A memory of `length` doubles and `regions` staging regions, registered; null when unavailable. */
function allocate(length: number, regions: number): BlockHome | null {
  if (!kernelModule.inUse()) return null;
  const stageAt = Math.ceil(length / 2) * 2;
  const pages = Math.ceil((8 * (stageAt + regions * STAGE_DOUBLES)) / PAGE_BYTES);
  if (pages > MAX_PAGES - 1) return null;
  let memory: WasmMemory;
  try {
    memory = sharedMemory(Math.max(1, pages));
  } catch {
    return null;
  }
  const home = { memory, id: ++blockCount + Math.random(), stageAt, regions };
  homes.set(memory.buffer, home);
  return home;
}

/**
 * `length` zeroed doubles in a shared WebAssembly memory with `regions` staging regions after
 * them; null when the kernels are off or unavailable, or past 4 GiB.
 */
export function kernelBlock(length: number, regions: number): Float64Array | null {
  const home = allocate(length, regions);
  return home === null ? null : new Float64Array(home.memory.buffer, 0, length);
}

/** This thread's own staging memory for products whose A is not in a kernel block (made on first use). */
let scratch: BlockHome | null | undefined;
function scratchHome(): BlockHome | null {
  if (scratch === undefined) scratch = allocate(0, 1);
  return scratch;
}

/** The memory `a` lives in, when it is a kernel block (or a part of one) known to this thread. */
export function homeOf(a: Float64Array): BlockHome | undefined {
  return homes.get(a.buffer);
}

/** Makes `a`'s buffer known as a view of `home` (a helper thread, for the arrays its job brought). */
export function adoptHome(a: Float64Array, home: BlockHome): void {
  homes.set(a.buffer, home);
}

/**
 * Instances by memory id, weakly held: a helper gets a fresh copy of the memory object with
 * every job and must not keep a dead basis alive; an instance costs ~25 µs.
 */
const bound = new Map<number, WeakRef<BoundKernels>>();

/** This thread's kernels over `home`'s memory. */
function kernelsOf(home: BlockHome): BoundKernels {
  const known = bound.get(home.id)?.deref();
  if (known !== undefined) return known;
  const exports = instantiate(kernelModule.compiled()!, home.memory);
  const dots = [[], ...[1, 2, 3, 4].map((u) => [() => {}, exports[`d${u}1`], exports[`d${u}2`]])] as Dots[][];
  const kernels: BoundKernels = { heap: new Float64Array(home.memory.buffer), dots, combine: exports.combine as Combine };
  // forget the ids whose instances were collected
  if (bound.size > 16) for (const [id, ref] of bound) if (ref.deref() === undefined) bound.delete(id);
  bound.set(home.id, new WeakRef(kernels));
  return kernels;
}

/** Where a product runs in the kernels: A's block and the thread's region there, or this thread's scratch with A staged. */
interface KernelPlace {
  home: BlockHome;
  region: number;
  /** A's rows are copied into the region a chunk at a time (A is not in a kernel block). */
  staged: boolean;
}

/** Fewest multiply-adds for which a product runs in the kernels (staging and calls cost more below; our choice). */
const KERNEL_MIN_WORK = 20_000;
/**
 * Fewest columns of A and of B for which A is staged for the dots kernels, and of C for the
 * combine kernel: copying A's rows costs about p multiply-adds' time per row (our choice; on
 * tet26k's 26,265 rows with p = 100, q = 6 the staged VᵀX ran at 0.5–1.4× the plain loop's
 * time and the staged X − V S at 0.95–2.3×, on a loaded machine, so combinations of six columns
 * stay plain).
 */
const STAGED_MIN_COLUMNS = 4;
const STAGED_COMBINE_MIN_COLUMNS = 12;
/** Fewest and most rows per staged chunk of the combine kernel. */
const COMBINE_CHUNK_MIN = 64;
const COMBINE_CHUNK_MAX = 512;
/** Rows per chunk of the dots kernels: block-ops.ts ROW_CHUNK, whose chunks the sums follow. */
const DOTS_CHUNK = 512;

/**
 * Where the product of A (rows × p) with q columns runs in the kernels (`dots`: AᵀB, `combine`:
 * C + A T), or null for the plain loops: too little work, the kernels off or unavailable, A not
 * in a kernel block and too narrow to stage, or the staging not fitting in a region.
 */
export function kernelPlace(a: Float64Array, region: number, rows: number, p: number, q: number, kind: 'dots' | 'combine'): KernelPlace | null {
  if (rows * p * q < KERNEL_MIN_WORK || !kernelModule.inUse()) return null;
  const home = homeOf(a);
  const inPlace = home !== undefined && region < home.regions;
  if (!inPlace && (p < STAGED_MIN_COLUMNS || q < (kind === 'dots' ? STAGED_MIN_COLUMNS : STAGED_COMBINE_MIN_COLUMNS))) return null;
  // doubles of the region used: out, B's chunk (and A's) for dots; T, C's chunk (and A's) for combine
  const staged = inPlace ? 0 : p;
  const need = kind === 'dots' ? 2 * ((q + 1) >> 1) * (p + DOTS_CHUNK) + DOTS_CHUNK * staged : Math.ceil(p / 6) * q * 6 + 2 + COMBINE_CHUNK_MIN * (q + staged);
  if (need > STAGE_DOUBLES) return null;
  if (inPlace) return { home, region, staged: false };
  const own = scratchHome();
  return own === null ? null : { home: own, region: 0, staged: true };
}

/**
 * out = AᵀB (p × q) through the dots kernels: per chunk of DOTS_CHUNK rows (the plain loop's
 * chunks, block-ops.ts ROW_CHUNK, so the sums are the same: the bit-for-bit tests fail if they part), B's rows staged row-major with its columns paired (a zero
 * pad column when q is odd) and, when A is not in the block, A's rows column-major; the chunk's
 * sums added into the staged out (p × 2⌈q/2⌉, column-major), copied to `out` at the end.
 */
export function simdTransposeTimes(place: KernelPlace, a: Float64Array, b: Float64Array, rows: number, p: number, q: number, out: Float64Array, rowFrom: number, rowTo: number): void {
  const chunkRows = DOTS_CHUNK;
  const { heap, dots } = kernelsOf(place.home);
  const pairs = (q + 1) >> 1;
  const qs = 2 * pairs;
  const outAt = place.home.stageAt + place.region * STAGE_DOUBLES;
  const bAt = outAt + p * qs;
  const aAt = bAt + chunkRows * qs;
  heap.fill(0, outAt, outAt + p * qs);
  const full = p >> 2;
  const rest = p & 3;
  const ldA = 8 * (place.staged ? chunkRows : rows);
  for (let r0 = rowFrom; r0 < rowTo; r0 += chunkRows) {
    const r1 = Math.min(rowTo, r0 + chunkRows);
    const len = r1 - r0;
    // staged B(r, j) at bAt + (r − r0) qs + j; A(r, h) at aAt + h · chunkRows + (r − r0) when staged
    if (q === 6) {
      // the block size: row by row, a contiguous run per row (5× faster here than column by column)
      const b1 = rows, b2 = 2 * rows, b3 = 3 * rows, b4 = 4 * rows, b5 = 5 * rows;
      for (let r = r0, t = bAt; r < r1; r++, t += 6) {
        heap[t] = b[r];
        heap[t + 1] = b[b1 + r];
        heap[t + 2] = b[b2 + r];
        heap[t + 3] = b[b3 + r];
        heap[t + 4] = b[b4 + r];
        heap[t + 5] = b[b5 + r];
      }
    } else {
      // four columns at a time (a 32-byte run per row), then the rest one by one
      let j = 0;
      for (; j + 4 <= q; j += 4) {
        const o0 = j * rows, o1 = o0 + rows, o2 = o1 + rows, o3 = o2 + rows;
        for (let r = r0, t = bAt + j; r < r1; r++, t += qs) {
          heap[t] = b[o0 + r];
          heap[t + 1] = b[o1 + r];
          heap[t + 2] = b[o2 + r];
          heap[t + 3] = b[o3 + r];
        }
      }
      for (; j < q; j++) for (let r = r0, o = j * rows, t = bAt + j; r < r1; r++, t += qs) heap[t] = b[o + r];
      if (q < qs) for (let r = r0, t = bAt + q; r < r1; r++, t += qs) heap[t] = 0;
    }
    if (place.staged) for (let h = 0; h < p; h++) heap.set(a.subarray(h * rows + r0, h * rows + r1), aAt + h * chunkRows);
    const pA = place.staged ? 8 * aAt : a.byteOffset + 8 * r0;
    // out(h, j) += Σ_r A(r, h) B(r, j): tiles of 4 columns of A (then the rest) × 2 column pairs of B (then one)
    for (let e = 0; e < pairs; e += 2) {
      const v = Math.min(2, pairs - e);
      const pB = 8 * bAt + 16 * e;
      const pOut = 8 * (outAt + 2 * e * p);
      if (full > 0) dots[4][v](pA, ldA, full, pB, 8 * qs, len, pOut, 8 * p);
      if (rest > 0) dots[rest][v](pA + 4 * full * ldA, ldA, 1, pB, 8 * qs, len, pOut + 32 * full, 8 * p);
    }
  }
  out.set(heap.subarray(outAt, outAt + p * q));
}

/**
 * C(rowFrom:rowTo, :) += A T through the combine kernel, T laid out as block-ops.ts
 * panelCoefficients (panel g: columns starts[g] + v, v < 6, clamped to p − 1; six coefficients
 * per column of C): T staged once, then per chunk of rows (even, as many as fit, at most 512)
 * C's rows staged column-major — zero instead when `inPlace` (C = A, timesSmallInPlace: the
 * chunk's result replaces A's first q columns only after every panel has read them) — and A's
 * rows when it is not in the block, the panels one after another (an odd last row by the plain
 * expression of block-ops.ts panel6x6), and the chunk copied back.
 */
export function simdAddPanels(place: KernelPlace, c: Float64Array, ldc: number, a: Float64Array, rows: number, p: number, t: Float64Array, q: number, starts: Int32Array, rowFrom: number, rowTo: number, inPlace: boolean): void {
  const { heap, combine } = kernelsOf(place.home);
  const tAt = place.home.stageAt + place.region * STAGE_DOUBLES;
  const cAt = tAt + t.length + (t.length & 1);
  const staged = place.staged ? p : 0;
  const chunk = Math.min(COMBINE_CHUNK_MAX, 2 * Math.floor((STAGE_DOUBLES - (cAt - tAt)) / (2 * (q + staged))));
  const aAt = cAt + chunk * q;
  heap.set(t, tAt);
  const last = p - 1;
  const cols = new Int32Array(6);
  for (let r0 = rowFrom; r0 < rowTo; r0 += chunk) {
    const r1 = Math.min(rowTo, r0 + chunk);
    const len = r1 - r0;
    // C(r0:r1, j) at cAt + j·chunk; A(r0:r1, h) at aAt + h·chunk when staged
    for (let j = 0; j < q; j++) {
      if (inPlace) heap.fill(0, cAt + j * chunk, cAt + j * chunk + len);
      else heap.set(c.subarray(j * ldc + r0, j * ldc + r1), cAt + j * chunk);
    }
    if (place.staged) for (let h = 0; h < p; h++) heap.set(a.subarray(h * rows + r0, h * rows + r1), aAt + h * chunk);
    for (let g = 0; g < starts.length; g++) {
      // heap index of A(r0, l_v) for the panel's six columns
      for (let v = 0; v < 6; v++) {
        const l = Math.min(starts[g] + v, last);
        cols[v] = place.staged ? aAt + l * chunk : a.byteOffset / 8 + l * rows + r0;
      }
      const tg = g * q * 6;
      // C(r, :) += Σ_v T(v, :) A(r, l_v) over the row pairs, then the odd last row
      if (len > 1) combine(8 * cols[0], 8 * cols[1], 8 * cols[2], 8 * cols[3], 8 * cols[4], 8 * cols[5], len >> 1, 8 * (tAt + tg), q, 8 * cAt, 8 * chunk);
      if (len & 1) {
        const r = len - 1;
        const x0 = heap[cols[0] + r], x1 = heap[cols[1] + r], x2 = heap[cols[2] + r], x3 = heap[cols[3] + r], x4 = heap[cols[4] + r], x5 = heap[cols[5] + r];
        for (let j = 0, o = tg; j < q; j++, o += 6) {
          heap[cAt + j * chunk + r] += t[o] * x0 + t[o + 1] * x1 + t[o + 2] * x2 + t[o + 3] * x3 + t[o + 4] * x4 + t[o + 5] * x5;
        }
      }
    }
    for (let j = 0; j < q; j++) c.set(heap.subarray(cAt + j * chunk, cAt + j * chunk + len), j * ldc + r0);
  }
}
