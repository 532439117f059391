/**
 * B-orthonormalization of a tall block through the eigen-decomposition of its Gram matrix
 * (the "SVQB" scheme of Stathopoulos & Wu, SIAM J. Sci. Comput. 23(6), 2002 — from memory):
 *
 *   G = Xᵀ(BX),  D = diag(G)^(−1/2),  D G D = V Θ Vᵀ,
 *   keep θ_i > tol·θ_max,   X ← X D V_kept Θ_kept^(−1/2)   ⇒   XᵀBX = I.
 *
 * Unlike Cholesky QR it never breaks down: directions of X that B does not see (B semi-definite,
 * e.g. a mass matrix with massless DOFs) or that depend on others come out as tiny θ and are
 * dropped, and the returned rank says how many columns remain. The diagonal scaling D makes the
 * test independent of the columns' lengths. Cost: one k×k symmetric eigenproblem, 2·rows·k² flops.
 * Orthogonality after one pass is about ε·cond(X); a second pass on the result brings it to O(ε).
 */
import { timesSmall, transposeTimes } from './block-ops.js';
import { symmetricEigen } from './symmetric-eigen.js';

export interface SvqbResult {
  /** rows×rank, B-orthonormal. */
  x: Float64Array;
  /** B·x (rows×rank) when BX was given, else null. */
  bx: Float64Array | null;
  rank: number;
  /** Columns whose Gram diagonal was zero (B-null columns) before any mixing. */
  zeroColumns: Int32Array;
}

/** B-orthonormal basis of span(X) (B = I when bx is null), dropping directions with θ ≤ tol·θ_max. */
export function svqbOrthonormalize(
  x: Float64Array,
  bx: Float64Array | null,
  rows: number,
  k: number,
  tol = 1e-12,
): SvqbResult {
  const g = transposeTimes(x, bx ?? x, rows, k, k);
  const d = new Float64Array(k);
  const zero: number[] = [];
  let gMax = 0;
  for (let i = 0; i < k; i++) gMax = Math.max(gMax, g[i * k + i]);
  // d_i = g_ii^(−1/2), columns with no B-length left out (d_i = 0)
  for (let i = 0; i < k; i++) {
    const gii = g[i * k + i];
    if (gii > 1e-300 && gii > 1e-30 * gMax) d[i] = 1 / Math.sqrt(gii);
    else zero.push(i);
  }
  const { transform, rank } = svqbCoefficients(g, k, d, tol);
  return {
    x: timesSmall(x, rows, k, transform, rank),
    bx: bx === null ? null : timesSmall(bx, rows, k, transform, rank),
    rank,
    zeroColumns: Int32Array.from(zero),
  };
}

export interface SvqbCoefficients {
  /** S = D U Θ^(−1/2) (k×rank): X S is B-orthonormal. */
  transform: Float64Array;
  /** R = Θ^(1/2) Uᵀ D⁻¹ (rank×k): X = (X S) R on the kept directions (0 where d_i = 0). */
  coefficients: Float64Array;
  rank: number;
}

/**
 * The small half of SVQB: from the Gram matrix G = XᵀBX (k×k, overwritten with Ĝ = D G D) and the
 * column scaling d (0 marks a column to leave out), the transform S and coefficients R, keeping
 * the eigen-directions of Ĝ with θ > tol·θ_max, largest first.
 */
export function svqbCoefficients(g: Float64Array, k: number, d: Float64Array, tol: number): SvqbCoefficients {
  // Ĝ = D G D, symmetrized
  for (let j = 0; j < k; j++) {
    for (let i = j; i < k; i++) {
      const v = 0.5 * (g[j * k + i] + g[i * k + j]) * d[i] * d[j];
      g[j * k + i] = v;
      g[i * k + j] = v;
    }
  }
  const eig = symmetricEigen(g, k);
  let thetaMax = 0;
  for (let i = 0; i < k; i++) thetaMax = Math.max(thetaMax, eig.values[i]);
  const kept: number[] = [];
  for (let i = k - 1; i >= 0; i--) if (eig.values[i] > tol * thetaMax && thetaMax > 0) kept.push(i);
  const rank = kept.length;
  const transform = new Float64Array(k * rank);
  const coefficients = new Float64Array(rank * k);
  // S = D U Θ^(−1/2) and R = Θ^(1/2) Uᵀ D⁻¹
  for (let c = 0; c < rank; c++) {
    const i = kept[c];
    const sq = Math.sqrt(eig.values[i]);
    for (let r = 0; r < k; r++) {
      const u = eig.vectors[i * k + r];
      transform[c * k + r] = (d[r] * u) / sq;
      coefficients[c + r * rank] = d[r] > 0 ? (sq * u) / d[r] : 0;
    }
  }
  return { transform, coefficients, rank };
}
