/**
 * Reduction of a symmetric band matrix (bandwidth b) to tridiagonal form by Givens rotations,
 * T = GᵀAG, keeping the band: the eigenvalues of the block-tridiagonal Lanczos matrix in O(n²b)
 * instead of the O(n³) of a dense Householder reduction. Rotations are not kept (values only;
 * eigenvectors come from inverse iteration on A itself, band-inverse-iteration.ts).
 *
 * Column k (k = 0 … n−3), from the bottom of its band up: the entry A(i, k), k+2 ≤ i ≤ k+b, is
 * zeroed by a rotation in the plane (i−1, i) chosen from (A(i−1, k), A(i, k)) ↦ (r, 0). Row i
 * carries entries up to column i+b, so the rotation puts one entry outside the band, the bulge
 * A(i+b, i−1). It is removed by a rotation in the plane (i+b−1, i+b), which moves it b rows down,
 * and so on until it leaves the matrix. Each rotation touches O(b) entries; there are O(n²)
 * rotations in all.
 *
 * Work storage: the lower band plus one extra diagonal for the bulge (width b+2 per column).
 */
import type { SymmetricBand } from './symmetric-band.js';

/** Rotation convention: rows p, q=p+1 become (c·row_p + s·row_q, −s·row_p + c·row_q), columns alike. */
class BandWork {
  readonly w: number;
  readonly a: Float64Array;
  constructor(
    readonly n: number,
    readonly b: number,
    src: SymmetricBand,
  ) {
    this.w = b + 2;
    this.a = new Float64Array(this.w * n);
    // copy the band into the wider work storage
    for (let j = 0; j < n; j++) {
      for (let o = 0; o <= b && j + o < n; o++) this.a[j * this.w + o] = src.lower[j * (b + 1) + o];
    }
  }
  /** A(i, j) for |i − j| ≤ b + 1. */
  get(i: number, j: number): number {
    return i >= j ? this.a[j * this.w + i - j] : this.a[i * this.w + j - i];
  }
  set(i: number, j: number, v: number): void {
    if (i >= j) this.a[j * this.w + i - j] = v;
    else this.a[i * this.w + j - i] = v;
  }
  /** A ← G A Gᵀ in the plane (p, p+1); entries outside rows/columns p−b … p+1+b are zero. */
  rotate(p: number, c: number, s: number): void {
    const q = p + 1;
    const lo = Math.max(0, p - this.b);
    const hi = Math.min(this.n - 1, q + this.b);
    // the pair of entries (A(r, p), A(r, q)) of every other index r in reach
    for (let r = lo; r <= hi; r++) {
      if (r === p || r === q) continue;
      const x = this.get(r, p);
      const y = this.get(r, q);
      this.set(r, p, c * x + s * y);
      this.set(r, q, c * y - s * x);
    }
    // the 2×2 block G [a_pp a_pq; a_pq a_qq] Gᵀ
    const app = this.get(p, p);
    const apq = this.get(q, p);
    const aqq = this.get(q, q);
    const cs = c * s;
    this.set(p, p, c * c * app + 2 * cs * apq + s * s * aqq);
    this.set(q, q, s * s * app - 2 * cs * apq + c * c * aqq);
    this.set(q, p, cs * (aqq - app) + (c * c - s * s) * apq);
  }
  /** Zero A(i, col) with a rotation in the plane (i−1, i); returns false when it was zero already. */
  annihilate(i: number, col: number): boolean {
    const y = this.get(i, col);
    if (y === 0) return false;
    const x = this.get(i - 1, col);
    const r = Math.hypot(x, y);
    this.rotate(i - 1, x / r, y / r);
    this.set(i - 1, col, r);
    this.set(i, col, 0);
    return true;
  }
}

/** Diagonal and off-diagonal of a tridiagonal T orthogonally similar to the band matrix. */
export function bandToTridiagonal(band: SymmetricBand): { diagonal: Float64Array; offDiagonal: Float64Array } {
  const { n, bandwidth: b } = band;
  const work = new BandWork(n, b, band);
  if (b > 1) {
    for (let k = 0; k + 2 < n; k++) {
      // entries of column k below the sub-diagonal, bottom first
      for (let i = Math.min(k + b, n - 1); i >= k + 2; i--) {
        if (!work.annihilate(i, k)) continue;
        // chase the bulge A(row, row − b − 1) down and out
        for (let row = i + b; row < n; row += b) {
          if (!work.annihilate(row, row - b - 1)) break;
        }
      }
    }
  }
  const diagonal = new Float64Array(n);
  const offDiagonal = new Float64Array(Math.max(n - 1, 0));
  for (let i = 0; i < n; i++) {
    diagonal[i] = work.get(i, i);
    if (i + 1 < n) offDiagonal[i] = work.get(i + 1, i);
  }
  return { diagonal, offDiagonal };
}
