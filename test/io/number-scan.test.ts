/**
 * Byte-level number parsing must agree bit for bit with ECMAScript Number(), which the
 * language specification (ECMA-262, StringToNumber / RoundMVResult) defines as correctly
 * rounded to nearest, ties to even — the outside reference here.
 */
import { describe, expect, it } from 'vitest';
import { scan, scanReal, scanUnsigned, SCAN_NOT_A_NUMBER, SCAN_NOT_INTEGER, SCAN_OK } from '../../src/io/number-scan.js';

function parseAll(tokens: string[]): Float64Array {
  const buf = Buffer.from(tokens.join('\n'), 'latin1');
  const out = new Float64Array(tokens.length);
  const refused: string[] = [];
  let p = 0;
  // one token per line
  for (let k = 0; k < tokens.length; k++) {
    let e = buf.indexOf(10, p);
    if (e < 0) e = buf.length;
    out[k] = scanReal(buf, p, e);
    if (scan.status !== SCAN_OK) refused.push(tokens[k]);
    p = e + 1;
  }
  expect(refused).toEqual([]);
  return out;
}

function xorshift(seed: number): () => number {
  let s = seed;
  return () => {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    return s / 4294967296;
  };
}

describe('scanReal', () => {
  it('matches Number() on 120 000 varied tokens (shortest, fixed, exponent, 1–21 digits)', () => {
    const r = xorshift(2024);
    const f = new Float64Array(1);
    const u = new Uint32Array(f.buffer);
    const tokens: string[] = [];
    // random doubles written in many ways
    for (let k = 0; tokens.length < 120_000; k++) {
      u[0] = (r() * 2 ** 32) >>> 0;
      u[1] = (r() * 2 ** 32) >>> 0;
      let x = f[0];
      if (k % 3 === 1) x = (r() - 0.5) * 10 ** Math.floor(r() * 60 - 30);
      if (!Number.isFinite(x)) continue;
      const form = k % 4;
      tokens.push(form === 0 ? String(x) : form === 1 ? x.toExponential(Math.floor(r() * 20)) : form === 2 ? x.toPrecision(1 + Math.floor(r() * 21)) : String(Math.abs(x) < 1e21 ? x : 1));
    }
    const got = parseAll(tokens);
    let mismatches = 0;
    for (let k = 0; k < tokens.length; k++) if (!Object.is(got[k], Number(tokens[k]))) mismatches++;
    expect(mismatches).toBe(0);
  });

  it('hard cases: boundaries of subnormal/normal/overflow, halfway points, long mantissas', () => {
    const tokens = [
      '0', '-0', '-0.0e5', '12.', '.5', '+.5', '5e-324', '2.4703282292062328e-324', '2.4703282292062327e-324',
      '2.2250738585072011e-308', '2.2250738585072014e-308', '1.7976931348623157e308', '1.7976931348623158e308',
      '9007199254740993', '9007199254740992.5', '9007199254740993.0000000001', '1e23', '8.98846567431158e307',
      '1.00000000000000011102230246251565404236316680908203125', '1.00000000000000011102230246251565404236316680908203124',
      '0.1', '0.30000000000000004', '123456789012345678', '1234567890123456789', '12345678901234567890',
      '4.9406564584124654e-324', '000000000000000000001.5', '1.5e-0002', '2.8E+2', '7e22', '7e-22', '1e-400',
    ];
    const got = parseAll(tokens);
    tokens.forEach((t, k) => expect(Object.is(got[k], Number(t)), t).toBe(true));
  });

  it('Fortran D exponents are read as E exponents', () => {
    expect(Array.from(parseAll(['1D3', '-2.5d-2', '1.0D+00']))).toEqual([1000, -0.025, 1]);
  });

  it('refuses text that is not a number', () => {
    for (const t of ['abc', '1e', '1.2.3', '--1', 'nan', 'inf', '0x10', '1,5', '.', '+', '1e+']) {
      const buf = Buffer.from(t, 'latin1');
      scanReal(buf, 0, buf.length);
      expect(scan.status, t).toBe(SCAN_NOT_A_NUMBER);
    }
  });
});

describe('scanUnsigned', () => {
  it('reads whole numbers and tells fractions from garbage', () => {
    const b = Buffer.from('1234 +7 1.0 x 3e2');
    expect(scanUnsigned(b, 0, 4)).toBe(1234);
    expect(scanUnsigned(b, 5, 7)).toBe(7);
    scanUnsigned(b, 8, 11);
    expect(scan.status).toBe(SCAN_NOT_INTEGER);
    scanUnsigned(b, 12, 13);
    expect(scan.status).toBe(SCAN_NOT_A_NUMBER);
    scanUnsigned(b, 14, 17);
    expect(scan.status).toBe(SCAN_NOT_INTEGER);
  });
});
