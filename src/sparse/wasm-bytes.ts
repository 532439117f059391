/**
 * Byte-level helpers for the WebAssembly modules this project assembles by hand
 * (wasm-tile-kernel.ts, simd-sweep-kernels.ts): LEB128 integers, names and sections of the
 * binary format (WebAssembly Core Specification, §5 "Binary Format").
 */

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
