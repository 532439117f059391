/**
 * Reader bounds and screening modes (the "Hardening" points of the reader, scaled down so the
 * suite stays fast; test/io/full-size-hardening.ts runs the full-size cases once):
 * - a declared order whose model cannot fit in memory is refused at the size line, before
 *   anything is allocated; a stiffness file with fewer entries than rows is refused there too;
 * - K and M headers are compared before M's entries are read;
 * - repeated entries are summed while reading, so memory follows the distinct entries;
 * - blank lines / padding beyond the stated limit are refused early;
 * - banner text is quoted only when it looks like a banner;
 * - screening 'record' keeps non-finite values (with lines) and asymmetry for the rules.
 * The expected sums are plain arithmetic on the test's own data; the Matrix Market layout is
 * NIST's (Boisvert, Pozo & Remington, NISTIR 5935).
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { readMatrixMarket, readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { MatrixMarketLines, FILLER_BYTES, BYTES_PER_ENTRY } from '../../src/io/matrix-market-lines.js';
import { forEachLine, probeFile } from '../../src/io/byte-lines.js';
import { oneLineMessage } from '../../src/io/errors.js';
import { sumDuplicateTriplets } from '../../src/sparse/assemble.js';
import { matrixFinite } from '../../src/rules/matrix-finite.js';
import { matrixSymmetry } from '../../src/rules/matrix-symmetry.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import type { MatrixSummary } from '../../src/io/matrix-summary.js';
import { caught } from './caught-input-error.js';

const here = dirname(fileURLToPath(import.meta.url));
const corpus = join(here, 'bad-inputs');
const dir = mkdtempSync(join(tmpdir(), 'modalgate-hardening-'));
const BANNER = '%%MatrixMarket matrix coordinate real symmetric\n';

function file(name: string, content: string | Buffer): string {
  const p = join(dir, name);
  writeFileSync(p, content);
  return p;
}


/** The parser's triplet arrays after a whole file (to see how much it kept). */
async function parse(path: string, options: { compactFrom?: number; fillerBytes?: number } = {}): Promise<MatrixMarketLines> {
  const info = await probeFile(path);
  const parser = new MatrixMarketLines(path, 'triplets', info, options);
  const scanned = await forEachLine(path, parser.onLine, { info, onBlock: parser.onBlock });
  parser.finish(scanned.lines);
  return parser;
}

describe('declared sizes', () => {
  it('a 10⁹ × 10⁹ header with 3 entries is refused at the size line with the memory figure', async () => {
    const p = file('huge.mtx', `${BANNER}1000000000 1000000000 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
    const t0 = performance.now();
    const e = await caught(readMatrixMarket(p));
    expect(performance.now() - t0).toBeLessThan(2000);
    expect(e.line).toBe(2);
    expect(oneLineMessage(e)).toMatch(/^.*huge\.mtx:2: the size line declares 1000000000 × 1000000000 with 3 entries; .* needs at least [\d.]+ GB, more than the [\d.]+ (GB|MB) of memory here$/);
  });

  it('an order far beyond what the entries can fill is refused before allocating per-row arrays; a lumped M with half its rows empty is read', async () => {
    // each entry reaches at most two rows, so 3 000 000 rows and 4 entries leave 2 999 992 rows empty
    const p = file('hollow.mtx', `${BANNER}3000000 3000000 4\n1 1 1.0\n2 2 1.0\n3 3 1.0\n4 4 1.0\n`);
    const e = await caught(readMatrixMarket(p));
    expect(e.line).toBe(2);
    expect(e.reason).toBe('the size line declares 3000000 rows but only 4 entries, so at least 2999992 rows would hold nothing at all; the size line is out of step with the data');
    const lumped = file('lumped-half.mtx', `${BANNER}12 12 6\n${[1, 2, 3, 7, 8, 9].map((i) => `${i} ${i} 2.0`).join('\n')}\n`);
    expect((await readMatrixMarket(lumped)).summary.zeroDiagonalCount).toBe(6);
  });

  it('a small budget refuses a model that would not fit; the same file passes with room', async () => {
    const p = file('small.mtx', `${BANNER}1000 1000 1000\n${Array.from({ length: 1000 }, (_, i) => `${i + 1} ${i + 1} 1.0`).join('\n')}\n`);
    const e = await caught(readMatrixMarket(p, { memoryBudgetBytes: 100_000 }));
    expect(e.reason).toContain('needs at least');
    expect((await readMatrixMarket(p, { memoryBudgetBytes: 10_000_000 })).matrix.n).toBe(1000);
  });

  it('a stiffness file with fewer entries than rows is refused; a mass file is not', async () => {
    const k = file('k-sparse.mtx', `${BANNER}4 4 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
    const kFull = file('k-full.mtx', `${BANNER}4 4 4\n1 1 1.0\n2 2 1.0\n3 3 1.0\n4 4 1.0\n`);
    const m = file('m-lumped.mtx', `${BANNER}4 4 2\n1 1 1.0\n2 2 1.0\n`);
    const e = await caught(readStiffnessAndMass(k, m));
    expect(e.file).toBe(k);
    expect(e.line).toBe(2);
    expect(e.reason).toContain('no empty row');
    const pair = await readStiffnessAndMass(kFull, m);
    expect(pair.mass.summary.zeroDiagonalCount).toBe(2);
  });

  it('a K/M size mismatch is found before M’s entries are read (garbage after M’s size line)', async () => {
    const k = file('k3.mtx', `${BANNER}3 3 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
    const m = file('m2-garbage.mtx', `${BANNER}2 2 2\nthis is not an entry\n\u0000\u0001\u0002\n`);
    const e = await caught(readStiffnessAndMass(k, m));
    expect(e.file).toBe(m);
    expect(e.line).toBe(2);
    expect(e.reason).toContain('must be the same size');
    expect(e.message).toContain(k);
  });

  it('a pair too large for the budget together is refused at M’s size line', async () => {
    const lines = Array.from({ length: 2000 }, (_, i) => `${i + 1} ${i + 1} 1.0`).join('\n');
    const k = file('k2000.mtx', `${BANNER}2000 2000 2000\n${lines}\n`);
    const m = file('m2000.mtx', `${BANNER}2000 2000 2000\n${lines}\n`);
    // alone each needs 16·2000 + 4·2001 + 8·2000·16 ≈ 296 kB; the pair ≈ 328 kB
    const e = await caught(readStiffnessAndMass(k, m, { memoryBudgetBytes: 310_000 }));
    expect(e.file).toBe(m);
    expect(e.reason).toContain('reading and solving the model needs at least');
  });
});

describe('duplicates and filler', () => {
  it('sumDuplicateTriplets sums equal (row, column) pairs and keeps each triangle apart', () => {
    // random triplets over a 7 × 7 pattern, both triangles; expected sums by a plain map
    let seed = 12345;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const m = 500;
    const rows = new Int32Array(m), cols = new Int32Array(m), vals = new Float64Array(m);
    const want = new Map<string, number>();
    for (let k = 0; k < m; k++) {
      rows[k] = Math.floor(rand() * 7);
      cols[k] = Math.floor(rand() * 7);
      vals[k] = Math.round(rand() * 100) / 4;
      const key = `${rows[k]},${cols[k]}`;
      want.set(key, (want.get(key) ?? 0) + vals[k]);
    }
    const kept = sumDuplicateTriplets(7, rows, cols, vals, m);
    expect(kept).toBe(want.size);
    const got = new Map<string, number>();
    for (let k = 0; k < kept; k++) got.set(`${rows[k]},${cols[k]}`, vals[k]);
    for (const [key, v] of want) expect(got.get(key)).toBeCloseTo(v, 9);
  });

  it('a .gz repeating one entry 200 000 times keeps at most 4096 triplets (n = 3 allows 6 distinct)', async () => {
    const body = '2 1 0.5\n'.repeat(200_000);
    const p = file('repeat.mtx.gz', gzipSync(`${BANNER}3 3 200003\n1 1 1\n2 2 1\n3 3 1\n${body}`));
    const parser = await parse(p);
    expect(parser.rows.length).toBeLessThanOrEqual(4096);
    const a = await readMatrixMarket(p);
    expect(a.summary.duplicatesSummed).toBe(199_999);
    expect(a.summary.entriesInFile).toBe(200_003);
    // a(2, 1) = 200 000 × 0.5
    expect(a.matrix.values[1]).toBe(100_000);
  });

  it('past the compaction size duplicates are summed as the arrays grow (2^20 scaled to 2^14; 300 000 lines, 300 distinct)', async () => {
    const n = 10_000;
    const lines: string[] = [];
    for (let k = 0; k < 300_000; k++) lines.push(`${(k % 300) + 1} ${(k % 300) + 1} 1`);
    const diag = Array.from({ length: n }, (_, i) => `${i + 1} ${i + 1} 0`).join('\n');
    const p = file('many.mtx.gz', gzipSync(`${BANNER}${n} ${n} ${300_000 + n}\n${diag}\n${lines.join('\n')}\n`));
    const parser = await parse(p, { compactFrom: 2 ** 14 });
    // without summing the arrays would reach ≥ 310 000 triplets
    expect(parser.rows.length).toBeLessThanOrEqual(2 ** 16);
    expect(parser.mergedWhileReading).toBeGreaterThan(250_000);
    const a = await readMatrixMarket(p);
    expect(a.summary.storedNonzeros).toBe(n);
    expect(a.matrix.values[a.matrix.colPtr[0]]).toBe(1000); // 300 000 / 300
    expect(a.summary.duplicatesSummed).toBe(300_000);
  });

  it('a .gz of blank lines is refused after about the filler allowance (16 MiB scaled to 2 MiB), naming the line', async () => {
    const allowance = 2 * 2 ** 20;
    const blanks = Buffer.alloc(allowance + 3 * 2 ** 20, 10);
    const p = file('blank.mtx.gz', gzipSync(Buffer.concat([Buffer.from(`${BANNER}3 3 1\n`), blanks, Buffer.from('1 1 1\n')]), { level: 1 }));
    const e = await caught(parse(p, { fillerBytes: allowance }));
    expect(e.reason).toContain('blank lines, comments or padding');
    // stopped within one 1 MiB buffer of the allowance (one blank line per byte)
    expect(e.line).toBeGreaterThan(allowance - 2 ** 20);
    expect(e.line).toBeLessThan(allowance + 2 ** 21);
  });

  it('the default allowance is 16 MiB + 256 bytes per entry', () => {
    expect(FILLER_BYTES).toBe(16 * 2 ** 20);
    expect(BYTES_PER_ENTRY).toBe(256);
  });

  it('blank lines between entries within the limit are still fine', async () => {
    const p = file('some-blanks.mtx', `${BANNER}2 2 2\n\n\n1 1 1\n\n2 2 2\n\n`);
    expect((await readMatrixMarket(p)).matrix.n).toBe(2);
  });
});

describe('banner quoting', () => {
  it('a first line that is not a banner is not quoted into the message', async () => {
    const p = file('passwd-like', 'root:x:0:0:secret-root-line:/root:/bin/bash\nmore\n');
    const e = await caught(readMatrixMarket(p));
    expect(e.line).toBe(1);
    expect(e.message).not.toContain('secret');
    expect(e.message).toContain('not quoted');
  });

  it('a banner-like line (any case) is still quoted', async () => {
    const p = file('lower-banner.mtx', '%%matrixmarket matrix coordinate real symmetric\n1 1 1\n1 1 1\n');
    expect((await caught(readMatrixMarket(p))).message).toContain("'%%matrixmarket matrix coordinate real symmetric'");
  });
});

function context(k: MatrixSummary, m: MatrixSummary): RuleContext {
  return { stiffnessSummary: k, massSummary: m } as unknown as RuleContext;
}

describe("screening 'record' (check): the rules judge values", () => {
  it('the corpus files with non-finite values are refused by default and recorded with their lines in record mode', async () => {
    // lines from the corpus manifest (test/io/bad-inputs/manifest.json)
    for (const [name, line] of [['nan-value.mtx', 4], ['inf-value.mtx', 3], ['overflow-value.mtx', 4]] as const) {
      const p = join(corpus, name);
      expect((await caught(readMatrixMarket(p))).line).toBe(line);
      const a = await readMatrixMarket(p, { screening: 'record' });
      expect(a.summary.nonFiniteCount).toBe(1);
      expect(a.summary.nonFiniteAt?.[0].line).toBe(line);
    }
  });

  it('matrix-finite fails naming file:line of the first non-finite entries, passes on finite ones', async () => {
    const bad = await readMatrixMarket(join(corpus, 'nan-value.mtx'), { screening: 'record' });
    const good = await readMatrixMarket(file('ok3.mtx', `${BANNER}3 3 3\n1 1 1\n2 2 1\n3 3 1\n`));
    const fail = matrixFinite.evaluate(context(bad.summary, good.summary), {});
    expect(fail.status).toBe('fail');
    expect(fail.message).toContain(`${join(corpus, 'nan-value.mtx')}:4`);
    expect(matrixFinite.evaluate(context(good.summary, good.summary), {}).status).toBe('pass');
  });

  it('duplicates summing past the double range are recorded with the line of the entry', async () => {
    const p = file('sum-overflow.mtx', `${BANNER}2 2 3\n1 1 1e308\n2 2 1\n1 1 1e308\n`);
    expect((await caught(readMatrixMarket(p))).reason).toContain('not finite');
    const a = await readMatrixMarket(p, { screening: 'record' });
    expect(a.summary.nonFiniteAt).toEqual([{ row: 1, col: 1, line: 3 }]);
  });

  it('a general file’s asymmetry is recorded, and matrix-symmetry applies its own tolerance (also above 1e-10)', async () => {
    // a(2,1) = -1, a(1,2) = -1 − 1e-8: relative asymmetry 1e-8 / 4 = 2.5e-9
    const p = file('slightly-asym.mtx', '%%MatrixMarket matrix coordinate real general\n2 2 4\n1 1 4\n2 1 -1\n1 2 -1.00000001\n2 2 4\n');
    await expect(readMatrixMarket(p, { asymmetryTolerance: 1e-10 })).rejects.toThrow(/not symmetric/);
    const a = await readMatrixMarket(p, { screening: 'record' });
    expect(a.summary.maxRelativeAsymmetry).toBeCloseTo(2.5e-9, 14);
    const sym = await readMatrixMarket(file('sym2.mtx', `${BANNER}2 2 2\n1 1 1\n2 2 1\n`));
    const ctx = context(a.summary, sym.summary);
    expect(matrixSymmetry.evaluate(ctx, { tolerance: 1e-6 }).status).toBe('pass');
    expect(matrixSymmetry.evaluate(ctx, { tolerance: 1e-12 }).status).toBe('fail');
  });

  it('the corpus’s asymmetric general files are accepted in record mode and measured', async () => {
    const one = await readMatrixMarket(join(corpus, 'one-sided-general.mtx'), { screening: 'record' });
    // a(3,1) = −1 with no a(1,3): |difference| / max|a| = 1 / 4
    expect(one.summary.maxRelativeAsymmetry).toBe(0.25);
    const asym = await readMatrixMarket(join(corpus, 'asymmetric-general.mtx'), { screening: 'record' });
    expect(asym.summary.maxRelativeAsymmetry).toBeCloseTo(0.5 / 4, 15);
  });

  it('structural defects are refused in record mode too', async () => {
    const e = await caught(readMatrixMarket(join(corpus, 'upper-triangle-in-symmetric.mtx'), { screening: 'record' }));
    expect(e.reason).toContain('above the diagonal');
  });
});

describe('DOF map header quoting', () => {
  it('a first line that does not start with dof, is not quoted', async () => {
    const { readDofMap } = await import('../../src/io/dof-map-reader.js');
    const p = file('not-a-map.csv', 'root:x:0:0:secret-root-line\n');
    const e = await caught(readDofMap(p, 3));
    expect(e.line).toBe(1);
    expect(e.message).not.toContain('secret');
    const q = file('near-map.csv', 'dof,node,comp,x,y,z\n1,10,ux,0,0,0\n');
    expect((await caught(readDofMap(q, 1))).message).toContain("found 'dof,node,comp,x,y,z'");
  });
});
