/**
 * Rayleigh–Ritz on an M-orthonormal basis V (n×k, VᵀMV = I):
 *
 *     K̄ = VᵀKV = S Λ Sᵀ,   Ritz vectors X = V S,   KX = (KV) S,   MX = (MV) S,
 *
 * so the residuals r_i = K x_i − λ_i M x_i come without further products. The small
 * symmetric eigenproblem is solved by src/dense (Householder + implicit QR). The Ritz values
 * are the best approximations to the eigenvalues of (K, M) from span(V) (Parlett, The
 * Symmetric Eigenvalue Problem, ch. 11).
 */
import { symmetricEigen } from '../dense/symmetric-eigen.js';
import type { MassBasis } from './m-orthonormalize.js';
import { timesSmall, transposeTimes } from '../dense/block-ops.js';

export interface RitzPairs {
  count: number;
  /** Ritz values λ_i, ascending. */
  values: Float64Array;
  /** X = V S (n×count), M-orthonormal. */
  vectors: Float64Array;
  massVectors: Float64Array;
  stiffnessVectors: Float64Array;
  /** ‖K x_i − λ_i M x_i‖₂. */
  residualNorms: Float64Array;
  /** ‖K x_i‖₂. */
  stiffnessNorms: Float64Array;
  /** |λ_i| ‖M x_i‖₂. */
  inertiaNorms: Float64Array;
  /** ‖x_i‖₂. */
  vectorNorms: Float64Array;
}

export function rayleighRitz(
  basis: MassBasis,
  n: number,
  stiffnessTimes: (x: Float64Array, k: number) => Float64Array,
): RitzPairs {
  const k = basis.count;
  const kv = stiffnessTimes(basis.vectors, k);
  const kbar = transposeTimes(basis.vectors, kv, n, k, k);
  // symmetrize K̄ against rounding
  for (let j = 0; j < k; j++) {
    for (let i = j + 1; i < k; i++) {
      const v = 0.5 * (kbar[i + j * k] + kbar[j + i * k]);
      kbar[i + j * k] = v;
      kbar[j + i * k] = v;
    }
  }
  const { values, vectors: s } = symmetricEigen(kbar, k);
  const x = timesSmall(basis.vectors, n, k, s, k);
  const mx = timesSmall(basis.massVectors, n, k, s, k);
  const kx = timesSmall(kv, n, k, s, k);
  return { count: k, values, vectors: x, massVectors: mx, stiffnessVectors: kx, ...residualsOf(x, mx, kx, values, k, n) };
}

/** ‖Kx − λMx‖, ‖Kx‖, |λ|‖Mx‖, ‖x‖ per column. */
export function residualsOf(
  x: Float64Array,
  mx: Float64Array,
  kx: Float64Array,
  values: Float64Array,
  k: number,
  n: number,
): { residualNorms: Float64Array; stiffnessNorms: Float64Array; inertiaNorms: Float64Array; vectorNorms: Float64Array } {
  const residualNorms = new Float64Array(k);
  const stiffnessNorms = new Float64Array(k);
  const inertiaNorms = new Float64Array(k);
  const vectorNorms = new Float64Array(k);
  // per column: ‖Kx − λMx‖², ‖Kx‖², ‖Mx‖², ‖x‖²
  for (let j = 0; j < k; j++) {
    const lam = values[j];
    let rr = 0;
    let kk = 0;
    let mm = 0;
    let xx = 0;
    for (let r = j * n; r < (j + 1) * n; r++) {
      const d = kx[r] - lam * mx[r];
      rr += d * d;
      kk += kx[r] * kx[r];
      mm += mx[r] * mx[r];
      xx += x[r] * x[r];
    }
    residualNorms[j] = Math.sqrt(rr);
    stiffnessNorms[j] = Math.sqrt(kk);
    inertiaNorms[j] = Math.abs(lam) * Math.sqrt(mm);
    vectorNorms[j] = Math.sqrt(xx);
  }
  return { residualNorms, stiffnessNorms, inertiaNorms, vectorNorms };
}
