/**
 * Correctly rounded conversion of a decimal w · 10^q (w a whole number of up to 19 digits)
 * to the nearest double, without building a string.
 *
 * Two exact paths, each falling back (returns false) whenever it cannot prove its answer:
 *
 * 1. Clinger's fast path: w < 2^53 and |q| ≤ 22. Both w and 10^|q| are exact doubles, so
 *    one IEEE multiplication or division rounds the exact value once, correctly.
 *
 * 2. A product-of-powers path in the manner of Eisel and Lemire (Lemire, "Number parsing at a
 *    gigabyte per second", Software: Practice and Experience 51(8), 2021): with W = w·2^lz
 *    normalized to [2^63, 2^64) and T_q = ⌊5^q · 2^(127 − e5)⌋ ∈ [2^127, 2^128) where
 *    e5 = ⌊log2 5^q⌋, the value is w·10^q = W · T_q · 2^(q + e5 − 127 − lz). We form the top
 *    64 bits H of W · T_hi (T_hi = top 64 bits of T_q). H under-estimates the exact product
 *    by less than one unit in its last place, so the 54 leading bits of H (53 + rounding bit)
 *    are exact unless the discarded low bits of H are all ones (a carry could reach them),
 *    and an exact tie is only possible when those discarded bits are all zero. In both of
 *    those rare cases (≈ 1 in 256) we return false and the caller uses Number() on the text.
 *    Results that would be subnormal or overflow also return NaN.
 *
 * The result goes to `decimalOut[0]` and the function returns whether it is proven: returning
 * a double from a call that is not inlined would allocate a heap number per value.
 *
 * Our own code; the table is computed here with BigInt on first use (651 entries).
 */

const MIN_Q = -342;
const MAX_Q = 308;

/** Top 64 bits of T_q as four 16-bit limbs (least significant first), and e5(q). */
const T_LIMBS = new Uint16Array((MAX_Q - MIN_Q + 1) * 4);
const E5 = new Int16Array(MAX_Q - MIN_Q + 1);

let tableReady = false;

/** Bits in a positive BigInt. */
function bitLength(x: bigint): number {
  const hex = x.toString(16);
  return hex.length * 4 - Math.clz32(parseInt(hex[0], 16)) + 28;
}

/** Fill the table on first use: T_q = floor(5^q · 2^(127 − e5)) for q in [MIN_Q, MAX_Q]. */
function fillTable(): void {
  let p = 1n; // 5^|q|
  // q = 0, ±1, ±2, …: one power of five serves both signs
  for (let a = 0; a <= -MIN_Q; a++, p *= 5n) {
    const bits = bitLength(p);
    if (a <= MAX_Q) {
      const s = 127 - (bits - 1);
      storeEntry(a, s >= 0 ? p << BigInt(s) : p >> BigInt(-s), bits - 1);
    }
    // 2^(bits−1) < 5^a < 2^bits (a ≥ 1), so log2(5^−a) ∈ (−bits, −bits + 1)
    if (a > 0) storeEntry(-a, (1n << BigInt(127 + bits)) / p, -bits);
  }
  tableReady = true;
}

function storeEntry(q: number, t: bigint, e5: number): void {
  const hi = t >> 64n;
  const k = (q - MIN_Q) * 4;
  for (let l = 0; l < 4; l++) T_LIMBS[k + l] = Number((hi >> BigInt(16 * l)) & 0xffffn);
  E5[q - MIN_Q] = e5;
}

const POW10 = new Float64Array(23);
// exact powers of ten 10^0 .. 10^22
for (let i = 0, v = 1; i < 23; i++, v *= 10) POW10[i] = v;

const POW2 = new Float64Array(1024 + 1075);
// exact powers of two 2^−1074 .. 2^1023 (index e + 1074)
for (let e = -1074; e <= 1023; e++) POW2[e + 1074] = 2 ** e;

const TWO32 = 4294967296;
const INV16 = 1 / 65536;
const TWO52 = 4503599627370496;
const TWO53 = 9007199254740992;

/** Where decimalToDouble puts its result. */
export const decimalOut = new Float64Array(1);

/**
 * Nearest double to ±(hi · 10^extra + lo) · 10^q, where hi < 10^15 holds the first (up to 15)
 * significant digits, and lo < 10^extra (extra ≤ 4) the following ones. Writes decimalOut[0];
 * returns false when the result could not be proven (the caller then converts the text).
 */
export function decimalToDouble(negative: boolean, hi: number, extra: number, lo: number, q: number): boolean {
  if (hi === 0 && lo === 0) {
    decimalOut[0] = negative ? -0 : 0;
    return true;
  }
  if (extra === 0 && q >= -22 && q <= 22) {
    // Clinger: one correctly rounded operation on exact operands
    const v = q >= 0 ? hi * POW10[q] : hi / POW10[-q];
    decimalOut[0] = negative ? -v : v;
    return true;
  }
  if (extra > 0 && extra <= 3) {
    const w = hi * POW10[extra] + lo;
    if (w < TWO53 && q >= -22 && q <= 22) {
      const v = q >= 0 ? w * POW10[q] : w / POW10[-q];
      decimalOut[0] = negative ? -v : v;
      return true;
    }
  }
  if (q < MIN_Q || q > MAX_Q) return false;
  return productPath(negative, hi, extra, lo, q);
}

function productPath(negative: boolean, hi: number, extra: number, lo: number, q: number): boolean {
  if (!tableReady) fillTable();
  // w = hi · 10^extra + lo as two 32-bit words (wh, wl)
  const p10 = POW10[extra];
  const hiH = Math.floor(hi / TWO32);
  const hiL = hi - hiH * TWO32;
  const lowProd = hiL * p10 + lo; // < 2^46 + 10^4, exact
  const carry = Math.floor(lowProd / TWO32);
  let wl = lowProd - carry * TWO32;
  let wh = hiH * p10 + carry; // < 2^32 since w < 10^19 < 2^64
  // normalize W = w · 2^lz into [2^63, 2^64)
  let lz: number;
  if (wh === 0) {
    lz = 32 + Math.clz32(wl);
    const s = lz - 32;
    wh = s === 0 ? wl : (wl << s) >>> 0;
    wl = 0;
  } else {
    lz = Math.clz32(wh);
    if (lz > 0) {
      wh = ((wh << lz) | (wl >>> (32 - lz))) >>> 0;
      wl = (wl << lz) >>> 0;
    }
  }
  const w0 = wl & 0xffff, w1 = wl >>> 16, w2 = wh & 0xffff, w3 = wh >>> 16;
  const k = (q - MIN_Q) * 4;
  const t0 = T_LIMBS[k], t1 = T_LIMBS[k + 1], t2 = T_LIMBS[k + 2], t3 = T_LIMBS[k + 3];
  // columns of the 128-bit product W · T_hi in 16-bit limbs, carries propagated upward
  // (column sums stay below 2^36, so double arithmetic is exact; `% 65536` on doubles is slow)
  let c = w0 * t0;
  c = Math.floor(c * INV16) + w0 * t1 + w1 * t0;
  c = Math.floor(c * INV16) + w0 * t2 + w1 * t1 + w2 * t0;
  c = Math.floor(c * INV16) + w0 * t3 + w1 * t2 + w2 * t1 + w3 * t0;
  c = Math.floor(c * INV16) + w1 * t3 + w2 * t2 + w3 * t1;
  let f = Math.floor(c * INV16);
  const h4 = c - f * 65536;
  c = f + w2 * t3 + w3 * t2;
  f = Math.floor(c * INV16);
  const h5 = c - f * 65536;
  c = f + w3 * t3;
  f = Math.floor(c * INV16);
  const h6 = c - f * 65536;
  const h7 = f; // < 2^16
  const upper = h7 >>> 15;
  const shift = 9 + upper; // bits of H below the 54 kept ones
  const low9 = h4 & 0x1ff;
  if (low9 === 0x1ff || (h4 & ((1 << shift) - 1)) === 0) return false; // carry or tie possible
  const top = h7 * TWO32 + h6 * 65536 + h5; // H >> 16, < 2^48
  let m = top * (upper === 0 ? 64 : 32) + (h4 >>> (shift + 1)); // H >> (shift + 1), < 2^53
  m += (h4 >>> shift) & 1; // round half up (ties excluded above)
  let e2 = shift + q + E5[q - MIN_Q] + 2 - lz;
  if (m === TWO53) {
    m = TWO52;
    e2++;
  }
  if (e2 < -1074 || e2 > 971) return false; // subnormal or overflow: let Number() decide
  const v = m * POW2[e2 + 1074];
  decimalOut[0] = negative ? -v : v;
  return true;
}
