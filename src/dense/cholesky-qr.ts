/**
 * Cholesky QR in an inner product ⟨x, y⟩_B = xᵀBy (B SPD, e.g. the mass matrix): given a tall
 * block X (rows×k) and BX, make X B-orthonormal without touching B again.
 *
 *   G = Xᵀ(BX) = L Lᵀ,   X ← X L⁻ᵀ,   BX ← (BX) L⁻ᵀ   ⇒   XᵀBX = L⁻¹ G L⁻ᵀ = I.
 *
 * One pass loses orthogonality in proportion to cond(X)² ε; a second pass on the result
 * ("CholeskyQR2") brings it to O(ε) when cond(X) ≲ ε^(−1/2). If G is not numerically positive
 * definite (dependent columns) the block is left unchanged and the failing column is returned,
 * so the caller can replace or drop that column.
 */
import { cholesky, solveRightLowerTransposed } from './cholesky.js';
import { transposeTimes } from './block-ops.js';

export type CholeskyQrResult =
  | { ok: true; /** L with XᵀBX = LLᵀ before the update (k×k). */ lower: Float64Array }
  | { ok: false; failedColumn: number };

/** X ← X L⁻ᵀ (and BX alike when given, else B = I) so that XᵀBX = I. */
export function choleskyOrthonormalize(
  x: Float64Array,
  bx: Float64Array | null,
  rows: number,
  k: number,
): CholeskyQrResult {
  const g = transposeTimes(x, bx ?? x, rows, k, k);
  // symmetrize G against rounding: G = (G + Gᵀ)/2
  for (let j = 0; j < k; j++) {
    for (let i = j + 1; i < k; i++) {
      const v = 0.5 * (g[j * k + i] + g[i * k + j]);
      g[j * k + i] = v;
      g[i * k + j] = v;
    }
  }
  const chol = cholesky(g, k);
  if (!chol.ok) return { ok: false, failedColumn: chol.failedColumn };
  solveRightLowerTransposed(x, rows, chol.lower, k);
  if (bx !== null) solveRightLowerTransposed(bx, rows, chol.lower, k);
  return { ok: true, lower: chol.lower };
}
