/**
 * Numbers read straight from a byte buffer (ASCII), no string per number on the common path.
 *
 * Accepted real syntax (Fortran-style, as in Matrix Market files):
 *   [+|-] digits [. [digits]] [exponent]  or  [+|-] . digits [exponent]
 *   exponent = (e|E|d|D) [+|-] digits
 * `d`/`D` exponents (Fortran double precision output, e.g. `1.5D+03`) are accepted because
 * Fortran exporters write them; `inf`, `nan`, hexadecimal and digit separators are not numbers.
 *
 * Conversion is correctly rounded (bit-exact with Number()): the decimal digits go to
 * decimalToDouble(); when it cannot prove its result (about 1 value in 256, or more than 19
 * significant digits) the token text is converted by Number().
 *
 * Results come back through the module state `scan` (end position, status) so that the hot
 * loop allocates nothing.
 */
import { decimalOut, decimalToDouble } from './decimal-to-double.js';

export const SCAN_OK = 0;
/** No number starts here (letter, punctuation, end of line). */
export const SCAN_NOT_A_NUMBER = 1;
/** An integer was expected but the token has a point or an exponent. */
export const SCAN_NOT_INTEGER = 2;
/** Integer larger than 2^31 − 1. */
export const SCAN_TOO_LARGE = 3;

export const scan = {
  /** Position just after the token. */
  end: 0,
  status: SCAN_OK,
  /** For reals: the token had a point or exponent (so it is not written as an integer). */
  hadFraction: false,
};

const ZERO = 48;
const SPACE = 32;
const TAB = 9;
const CR = 13;
const NEWLINE = 10;

function isBlank(c: number): boolean {
  return c === SPACE || c === TAB || c === CR;
}

/** Position of the first non-blank byte at or after p (or end). */
export function skipBlanks(buf: Uint8Array, p: number, end: number): number {
  while (p < end && isBlank(buf[p])) p++;
  return p;
}

/** The token (up to the next blank) starting at p, for messages; shortened when long. */
export function tokenText(buf: Buffer, p: number, end: number): string {
  let e = p;
  while (e < end && !isBlank(buf[e])) e++;
  const t = buf.toString('latin1', p, Math.min(e, p + 40)).replace(/[^\x20-\x7e]/g, '?');
  return e - p > 40 ? `${t}…` : t;
}

/**
 * Unsigned decimal integer at p (optional leading '+'). Sets scan.end/status; returns the
 * value, or −1 when there is none. A leading '-' is reported as SCAN_NOT_A_NUMBER with the
 * value −1; callers that want to name a negative index check buf[p] themselves.
 */
export function scanUnsigned(buf: Uint8Array, p: number, end: number): number {
  if (p < end && buf[p] === 43) p++; // '+'
  const start = p;
  let v = 0;
  // accumulate the decimal digits
  while (p < end) {
    const d = buf[p] - ZERO;
    if (d < 0 || d > 9) break;
    v = v * 10 + d;
    p++;
  }
  scan.end = p;
  if (p === start) {
    scan.status = SCAN_NOT_A_NUMBER;
    return -1;
  }
  if (p < end && !isBlank(buf[p])) {
    const c = buf[p];
    scan.status = c === 46 || c === 101 || c === 69 || c === 100 || c === 68 ? SCAN_NOT_INTEGER : SCAN_NOT_A_NUMBER;
    return -1;
  }
  scan.status = v > 2147483647 ? SCAN_TOO_LARGE : SCAN_OK;
  return v;
}

/**
 * Real number at p, up to a blank, a newline or the end. Sets scan.end, scan.status,
 * scan.hadFraction and returns the correctly rounded double (±Infinity for overflowing text).
 */
export function scanReal(buf: Buffer, p: number, end: number): number {
  scanRealInto(buf, p, end);
  return realOut[0];
}

/** The value scanned by scanRealInto (NaN when there was no number). */
export const realOut = new Float64Array(1);

/** As scanReal, result in realOut[0]: hot loops use this to avoid a heap number per value. */
export function scanRealInto(buf: Buffer, p: number, end: number): void {
  const start = p;
  let negative = false;
  if (p < end && (buf[p] === 45 || buf[p] === 43)) {
    negative = buf[p] === 45;
    p++;
  }
  let hi = 0; // first 15 significant digits
  let lo = 0; // next up to 4 significant digits
  let nd = 0; // significant digits seen (leading zeros excluded)
  let q = 0; // decimal exponent: −(digits after the point), + dropped integer digits
  let digits = 0; // all mantissa digits seen
  let fraction = false;
  // integer part: significant digits into hi, then lo
  for (; p < end; p++) {
    const d = buf[p] - ZERO;
    if (d < 0 || d > 9) break;
    digits++;
    if (nd < 15) {
      if (nd !== 0 || d !== 0) {
        hi = hi * 10 + d;
        nd++;
      }
    } else {
      if (nd < 19) lo = lo * 10 + d;
      else q++;
      nd++;
    }
  }
  if (p < end && buf[p] === 46) {
    fraction = true;
    // fraction part: each kept digit lowers the decimal exponent by one
    for (p++; p < end; p++) {
      const d = buf[p] - ZERO;
      if (d < 0 || d > 9) break;
      digits++;
      if (nd < 15) {
        q--;
        if (nd !== 0 || d !== 0) {
          hi = hi * 10 + d;
          nd++;
        }
      } else if (nd < 19) {
        q--;
        lo = lo * 10 + d;
        nd++;
      } else nd++;
    }
  }
  if (digits === 0) return notANumber(p);
  if (p < end && ((buf[p] | 32) === 101 || (buf[p] | 32) === 100)) {
    // exponent: (e|E|d|D) [+|-] digits
    fraction = true;
    p++;
    let expNegative = false;
    if (p < end && (buf[p] === 45 || buf[p] === 43)) {
      expNegative = buf[p] === 45;
      p++;
    }
    const expStart = p;
    let e = 0;
    // accumulate the exponent digits (capped: beyond ±10^6 the value is 0 or infinite anyway)
    for (; p < end; p++) {
      const d = buf[p] - ZERO;
      if (d < 0 || d > 9) break;
      if (e < 1e6) e = e * 10 + d;
    }
    if (p === expStart) return notANumber(p);
    q += expNegative ? -e : e;
  }
  if (p < end && !isBlank(buf[p]) && buf[p] !== NEWLINE) return notANumber(p);
  scan.end = p;
  scan.status = SCAN_OK;
  scan.hadFraction = fraction;
  if (nd <= 19 && decimalToDouble(negative, hi, nd > 15 ? nd - 15 : 0, lo, q)) realOut[0] = decimalOut[0];
  else realOut[0] = slowReal(buf, start, p);
}

function notANumber(p: number): void {
  scan.end = p;
  scan.status = SCAN_NOT_A_NUMBER;
  realOut[0] = NaN;
}

/** Exact conversion of an already validated token by the JavaScript number parser. */
function slowReal(buf: Buffer, start: number, end: number): number {
  let text = buf.toString('latin1', start, end);
  if (/[dD]/.test(text)) text = text.replace(/[dD]/, 'e');
  return Number(text);
}
