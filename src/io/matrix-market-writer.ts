/**
 * Write Matrix Market files: a symmetric matrix as `coordinate real symmetric` (its lower
 * triangle, column by column, rows ascending) and a dense block as `array real general`
 * (column-major, one value per line).
 *
 * Numbers are written as JavaScript's shortest round-trip decimal (String(x)), which reads
 * back to the same double bit for bit; its exponent form (`1e+21`, `5e-324`) is the usual
 * Fortran/C syntax Matrix Market readers accept. −0 is written `-0`. Non-finite values are
 * refused (they are not valid matrix data). Output goes in chunks through a temporary file
 * (atomic rename); gzip when the path ends in `.gz` or the option says so.
 */
import type { SymmetricCsc } from '../sparse/csc.js';
import { batchLines, writeChunksAtomic } from './atomic-stream-write.js';

export interface MatrixWriteOptions {
  /** Comment lines written after the banner (newlines split into several `%` lines). */
  comment?: string;
  gzip?: boolean;
}

/** Shortest text that reads back to exactly x. */
export function formatReal(x: number): string {
  if (x === 0) return Object.is(x, -0) ? '-0' : '0';
  if (x - x !== 0) throw new Error(`cannot write the non-finite value ${x} to a Matrix Market file`);
  return String(x);
}

function commentLines(comment: string | undefined): string {
  if (!comment) return '';
  return comment
    .split(/\r?\n/)
    .map((l) => `% ${l}\n`)
    .join('');
}

export async function writeSymmetricMatrixMarket(path: string, a: SymmetricCsc, options: MatrixWriteOptions = {}): Promise<void> {
  const header =
    '%%MatrixMarket matrix coordinate real symmetric\n' + commentLines(options.comment) + `${a.n} ${a.n} ${a.colPtr[a.n]}\n`;
  await writeChunksAtomic(path, batchLines(symmetricLines(a, header)), { gzip: options.gzip });
}

function* symmetricLines(a: SymmetricCsc, header: string): Generator<string> {
  yield header;
  const { n, colPtr, rowIdx, values } = a;
  // column j: its stored rows i ≥ j as "i j a_ij", 1-based
  for (let j = 0; j < n; j++) {
    const col = ` ${j + 1} `;
    let s = '';
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) s += `${rowIdx[p] + 1}${col}${formatReal(values[p])}\n`;
    yield s;
  }
}

/** Dense rows × cols block, column-major values (entry (i, j) at values[i + j·rows]). */
export async function writeDenseArray(
  path: string,
  rows: number,
  cols: number,
  values: Float64Array,
  options: MatrixWriteOptions = {},
): Promise<void> {
  if (values.length < rows * cols) throw new Error(`writeDenseArray: ${values.length} values for a ${rows} × ${cols} array`);
  const header = '%%MatrixMarket matrix array real general\n' + commentLines(options.comment) + `${rows} ${cols}\n`;
  await writeChunksAtomic(path, batchLines(denseLines(rows, cols, values, header)), { gzip: options.gzip });
}

function* denseLines(rows: number, cols: number, values: Float64Array, header: string): Generator<string> {
  yield header;
  // column j, top to bottom
  for (let j = 0; j < cols; j++) {
    let s = '';
    for (let i = 0, o = j * rows; i < rows; i++) s += `${formatReal(values[o + i])}\n`;
    yield s;
  }
}
