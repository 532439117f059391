/**
 * Converged eigenpairs set aside ("locked") while an algorithm keeps iterating on the rest,
 * M-orthogonal to them. Holds the vectors, their M-images (for projections), the values and
 * the residuals, growing its arrays geometrically.
 */
import type { MassBasis } from './m-orthonormalize.js';
import type { RitzPairs } from './rayleigh-ritz.js';

export class LockedSet {
  readonly n: number;
  count = 0;
  private vectors: Float64Array;
  private massVectors: Float64Array;
  private values: number[] = [];
  private residuals: number[] = [];

  constructor(n: number, capacity = 8) {
    this.n = n;
    this.vectors = new Float64Array(n * capacity);
    this.massVectors = new Float64Array(n * capacity);
  }

  /** The locked eigenvalues in locking order. */
  valuesView(): number[] {
    return this.values.slice();
  }

  /** Lock Ritz pair i. */
  add(ritz: RitzPairs, i: number, residual: number): void {
    this.push(
      ritz.vectors.subarray(i * this.n, (i + 1) * this.n),
      ritz.massVectors.subarray(i * this.n, (i + 1) * this.n),
      ritz.values[i],
      residual,
    );
  }

  push(vector: Float64Array, massVector: Float64Array, value: number, residual: number): void {
    const n = this.n;
    if ((this.count + 1) * n > this.vectors.length) {
      const grown = new Float64Array(Math.max(2 * this.vectors.length, (this.count + 1) * n));
      grown.set(this.vectors);
      this.vectors = grown;
      const grownM = new Float64Array(grown.length);
      grownM.set(this.massVectors);
      this.massVectors = grownM;
    }
    this.vectors.set(vector, this.count * n);
    this.massVectors.set(massVector, this.count * n);
    this.values.push(value);
    this.residuals.push(residual);
    this.count++;
  }

  /** The locked vectors as an M-orthonormal block (views, no copy). */
  basis(): MassBasis {
    const len = this.count * this.n;
    return { vectors: this.vectors.subarray(0, len), massVectors: this.massVectors.subarray(0, len), count: this.count };
  }

  /** The first `limit` locked pairs sorted by ascending eigenvalue. */
  result(limit: number): { count: number; values: Float64Array; vectors: Float64Array; residuals: Float64Array } {
    const n = this.n;
    const order = this.values.map((_v, i) => i).sort((a, b) => this.values[a] - this.values[b]);
    const count = Math.min(limit, this.count);
    const vectors = new Float64Array(n * count);
    const values = new Float64Array(count);
    const residuals = new Float64Array(count);
    // column t of the result is locked pair order[t]
    for (let t = 0; t < count; t++) {
      const i = order[t];
      vectors.set(this.vectors.subarray(i * n, (i + 1) * n), t * n);
      values[t] = this.values[i];
      residuals[t] = this.residuals[i];
    }
    return { count, values, vectors, residuals };
  }

  /**
   * Locked pairs plus extra (unconverged) Ritz pairs, ascending: the best current picture of
   * the spectrum near σ.
   */
  estimates(extraValues: ArrayLike<number>, extraVectors: Float64Array, extraCount: number): {
    estimates: Float64Array;
    estimateVectors: Float64Array;
    estimateCount: number;
  } {
    const n = this.n;
    const all = this.values.map((v, i) => ({ v, src: 0, i }));
    for (let i = 0; i < extraCount; i++) all.push({ v: extraValues[i], src: 1, i });
    all.sort((a, b) => a.v - b.v);
    const estimateVectors = new Float64Array(n * all.length);
    // column t: a locked vector or an extra Ritz vector
    all.forEach((e, t) => {
      const from = e.src === 0 ? this.vectors : extraVectors;
      estimateVectors.set(from.subarray(e.i * n, (e.i + 1) * n), t * n);
    });
    return { estimates: Float64Array.from(all, (e) => e.v), estimateVectors, estimateCount: all.length };
  }
}
