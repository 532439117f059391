/**
 * Sparse LDLᵀ at scale, beside SciPy's SuperLU (`scipy.sparse.linalg.splu`) on the same matrix.
 *
 * Models (from fixtures/generator): a steel hex solid of 40×32×30 hexahedra clamped on one face
 * (≈123k DOFs) and a 22×22×21-node rigid-jointed space frame of steel tubes clamped at its base
 * (≈58k DOFs). For each, a fresh child process (so its peak RSS is the factorization's alone)
 * loads K and M, chooses the ordering, runs the symbolic and numeric phases at σ = 0 and times
 * solves (1 vector; 8 single solves vs one block of 8). The same K is written as Matrix Market
 * and factored by test/bench/scipy_splu_bench.py: first (when pymetis is installed) on the matrix
 * pre-ordered by METIS nested dissection with SuperLU in symmetric mode — the strongest SciPy
 * set-up on 3-D solids — then with MMD on AᵀA+… ('MMD_AT_PLUS_A') and SuperLU's default column
 * order (COLAMD), each with a 600 s timeout.
 *
 * Memory: "peak" is the child's high-water RSS (process.resourceUsage().maxRSS) minus its RSS
 * before loading the input; it is compared with the bytes of the input CSC arrays plus the
 * factor's arrays (target ≤ 1.5×). Versus SciPy both sides report peak minus the RSS once the
 * input is loaded. The machine may be shared: times are given as wall clock and as the
 * process's CPU time (process.cpuUsage / time.process_time); ratios use both.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { writeSymmetricMatrixMarket } from '../../src/io/matrix-market-writer.js';
import { clampedHexSolid, latticeFrame } from './bench-models.js';
import { symMultiply, type SymmetricCsc } from '../../src/sparse/csc.js';
import { createShiftedSolver } from '../../src/sparse/shifted-solver.js';

const here = dirname(fileURLToPath(import.meta.url));
const repoRoot = resolve(here, '../../..');
const SCIPY_TIMEOUT_S = 600;
const mb = (bytes: number): string => `${(bytes / 2 ** 20).toFixed(0)} MB`;
const s = (ms: number): string => `${(ms / 1000).toFixed(2)} s`;

/** Raw dump of CSC arrays for the child process. */
function writeCsc(dir: string, name: string, a: SymmetricCsc): void {
  writeFileSync(join(dir, `${name}.colptr`), new Uint8Array(a.colPtr.buffer, a.colPtr.byteOffset, a.colPtr.byteLength));
  writeFileSync(join(dir, `${name}.rowidx`), new Uint8Array(a.rowIdx.buffer, a.rowIdx.byteOffset, a.rowIdx.byteLength));
  writeFileSync(join(dir, `${name}.values`), new Uint8Array(a.values.buffer, a.values.byteOffset, a.values.byteLength));
}

function readCsc(dir: string, name: string, n: number): SymmetricCsc {
  const bytes = (ext: string) => {
    const b = readFileSync(join(dir, `${name}.${ext}`));
    return b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength);
  };
  return { n, colPtr: new Int32Array(bytes('colptr')), rowIdx: new Int32Array(bytes('rowidx')), values: new Float64Array(bytes('values')) };
}

interface ChildReport {
  n: number;
  inputBytes: number;
  candidates: { name: string; nnzL: number; ms: number }[];
  ordering: string;
  orderingMs: number;
  symbolicMs: number;
  numericMs: number;
  numericCpuMs: number;
  nnzL: number;
  flops: number;
  supernodes: number;
  factorBytes: number;
  solveMs: number;
  eightSinglesMs: number;
  blockOfEightMs: number;
  residual: number;
  peakOverStartBytes: number;
  peakOverLoadedBytes: number;
  negative: number;
}

/** Child process: load, order, factor, solve; print one JSON line. */
function runChild(dir: string): void {
  const gc = (globalThis as { gc?: () => void }).gc ?? (() => {});
  gc();
  const rssStart = process.memoryUsage().rss;
  const meta = JSON.parse(readFileSync(join(dir, 'meta.json'), 'utf8')) as { n: number };
  const n = meta.n;
  const stiffness = readCsc(dir, 'K', n);
  const mass = readCsc(dir, 'M', n);
  const coordinates = new Float64Array(readFileSync(join(dir, 'coords')).buffer.slice(0));
  gc();
  const rssLoaded = process.memoryUsage().rss;
  const inputBytes = [stiffness, mass].reduce((t, a) => t + a.colPtr.byteLength + a.rowIdx.byteLength + a.values.byteLength, 0);
  const solver = createShiftedSolver(stiffness, mass, { ordering: 'auto', coordinates });
  gc();
  const cpu0 = process.cpuUsage();
  const f = solver.factor(0);
  const cpu1 = process.cpuUsage(cpu0);
  const numericCpuMs = (cpu1.user + cpu1.system) / 1000;
  const b = new Float64Array(n * 8);
  for (let i = 0; i < b.length; i++) b[i] = Math.sin(i * 0.37) + 0.1;
  const cpuMs = (): number => {
    const u = process.cpuUsage();
    return (u.user + u.system) / 1000;
  };
  let t = performance.now();
  const x = f.solve(b.subarray(0, n));
  const solveMs = performance.now() - t;
  t = cpuMs();
  for (let c = 0; c < 8; c++) f.solve(b.subarray(c * n, (c + 1) * n));
  const eightSinglesMs = cpuMs() - t;
  t = cpuMs();
  f.solveBlock(b, 8);
  const blockOfEightMs = cpuMs() - t;
  const kx = symMultiply(stiffness, x);
  let r = 0;
  let xn = 0;
  let an = 0;
  for (let i = 0; i < n; i++) {
    r = Math.max(r, Math.abs(kx[i] - b[i]));
    xn = Math.max(xn, Math.abs(x[i]));
  }
  for (let p = 0; p < stiffness.colPtr[n]; p++) an = Math.max(an, Math.abs(stiffness.values[p]));
  const peak = process.resourceUsage().maxRSS * 1024;
  const d = f.diagnostics;
  const report: ChildReport = {
    n,
    inputBytes,
    candidates: [...solver.orderingCandidates],
    ordering: d.ordering,
    orderingMs: d.timings.orderingMs,
    symbolicMs: d.timings.symbolicMs,
    numericMs: d.timings.numericMs,
    numericCpuMs,
    nnzL: d.nnzL,
    flops: d.flops,
    supernodes: d.supernodes,
    factorBytes: d.factorBytes,
    solveMs,
    eightSinglesMs,
    blockOfEightMs,
    residual: r / (an * xn),
    peakOverStartBytes: peak - rssStart,
    peakOverLoadedBytes: peak - rssLoaded,
    negative: f.inertia.negative,
  };
  console.log(JSON.stringify(report));
}

interface ScipyReport {
  permc_spec: string;
  factor_s: number;
  factor_cpu_s: number;
  nnz_L: number;
  nnz_U: number;
  peak_minus_baseline_mb: number;
}

function scipyAvailable(): boolean {
  const r = spawnSync('python3', ['-c', 'import scipy.sparse.linalg, scipy.io'], { encoding: 'utf8' });
  return r.status === 0;
}

function pymetisAvailable(): boolean {
  return spawnSync('python3', ['-c', 'import pymetis'], { encoding: 'utf8' }).status === 0;
}

function runScipy(file: string, permc: string): ScipyReport | string {
  const script = join(repoRoot, 'test/bench/scipy_splu_bench.py');
  const r = spawnSync('python3', [script, file, permc], { encoding: 'utf8', timeout: SCIPY_TIMEOUT_S * 1000 });
  if (r.error || r.status !== 0) return r.signal ? `did not finish within ${SCIPY_TIMEOUT_S} s` : `failed: ${(r.stderr || String(r.error)).trim().split('\n').pop()}`;
  return JSON.parse(r.stdout.trim().split('\n').pop()!) as ScipyReport;
}

async function benchCase(label: string, build: () => GeneratedModel, withScipy: boolean): Promise<void> {
  const model = build();
  const n = model.stiffness.n;
  const dir = mkdtempSync(join(tmpdir(), 'modalgate-sparse-bench-'));
  try {
    writeCsc(dir, 'K', model.stiffness);
    writeCsc(dir, 'M', model.mass);
    writeFileSync(join(dir, 'coords'), new Uint8Array(model.coordinates.buffer, model.coordinates.byteOffset, model.coordinates.byteLength));
    writeFileSync(join(dir, 'meta.json'), JSON.stringify({ n }));
    console.log(`\n${label}: ${n} DOFs, stored nonzeros K ${model.stiffness.colPtr[n]}, M ${model.mass.colPtr[n]}`);
    const child = spawnSync(process.execPath, ['--expose-gc', fileURLToPath(import.meta.url), '--child', dir], {
      encoding: 'utf8',
      maxBuffer: 1 << 24,
    });
    if (child.status !== 0) {
      console.log(`  our solver failed: ${child.stderr.trim().split('\n').slice(-3).join(' | ')}`);
      return;
    }
    const o = JSON.parse(child.stdout.trim().split('\n').pop()!) as ChildReport;
    printOurs(o);
    if (!withScipy) return;
    const mtx = join(dir, 'K.mtx');
    await writeSymmetricMatrixMarket(mtx, model.stiffness);
    const defaults = [...(pymetisAvailable() ? ['METIS_ND'] : []), 'MMD_AT_PLUS_A', 'COLAMD'];
    const specs = (process.env.SPARSE_BENCH_PERMC?.split(',') ?? defaults).filter((p) => p !== 'none');
    for (const permc of specs) printScipy(o, runScipy(mtx, permc), permc);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function printOurs(o: ChildReport): void {
  for (const c of o.candidates) console.log(`  ordering candidate ${c.name.padEnd(22)} nnz(L) ${c.nnzL.toExponential(3)}  (${s(c.ms)})`);
  console.log(`  chosen ${o.ordering}; ordering ${s(o.orderingMs)}, symbolic ${s(o.symbolicMs)}, numeric ${s(o.numericMs)} wall, ${s(o.numericCpuMs)} CPU`);
  console.log(`  nnz(L) ${o.nnzL.toExponential(3)}, flops ${o.flops.toExponential(3)} (${(o.flops / o.numericCpuMs / 1e6).toFixed(2)} GFlop/s of CPU time), supernodes ${o.supernodes}`);
  console.log(`  solve 1 vector ${o.solveMs.toFixed(0)} ms wall; 8 single solves ${o.eightSinglesMs.toFixed(0)} ms CPU vs block of 8 ${o.blockOfEightMs.toFixed(0)} ms CPU (ratio ${(o.blockOfEightMs / o.eightSinglesMs).toFixed(2)})`);
  console.log(`  relative residual ‖Kx − b‖∞/(max|K|·‖x‖∞) ${o.residual.toExponential(2)}, negative pivots ${o.negative}`);
  const arrays = o.inputBytes + o.factorBytes;
  console.log(`  memory: input ${mb(o.inputBytes)} + factor ${mb(o.factorBytes)} = ${mb(arrays)}; peak RSS over start ${mb(o.peakOverStartBytes)} (${(o.peakOverStartBytes / arrays).toFixed(2)}× arrays, target ≤ 1.5×)`);
}

function printScipy(o: ChildReport, r: ScipyReport | string, permc: string): void {
  if (typeof r === 'string') {
    console.log(`  SciPy splu permc_spec=${permc}: ${r}`);
    return;
  }
  const oursMb = o.peakOverLoadedBytes / 2 ** 20;
  console.log(
    `  SciPy splu permc_spec=${permc}: factor ${r.factor_s.toFixed(2)} s wall, ${r.factor_cpu_s.toFixed(2)} s CPU, nnz(L)+nnz(U) ${(r.nnz_L + r.nnz_U).toExponential(3)}, peak over loaded ${r.peak_minus_baseline_mb.toFixed(0)} MB` +
      ` | ours/SciPy: numeric time ${(o.numericMs / 1000 / r.factor_s).toFixed(2)} wall, ${(o.numericCpuMs / 1000 / r.factor_cpu_s).toFixed(2)} CPU, memory ${(oursMb / r.peak_minus_baseline_mb).toFixed(2)}`,
  );
}

export default async function sparseBench(): Promise<void> {
  const withScipy = scipyAvailable();
  if (!withScipy) console.log('python3 with scipy not found: SciPy comparison skipped');
  // SPARSE_BENCH_CASE=frame|hex runs one model; SPARSE_BENCH_PERMC=A,B picks SciPy's column orders ('none': ours only;
  // 'METIS_ND': METIS nested dissection through pymetis, the default first choice when pymetis is installed)
  const only = process.env.SPARSE_BENCH_CASE;
  if (!only || only === 'frame') await benchCase('space frame 22×22×21 nodes', latticeFrame, withScipy);
  if (!only || only === 'hex') await benchCase('hex solid 40×32×30 elements', clampedHexSolid, withScipy);
}

if (process.argv[2] === '--child') runChild(process.argv[3]);
