/**
 * Reading K and M into shared memory (MatrixReadOptions.sharedArrays): the same matrix as a plain read, its rowIdx and values
 * in shared memory when the file is plain and nothing was merged; a gzip file or one with
 * duplicates still reads, with ordinary arrays where a copy was needed anyway.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { readMatrixMarket, readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';

const dir = mkdtempSync(join(tmpdir(), 'modalgate-shared-read-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const stiffnessText = '%%MatrixMarket matrix coordinate real symmetric\n4 4 7\n1 1 4\n2 1 -1\n2 2 4\n3 2 -1\n3 3 4\n4 3 -1\n4 4 4\n';
const massText = '%%MatrixMarket matrix coordinate real symmetric\n4 4 4\n1 1 1\n2 2 1\n3 3 1\n4 4 0.5\n';
const duplicatesText = '%%MatrixMarket matrix coordinate real symmetric\n4 4 5\n1 1 1\n2 2 1\n3 3 1\n4 4 0.25\n4 4 0.25\n';

function write(name: string, text: string | Buffer): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

const plain = (a: { colPtr: Int32Array; rowIdx: Int32Array; values: Float64Array }) => ({
  colPtr: Array.from(a.colPtr),
  rowIdx: Array.from(a.rowIdx),
  values: Array.from(a.values),
});

describe('reading K and M into shared memory', () => {
  it('gives the same matrices, rowIdx and values in shared memory for plain files', async () => {
    const k = write('k.mtx', stiffnessText);
    const m = write('m.mtx', massText);
    const shared = await readStiffnessAndMass(k, m, { sharedArrays: true });
    const ordinary = await readStiffnessAndMass(k, m, { sharedArrays: false });
    expect(plain(shared.stiffness.matrix)).toEqual(plain(ordinary.stiffness.matrix));
    expect(plain(shared.mass.matrix)).toEqual(plain(ordinary.mass.matrix));
    expect(shared.stiffness.summary).toEqual(ordinary.stiffness.summary);
    for (const a of [shared.stiffness.matrix, shared.mass.matrix]) {
      expect(a.values.buffer).toBeInstanceOf(SharedArrayBuffer);
      expect(a.rowIdx.buffer).toBeInstanceOf(SharedArrayBuffer);
    }
    expect(ordinary.stiffness.matrix.values.buffer).not.toBeInstanceOf(SharedArrayBuffer);
  });

  it('reads gzip files and merged duplicates the same way, in ordinary arrays', async () => {
    const gz = write('k.mtx.gz', gzipSync(stiffnessText));
    const dup = write('dup.mtx', duplicatesText);
    const fromGzip = await readMatrixMarket(gz, { sharedArrays: true });
    expect(plain(fromGzip.matrix)).toEqual(plain((await readMatrixMarket(gz)).matrix));
    expect(fromGzip.matrix.values.buffer).not.toBeInstanceOf(SharedArrayBuffer);
    const merged = await readMatrixMarket(dup, { sharedArrays: true });
    expect(plain(merged.matrix)).toEqual(plain((await readMatrixMarket(dup)).matrix));
    expect(merged.summary.duplicatesSummed).toBe(1);
  });
});
