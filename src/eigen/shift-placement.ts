/**
 * Where to put the shift σ of the solve (common practice, docs/sources.md §3 and §8):
 *
 *  - below every wanted eigenvalue, so the wanted ones are those nearest σ;
 *  - not far below: convergence goes like (λ_N − σ)/(λ_{q+1} − σ), so |σ| ≤ 0.1 λ_N (λ_6 when
 *    fewer than six modes are wanted, SHIFT_REACH);
 *  - for free-free models (rigid-body eigenvalues ≈ 0) not too close to 0 either: the
 *    rigid-body θ = 1/|σ| would swamp the elastic 1/(λ_e − σ) and cost accuracy, so
 *    |σ| ≥ 1e-3 λ_e (first elastic eigenvalue).
 *
 * The first guess comes from the diagonal: min_j K_jj/M_jj is a Rayleigh quotient, so it
 * bounds λ₁ from above; σ₁ = −FIRST_SHIFT_FRACTION · that. If a first pass shows σ₁ outside the
 * window, σ₂ = −0.01 λ_e (or −0.01 λ₁ when nothing is rigid).
 *
 * Why the floor 1e-3 λ_e is real (measured, DEVELOPERS.md "Known limits"): the rigid-body θ = 1/|σ|
 * sets the rounding level of the projected matrix T, so an elastic Ritz pair is resolved only to
 * about ε λ_e/|σ| relative; the residual tolerance 1e-12 needs |σ| ≳ ε/1e-12 · λ_e ≈ 2e-4 λ_e.
 * Held at σ₁ without the restart, the 975-DOF free-free hex bar took 138 solves at |σ| = 3e-4 λ_e
 * (as at 1e-2 λ_e), 236 at 3e-5 λ_e, 394 at 3e-6 λ_e, and found only 13 of 20 modes at 3e-8 λ_e.
 */
import type { SymmetricCsc } from '../sparse/csc.js';

/** |λ| below this fraction of max_j K_jj/M_jj counts as a rigid-body (zero) eigenvalue here. */
export const RIGID_BODY_FRACTION = 1e-10;

export interface DiagonalScale {
  /** min_j K_jj / M_jj over M_jj > 0 (≥ λ₁). */
  minRatio: number;
  /** max_j K_jj / M_jj over M_jj > 0 (the scale of the top of the spectrum). */
  maxRatio: number;
}

export function diagonalScale(stiffness: SymmetricCsc, mass: SymmetricCsc): DiagonalScale {
  const kd = diagonal(stiffness);
  const md = diagonal(mass);
  let minRatio = Infinity;
  let maxRatio = 0;
  // Rayleigh quotients of the unit vectors e_j
  for (let j = 0; j < kd.length; j++) {
    if (md[j] > 0 && kd[j] > 0) {
      const r = kd[j] / md[j];
      if (r < minRatio) minRatio = r;
      if (r > maxRatio) maxRatio = r;
    }
  }
  if (!Number.isFinite(minRatio)) minRatio = maxRatio = 1;
  return { minRatio, maxRatio };
}

function diagonal(a: SymmetricCsc): Float64Array {
  const d = new Float64Array(a.n);
  for (let j = 0; j < a.n; j++) {
    const p = a.colPtr[j];
    if (p < a.colPtr[j + 1] && a.rowIdx[p] === j) d[j] = a.values[p];
  }
  return d;
}

/**
 * σ₁ = −FIRST_SHIFT_FRACTION · min_j K_jj/M_jj (our choice, from measured ratios). The ratio
 * R = min K_jj/M_jj ÷ λ_e (λ₁ when nothing is rigid) grows with mesh refinement like (L/h)²: 320,
 * 1.5e3 and 3.1e4 on the bench's free-free hex bars of 1k and 10k DOFs and its 26k quadratic-tet
 * bracket, 3.6e4–3.8e4 (of λ₁) on their clamped 10k and 24k versions. σ₁ is in the window when
 * 1e-3 ≤ 1e-5 R ≤ 0.1 λ_N/λ_e, and λ_N/λ_e is 10–400 for 20 modes of those models: the fraction
 * maps R from 1e2 to about 1e5 into it. The earlier 1e-6 put every free-free model with R < 1e3
 * (the 1k bar: |σ₁| = 3e-4 λ_e) below the floor, so the first factorization was thrown away. Outside
 * that range (very coarse free-free models, very fine or slender clamped ones asking for few
 * modes) the first pass's judgement still moves the shift (solve-modes.ts).
 */
export const FIRST_SHIFT_FRACTION = 1e-5;

export function firstShiftGuess(scale: DiagonalScale): number {
  return -FIRST_SHIFT_FRACTION * scale.minRatio;
}

/**
 * "Too far" is judged against λ_max(N, 6), not λ_N: for a few wanted modes the rate is set by the
 * eigenvalues the basis reaches past them (block Lanczos's first block already holds six), so a
 * shift 0.38 λ₁ below a clamped 10k hex bar's λ₁ cost no solves for one mode yet was refused
 * (a third factorization) when judged against λ₁ (our choice; measured, DEVELOPERS.md).
 */
const SHIFT_REACH = 6;

export interface ShiftVerdict {
  acceptable: boolean;
  better: number;
  rigidBodyCount: number;
}

/** |λ| at or below this is a rigid-body (zero) eigenvalue of the pencil whose diagonal scale is `scale`. */
export function rigidBodyZero(scale: DiagonalScale): number {
  return RIGID_BODY_FRACTION * scale.maxRatio;
}

/**
 * Judge σ against estimates of the lowest `wanted` eigenvalues (ascending, any accuracy) and
 * propose a better shift if it is outside the window of the module comment.
 */
export function judgeShift(sigma: number, estimates: Float64Array, wanted: number, scale: DiagonalScale): ShiftVerdict {
  const zero = rigidBodyZero(scale);
  const lowest = Array.from(estimates.subarray(0, Math.max(wanted, 1)));
  const rigidBodyCount = lowest.filter((v) => Math.abs(v) <= zero).length;
  const elastic = estimates.find((v) => v > zero);
  const top: number | undefined = estimates[Math.min(estimates.length, Math.max(wanted, SHIFT_REACH)) - 1];
  if (elastic === undefined || top === undefined) return { acceptable: true, better: sigma, rigidBodyCount };
  const tooFar = Math.abs(sigma) > 0.1 * Math.max(Math.abs(top), elastic);
  const tooClose = rigidBodyCount > 0 && Math.abs(sigma) < 1e-3 * elastic;
  const lowestValue = lowest[0];
  const base = rigidBodyCount > 0 ? elastic : Math.max(lowestValue, elastic * 1e-3);
  return { acceptable: !tooFar && !tooClose, better: Math.min(-0.01 * base, lowestValue - 0.01 * base), rigidBodyCount };
}
