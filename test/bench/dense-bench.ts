/**
 * Dense kernels at the sizes the eigen solvers hand them: projected eigenproblems of order
 * 100 … 1000 (symmetricEigen, values only and with vectors; symmetricEigenRange with 20 vectors;
 * generalizedSymmetricEigen), block-tridiagonal Lanczos matrices of order 500 … 2000 with
 * block size 8 (bandedEigen, all values and 20 vectors), and the
 * thin-block products for a 120k-row block of 40 columns (transposeTimes, gram, timesSmall).
 * Prints wall-clock times (best of a few runs) and the achieved Gflop/s for the block products.
 */
import { generalizedSymmetricEigen } from '../../src/dense/generalized-eigen.js';
import { symmetricEigen, symmetricEigenvalues } from '../../src/dense/symmetric-eigen.js';
import { gram, timesSmall, transposeTimes } from '../../src/dense/block-ops.js';
import { bandedEigen } from '../../src/dense/banded-eigen.js';
import { symmetricEigenRange } from '../../src/dense/selected-eigen.js';
import { bandFromDense } from '../../src/dense/symmetric-band.js';

function random(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

function symmetric(n: number, seed: number, diagShift = 0): Float64Array {
  const r = random(seed);
  const a = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) a[j * n + i] = a[i * n + j] = r();
    a[j * n + j] += diagShift;
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
    const range = best(runs, () => symmetricEigenRange(a, n, n - 20, 20));
    const m = symmetric(n, n + 1, n); // diagonally dominant: SPD
    const gen = best(runs, () => generalizedSymmetricEigen(a, m, n, { method: 'cholesky' }));
    console.log(
      `n = ${n}: eigenvalues ${values.toFixed(0)} ms, with all vectors ${full.toFixed(0)} ms, ` +
        `with 20 vectors ${range.toFixed(0)} ms, generalized (Cholesky) ${gen.toFixed(0)} ms`,
    );
  }
  const bandSizes = (process.env.DENSE_BENCH_BAND_SIZES ?? '500,1000,2000').split(',').map(Number);
  for (const n of bandSizes) {
    const b = 8;
    const a = symmetric(n, 7 * n);
    // keep only the band |i − j| ≤ b
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) if (Math.abs(i - j) > b) a[j * n + i] = 0;
    const band = bandFromDense(a, n, b);
    const t = best(1, () => bandedEigen(band, n - 20, 20));
    console.log(`band n = ${n}, b = ${b}: all values + 20 vectors ${t.toFixed(0)} ms`);
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
