/**
 * `modalgate inspect <matrix> [--dofs file] [--json]`: read one stiffness or mass matrix and
 * print what screening found (size, nonzeros, file format, duplicates, symmetry, diagonal,
 * bandwidth). With a DOF map, zero and negative diagonals are named by node and component.
 * Bad input → one stderr line, exit 2 (through runAction).
 */
import type { Command } from 'commander';
import { readMatrixMarket } from '../io/matrix-market-reader.js';
import { readDofMap } from '../io/dof-map-reader.js';
import { describeDof, type DofMap } from '../io/dof-map.js';
import { InputError } from '../io/errors.js';
import type { MatrixSummary } from '../io/matrix-summary.js';
import { EXIT_PASS, runAction } from './run-action.js';

export interface InspectOptions {
  dofs?: string;
  json?: boolean;
  asymmetryTolerance?: string;
}

export function registerInspect(program: Command): void {
  program
    .command('inspect')
    .description('read a stiffness or mass matrix (Matrix Market .mtx or .mtx.gz) and print its screening facts')
    .argument('<matrix>', 'matrix file')
    .option('--dofs <file>', 'DOF map CSV (dof,node,component,x,y,z) to name DOFs by node and component')
    .option('--json', 'print the facts as JSON')
    .option('--asymmetry-tolerance <ratio>', 'largest accepted max|a_ij - a_ji| / max|a| for general files', '1e-10')
    .action(runAction(inspectMatrix));
}

/** The command's action: prints the report, returns the exit code (errors propagate). */
export async function inspectMatrix(matrixPath: string, opts: InspectOptions): Promise<number> {
  const tolerance = Number(opts.asymmetryTolerance ?? '1e-10');
  if (!(tolerance >= 0)) throw new InputError('--asymmetry-tolerance', `must be a number ≥ 0, got '${opts.asymmetryTolerance}'`);
  const { summary, gzip, fileBytes } = await readMatrixMarket(matrixPath, { asymmetryTolerance: tolerance });
  const dofMap = opts.dofs ? await readDofMap(opts.dofs, summary.n) : undefined;
  const file = { gzip, fileBytes };
  process.stdout.write(opts.json ? formatInspectionJson(summary, dofMap, file) : formatInspection(summary, dofMap, file));
  return EXIT_PASS;
}

/** Short readable number: plain when moderate, exponent form otherwise. */
function shortNumber(x: number): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e7 ? String(Number(x.toPrecision(6))) : x.toExponential(4);
}

function dofList(dofs: number[], count: number, map: DofMap | undefined): string {
  if (count === 0) return 'none';
  const names = dofs.map((d) => describeDof(map, d)).join(', ');
  return `${count}: ${names}${count > dofs.length ? `, … (first ${dofs.length} shown)` : ''}`;
}

/** How the matrix file is stored on disk. */
export interface StoredFile {
  gzip: boolean;
  fileBytes: number;
}

function storage(file: StoredFile | undefined): string {
  if (!file) return '';
  return `, ${file.gzip ? 'gzip, ' : ''}${file.fileBytes} bytes`;
}

/** The plain-text report of one matrix. */
export function formatInspection(s: MatrixSummary, map?: DofMap, file?: StoredFile): string {
  const symmetry =
    s.symmetry === 'symmetric'
      ? 'exact (the file stores one triangle)'
      : s.asymmetryAt
        ? `largest relative asymmetry ${shortNumber(s.maxRelativeAsymmetry)} at (${s.asymmetryAt.row}, ${s.asymmetryAt.col})`
        : 'exact (both triangles equal)';
  const rows: [string, string][] = [
    ['file format', `Matrix Market ${s.format} ${s.field} ${s.symmetry}${storage(file)}`],
    ['size', `${s.n} × ${s.n}`],
    ['entries in file', `${s.entriesInFile} (${s.duplicatesSummed} duplicates summed)`],
    ['nonzeros', `${s.storedNonzeros} stored (lower triangle), ${s.fullNonzeros} in the full matrix`],
    ['symmetry', symmetry],
    ['largest |a_ij|', shortNumber(s.maxAbsEntry)],
    ['diagonal range', `${shortNumber(s.diagonalMin)} … ${shortNumber(s.diagonalMax)}`],
    ['diagonal spread', s.diagonalSpread > 0 ? `${shortNumber(s.diagonalSpread)} (max/min of nonzero |a_jj|)` : 'no nonzero diagonal'],
    ['zero diagonals', dofList(s.zeroDiagonalDofs, s.zeroDiagonalCount, map)],
    ['negative diagonals', dofList(s.negativeDiagonalDofs, s.negativeDiagonalCount, map)],
    ['half-bandwidth', `${s.bandwidth} (max |i − j| over nonzeros)`],
  ];
  const width = Math.max(...rows.map(([k]) => k.length));
  return `${s.file}\n${rows.map(([k, v]) => `  ${k.padEnd(width)}  ${v}`).join('\n')}\n`;
}

/** The summary as JSON; DOF lists also as names (1-based, by node/component with a map). */
function formatInspectionJson(s: MatrixSummary, map?: DofMap, file?: StoredFile): string {
  const out = {
    ...s,
    ...(file ? { gzip: file.gzip, fileBytes: file.fileBytes } : {}),
    zeroDiagonalNames: s.zeroDiagonalDofs.map((d) => describeDof(map, d)),
    negativeDiagonalNames: s.negativeDiagonalDofs.map((d) => describeDof(map, d)),
  };
  return `${JSON.stringify(out, null, 2)}\n`;
}
