/**
 * The relative residual used for convergence and reported per mode:
 *
 *     ρ_i = ‖K φ_i − λ_i M φ_i‖₂ / max(‖K φ_i‖₂,  τ · ‖K‖₁ · ‖φ_i‖₂)
 *
 * ‖Kφ‖ is the natural scale of an elastic mode. A rigid-body mode has Kφ ≈ 0, so its residual
 * is measured instead against the floor τ‖K‖₁‖φ‖ — the stiffness force a vector of that size
 * would meet at a fraction τ of the largest stiffness. τ = 1e-5 is our choice: rounding alone
 * leaves ‖Kφ‖ ≈ ε‖K‖‖φ‖ for an exact rigid-body vector, so a converged rigid-body mode shows
 * ρ ≈ ε/τ ≈ 1e-11, while elastic modes with ‖Kφ‖ above the floor keep the plain
 * ‖r‖/‖Kφ‖ form. (The LAPACK test ratio ‖r‖/((‖K‖ + |λ|‖M‖)‖φ‖) is the τ = 1 limit — too
 * lenient for the lowest elastic modes, whose ‖Kφ‖ is far below ‖K‖‖φ‖.)
 */
export const RIGID_BODY_RESIDUAL_FLOOR = 1e-5;

export function relativeResidual(residualNorm: number, stiffnessForceNorm: number, vectorNorm: number, stiffnessNorm: number): number {
  const floor = RIGID_BODY_RESIDUAL_FLOOR * stiffnessNorm * vectorNorm;
  const denominator = Math.max(stiffnessForceNorm, floor);
  return denominator > 0 ? residualNorm / denominator : residualNorm === 0 ? 0 : Infinity;
}
