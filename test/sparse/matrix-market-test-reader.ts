/**
 * Test-only reader for the symmetric coordinate Matrix Market files in ../shared/reference
 * (NIST Matrix Market format, NISTIR 5935: banner, % comments, size line, 1-based "i j value").
 * The project's own reader lives in src/io; this keeps the sparse tests independent of it.
 */
import { readFileSync } from 'node:fs';
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

export function readSymmetricMtx(file: string): SymmetricCsc {
  const lines = readFileSync(file, 'utf8').split('\n');
  let li = 0;
  while (lines[li].startsWith('%') || lines[li].trim() === '') li++;
  const [n, , nnz] = lines[li++].trim().split(/\s+/).map(Number);
  const t = new TripletList(nnz);
  for (; li < lines.length; li++) {
    const s = lines[li].trim();
    if (s === '' || s.startsWith('%')) continue;
    const f = s.split(/\s+/);
    t.push(Number(f[0]) - 1, Number(f[1]) - 1, Number(f[2]));
  }
  return assembleSymmetric(n, t).matrix;
}
