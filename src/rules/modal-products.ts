/**
 * Products of the solved mode shapes with K and M, shared by the verification rules:
 *   P_M = Φᵀ M Φ   (should be I for mass-normalized, M-orthogonal modes),
 *   P_K = Φᵀ K Φ   (should be Λ = diag(λ)),
 *   r_i = ‖K φ_i − λ_i M φ_i‖₂ / ((‖K‖₁ + |λ_i| ‖M‖₁) ‖φ_i‖₂)   per mode.
 * The residual form follows the LAPACK test ratio (CRITERIA.md §6, [C] form, [CP] limit). The
 * norms ‖·‖₁ are the largest column sums of |A| (equal to ‖·‖∞ for symmetric A). Computed once
 * per ModesResult and cached, so the rules that read them stay cheap and pure.
 */
import { symMultiplyBlock, symOneNorm, type SymmetricCsc } from '../sparse/csc.js';
import { transposeTimes } from '../dense/block-ops.js';
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
  const massProjected = transposeTimes(phi, mPhi, n, m, m);
  const stiffnessProjected = transposeTimes(phi, kPhi, n, m, m);
  const normK = symOneNorm(stiffness);
  const normM = symOneNorm(mass);
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
