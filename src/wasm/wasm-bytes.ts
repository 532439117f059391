/**
 * The binary encoding of the WebAssembly modules this project assembles by hand
 * (src/sparse/wasm-tile-kernel.ts, simd-sweep-kernels.ts, sym-product-kernel.ts;
 * src/dense/simd-block-kernels.ts): LEB128 integers, names, sections, the module layout, a named
 * encoding for every instruction the kernels use, and a locals allocator (WebAssembly Core
 * Specification, §5 "Binary Format"; SIMD instructions after the 0xfd prefix, §5.4.8). No other
 * file writes an opcode byte. test/sparse/wasm/*.wat holds every module as text
 * (test/sparse/wasm-modules.test.ts).
 */

/** Unsigned LEB128. */
function leb(n: number): number[] {
  const out: number[] = [];
  // seven bits per byte, high bit = more follows
  do {
    let b = n & 0x7f;
    n >>>= 7;
    if (n) b |= 0x80;
    out.push(b);
  } while (n);
  return out;
}

/** Signed LEB128 of a small non-negative constant. */
function sleb(n: number): number[] {
  const out: number[] = [];
  // as leb, but the last byte's bit 6 must be clear (non-negative)
  for (;;) {
    const b = n & 0x7f;
    n >>= 7;
    if (n === 0 && (b & 0x40) === 0) {
      out.push(b);
      return out;
    }
    out.push(b | 0x80);
  }
}

/** A section: its id, its byte length, its body. */
function section(id: number, body: number[]): number[] {
  return [id, ...leb(body.length), ...body];
}

/** A name: its length, then its characters (ASCII here). */
function name(s: string): number[] {
  return [...leb(s.length), ...Array.from(s, (ch) => ch.charCodeAt(0))];
}

/** Value types. */
const I32 = 0x7f;
const V128 = 0x7b;
const F64 = 0x7c;
/** Memory access immediates: log2 of the alignment (8 or 4 bytes), then the constant offset. */
const ALIGN_8 = 3;
const ALIGN_4 = 2;
const simd = (code: number, ...immediates: number[]) => [0xfd, ...leb(code), ...immediates];

/** The instructions the kernels use (Core Specification §5.4), each as its bytes. */
export const op = {
  // control
  block: [0x02, 0x40],
  loop: [0x03, 0x40],
  end: [0x0b],
  /** Branch to the enclosing label `depth` levels out (0 = innermost). */
  br: (depth: number) => [0x0c, ...leb(depth)],
  brIf: (depth: number) => [0x0d, ...leb(depth)],
  // locals
  localGet: (i: number) => [0x20, ...leb(i)],
  localSet: (i: number) => [0x21, ...leb(i)],
  // i32
  i32Const: (v: number) => [0x41, ...sleb(v)],
  i32Eqz: [0x45],
  i32Ne: [0x47],
  i32GeU: [0x4f],
  i32Add: [0x6a],
  i32Sub: [0x6b],
  i32Mul: [0x6c],
  i32Shl: [0x74],
  /** i32.load (4-byte aligned, at a constant offset). */
  i32Load: (off: number) => [0x28, ALIGN_4, ...leb(off)],
  // f64 (8-byte aligned, at a constant offset)
  f64Load: (off: number) => [0x2b, ALIGN_8, ...leb(off)],
  f64Store: (off: number) => [0x39, ALIGN_8, ...leb(off)],
  f64Add: [0xa0],
  f64Sub: [0xa1],
  f64Mul: [0xa2],
  /** f64.const 0. */
  f64Zero: [0x44, 0, 0, 0, 0, 0, 0, 0, 0],
  // 128-bit SIMD: v128.load / v128.load64_splat / v128.store (8-byte aligned, at a constant offset)
  v128Load: (off: number) => simd(0, ALIGN_8, ...leb(off)),
  v128Splat64: (off: number) => simd(10, ALIGN_8, ...leb(off)),
  v128Store: (off: number) => simd(11, ALIGN_8, ...leb(off)),
  /** v128.const of sixteen zero bytes. */
  v128Zero: simd(12, ...new Array<number>(16).fill(0)),
  f64x2ExtractLane: (lane: number) => simd(33, lane),
  f64x2Neg: simd(237),
  f64x2Add: simd(240),
  f64x2Sub: simd(241),
  f64x2Mul: simd(242),
};

const { localGet: get, localSet: set } = op;

/** block { loop { cond; if true break; body; continue } } */
export function loopUntil(cond: number[], body: number[]): number[] {
  return [...op.block, ...op.loop, ...cond, ...op.brIf(1), ...body, ...op.br(0), ...op.end, ...op.end];
}

/** block { loop { if (local `counter` = 0) break; body; counter −= 1; continue } } */
export function countdown(counter: number, body: number[]): number[] {
  return loopUntil([...get(counter), ...op.i32Eqz], [...body, ...get(counter), ...op.i32Const(1), ...op.i32Sub, ...set(counter)]);
}

/** local ← local + (the i32 the instructions `by` push). */
export function addTo(local: number, by: number[]): number[] {
  return [...get(local), ...by, ...op.i32Add, ...set(local)];
}

/** acc ← acc + a·b on v128 locals (two doubles each). */
export function mulAddTo(acc: number, a: number, b: number): number[] {
  return [...get(acc), ...get(a), ...get(b), ...op.f64x2Mul, ...op.f64x2Add, ...set(acc)];
}

/**
 * The locals of one function, numbered after its `params` i32 parameters in the order they are
 * asked for; consecutive locals of one type are declared as one run.
 */
export class Locals {
  /** The parameters' indices, 0 … params−1. */
  readonly params: number[];
  private next: number;
  private readonly runs: [count: number, type: number][] = [];

  constructor(params: number) {
    this.params = Array.from({ length: params }, (_, i) => i);
    this.next = params;
  }

  /** `count` consecutive i32 locals; the first one's index. */
  i32(count = 1): number {
    return this.take(count, I32);
  }

  /** `count` consecutive f64 locals; the first one's index. */
  f64(count = 1): number {
    return this.take(count, F64);
  }

  /** `count` consecutive v128 locals; the first one's index. */
  v128(count = 1): number {
    return this.take(count, V128);
  }

  /** The function body: its local declarations, `code`, end. */
  body(code: number[]): number[] {
    return [...leb(this.runs.length), ...this.runs.flatMap(([count, type]) => [...leb(count), type]), ...code, ...op.end];
  }

  private take(count: number, type: number): number {
    const first = this.next;
    const last = this.runs[this.runs.length - 1];
    if (last !== undefined && last[1] === type) last[0] += count;
    else this.runs.push([count, type]);
    this.next += count;
    return first;
  }
}

/** One exported function: how many i32 parameters it takes (it returns nothing), its name, its body (Locals.body). */
export interface ExportedFunction {
  params: number;
  name: string;
  body: number[];
}

/**
 * A module that imports a shared memory as `k.memory` (at least one page, at most `maxPages`)
 * and exports `functions` in order; one function type per distinct parameter count, in order of
 * first use.
 */
export function assembleModule(maxPages: number, functions: ExportedFunction[]): Uint8Array {
  const arities = [...new Set(functions.map((f) => f.params))];
  const types = arities.flatMap((n) => [0x60, ...leb(n), ...new Array<number>(n).fill(I32), ...leb(0)]);
  const MEMORY = 0x02;
  const SHARED_WITH_MAX = 0x03;
  const FUNC = 0x00;
  const code = functions.flatMap((f) => [...leb(f.body.length), ...f.body]);
  return new Uint8Array([
    // magic and version
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, [...leb(arities.length), ...types]),
    ...section(2, [...leb(1), ...name('k'), ...name('memory'), MEMORY, SHARED_WITH_MAX, ...leb(1), ...leb(maxPages)]),
    ...section(3, [...leb(functions.length), ...functions.flatMap((f) => leb(arities.indexOf(f.params)))]),
    ...section(7, [...leb(functions.length), ...functions.flatMap((f, i) => [...name(f.name), FUNC, ...leb(i)])]),
    ...section(10, [...leb(functions.length), ...code]),
  ]);
}
