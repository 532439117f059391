/**
 * Scaling of the N-thread paths (src/sparse/helper-thread.ts) on one mid-size model: the ~30k-DOF
 * clamped hex bar of the modes bench (40×15×15 hexahedra, bench-models.ts hexBar). One fresh
 * child process per thread count, started with MODALGATE_THREADS = N (the way `check --jobs`
 * hands a model worker its share of the cores), times the phases that run on N threads:
 * ordering (separator runs), numeric factorization at σ = 0 (best of 3), a block solve of 6
 * right-hand sides (best of 5) and the basis products of block Lanczos on an n × 60 basis
 * (P = VᵀX, X − V P, best of 5). Prints wall time per phase and the speed-up over the first count.
 *
 * THREADS_BENCH_COUNTS=1,2,4 picks the counts (default 1 … the cores); counts above the cores
 * are capped by MODALGATE_THREADS's rule (min with the cores), so they measure nothing new.
 * On a shared machine the other processes take cores too: repeat and read the spread.
 *
 * Then, without running anything in parallel, what the design predicts for 2 … 16 threads on the
 * bench's models (THREADS_BENCH_MODELS=hex30k,hex120k,frame60k,tet100k): from the subtree split
 * of each (subtree-split.ts), the modelled factorization time over the serial one, the largest
 * part's share of the work, the top's share of the flops (factored after the parts, its large
 * supernodes shared) and of nnz(L) (swept on one thread in every solve).
 */
import { spawnSync } from 'node:child_process';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { hexBar, spaceFrame60k, tetBracket100k } from './bench-models.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { createShiftedSolver } from '../../src/sparse/shifted-solver.js';
import { chooseOrdering } from '../../src/sparse/ordering/choose-ordering.js';
import { analyzeShiftedPair, type SupernodalStructure } from '../../src/sparse/symbolic.js';
import { splitSubtrees } from '../../src/sparse/subtree-split.js';
import { availableThreads } from '../../src/sparse/helper-thread.js';
import { basisAddTimesSmall, basisBlock, basisOperand, basisTransposeTimes } from '../../src/eigen/shared-block-products.js';

interface Phases {
  threads: number;
  factorThreads: number;
  n: number;
  orderingMs: number;
  factorMs: number;
  solveMs: number;
  productsMs: number;
}

function best(times: number, run: () => void): number {
  let fastest = Infinity;
  for (let r = 0; r < times; r++) {
    const t = performance.now();
    run();
    fastest = Math.min(fastest, performance.now() - t);
  }
  return fastest;
}

function runChild(): void {
  const { stiffness, mass } = hexBar([40, 15, 15], true);
  const n = stiffness.n;
  const t0 = performance.now();
  const solver = createShiftedSolver(stiffness, mass);
  const orderingMs = performance.now() - t0;
  let factorThreads = 1;
  let factor = solver.factor(0);
  const factorMs = best(3, () => {
    factor.release();
    factor = solver.factor(0);
    factorThreads = factor.diagnostics.threads ?? 1;
  });
  const b = new Float64Array(n * 6).map((_, i) => Math.sin(0.37 * i));
  const solveMs = best(5, () => factor.solveBlock(b, 6));
  const m = 60;
  const v = basisBlock(n * m);
  for (let i = 0; i < v.length; i++) v[i] = Math.cos(0.001 * i);
  const productsMs = best(5, () => {
    const x = basisOperand(b, n * 6);
    const p = basisTransposeTimes(v, x, n, m, 6);
    basisAddTimesSmall(x, v, n, m, p, 6, -1);
  });
  const report: Phases = { threads: availableThreads(), factorThreads, n, orderingMs, factorMs, solveMs, productsMs };
  console.log(JSON.stringify(report));
}

/** Σ over supernodes in `ranges` of (flop weight as in subtree-split.ts, stored entries of L). */
function workOf(s: SupernodalStructure, ranges: [number, number][]): { flops: number; entries: number } {
  let flops = 0;
  let entries = 0;
  for (const [lo, hi] of ranges) {
    for (let sn = lo; sn <= hi; sn++) {
      const nc = s.superStart[sn + 1] - s.superStart[sn];
      const nr = s.rowPtr[sn + 1] - s.rowPtr[sn];
      for (let c = 0; c < nc; c++) flops += (nr - c) * (nr - c);
      entries += nc * nr - (nc * (nc - 1)) / 2;
    }
  }
  return { flops, entries };
}

const PREDICTION_MODELS: Record<string, () => GeneratedModel> = {
  hex30k: () => hexBar([40, 15, 15], true),
  hex120k: () => hexBar([64, 24, 24], false),
  frame60k: () => spaceFrame60k(false),
  tet100k: () => tetBracket100k(false),
};

/** The split the solver would choose for 2 … 16 threads on each model, and what it predicts. */
function printPredictions(): void {
  const names = (process.env.THREADS_BENCH_MODELS ?? Object.keys(PREDICTION_MODELS).join(',')).split(',');
  for (const name of names) {
    const build = PREDICTION_MODELS[name];
    if (build === undefined) continue;
    const { stiffness, mass } = build();
    const order = chooseOrdering(stiffness, mass, { ordering: 'auto' });
    const s = analyzeShiftedPair(stiffness, mass, order.perm);
    const all = workOf(s, [[0, s.supernodes - 1]]);
    console.log(`  ${name}: ${s.n} DOF, ${order.name}, flops ${s.flops.toExponential(2)}, nnz(L) ${s.nnzL.toExponential(2)}`);
    for (const threads of [2, 4, 8, 16]) {
      const split = splitSubtrees(s, threads);
      if (split === null) {
        console.log(`    N=${String(threads).padStart(2)}: no split`);
        continue;
      }
      const top = workOf(s, split.top);
      const largest = Math.max(...split.parts.map((p) => workOf(s, p).flops));
      console.log(
        `    N=${String(threads).padStart(2)}: factor time ${split.timeRatio.toFixed(3)} of serial (${(1 / split.timeRatio).toFixed(2)}×), largest part ${((100 * largest) / all.flops).toFixed(1)} % of the flops, top ${((100 * top.flops) / all.flops).toFixed(1)} % of the flops and ${((100 * top.entries) / all.entries).toFixed(1)} % of L`,
      );
    }
  }
}

async function measure(): Promise<void> {
  const counts = (process.env.THREADS_BENCH_COUNTS ?? Array.from({ length: availableParallelism() }, (_, i) => i + 1).join(',')).split(',').map(Number);
  const rows: Phases[] = [];
  for (const threads of counts) {
    const child = spawnSync(process.execPath, ['--expose-gc', fileURLToPath(import.meta.url), '--child'], {
      encoding: 'utf8',
      env: { ...process.env, MODALGATE_THREADS: String(threads) },
    });
    if (child.status !== 0) {
      console.log(`  MODALGATE_THREADS=${threads}: failed: ${child.stderr.trim().split('\n').slice(-3).join(' | ')}`);
      continue;
    }
    rows.push(JSON.parse(child.stdout.trim().split('\n').pop()!) as Phases);
  }
  const base = rows[0];
  if (base === undefined) return;
  const ms = (v: number, b: number) => `${v.toFixed(0).padStart(6)} ms (${(b / v).toFixed(2)}×)`;
  console.log(`  hex bar 40×15×15 clamped, ${base.n} DOF; wall time, speed-up over MODALGATE_THREADS=${base.threads}`);
  for (const r of rows) {
    console.log(
      `  N=${r.threads} (factor on ${r.factorThreads}): ordering ${ms(r.orderingMs, base.orderingMs)}, factor ${ms(r.factorMs, base.factorMs)}, solve of 6 ${ms(r.solveMs, base.solveMs)}, basis products ${ms(r.productsMs, base.productsMs)}`,
    );
  }
}

async function measureAndPredict(): Promise<void> {
  if (process.env.THREADS_BENCH_PREDICT !== 'only') await measure();
  if (process.env.THREADS_BENCH_PREDICT !== '0') {
    console.log('  predicted by the subtree split (subtree-split.ts model; nothing run in parallel):');
    printPredictions();
  }
}

export default measureAndPredict;

if (process.argv[2] === '--child') runChild();
