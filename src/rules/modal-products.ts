/**
 * Products of the solved mode shapes with K and M, shared by the verification rules:
 *   P_M = Φᵀ M Φ   (should be I for mass-normalized, M-orthogonal modes),
 *   P_K = Φᵀ K Φ   (should be Λ = diag(λ)),
 *   r_i = ‖K φ_i − λ_i M φ_i‖₂ / ((‖K‖₁ + |λ_i| ‖M‖₁) ‖φ_i‖₂)   per mode.
 * The residual form follows the LAPACK test ratio (CRITERIA.md §6, [C] form, [CP] limit). The
 * norms ‖·‖₁ are the largest column sums of |A| (equal to ‖·‖∞ for symmetric A). Computed once
 * per ModesResult and cached, so the rules that read them stay cheap and pure.
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import type { ModesResult } from '../eigen/modes-types.js';

export interface ModalProducts {
  modes: number;
  /** Φᵀ M Φ, column-major modes × modes. */
  massProjected: Float64Array;
  /** Φᵀ K Φ, column-major modes × modes. */
  stiffnessProjected: Float64Array;
  /** Relative residual per mode (form above). */
  relativeResiduals: Float64Array;
}

const cache = new WeakMap<ModesResult, ModalProducts>();

export function modalProducts(stiffness: SymmetricCsc, mass: SymmetricCsc, modes: ModesResult): ModalProducts {
  const hit = cache.get(modes);
  if (hit) return hit;
  const n = modes.n;
  const m = modes.eigenvalues.length;
  const phi = modes.shapes;
  const kPhi = symMultiplyBlock(stiffness, phi, m);
  const mPhi = symMultiplyBlock(mass, phi, m);
  const massProjected = projected(phi, mPhi, n, m);
  const stiffnessProjected = projected(phi, kPhi, n, m);
  const normK = oneNorm(stiffness);
  const normM = oneNorm(mass);
  const relativeResiduals = new Float64Array(m);
  // r_i = ‖Kφ_i − λ_i Mφ_i‖ / ((‖K‖ + |λ_i|‖M‖)‖φ_i‖)
  for (let i = 0; i < m; i++) {
    const lambda = modes.eigenvalues[i];
    let rr = 0;
    let pp = 0;
    for (let r = 0, o = i * n; r < n; r++, o++) {
      const d = kPhi[o] - lambda * mPhi[o];
      rr += d * d;
      pp += phi[o] * phi[o];
    }
    const scale = (normK + Math.abs(lambda) * normM) * Math.sqrt(pp);
    relativeResiduals[i] = scale > 0 ? Math.sqrt(rr) / scale : Math.sqrt(rr);
  }
  const products = { modes: m, massProjected, stiffnessProjected, relativeResiduals };
  cache.set(modes, products);
  return products;
}

/** Φᵀ (AΦ): entry (i, j) = φ_iᵀ (Aφ_j), symmetric, filled from the lower half. */
function projected(phi: Float64Array, aPhi: Float64Array, n: number, m: number): Float64Array {
  const p = new Float64Array(m * m);
  // p_ij = Σ_r φ_ri (Aφ_j)_r for j ≤ i, mirrored
  for (let j = 0; j < m; j++) {
    for (let i = j; i < m; i++) {
      let s = 0;
      for (let r = 0, a = i * n, b = j * n; r < n; r++) s += phi[a + r] * aPhi[b + r];
      p[i + j * m] = s;
      p[j + i * m] = s;
    }
  }
  return p;
}

/** ‖A‖₁ = max_j Σ_i |a_ij| of the full symmetric matrix stored as its lower triangle. */
export function oneNorm(a: SymmetricCsc): number {
  const colSum = new Float64Array(a.n);
  // each stored a_ij (i > j) adds to columns j and i; the diagonal once
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      const v = Math.abs(a.values[p]);
      colSum[j] += v;
      if (i !== j) colSum[i] += v;
    }
  }
  let best = 0;
  for (let j = 0; j < a.n; j++) if (colSum[j] > best) best = colSum[j];
  return best;
}
