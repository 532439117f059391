/**
 * The verification figures of the solved modes, shared by the verification rules:
 *   P_M = Φᵀ M Φ   (should be I for mass-normalized, M-orthogonal modes),
 *   P_K = Φᵀ K Φ   (should be Λ = diag(λ)),
 *   ρ_i           the eigenpair residual of each mode (src/eigen/residual-measure.ts).
 * They are formed once, by the solver's verification (src/eigen/verification.ts), and carried in
 * the ModesResult; the rules read them from there, so `modes`, the rules and the reports show the
 * same numbers. A result made without the verification (a hand-made or loaded one) gets them
 * from the same function here, once, cached per result.
 */
import { symOneNorm, type SymmetricCsc } from '../../sparse/csc.js';
import type { ModesResult } from '../../eigen/modes-types.js';
import { checkShapes } from '../../eigen/verification.js';

export interface ModalProducts {
  modes: number;
  /** Φᵀ M Φ, column-major modes × modes. */
  massProjected: Float64Array;
  /** Φᵀ K Φ, column-major modes × modes. */
  stiffnessProjected: Float64Array;
  /** Eigenpair residual per mode (residual-measure.ts). */
  relativeResiduals: Float64Array;
}

const cache = new WeakMap<ModesResult, ModalProducts>();

export function modalProducts(stiffness: SymmetricCsc, mass: SymmetricCsc, modes: ModesResult): ModalProducts {
  const hit = cache.get(modes);
  if (hit) return hit;
  const m = modes.eigenvalues.length;
  let products: ModalProducts;
  if (modes.projections && modes.projections.mass.length === m * m && modes.residuals.length === m) {
    products = { modes: m, massProjected: modes.projections.mass, stiffnessProjected: modes.projections.stiffness, relativeResiduals: modes.residuals };
  } else {
    const checks = checkShapes(stiffness, mass, modes.eigenvalues, modes.shapes, symOneNorm(stiffness));
    products = { modes: m, massProjected: checks.projections.mass, stiffnessProjected: checks.projections.stiffness, relativeResiduals: checks.residuals };
  }
  cache.set(modes, products);
  return products;
}
