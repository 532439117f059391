/**
 * Where to put the shift σ of the solve (common practice, docs/sources.md §3 and §8):
 *
 *  - below every wanted eigenvalue, so the wanted ones are those nearest σ;
 *  - not far below: convergence goes like (λ_N − σ)/(λ_{q+1} − σ), so |σ| ≤ 0.1 λ_N;
 *  - for free-free models (rigid-body eigenvalues ≈ 0) not too close to 0 either: the
 *    rigid-body θ = 1/|σ| would swamp the elastic 1/(λ_e − σ) and cost accuracy, so
 *    |σ| ≥ 1e-3 λ_e (first elastic eigenvalue).
 *
 * The first guess comes from the diagonal: min_j K_jj/M_jj is a Rayleigh quotient, so it
 * bounds λ₁ from above; σ₁ = −1e-6 · that. If a first pass shows σ₁ outside the window,
 * σ₂ = −0.01 λ_e (or −0.01 λ₁ when nothing is rigid).
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

export function firstShiftGuess(scale: DiagonalScale): number {
  return -1e-6 * scale.minRatio;
}

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
  const lowest = Array.from(estimates).slice(0, Math.max(wanted, 1));
  const rigidBodyCount = lowest.filter((v) => Math.abs(v) <= zero).length;
  const elastic = Array.from(estimates).find((v) => v > zero);
  const top = lowest[lowest.length - 1];
  if (elastic === undefined || top === undefined) return { acceptable: true, better: sigma, rigidBodyCount };
  const tooFar = Math.abs(sigma) > 0.1 * Math.max(Math.abs(top), elastic);
  const tooClose = rigidBodyCount > 0 && Math.abs(sigma) < 1e-3 * elastic;
  const lowestValue = lowest[0];
  const base = rigidBodyCount > 0 ? elastic : Math.max(lowestValue, elastic * 1e-3);
  return { acceptable: !tooFar && !tooClose, better: Math.min(-0.01 * base, lowestValue - 0.01 * base), rigidBodyCount };
}
