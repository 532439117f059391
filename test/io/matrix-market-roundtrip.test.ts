/**
 * Write → read round trips are bit-exact (K, M and dense mode-shape arrays, plain and gzip),
 * and the reader gives the structure the Matrix Market rules define (NISTIR 5935; docs/sources.md
 * §4 [C]): 1-based coordinates, symmetric files as their lower triangle, array files in
 * column-major order. Reference for number text: ECMAScript Number() / String(), which the
 * language specifies as correctly rounded and shortest round-trip.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readDenseArray, readMatrixMarket } from '../../src/io/matrix-market-reader.js';
import { writeDenseArray, writeSymmetricMatrixMarket, formatReal } from '../../src/io/matrix-market-writer.js';
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

const dir = mkdtempSync(join(tmpdir(), 'modalgate-io-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Deterministic pseudo-random numbers (xorshift32). */
function rng(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    return s / 4294967296;
  };
}

/** Awkward doubles: random bit patterns (finite), subnormals, ±0, extremes, short decimals. */
function awkwardValues(count: number, seed: number): Float64Array {
  const r = rng(seed);
  const v = new Float64Array(count);
  const bits = new Uint32Array(v.buffer);
  const special = [0, -0, 5e-324, -5e-324, 2.2250738585072014e-308, 2.225073858507201e-308, 1.7976931348623157e308, -1.7976931348623157e308, 1e-300, 1e300, 0.1, 1 / 3, 123456789012345680000, 9007199254740993];
  // fill: every 4th a random bit pattern, others spread over magnitudes, some specials
  for (let k = 0; k < count; k++) {
    const kind = k % 5;
    if (kind === 0) {
      do {
        bits[2 * k] = (r() * 2 ** 32) >>> 0;
        bits[2 * k + 1] = (r() * 2 ** 32) >>> 0;
      } while (!Number.isFinite(v[k]));
    } else if (kind === 1) v[k] = (r() - 0.5) * 10 ** Math.floor(r() * 600 - 300);
    else if (kind === 2) v[k] = r() * 1e-310; // subnormal
    else if (kind === 3) v[k] = special[k % special.length];
    else v[k] = Math.round(r() * 1e6) / 1000;
  }
  return v;
}

function randomSymmetric(n: number, perColumn: number, seed: number): SymmetricCsc {
  const r = rng(seed);
  const t = new TripletList();
  const values = awkwardValues(n * (perColumn + 1), seed + 1);
  let k = 0;
  // diagonal plus a few random rows below it in each column
  for (let j = 0; j < n; j++) {
    t.push(j, j, values[k++]);
    for (let q = 0; q < perColumn; q++) {
      const i = j + 1 + Math.floor(r() * (n - j - 1));
      if (i < n && i > j) t.push(i, j, values[k++]);
    }
  }
  // keep one entry per position so the round trip compares values, not sums
  const a = assembleSymmetric(n, t).matrix;
  let w = 0;
  const vals = a.values;
  for (let p = 0; p < vals.length; p++) vals[p] = values[w++ % values.length];
  return a;
}

function sameBits(a: Float64Array, b: Float64Array): boolean {
  return a.length === b.length && Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength));
}

describe('Matrix Market round trip', () => {
  it.each([
    ['stiffness-like', 300, 6, 11],
    ['mass-like (diagonal)', 200, 0, 12],
  ])('%s matrix: write → read is bit-exact, .mtx.gz reads identical to .mtx', async (_label, n, perColumn, seed) => {
    const a = randomSymmetric(n, perColumn, seed);
    const plain = join(dir, `a${seed}.mtx`);
    const gz = join(dir, `a${seed}.mtx.gz`);
    await writeSymmetricMatrixMarket(plain, a, { comment: 'round trip test\nsecond line' });
    await writeSymmetricMatrixMarket(gz, a);
    const back = await readMatrixMarket(plain);
    const backGz = await readMatrixMarket(gz);
    for (const b of [back.matrix, backGz.matrix]) {
      expect(b.n).toBe(a.n);
      expect(Array.from(b.colPtr)).toEqual(Array.from(a.colPtr));
      expect(Array.from(b.rowIdx)).toEqual(Array.from(a.rowIdx));
      expect(sameBits(b.values, a.values)).toBe(true);
    }
    expect(readFileSync(gz).subarray(0, 2)).toEqual(Buffer.from([0x1f, 0x8b]));
    expect(back.summary.entriesInFile).toBe(a.colPtr[n]);
    expect(back.summary.duplicatesSummed).toBe(0);
  });

  it('dense mode-shape array: write → read is bit-exact (plain and gzip)', async () => {
    const rows = 97, cols = 7;
    const v = awkwardValues(rows * cols, 5);
    for (const name of ['modes.mtx', 'modes.mtx.gz']) {
      const p = join(dir, name);
      await writeDenseArray(p, rows, cols, v, { comment: 'mode shapes' });
      const back = await readDenseArray(p);
      expect([back.rows, back.cols]).toEqual([rows, cols]);
      expect(sameBits(back.values, v)).toBe(true);
    }
  });

  it('gzip is recognised by its magic bytes, not the file name', async () => {
    const text = '%%MatrixMarket matrix coordinate real symmetric\n2 2 2\n1 1 2.5\n2 1 -1\n';
    const p = join(dir, 'compressed-but-named.mtx');
    writeFileSync(p, gzipSync(text));
    const { matrix } = await readMatrixMarket(p);
    expect(Array.from(matrix.values)).toEqual([2.5, -1]);
  });

  it('a highly compressed .mtx.gz (storage grown while reading) with 200 000 duplicates', async () => {
    const p = join(dir, 'dups.mtx.gz');
    writeFileSync(p, gzipSync(`%%MatrixMarket matrix coordinate real symmetric\n2 2 200001\n${'1 1 0.5\n'.repeat(200000)}2 2 1\n`));
    const { matrix, summary } = await readMatrixMarket(p);
    expect(Array.from(matrix.values)).toEqual([100000, 1]);
    expect(summary.duplicatesSummed).toBe(199999);
    expect(summary.entriesInFile).toBe(200001);
  });

  it('writes -0 as "-0" and refuses non-finite values', () => {
    expect(formatReal(-0)).toBe('-0');
    expect(formatReal(1e21)).toBe('1e+21');
    expect(() => formatReal(NaN)).toThrow();
  });
});

describe('reader structure', () => {
  it('Fortran-style numbers, CRLF, blank lines, mixed case qualifiers, D exponents', async () => {
    const p = join(dir, 'fortran.mtx');
    writeFileSync(
      p,
      '%%MatrixMarket MATRIX Coordinate Real Symmetric\r\n% comment\r\n\r\n  4 4 5\r\n1 1 1.5e-2\r\n2 1 -2.8E2\r\n2 2 12.\r\n\r\n3 3 1D3\r\n4   4\t+.5\r\n',
    );
    const { matrix, summary } = await readMatrixMarket(p);
    expect(Array.from(matrix.values)).toEqual([1.5e-2, -2.8e2, 12, 1000, 0.5]);
    expect(Array.from(matrix.colPtr)).toEqual([0, 2, 3, 4, 5]);
    expect(summary.bandwidth).toBe(1);
  });

  it('entries in any order, duplicates summed and counted, rows sorted with the diagonal first', async () => {
    const p = join(dir, 'shuffled.mtx');
    // dense reference built by hand: A = [[4,-1,0],[-1,5,-2],[0,-2,6]]
    writeFileSync(p, '%%MatrixMarket matrix coordinate real symmetric\n3 3 7\n3 2 -2\n3 3 6\n2 1 -0.5\n1 1 4\n2 2 2\n2 1 -0.5\n2 2 3\n');
    const { matrix, summary } = await readMatrixMarket(p);
    expect(Array.from(matrix.colPtr)).toEqual([0, 2, 4, 5]);
    expect(Array.from(matrix.rowIdx)).toEqual([0, 1, 1, 2, 2]);
    expect(Array.from(matrix.values)).toEqual([4, -1, 5, -2, 6]);
    expect(summary.duplicatesSummed).toBe(2);
    expect(summary.storedNonzeros).toBe(5);
    expect(summary.fullNonzeros).toBe(7);
  });

  it('a general file that is symmetric within the tolerance is accepted, with its asymmetry reported', async () => {
    const p = join(dir, 'general.mtx');
    writeFileSync(p, '%%MatrixMarket matrix coordinate real general\n2 2 4\n1 1 10\n1 2 -1\n2 1 -1.0000000000001\n2 2 10\n');
    const { matrix, summary } = await readMatrixMarket(p);
    expect(matrix.rowIdx.length).toBe(3);
    expect(summary.maxRelativeAsymmetry).toBeCloseTo(1e-14, 15);
    expect(summary.asymmetryAt).toEqual({ row: 2, col: 1 });
    await expect(readMatrixMarket(p, { asymmetryTolerance: 1e-16 })).rejects.toThrow(/:4: the matrix is not symmetric/);
  });

  it('array files: general (checked for symmetry) and symmetric (lower triangle by columns)', async () => {
    const g = join(dir, 'array-general.mtx');
    writeFileSync(g, '%%MatrixMarket matrix array real general\n2 2\n4\n-1\n-1\n5\n');
    const s = join(dir, 'array-symmetric.mtx');
    writeFileSync(s, '%%MatrixMarket matrix array real symmetric\n3 3\n4\n-1\n0\n5\n-2\n6\n');
    const a = (await readMatrixMarket(g)).matrix;
    expect(Array.from(a.values)).toEqual([4, -1, 5]);
    const b = (await readMatrixMarket(s)).matrix;
    expect(Array.from(b.colPtr)).toEqual([0, 2, 4, 5]);
    expect(Array.from(b.values)).toEqual([4, -1, 5, -2, 6]);
  });

  it('summary: zero and negative diagonals, spread, capped lists', async () => {
    const p = join(dir, 'diag.mtx');
    const lines = ['%%MatrixMarket matrix coordinate real symmetric', '30 30 29'];
    // diagonal 1..29 except dof 1 (missing → zero), dof 3 negative
    for (let j = 2; j <= 30; j++) lines.push(`${j} ${j} ${j === 3 ? -2 : j}`);
    writeFileSync(p, lines.join('\n'));
    const { summary } = await readMatrixMarket(p, { listCap: 5 });
    expect(summary.zeroDiagonalCount).toBe(1);
    expect(summary.zeroDiagonalDofs).toEqual([0]);
    expect(summary.negativeDiagonalDofs).toEqual([2]);
    expect(summary.diagonalMin).toBe(-2);
    expect(summary.diagonalMax).toBe(30);
    expect(summary.diagonalSpread).toBe(15);
  });
});

describe('array files through gzip', () => {
  it('a compressed array stiffness file grows its storage while reading', async () => {
    const n = 400;
    const lines = ['%%MatrixMarket matrix array real symmetric', `${n} ${n}`];
    // lower triangle by columns: 1000 on the diagonal, 1 elsewhere (80 200 nonzeros > first guess)
    for (let j = 0; j < n; j++) for (let i = j; i < n; i++) lines.push(i === j ? '1000' : '1');
    const p = join(dir, 'array-dense.mtx.gz');
    writeFileSync(p, gzipSync(lines.join('\n') + '\n'));
    const { matrix, summary } = await readMatrixMarket(p);
    expect(summary.storedNonzeros).toBe((n * (n + 1)) / 2);
    expect(summary.bandwidth).toBe(n - 1);
    expect(matrix.values[matrix.colPtr[n - 1]]).toBe(1000);
    expect(matrix.values[matrix.colPtr[n - 1] - 1]).toBe(1);
  });
});

describe('odd files', () => {
  it('a line longer than the 1 MiB buffer is an InputError naming its line', async () => {
    const p = join(dir, 'long-line.mtx');
    writeFileSync(p, `%%MatrixMarket matrix coordinate real symmetric\n% ${'x'.repeat(1_100_000)}\n1 1 1\n1 1 1\n`);
    await expect(readMatrixMarket(p)).rejects.toThrow(/long-line\.mtx:2: line is longer than/);
  });

  it('a plain-text file named .mtx.gz is read as plain text', async () => {
    const p = join(dir, 'not-really.mtx.gz');
    writeFileSync(p, '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 7\n');
    expect(Array.from((await readMatrixMarket(p)).matrix.values)).toEqual([7]);
  });
});
