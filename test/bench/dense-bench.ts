/**
 * Dense kernels at the sizes the eigen solvers hand them: projected eigenproblems of order
 * 100 … 1000 (symmetricEigen, values only and with vectors) and the thin-block products for a 120k-row block of 40 columns (transposeTimes, gram, timesSmall).
 * Prints wall-clock times (best of a few runs) and the achieved Gflop/s for the block products.
 */
import { symmetricEigen, symmetricEigenvalues } from '../../src/dense/symmetric-eigen.js';
import { gram, timesSmall, transposeTimes } from '../../src/dense/block-ops.js';

function random(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

function symmetric(n: number, seed: number): Float64Array {
  const r = random(seed);
  const a = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) a[j * n + i] = a[i * n + j] = r();
  }
  return a;
}

function best(runs: number, f: () => void): number {
  let t = Infinity;
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    f();
    t = Math.min(t, performance.now() - t0);
  }
  return t;
}

export default async function denseBench(): Promise<void> {
  const sizes = (process.env.DENSE_BENCH_SIZES ?? '100,200,500,1000').split(',').map(Number);
  for (const n of sizes) {
    const a = symmetric(n, n);
    const runs = n <= 200 ? 3 : 1;
    const values = best(runs, () => symmetricEigenvalues(a, n));
    const full = best(runs, () => symmetricEigen(a, n));
    console.log(`n = ${n}: eigenvalues ${values.toFixed(0)} ms, with all vectors ${full.toFixed(0)} ms`);
  }
  const rows = 120_000;
  const p = 40;
  const x = Float64Array.from({ length: rows * p }, random(1));
  const y = Float64Array.from({ length: rows * p }, random(2));
  const s = Float64Array.from({ length: p * p }, random(3));
  const gf = (flops: number, ms: number): string => `${(flops / ms / 1e6).toFixed(2)} Gflop/s`;
  const tt = best(3, () => transposeTimes(x, y, rows, p, p));
  const tg = best(3, () => gram(x, rows, p));
  const ts = best(3, () => timesSmall(x, rows, p, s, p));
  console.log(`${rows}×${p} block: XᵀY ${tt.toFixed(0)} ms (${gf(2 * rows * p * p, tt)}), ` +
    `XᵀX ${tg.toFixed(0)} ms (${gf(rows * p * (p + 1), tg)}), X·S ${ts.toFixed(0)} ms (${gf(2 * rows * p * p, ts)})`);
}
