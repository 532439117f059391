/**
 * Read stiffness and mass matrices (and dense mode-shape arrays) from Matrix Market files,
 * `.mtx` or gzip-compressed (detected by magic bytes), streaming: the text is never held
 * whole, numbers are parsed straight from the bytes (bit-exact, see ./number-scan.ts).
 *
 * Policy for K and M (our choices, after the NIST format rules):
 * - `coordinate` or `array`; `real` or `integer`; `general` or `symmetric`. `complex`,
 *   `pattern`, `hermitian` and `skew-symmetric` are refused with the reason.
 * - Duplicate entries are summed (the FE-assembly convention) and counted.
 * - A `symmetric` file must hold only the lower triangle (row ≥ column).
 * - A `general` file is accepted when numerically symmetric: max |a_ij − a_ji| / max|a| ≤
 *   `asymmetryTolerance` (default 1e-10, our choice: far above round-off of exported
 *   symmetric data ≈ 1e-16, far below any physical asymmetry); the stored entry is the mean.
 *   Stricter screening (docs/sources.md §6 suggests 1e-12 · max|K|, [CP]) is for the rules, which
 *   read `maxRelativeAsymmetry` from the summary.
 * - Non-finite values are refused (docs/sources.md §4, [CP]); so are declared sizes the file
 *   cannot possibly hold (each coordinate line needs ≥ 6 bytes; gzip expands ≤ 1032:1) and
 *   orders whose model cannot fit in memory (./matrix-market-memory.ts).
 * - With `screening: 'record'` (what `check` uses) the reader refuses neither: non-finite
 *   values are kept and listed with their lines (`MatrixSummary.nonFiniteAt`), and a
 *   `general` file's asymmetry is only measured (the stored entry is still the mean), so the
 *   matrix-finite and matrix-symmetry rules decide against their own options. Structural
 *   defects (entries above the diagonal of a `symmetric` file, bad indices, counts) are
 *   refused in both modes.
 * - readStiffnessAndMass reads both headers before either file's entries, so a K/M size
 *   mismatch, or a pair too large for memory, is found in milliseconds.
 */
import { InputError } from './errors.js';
import { forEachLine, probeFile, type ByteSourceInfo } from './byte-lines.js';
import { MatrixMarketLines, type MatrixLinesOptions, type NonFiniteEntry } from './matrix-market-lines.js';
import type { MatrixMarketBanner, MatrixMarketSize } from './matrix-market-header.js';
import { formatBytes, memoryBudgetBytes, readingBytes, solvingBytes } from './matrix-market-memory.js';
import { scan, scanUnsigned, skipBlanks } from './number-scan.js';
import { assembleSymmetricInPlace } from '../sparse/assemble.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import { summarizeMatrix } from './matrix-checks.js';
import type { MatrixSummary } from './matrix-summary.js';

const DEFAULT_ASYMMETRY_TOLERANCE = 1e-10;

export interface MatrixReadOptions {
  /** Largest accepted max |a_ij − a_ji| / max|a| for `general` files (default 1e-10). */
  asymmetryTolerance?: number;
  /** Cap of the DOF lists in the summary (default 20). */
  listCap?: number;
  /** 'refuse' (default): non-finite values and asymmetry above the tolerance are input errors; 'record': measured only. */
  screening?: 'refuse' | 'record';
  /** The matrix's part in the model: a stiffness file needs an entry per row. */
  role?: 'stiffness' | 'mass';
  /** Memory the model may take (default: the machine's, see matrix-market-memory.ts). */
  memoryBudgetBytes?: number;
}

export interface MatrixFile {
  matrix: SymmetricCsc;
  summary: MatrixSummary;
  /** Line number of the size line (for messages about the whole matrix). */
  sizeLine: number;
  /** The file was gzip-compressed; its size on disk in bytes. */
  gzip: boolean;
  fileBytes: number;
}

/** A stiffness or mass matrix as its lower-triangle CSC, with its screening summary. */
export async function readMatrixMarket(path: string, options: MatrixReadOptions = {}): Promise<MatrixFile> {
  const info = await probeFile(path);
  const parser = new MatrixMarketLines(path, 'triplets', info, linesOptions(options));
  const scanned = await forEachLine(path, parser.onLine, { info, onBlock: parser.onBlock });
  parser.finish(scanned.lines);
  const record = options.screening === 'record';
  const banner = parser.banner!;
  const size = parser.size!;
  const general = banner.symmetry === 'general';
  const { rows, cols, vals, stored } = parser;
  parser.rows = parser.cols = new Int32Array(0);
  parser.vals = new Float64Array(0);
  const assembled = assembleSymmetricInPlace(size.rows, rows, cols, vals, stored, { compareMirrors: general });
  let relative = 0;
  const mirrors = assembled.mirrors;
  if (mirrors && mirrors.maxAbsEntry > 0) relative = mirrors.maxAbsoluteAsymmetry / mirrors.maxAbsEntry;
  const tolerance = options.asymmetryTolerance ?? DEFAULT_ASYMMETRY_TOLERANCE;
  if (mirrors && relative > tolerance && !record) await rejectAsymmetric(path, info, banner.format, mirrors, relative, tolerance);
  const summary = summarizeMatrix(assembled.matrix, {
    file: path,
    format: banner.format,
    field: banner.field,
    symmetry: banner.symmetry,
    entriesInFile: parser.count,
    duplicatesSummed: assembled.duplicatesSummed + parser.mergedWhileReading,
    maxRelativeAsymmetry: relative,
    asymmetryRow: mirrors && mirrors.maxAbsoluteAsymmetry > 0 ? mirrors.worstRow : undefined,
    asymmetryCol: mirrors && mirrors.maxAbsoluteAsymmetry > 0 ? mirrors.worstCol : undefined,
    listCap: options.listCap,
  });
  if (summary.nonFiniteCount > 0 && !record) await rejectNonFiniteSum(path, info, banner.format, assembled.matrix);
  if (summary.nonFiniteCount > 0) summary.nonFiniteAt = await nonFiniteLocations(path, info, banner.format, assembled.matrix, parser.nonFinite);
  return { matrix: assembled.matrix, summary, sizeLine: size.line, gzip: info.gzip, fileBytes: info.fileBytes };
}

/** Stiffness and mass of one model: both read, and of the same size. */
export async function readStiffnessAndMass(
  stiffnessPath: string,
  massPath: string,
  options: MatrixReadOptions = {},
): Promise<{ stiffness: MatrixFile; mass: MatrixFile }> {
  // both headers first: sizes compared and memory bounded before any entry is read
  const k = await readMatrixHeader(stiffnessPath, { ...options, role: 'stiffness' });
  const m = await readMatrixHeader(massPath, { ...options, role: 'mass' });
  const n = k.size.rows;
  if (m.size.rows !== n) {
    throw new InputError(
      massPath,
      `the mass matrix is ${m.size.rows} × ${m.size.rows} but the stiffness matrix ${stiffnessPath} is ${n} × ${n}; they must be the same size`,
      { line: m.size.line },
    );
  }
  const need =
    readingBytes(n, k.size.entries, k.banner.symmetry === 'symmetric') +
    readingBytes(n, m.size.entries, m.banner.symmetry === 'symmetric') +
    solvingBytes(n);
  const budget = options.memoryBudgetBytes ?? memoryBudgetBytes();
  if (need > budget) {
    throw new InputError(
      massPath,
      `with the stiffness matrix ${stiffnessPath} (${k.size.entries} entries) and this mass matrix (${m.size.entries} entries) of order ${n}, ` +
        `reading and solving the model needs at least ${formatBytes(need)}, more than the ${formatBytes(budget)} of memory here`,
      { line: m.size.line },
    );
  }
  const stiffness = await readMatrixMarket(stiffnessPath, { ...options, role: 'stiffness' });
  const mass = await readMatrixMarket(massPath, { ...options, role: 'mass' });
  return { stiffness, mass };
}

/** Header text allowed before the size line (a real header is a few kB of comments). */
const HEADER_BYTES = 16 * 2 ** 20;

/**
 * The banner and size line of a matrix file, checked as readMatrixMarket checks them
 * (declared size against the file, memory, a stiffness row count), without reading entries.
 */
export async function readMatrixHeader(
  path: string,
  options: MatrixReadOptions = {},
): Promise<{ banner: MatrixMarketBanner; size: MatrixMarketSize }> {
  const info = await probeFile(path);
  const parser = new MatrixMarketLines(path, 'triplets', info, { ...linesOptions(options), headerOnly: true });
  let bytes = 0;
  const scanned = await forEachLine(
    path,
    (buf, start, end, line) => {
      bytes += end - start + 1;
      if (bytes > HEADER_BYTES) {
        throw new InputError(path, `more than ${HEADER_BYTES / 2 ** 20} MiB of text before the size line (blank lines or comments)`, { line });
      }
      parser.onLine(buf, start, end, line);
      return !parser.headerDone;
    },
    { info },
  );
  if (!parser.headerDone) parser.finish(scanned.lines);
  return { banner: parser.banner!, size: parser.size! };
}

/** The DOFs of a stiffness file by its size line, undefined when that cannot be read (reading the file will say why). */
export async function stiffnessDofs(path: string): Promise<number | undefined> {
  try {
    return (await readMatrixHeader(path, { role: 'stiffness' })).size.rows;
  } catch {
    return undefined;
  }
}

function linesOptions(options: MatrixReadOptions): MatrixLinesOptions {
  return { screening: options.screening, role: options.role, memoryBudgetBytes: options.memoryBudgetBytes };
}

export interface DenseArray {
  rows: number;
  cols: number;
  /** Column-major: entry (i, j) at values[i + j·rows]. */
  values: Float64Array;
}

/** A dense `array real general` file (e.g. mode shapes, one column per mode). */
export async function readDenseArray(path: string): Promise<DenseArray> {
  const info = await probeFile(path);
  const parser = new MatrixMarketLines(path, 'dense', info);
  const scanned = await forEachLine(path, parser.onLine, { info, onBlock: parser.onBlock });
  parser.finish(scanned.lines);
  return { rows: parser.size!.rows, cols: parser.size!.cols, values: parser.dense };
}

async function rejectAsymmetric(
  path: string,
  info: ByteSourceInfo,
  format: string,
  m: NonNullable<ReturnType<typeof assembleSymmetricInPlace>['mirrors']>,
  relative: number,
  tolerance: number,
): Promise<never> {
  const i = m.worstRow + 1;
  const j = m.worstCol + 1;
  const line = format === 'coordinate' ? await findEntryLine(path, info, i, j) : undefined;
  throw new InputError(
    path,
    `the matrix is not symmetric: a(${i}, ${j}) = ${m.lowerValue} but a(${j}, ${i}) = ${m.upperValue}; ` +
      `|difference| / max|a| = ${relative.toExponential(2)} exceeds the tolerance ${tolerance}`,
    { line },
  );
}

async function rejectNonFiniteSum(path: string, info: ByteSourceInfo, format: string, a: SymmetricCsc): Promise<never> {
  let i = 0, j = 0;
  // first stored entry that is not finite
  search: for (j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      if (a.values[p] - a.values[p] !== 0) {
        i = a.rowIdx[p];
        break search;
      }
    }
  }
  const line = format === 'coordinate' ? await findEntryLine(path, info, i + 1, j + 1) : undefined;
  throw new InputError(path, `duplicate entries at (${i + 1}, ${j + 1}) sum to a value that is not finite`, { line });
}

/** The first few non-finite entries, with lines: literal ones from the parser, sums found in the CSC. */
async function nonFiniteLocations(
  path: string,
  info: ByteSourceInfo,
  format: string,
  a: SymmetricCsc,
  literal: NonFiniteEntry[],
): Promise<NonFiniteEntry[]> {
  if (literal.length > 0) return literal.slice();
  // no literal inf/nan: finite values summed (duplicates) or averaged (mirrors) to infinity
  const out: NonFiniteEntry[] = [];
  for (let j = 0; j < a.n && out.length < 1; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      if (a.values[p] - a.values[p] !== 0) {
        const i = a.rowIdx[p] + 1;
        const line = format === 'coordinate' ? await findEntryLine(path, info, i, j + 1) : undefined;
        out.push({ row: i, col: j + 1, line: line ?? 0 });
        break;
      }
    }
  }
  return out;
}

/**
 * Line of the first coordinate entry at (i, j) or (j, i), 1-based; a second pass over the
 * file, used only to point at the line of an error found after reading.
 */
async function findEntryLine(path: string, info: ByteSourceInfo, i: number, j: number): Promise<number | undefined> {
  let found: number | undefined;
  let inData = false;
  await forEachLine(
    path,
    (buf, start, end, line) => {
      let p = skipBlanks(buf, start, end);
      if (p === end || buf[p] === 37) return true;
      if (!inData) {
        inData = true; // the size line
        return true;
      }
      const r = scanUnsigned(buf, p, end);
      p = skipBlanks(buf, scan.end, end);
      const c = scanUnsigned(buf, p, end);
      if ((r === i && c === j) || (r === j && c === i)) {
        found = line;
        return false;
      }
      return true;
    },
    { info },
  );
  return found;
}
