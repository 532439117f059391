/**
 * Modal participation: how much of the rigid-body mass each mode carries.
 *
 * With mass-normalized shapes Φ (φᵀMφ = 1) and rigid-body vectors R (about the centre of mass),
 *   Γ_jk = φ_jᵀ M r_k                      participation factor of mode j in direction k,
 *   m_eff,jk = Γ_jk²                       effective mass (effective inertia for rotations),
 *   Σ_j over all modes m_eff,jk = r_kᵀ M r_k   (completeness of the M-orthonormal modes),
 * so the cumulative effective mass over the solved modes, divided by r_kᵀ M r_k, is the
 * fraction of the mass the solved modes represent in that direction.
 */
import type { ModesResult } from '../eigen/modes-types.js';
import { RIGID_BODY_DIRECTIONS, type RigidBodyDirection } from './rigid-body-vectors.js';

export interface Participation {
  modes: number;
  /** factors[j][k] = Γ_jk (mode j, direction k). */
  factors: number[][];
  /** effectiveMass[j][k] = Γ_jk². */
  effectiveMass: number[][];
  /** cumulativeFraction[j][k] = Σ_{i ≤ j} Γ_ik² / r_kᵀ M r_k (null where the direction has no mass). */
  cumulativeFraction: (number | null)[][];
  /** r_kᵀ M r_k per direction (mass for translations, inertia about the CoM for rotations). */
  rigidBodyMass: number[];
  directions: readonly RigidBodyDirection[];
}

/** Γ = Φᵀ (M R) from the shapes and M R (column-major n × 6). */
export function modalParticipation(modes: ModesResult, massTimesR: Float64Array, rigidBodyMassDiagonal: readonly number[]): Participation {
  const n = modes.n;
  const count = modes.eigenvalues.length;
  const factors: number[][] = [];
  const effectiveMass: number[][] = [];
  const cumulativeFraction: (number | null)[][] = [];
  const running = [0, 0, 0, 0, 0, 0];
  // Γ_jk = Σ_i φ_ij (MR)_ik, then its square and the running sum over modes
  for (let j = 0; j < count; j++) {
    const gamma: number[] = [];
    for (let k = 0; k < 6; k++) {
      let s = 0;
      for (let i = 0, oj = j * n, ok = k * n; i < n; i++) s += modes.shapes[oj + i] * massTimesR[ok + i];
      gamma.push(s);
      running[k] += s * s;
    }
    factors.push(gamma);
    effectiveMass.push(gamma.map((s) => s * s));
    cumulativeFraction.push(running.map((sum, k) => (rigidBodyMassDiagonal[k] > 0 ? sum / rigidBodyMassDiagonal[k] : null)));
  }
  return {
    modes: count,
    factors,
    effectiveMass,
    cumulativeFraction,
    rigidBodyMass: [...rigidBodyMassDiagonal],
    directions: RIGID_BODY_DIRECTIONS,
  };
}

/** Cumulative fraction in direction k over modes 0..last (last = −1 → 0; null = no mass). */
export function cumulativeFractionAt(p: Participation, direction: number, lastMode: number): number | null {
  if (lastMode < 0 || p.modes === 0) return 0;
  return p.cumulativeFraction[Math.min(lastMode, p.modes - 1)][direction];
}
