/**
 * The child processes of the modes bench (modes-bench.ts), each measured whole by /usr/bin/time:
 * our CLI's `modes` and `check`, and SciPy's eigsh (scipy_eigsh_bench.py). Wall time, peak RSS
 * and CPU time (user + sys) are the kernel's figures for the process, file reading and start-up
 * included; the solve-only times come from each side's own JSON.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const here = path.dirname(fileURLToPath(import.meta.url));
export const repoRoot = path.resolve(here, '../../..');
const cli = path.join(repoRoot, 'dist/src/cli/main.js');
const scipyScript = path.join(repoRoot, 'test/bench/scipy_eigsh_bench.py');
const TIME = '/usr/bin/time';
const TIMEOUT = '/usr/bin/timeout';
const MARK = 'MODES_BENCH_TIME';

/** One finished child process as the kernel saw it. */
export interface Measured {
  status: number | null;
  wallS: number;
  peakRssKb: number;
  cpuS: number;
  /** The child's stderr without the timing line (for an error message). */
  stderr: string;
  timedOut: boolean;
}

/**
 * Run `command args` under /usr/bin/time (or a stopwatch when it is missing: no RSS, no CPU).
 * With `timeoutS` the command runs under coreutils' `timeout`, which stops the command itself
 * (killing /usr/bin/time would leave it running); time's figures then include it, as the
 * kernel adds a waited-for child's peak RSS and CPU time to its parent's.
 */
export function runMeasured(command: string, args: string[], timeoutS?: number): Measured {
  const useTime = existsSync(TIME);
  const stop = timeoutS !== undefined && existsSync(TIMEOUT) ? [TIMEOUT, '-k', '10', String(timeoutS)] : [];
  const argv = [...stop, command, ...args];
  const t0 = performance.now();
  // spawnSync's own limit only as a backstop (it would stop the outer process alone)
  const options = { encoding: 'utf8' as const, timeout: timeoutS !== undefined ? 1000 * (timeoutS + 60) : undefined, maxBuffer: 64 << 20 };
  const r = useTime ? spawnSync(TIME, ['-f', `${MARK} %e %M %U %S`, ...argv], options) : spawnSync(argv[0], argv.slice(1), options);
  const stopwatchS = (performance.now() - t0) / 1000;
  const lines = (r.stderr ?? '').split('\n');
  const mark = lines.filter((l) => l.startsWith(MARK)).pop();
  const [wall, rss, user, sys] = mark ? mark.slice(MARK.length).trim().split(/\s+/).map(Number) : [stopwatchS, NaN, NaN, NaN];
  return {
    status: r.status,
    wallS: wall,
    peakRssKb: rss,
    cpuS: user + sys,
    stderr: lines.filter((l) => !l.startsWith(MARK) && !l.startsWith('Command exited with non-zero status') && !l.startsWith('Command terminated by signal')).join('\n').trim(),
    // coreutils' timeout exits 124 (137 after its KILL)
    timedOut: (r.error as NodeJS.ErrnoException | undefined)?.code === 'ETIMEDOUT' || (stop.length > 0 && (r.status === 124 || r.status === 137)),
  };
}

/** The files of one model written for the bench. */
export interface ModelFiles {
  stiffness: string;
  mass: string;
  dofs: string;
}

export interface OursRun extends Measured {
  eigenvalues: number[];
  /** The solver's own total (factorizations, iteration, verification; file reading excluded), s. */
  solveS: number;
  /** The iteration shift, for SciPy's σ. */
  shift: number;
  solves: number | undefined;
  sturmOk: boolean;
  sturmLine: string;
  maxResidual: number;
  phases: string;
}

/** `modalgate modes --count k` on the files, through the built CLI. */
export function runOursModes(files: ModelFiles, k: number, jsonPath: string): OursRun | string {
  const args = [cli, 'modes', '--stiffness', files.stiffness, '--mass', files.mass, '--dofs', files.dofs, '--count', String(k), '--json', jsonPath];
  const m = runMeasured(process.execPath, args);
  // exit 1 is a solve that did not verify: its JSON is still written and the Sturm column says so
  if (m.status !== 0 && m.status !== 1) return `ours failed (exit ${m.status}): ${m.stderr.split('\n').pop()}`;
  const doc = readJson(jsonPath);
  if (!doc) return `ours wrote no readable JSON (exit ${m.status}): ${m.stderr.split('\n').pop()}`;
  const t = doc.timings;
  return {
    ...m,
    eigenvalues: doc.eigenvalues,
    solveS: t.totalMs / 1000,
    shift: doc.shifts.length > 1 ? doc.shifts[doc.shifts.length - 2] : doc.shifts[0],
    solves: reportedSolves(doc.solves),
    sturmOk: doc.sturm.ok === true,
    sturmLine: `${doc.sturm.countBelow} below σ, ${doc.sturm.modesReturned} returned`,
    maxResidual: Math.max(...doc.residuals),
    phases: `factor ${(t.factorMs / 1000).toFixed(1)} s, iterate ${(t.iterateMs / 1000).toFixed(1)} s, verify ${(t.verifyMs / 1000).toFixed(1)} s, ${doc.shifts.length} factorization(s), ${doc.factor?.ordering ?? '?'} order`,
  };
}

export type ScipyOrdering = 'nd' | 'mmd';

export interface ScipyRun extends Measured {
  ordering: ScipyOrdering;
  orderingName: string;
  eigenvalues: number[];
  /** Ordering + factorization + eigsh (file reading excluded), s. */
  solveS: number;
  solves: number | undefined;
}

/** Which of SciPy's orderings this machine can run: none without scipy, 'nd' only with pymetis. */
export function scipyOrderingsAvailable(): ScipyOrdering[] {
  const has = (module: string): boolean => spawnSync('python3', ['-c', `import ${module}`], { encoding: 'utf8' }).status === 0;
  if (!has('scipy.sparse.linalg')) return [];
  return has('pymetis') ? ['mmd', 'nd'] : ['mmd'];
}

/** scipy_eigsh_bench.py on the files with one ordering. */
export function runScipy(files: ModelFiles, k: number, sigma: number, ordering: ScipyOrdering, jsonPath: string, timeoutS: number): ScipyRun | string {
  const m = runMeasured('python3', [scipyScript, files.stiffness, files.mass, String(k), String(sigma), jsonPath, ordering], timeoutS);
  if (m.timedOut) return `${ordering}: stopped after ${timeoutS} s`;
  const doc = m.status === 0 ? readJson(jsonPath) : undefined;
  if (!doc) return `${ordering}: failed (exit ${m.status}): ${m.stderr.split('\n').pop()}`;
  return { ...m, ordering, orderingName: doc.ordering, eigenvalues: doc.eigenvalues, solveS: doc.seconds, solves: reportedSolves(doc.solves) };
}

/** A JSON document of either side, or undefined when missing or unreadable. */
function readJson(file: string): any {
  try {
    return JSON.parse(readFileSync(file, 'utf8'));
  } catch {
    return undefined;
  }
}

/** A solve count from a JSON document; 0 or a missing field means not counted. */
function reportedSolves(x: unknown): number | undefined {
  return typeof x === 'number' && x > 0 ? x : undefined;
}

/** `modalgate check -c config -q` with JUnit and JSON reports, through the built CLI. */
export function runOursCheck(configPath: string, junitPath: string, jsonPath: string): Measured {
  return runMeasured(process.execPath, [cli, 'check', '-c', configPath, '--junit', junitPath, '--json', jsonPath, '-q']);
}

/**
 * The largest relative difference of the elastic eigenvalues; rigid-body values (≤ 1e-10 of the
 * largest) are rounding noise on both sides and are skipped.
 */
export function maxRelativeDifference(a: readonly number[], b: readonly number[]): number {
  const scale = Math.max(...a.map(Math.abs));
  let worst = 0;
  for (let i = 0; i < Math.min(a.length, b.length); i++) {
    if (Math.max(Math.abs(a[i]), Math.abs(b[i])) <= 1e-10 * scale) continue;
    worst = Math.max(worst, Math.abs(a[i] - b[i]) / Math.abs(b[i]));
  }
  return worst;
}
