/**
 * The eigenpair residual — the one residual measure of modalgate. The solver's convergence test,
 * its verification, `modes` output, the eigen-residual rule and every report use it:
 *
 *     ρ_i = ‖K φ_i − λ_i M φ_i‖₂ / max(‖K φ_i‖₂ + |λ_i| ‖M φ_i‖₂,  τ · ‖K‖₁ · ‖φ_i‖₂)
 *
 * The denominator is the size of the two forces that should balance: for an exact pair Kφ = λMφ
 * the residual is their difference, so ρ is the relative imbalance (scale-free: a pair whose
 * shape mixes in a fraction c of another mode j shows ρ ≈ c·|λ_j − λ_i| / (λ_i + λ_j), e.g.
 * 0.3 mixed into a mode of a spectrum spaced 2:1 gives ρ ≈ 0.1). A rigid-body mode has Kφ ≈ 0
 * and λ ≈ 0, so both forces vanish and the bare ratio is rounding divided by rounding; its
 * residual is measured instead against the floor τ‖K‖₁‖φ‖ — the stiffness force a vector of that
 * size would meet at a fraction τ of the largest stiffness. τ = 1e-5 is our choice: rounding
 * alone leaves ‖Kφ‖ ≈ ε‖K‖‖φ‖ for an exact rigid-body vector, so a converged rigid-body mode
 * shows ρ ≈ ε/τ ≈ 1e-11, while elastic modes, whose forces are above the floor, keep the plain
 * form. (The LAPACK test ratio ‖r‖/((‖K‖ + |λ|‖M‖)‖φ‖) is the τ = 1 limit: too lenient for the
 * lowest elastic modes, whose ‖Kφ‖ lies far below ‖K‖‖φ‖ — it passed a shape 30 % off.)
 */
const RIGID_BODY_RESIDUAL_FLOOR = 1e-5;

/**
 * The residual a verified solution meets: 1e-8, common practice for computed modes (the same
 * default as the eigen-residual rule); the solver converges to 1e-12.
 */
export const EIGENPAIR_RESIDUAL_LIMIT = 1e-8;

/** The name reports give the measure. */
export const EIGENPAIR_RESIDUAL_NAME = 'eigenpair residual ‖Kφ − λMφ‖ / (‖Kφ‖ + |λ|‖Mφ‖)';

export function relativeResidual(
  residualNorm: number,
  stiffnessForceNorm: number,
  inertiaForceNorm: number,
  vectorNorm: number,
  stiffnessNorm: number,
): number {
  const floor = RIGID_BODY_RESIDUAL_FLOOR * stiffnessNorm * vectorNorm;
  const denominator = Math.max(stiffnessForceNorm + inertiaForceNorm, floor);
  return denominator > 0 ? residualNorm / denominator : residualNorm === 0 ? 0 : Infinity;
}
