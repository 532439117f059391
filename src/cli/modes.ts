/**
 * `modalgate modes --stiffness K.mtx --mass M.mtx [--count N | --max-hz F] ...`: solve the
 * lowest modes (src/eigen/solve-modes.ts) and print a table with the verification summary;
 * `--json` writes the numbers, `--shapes` the mass-normalized shapes as a Matrix Market array.
 *
 * Exit codes:
 *   0  solved and verified: the Sturm count equals the modes returned (a cluster that straddles
 *      the count is returned whole, and said), every eigenpair residual ≤ 1e-8;
 *   1  solved but not verified: the count disagrees, fewer modes than asked were found, a
 *      residual is above 1e-8 (the table is still printed and --json still written);
 *   2  input that cannot be solved: unreadable files, bad options, a pencil the screening
 *      refuses (src/model/screen-pencil.ts, the same as `check`), or an M the solver finds
 *      indefinite — one line naming the file (through runAction).
 */
import type { Command } from 'commander';
import { readStiffnessAndMass } from '../io/matrix-market-reader.js';
import { writeDenseArray } from '../io/matrix-market-writer.js';
import { readDofMap } from '../io/dof-map-reader.js';
import { writeFileAtomic } from '../io/atomic-write.js';
import { InputError } from '../io/errors.js';
import { IndefiniteMassError, type ModesRequest, type ModesResult } from '../eigen/modes-types.js';
import { solveModes } from '../eigen/solve-modes.js';
import { EIGENPAIR_RESIDUAL_LIMIT, EIGENPAIR_RESIDUAL_NAME } from '../eigen/residual-measure.js';
import { screenPencil } from '../model/screen-pencil.js';
import { EXIT_PASS, EXIT_RULE_FAILED, runAction } from './run-action.js';
import { MemoryLimitError } from '../sparse/memory-limit.js';
import { DEFAULT_MEMORY_SHARE, defaultMemoryLimitBytes, parseMemorySize } from './limits.js';
import { prestartSolverThreads } from '../pipeline/read-step.js';

interface ModesOptions {
  stiffness: string;
  mass: string;
  count?: string;
  maxHz?: string;
  method?: string;
  dofs?: string;
  json?: string;
  shapes?: string;
  maxMemory?: number;
}

export function registerModes(program: Command): void {
  program
    .command('modes')
    .description('solve the lowest modes of K φ = λ M φ and prove with a Sturm count that none was missed')
    .requiredOption('--stiffness <file>', 'stiffness matrix K (Matrix Market .mtx or .mtx.gz)')
    .requiredOption('--mass <file>', 'mass matrix M (Matrix Market .mtx or .mtx.gz)')
    .option('--count <n>', 'number of lowest modes (default 10 when --max-hz is not given)')
    .option('--max-hz <f>', 'every mode below this frequency in Hz')
    .option('--method <name>', 'lanczos or subspace (default lanczos)')
    .option('--dofs <file>', 'DOF map CSV (dof,node,component,x,y,z); its coordinates guide the ordering')
    .option('--json <file>', 'write eigenvalues, frequencies, residuals and checks as JSON')
    .option('--shapes <file>', 'write the mass-normalized mode shapes as a Matrix Market array')
    .option('--max-memory <size>', `refuse a solve predicted to need more memory (e.g. 6G; default ${DEFAULT_MEMORY_SHARE * 100} % of this machine's)`, parseMemorySize)
    .action(runAction(modes));
}

function parseRequest(opts: ModesOptions): ModesRequest {
  if (opts.count !== undefined && opts.maxHz !== undefined) {
    throw new InputError('--count', 'give either --count or --max-hz, not both');
  }
  const request: ModesRequest = {};
  if (opts.maxHz !== undefined) {
    const f = Number(opts.maxHz);
    if (!(f > 0) || !Number.isFinite(f)) throw new InputError('--max-hz', `must be a frequency above 0 Hz, got '${opts.maxHz}'`);
    request.maxHz = f;
  } else {
    const text = opts.count ?? '10';
    const n = Number(text);
    if (!Number.isInteger(n) || n < 1) throw new InputError('--count', `must be a whole number of modes ≥ 1, got '${text}'`);
    request.count = n;
  }
  if (opts.method !== undefined) {
    if (opts.method !== 'lanczos' && opts.method !== 'subspace') {
      throw new InputError('--method', `must be 'lanczos' or 'subspace', got '${opts.method}'`);
    }
    request.method = opts.method;
  }
  return request;
}

async function modes(opts: ModesOptions): Promise<number> {
  const request = parseRequest(opts);
  request.memoryLimitBytes = opts.maxMemory ?? defaultMemoryLimitBytes();
  await prestartSolverThreads(opts.stiffness);
  const { stiffness, mass } = await readStiffnessAndMass(opts.stiffness, opts.mass);
  const n = stiffness.matrix.n;
  const blocker = screenPencil(stiffness.summary, mass.summary, mass.matrix);
  if (blocker) throw new InputError(blocker.file, `${blocker.reason}; the modes cannot be solved`);
  if (request.count !== undefined && request.count > n) {
    throw new InputError('--count', `asks for ${request.count} modes but the model has only ${n} DOFs`);
  }
  if (opts.dofs) {
    const map = await readDofMap(opts.dofs, n);
    const xyz = new Float64Array(3 * n);
    // interleave x, y, z per DOF
    for (let i = 0; i < n; i++) {
      xyz[3 * i] = map.x[i];
      xyz[3 * i + 1] = map.y[i];
      xyz[3 * i + 2] = map.z[i];
    }
    request.coordinates = xyz;
  }
  request.onProgress = progressLine();
  const result = solveOrRefuse(stiffness.matrix, mass.matrix, request, opts.stiffness, opts.mass);
  if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
  process.stdout.write(formatModesTable(result));
  if (opts.json) await writeFileAtomic(opts.json, `${JSON.stringify(modesJson(result, opts), null, 2)}\n`);
  if (opts.shapes) {
    await writeDenseArray(opts.shapes, n, result.eigenvalues.length, result.shapes, {
      comment: `mass-normalized mode shapes (phi^T M phi = 1), one column per mode, from ${opts.stiffness} and ${opts.mass}`,
      gzip: opts.shapes.endsWith('.gz'),
    });
  }
  return verified(result) ? EXIT_PASS : EXIT_RULE_FAILED;
}

/** The solve; an M found indefinite on the way is bad input in the mass file. */
function solveOrRefuse(stiffness: Parameters<typeof solveModes>[0], mass: Parameters<typeof solveModes>[1], request: ModesRequest, stiffnessFile: string, massFile: string): ModesResult {
  try {
    return solveModes(stiffness, mass, request);
  } catch (e) {
    if (e instanceof IndefiniteMassError) throw new InputError(massFile, e.message);
    // a model too large for the limit: the stiffness file names the model
    if (e instanceof MemoryLimitError) throw new InputError(stiffnessFile, e.message);
    throw e;
  }
}

/** Complete by the Sturm count and every eigenpair residual within the limit. */
export function verified(r: ModesResult): boolean {
  return r.sturm.ok && worstResidual(r) <= EIGENPAIR_RESIDUAL_LIMIT;
}

/** The largest eigenpair residual; NaN counts as the worst. */
function worstResidual(r: ModesResult): number {
  let worst = 0;
  for (const x of r.residuals) if (!(x <= worst)) worst = Number.isNaN(x) ? Infinity : x;
  return worst;
}

/** A throttled progress writer: only on a TTY, only after the solve has run about a second. */
function progressLine(): ((message: string) => void) | undefined {
  if (!process.stderr.isTTY) return undefined;
  const start = Date.now();
  let last = 0;
  return (message: string) => {
    const now = Date.now();
    if (now - start < 1000 || now - last < 200) return;
    last = now;
    process.stderr.write(`\r\x1b[K${message}`);
  };
}

function num(x: number, digits = 6): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e7 ? String(Number(x.toPrecision(digits))) : x.toExponential(digits - 1);
}

/** The plain table: mode, frequency, eigenvalue, residual; then the verification summary. */
export function formatModesTable(r: ModesResult): string {
  const rows = Array.from(r.eigenvalues, (lam, i) => [String(i + 1), num(r.frequenciesHz[i]), num(lam, 10), r.residuals[i].toExponential(1)]);
  const head = ['mode', 'frequency Hz', 'eigenvalue (rad/s)²', 'residual'];
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((row) => row[c].length)));
  const line = (cells: string[]) => cells.map((s, c) => (c === 0 ? s.padStart(widths[c]) : s.padStart(widths[c]))).join('  ') + '\n';
  let out = line(head) + rows.map(line).join('');
  const s = r.sturm;
  out += '\nverification\n';
  out += `  Sturm count at σ = ${num(s.shift, 10)}: ${s.countBelow} eigenvalue(s) below, ${s.modesReturned} mode(s) returned — ${s.ok ? 'complete' : 'NOT VERIFIED'}\n`;
  if (s.note) out += `  note: ${s.note}\n`;
  const worst = worstResidual(r);
  const residualVerdict = worst <= EIGENPAIR_RESIDUAL_LIMIT ? `within ${EIGENPAIR_RESIDUAL_LIMIT}` : `ABOVE ${EIGENPAIR_RESIDUAL_LIMIT}`;
  out += `  largest ${EIGENPAIR_RESIDUAL_NAME}: ${worst.toExponential(2)}, ${residualVerdict}\n`;
  out += `  max |ΦᵀMΦ − I| ${r.orthogonality.massMaxDeviation.toExponential(2)},  max |ΦᵀKΦ − Λ| / |λ|max ${r.orthogonality.stiffnessMaxDeviation.toExponential(2)}\n`;
  const kernels = r.factor.kernels ? `, ${r.factor.kernels.factor} factor and ${r.factor.kernels.sweeps} sweep kernels` : '';
  out += `  ${r.method}, ${r.iterations} iteration(s), ${r.solves ?? 0} solves, ${r.shifts.length} factorization(s)${kernels}, ${(r.timings.totalMs / 1000).toFixed(2)} s\n`;
  for (const w of r.warnings) out += `  warning: ${w}\n`;
  return out;
}

/** The JSON document of `--json`. */
function modesJson(r: ModesResult, opts: { stiffness: string; mass: string }): Record<string, unknown> {
  return {
    stiffness: opts.stiffness,
    mass: opts.mass,
    n: r.n,
    method: r.method,
    eigenvalues: Array.from(r.eigenvalues),
    frequenciesHz: Array.from(r.frequenciesHz),
    residualMeasure: EIGENPAIR_RESIDUAL_NAME,
    residuals: Array.from(r.residuals),
    verified: verified(r),
    sturm: r.sturm,
    ...(r.clusterExtension ? { clusterExtension: r.clusterExtension } : {}),
    orthogonality: r.orthogonality,
    shifts: r.shifts,
    iterations: r.iterations,
    solves: r.solves ?? 0,
    timings: r.timings,
    factor: { ordering: r.factor.ordering, nnzL: r.factor.nnzL, factorBytes: r.factor.factorBytes, kernels: r.factor.kernels },
    warnings: r.warnings,
    diagnostics: r.diagnostics ?? [],
  };
}
