/**
 * Byte-level helpers for the WebAssembly modules this project assembles by hand
 * (wasm-tile-kernel.ts, simd-sweep-kernels.ts): LEB128 integers, names and sections of the
 * binary format (WebAssembly Core Specification, §5 "Binary Format").
 */

/** The one WebAssembly name used here (the project's lib settings do not include it). */
declare const WebAssembly: { Module: new (bytes: Uint8Array) => object };

/**
 * The compiled module of `bytes`, compiled on first use and kept; null where WebAssembly, or a
 * feature the bytes use (SIMD, shared memory), is missing.
 */
export function compileOnce(bytes: () => Uint8Array): () => object | null {
  let compiled: object | null | undefined;
  return () => {
    if (compiled === undefined) {
      try {
        compiled = new WebAssembly.Module(bytes());
      } catch {
        compiled = null;
      }
    }
    return compiled;
  };
}

/** Unsigned LEB128. */
export function leb(n: number): number[] {
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
export function sleb(n: number): number[] {
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
export function section(id: number, body: number[]): number[] {
  return [id, ...leb(body.length), ...body];
}

/** A name: its length, then its characters (ASCII here). */
export function name(s: string): number[] {
  return [...leb(s.length), ...Array.from(s, (ch) => ch.charCodeAt(0))];
}

/** Instruction encodings used by both modules (Core Specification §5.4; SIMD opcodes after the 0xfd prefix). */
export const op = {
  localGet: (i: number) => [0x20, ...leb(i)],
  localSet: (i: number) => [0x21, ...leb(i)],
  i32Const: (v: number) => [0x41, ...sleb(v)],
  simd: (code: number, ...rest: number[]) => [0xfd, ...leb(code), ...rest],
  /** v128.load / v128.load64_splat / v128.store with 8-byte alignment at a constant offset. */
  v128Load: (off: number) => [0xfd, 0, 3, ...leb(off)],
  v128Splat64: (off: number) => [0xfd, 10, 3, ...leb(off)],
  v128Store: (off: number) => [0xfd, 11, 3, ...leb(off)],
  v128Zero: [0xfd, 12, ...new Array<number>(16).fill(0)],
  f64x2Add: [0xfd, ...leb(240)],
  f64x2Sub: [0xfd, ...leb(241)],
  f64x2Mul: [0xfd, ...leb(242)],
  f64x2Neg: [0xfd, ...leb(237)],
};

/** block { loop { if (local `counter` = 0) break; body; counter −= 1; continue } } */
export function countdown(counter: number, body: number[]): number[] {
  return [0x02, 0x40, 0x03, 0x40, ...op.localGet(counter), 0x45, 0x0d, 1, ...body, ...op.localGet(counter), ...op.i32Const(1), 0x6b, ...op.localSet(counter), 0x0c, 0, 0x0b, 0x0b];
}

/** local ← local + (the i32 the instructions `by` push). */
export function addTo(local: number, by: number[]): number[] {
  return [...op.localGet(local), ...by, 0x6a, ...op.localSet(local)];
}
