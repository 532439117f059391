/**
 * The N-thread factorization, block solve, basis and K/M products and ordering
 * (src/sparse/split-factor.ts, split-solve.ts, block-product-jobs.ts, separator-jobs.ts,
 * src/eigen/shared-block-products.ts) run their helpers from the compiled worker file, so this
 * test loads the compiled modules from dist/ (built when missing or stale). N = 1 … 4 on a
 * 2-core machine: setThreadCount oversubscribes the cores on purpose, which must stay correct.
 *
 * References: the N-thread results against the one-thread ones (identical to rounding), which
 * are themselves checked against ml-matrix in supernodal.test.ts; solves also against the
 * definition of the solve, the residual of (K − σM) x = b; and every N against a second run at
 * the same N, bit for bit (the results must not depend on timing).
 */
import path from 'node:path';
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { diagonalOf, maxAbsEntry, symMultiplyBlock, type SymmetricCsc } from '../../src/sparse/csc.js';
import { hexGridPair } from './fe-like-matrices.js';
import { buildTetBox } from '../../fixtures/generator/tet-bracket.js';
import { ensureBuilt } from '../cli/built-cli.js';

const distRoot = path.resolve(import.meta.dirname, '../../dist/src');
const dist = path.join(distRoot, 'sparse');
// the helpers run from the compiled files only: build them when missing or older than the sources
ensureBuilt();

type Solvers = typeof import('../../src/sparse/shifted-solver.js');
type Threads = typeof import('../../src/sparse/helper-thread.js');
const load = async <T>(file: string): Promise<T> => (await import(pathToFileURL(path.join(distRoot, file)).href)) as T;
const threadsModule = () => load<Threads>('sparse/helper-thread.js');

afterAll(async () => (await threadsModule()).setThreadCount(undefined));

const THREAD_COUNTS = [1, 2, 3, 4];

/* Generated models: a hex-pattern grid (test/sparse/fe-like-matrices.ts) and a quadratic-tet box with shuffled numbering (fixtures/generator). */
/** Generated models, each solved at one shift (`which` of the two below). */
const models: { name: string; pair: () => { stiffness: SymmetricCsc; mass: SymmetricCsc }; which: number }[] = [
  { name: 'hex grid 11×10×10 (4 356 DOF)', pair: () => hexGridPair(11, 10, 10, 3), which: 1 },
  { name: 'quadratic-tet box 7×5×4 cells (4 455 DOF)', pair: () => buildTetBox({ sizeM: [0.09, 0.05, 0.04], cells: [7, 5, 4], order: 2, seed: 5 }), which: 0 },
];

/** max over columns of ‖(K − σM) x − b‖∞ / ((max|K| + |σ| max|M|) ‖x‖∞). */
function relativeResidual(stiffness: SymmetricCsc, mass: SymmetricCsc, shift: number, x: Float64Array, b: Float64Array, k: number): number {
  const n = stiffness.n;
  const kx = symMultiplyBlock(stiffness, x, k, new Float64Array(n * k));
  const mx = symMultiplyBlock(mass, x, k, new Float64Array(n * k));
  const scale = maxAbsEntry(stiffness) + Math.abs(shift) * maxAbsEntry(mass);
  let worst = 0;
  for (let c = 0; c < k; c++) {
    let r = 0;
    let xn = 0;
    for (let i = c * n; i < (c + 1) * n; i++) {
      r = Math.max(r, Math.abs(kx[i] - shift * mx[i] - b[i]));
      xn = Math.max(xn, Math.abs(x[i]));
    }
    worst = Math.max(worst, r / (scale * xn));
  }
  return worst;
}

/** The first index where x and y differ (as numbers; −0 equals 0), or −1 when they are identical (vitest's deep equality is slow on long arrays). */
function firstDifference(x: ArrayLike<number>, y: ArrayLike<number>): number {
  if (x.length !== y.length) return Math.min(x.length, y.length);
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return i;
  return -1;
}

/** max |x − y| / max |y|. */
function relativeDifference(x: Float64Array, y: Float64Array): number {
  let d = 0;
  let m = 0;
  for (let i = 0; i < y.length; i++) {
    d = Math.max(d, Math.abs(x[i] - y[i]));
    m = Math.max(m, Math.abs(y[i]));
  }
  return d / m;
}

describe.each(models)('N-thread LDLᵀ and solves from the compiled modules: $name', ({ pair, which }) => {
  const { stiffness, mass } = pair();
  const n = stiffness.n;
  const ratio = diagonalOf(stiffness).reduce((a, v) => a + v, 0) / diagonalOf(mass).reduce((a, v) => a + v, 0);
  const k = 6;
  const b = new Float64Array(n * k).map((_, i) => Math.sin(0.37 * i) + 0.1);
  // below the spectrum (positive definite) and inside it (indefinite, negative pivots); the
  // bounds on the residual and on the spread across N grow with the conditioning there
  const shifts = [
    { shift: -ratio, residual: 1e-13, acrossN: 1e-13 },
    { shift: 0.5 * ratio, residual: 1e-11, acrossN: 1e-9 },
  ].filter((_, i) => i === which);

  it(`N = 1…4 agree to rounding and each N repeats bit for bit, also in recycled memory (shift ${which === 0 ? 'below' : 'inside'} the spectrum)`, async () => {
    const { createShiftedSolver } = await load<Solvers>('sparse/shifted-solver.js');
    const { setThreadCount } = await threadsModule();
    const serial: { x: Float64Array; inertia: unknown; ratio: number }[] = [];
    for (const threads of THREAD_COUNTS) {
      setThreadCount(threads);
      const solver = createShiftedSolver(stiffness, mass, { ordering: 'nested-dissection' });
      shifts.forEach(({ shift, residual, acrossN }, i) => {
        // the second factorization refactors into the first one's released memory
        const [first, second] = [0, 1].map(() => {
          const f = solver.factor(shift);
          const x = f.solveBlock(b, k);
          f.release();
          return { f, x };
        });
        // the tree was split into N parts: every thread factored and swept
        expect(first.f.diagnostics.threads).toBe(threads);
        // the same N: the same bits, every run
        expect(firstDifference(second.x, first.x)).toBe(-1);
        expect(second.f.inertia).toEqual(first.f.inertia);
        expect(second.f.diagnostics.maxDiagonalToPivotRatio).toBe(first.f.diagnostics.maxDiagonalToPivotRatio);
        // the definition of the solve
        expect(relativeResidual(stiffness, mass, shift, first.x, b, k)).toBeLessThan(residual);
        serial[i] ??= { x: first.x, inertia: first.f.inertia, ratio: first.f.diagnostics.maxDiagonalToPivotRatio };
        // different N: the same inertia, the same solution to rounding
        expect(first.f.inertia).toEqual(serial[i].inertia);
        expect(Math.abs(first.f.diagnostics.maxDiagonalToPivotRatio / serial[i].ratio - 1)).toBeLessThan(1e-8);
        expect(relativeDifference(first.x, serial[i].x)).toBeLessThan(acrossN);
      });
    }
  });
});

describe('N-thread factor memory, from the compiled modules', () => {
  const { stiffness, mass } = hexGridPair(11, 10, 10, 3);

  it('the memory limit counts scratch for each of the N threads that factor', async () => {
    const { createShiftedSolver } = await load<Solvers>('sparse/shifted-solver.js');
    const { MemoryLimitError } = await load<typeof import('../../src/sparse/memory-limit.js')>('sparse/memory-limit.js');
    const { setThreadCount } = await threadsModule();
    // the prediction each thread count makes, read from the refusal of a 1-byte limit
    const predicted = THREAD_COUNTS.map((threads) => {
      setThreadCount(threads);
      try {
        createShiftedSolver(stiffness, mass, { ordering: 'nested-dissection', memoryLimitBytes: 1 });
      } catch (e) {
        if (e instanceof MemoryLimitError) return e.predictedBytes;
        throw e;
      }
      throw new Error('no refusal');
    });
    const perThread = predicted[1] - predicted[0];
    expect(perThread).toBeGreaterThan(0);
    for (let t = 2; t < THREAD_COUNTS.length; t++) expect(predicted[t] - predicted[0]).toBe(t * perThread);
  });
});

describe('basis and K/M products split N ways, from the compiled modules', () => {
  it('equal the one-thread kernels (src/dense/block-ops.ts, csc.ts) to rounding, bit for bit at a fixed N', async () => {
    const shared = await load<typeof import('../../src/eigen/shared-block-products.js')>('eigen/shared-block-products.js');
    const jobs = await load<typeof import('../../src/sparse/block-product-jobs.js')>('sparse/block-product-jobs.js');
    const blockKernels = await load<typeof import('../../src/dense/simd-block-kernels.js')>('dense/simd-block-kernels.js');
    const { setThreadCount } = await threadsModule();
    const { addTimesSmall, timesSmallInPlace, transposeTimes } = await import('../../src/dense/block-ops.js');
    // 20 011 × 40 × 12 multiply-adds: four shares of at least SPLIT_MIN_WORK
    const [rows, p, q] = [20_011, 40, 12];
    const x = Float64Array.from({ length: rows * q }, (_, i) => Math.cos(0.007 * i));
    const s = Float64Array.from({ length: p * q }, (_, i) => 0.1 * i - 1);
    const values = Float64Array.from({ length: rows * p }, (_, i) => Math.sin(0.013 * i));
    const p0 = transposeTimes(values, x, rows, p, q);
    const absDot = transposeTimes(values.map(Math.abs), x.map(Math.abs), rows, p, q);
    const c0 = x.slice();
    addTimesSmall(c0, values, rows, p, s, q, -1);
    const v0 = values.slice();
    timesSmallInPlace(v0, rows, p, s, q);
    // about 3·10⁵ stored entries × 30 columns: the most shares (four) of at least SPLIT_MIN_WORK
    const { stiffness } = hexGridPair(14, 13, 12, 3);
    const smallPair = hexGridPair(3, 4, 2, 5);
    const k = 30;
    const xk = Float64Array.from({ length: stiffness.n * k }, (_, i) => Math.sin(0.011 * i));
    const y0 = symMultiplyBlock(stiffness, xk, k, new Float64Array(stiffness.n * k));
    for (const threads of THREAD_COUNTS) {
      setThreadCount(threads);
      const basis = shared.basisBlock(rows * p);
      // with helpers in a SIMD kernel block (shared WebAssembly memory); its products are bit-identical to the plain loops
      expect(blockKernels.homeOf(basis) !== undefined).toBe(threads >= 2);
      expect(basis.buffer instanceof SharedArrayBuffer).toBe(threads >= 2);
      basis.set(values);
      // P = VᵀX: partial sums added in share order
      const p1 = shared.basisTransposeTimes(basis, x, rows, p, q);
      expect(firstDifference(shared.basisTransposeTimes(basis, x, rows, p, q), p1)).toBe(-1);
      // any order of summation is within rows · ε · Σ|v||x| of the exact sum (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §3.1; from memory)
      for (let i = 0; i < p * q; i++) expect(Math.abs(p1[i] - p0[i])).toBeLessThanOrEqual(2 * rows * Number.EPSILON * absDot[i]);
      // X − V S and V ← V S: each row by one thread with the same kernel, identical to one thread
      const c1 = x.slice();
      shared.basisAddTimesSmall(c1, basis, rows, p, s, q, -1);
      expect(firstDifference(c1, c0)).toBe(-1);
      shared.basisTimesSmallInPlace(basis, rows, p, s, q);
      expect(firstDifference(basis.subarray(0, rows * q), v0.subarray(0, rows * q))).toBe(-1);
      // Y = K X over shares of the stored columns
      const a = jobs.sharedMatrix(stiffness);
      expect(a === null).toBe(threads < 2);
      if (a === null) continue;
      // placed once in one shared WebAssembly memory for the SIMD product kernel (src/sparse/sym-product-kernel.ts)
      expect(a.values.buffer).toBe(a.colPtr.buffer);
      // a product too small to split: bit-identical to the plain one-thread loops, for every column count
      const small = jobs.sharedMatrix(smallPair.stiffness)!;
      for (let kk = 1; kk <= 13; kk++) {
        const xs = Float64Array.from({ length: smallPair.stiffness.n * kk }, (_, i) => Math.cos(0.3 * i));
        const ys = new Float64Array(xs.length);
        expect(jobs.splitSymMultiplyBlock(small, xs, kk, ys)).toBe(true);
        expect(firstDifference(ys, symMultiplyBlock(smallPair.stiffness, xs, kk, new Float64Array(xs.length)))).toBe(-1);
      }
      const y1 = new Float64Array(stiffness.n * k);
      expect(jobs.splitSymMultiplyBlock(a, xk, k, y1)).toBe(true);
      const y2 = new Float64Array(stiffness.n * k);
      jobs.splitSymMultiplyBlock(a, xk, k, y2);
      expect(firstDifference(y2, y1)).toBe(-1);
      expect(relativeDifference(y1, y0)).toBeLessThan(1e-14);
    }
  });
});

describe('ordering with the multilevel dissection on N threads, from the compiled modules', () => {
  it('gives the same ordering on 1, 2, 3 and 4 threads (the dissection is deterministic)', async () => {
    const { chooseOrdering } = await load<typeof import('../../src/sparse/ordering/choose-ordering.js')>('sparse/ordering/choose-ordering.js');
    // 2 730 supervariables: the top parts get several runs, dealt over the helpers
    const { stiffness, mass } = hexGridPair(14, 13, 12, 5);
    const one = chooseOrdering(stiffness, mass, { ordering: 'nested-dissection', threads: 1 });
    for (const threads of THREAD_COUNTS.slice(1)) {
      const many = chooseOrdering(stiffness, mass, { ordering: 'nested-dissection', threads });
      expect(many.predictedNnzL).toBe(one.predictedNnzL);
      expect(firstDifference(many.perm, one.perm)).toBe(-1);
    }
  });
});

describe('the thread count N = min(cores, MODALGATE_THREADS)', () => {
  const url = pathToFileURL(path.join(dist, 'helper-thread.js')).href;
  /** availableThreads() read in a fresh worker thread with MODALGATE_THREADS = value in its env (undefined: unset). */
  const threadsWith = (value: string | undefined): Promise<number> => {
    const env: Record<string, string | undefined> = { ...process.env, MODALGATE_THREADS: value };
    if (value === undefined) delete env.MODALGATE_THREADS;
    const code = `import(${JSON.stringify(url)}).then((m) => require('node:worker_threads').parentPort.postMessage(m.availableThreads()))`;
    const worker = new Worker(code, { eval: true, env });
    return new Promise((resolve, reject) => {
      worker.once('message', (v: number) => void worker.terminate().then(() => resolve(v)));
      worker.once('error', reject);
    });
  };

  // the thread where the solver runs reads its own env: `check --jobs` gives each model worker its share there
  it('is read from the env of the thread where the solver runs, capped by the cores; 1 keeps everything on one thread', async () => {
    const cores = availableParallelism();
    expect(await threadsWith(undefined)).toBe(cores);
    expect(await threadsWith('1')).toBe(1);
    expect(await threadsWith('64')).toBe(cores);
    // not a positive integer: ignored
    expect(await threadsWith('0')).toBe(cores);
    expect(await threadsWith('two')).toBe(cores);
  });
});
