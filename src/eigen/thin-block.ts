/**
 * Products of thin column-major blocks used by the eigen algorithms (n×a blocks with a ≪ n,
 * and small a×b coefficient matrices). Temporary home until src/dense/block-ops.ts lands.
 */

/** G = Xᵀ Y, with X n×a and Y n×b; G is a×b column-major. */
export function crossProduct(x: Float64Array, a: number, y: Float64Array, b: number, n: number): Float64Array {
  const g = new Float64Array(a * b);
  // g_ij = Σ_r x_ri y_rj
  for (let j = 0; j < b; j++) {
    const yo = j * n;
    for (let i = 0; i < a; i++) {
      const xo = i * n;
      let s = 0;
      for (let r = 0; r < n; r++) s += x[xo + r] * y[yo + r];
      g[i + j * a] = s;
    }
  }
  return g;
}

/** Z = X Q, with X n×a and Q a×b; Z is n×b. */
export function blockTimes(x: Float64Array, a: number, q: Float64Array, b: number, n: number): Float64Array {
  const z = new Float64Array(n * b);
  // z_j = Σ_i q_ij x_i
  for (let j = 0; j < b; j++) {
    const zo = j * n;
    for (let i = 0; i < a; i++) {
      const c = q[i + j * a];
      if (c === 0) continue;
      const xo = i * n;
      for (let r = 0; r < n; r++) z[zo + r] += c * x[xo + r];
    }
  }
  return z;
}

/** Y ← Y − X H, with X n×a, H a×b, Y n×b. */
export function subtractBlockTimes(y: Float64Array, x: Float64Array, a: number, h: Float64Array, b: number, n: number): void {
  // y_j −= Σ_i h_ij x_i
  for (let j = 0; j < b; j++) {
    const yo = j * n;
    for (let i = 0; i < a; i++) {
      const c = h[i + j * a];
      if (c === 0) continue;
      const xo = i * n;
      for (let r = 0; r < n; r++) y[yo + r] -= c * x[xo + r];
    }
  }
}

/** Columns [from, to) of an n-row block, copied. */
export function columns(x: Float64Array, n: number, from: number, to: number): Float64Array {
  return x.slice(from * n, to * n);
}

/** [X Y]: the columns of X followed by those of Y. */
export function joinColumns(x: Float64Array, y: Float64Array): Float64Array {
  const z = new Float64Array(x.length + y.length);
  z.set(x, 0);
  z.set(y, x.length);
  return z;
}

/** Euclidean norm of column j of an n-row block. */
export function columnNorm(x: Float64Array, n: number, j: number): number {
  let s = 0;
  // √Σ x_rj²
  for (let r = j * n; r < (j + 1) * n; r++) s += x[r] * x[r];
  return Math.sqrt(s);
}

/** A deterministic pseudo-random n×k block in [−0.5, 0.5) (mulberry32), so runs repeat exactly. */
export function randomBlock(n: number, k: number, seed: number): Float64Array {
  const x = new Float64Array(n * k);
  let s = seed >>> 0;
  // one uniform number per entry
  for (let i = 0; i < x.length; i++) {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    x[i] = ((t ^ (t >>> 14)) >>> 0) / 4294967296 - 0.5;
  }
  return x;
}
