/**
 * Checks run on every solution and returned as data (never thrown, never hidden):
 *
 *  - Sturm count: by Sylvester's law of inertia the negative pivots of LDLᵀ(K − σM) equal the
 *    number of eigenvalues below σ (M positive semidefinite; infinite eigenvalues of massless
 *    DOFs are not counted). With σ in the gap after λ_N the count must equal N — the proof that
 *    no mode below λ_N was missed (Bathe §11.6; Templates ch. 4).
 *  - eigenpair residual per mode (residual-measure.ts),
 *  - the projections ΦᵀMΦ and ΦᵀKΦ, kept in the result so the rules read these numbers
 *    instead of forming them again,
 *  - M-orthonormality  max |ΦᵀMΦ − I|,
 *  - K-orthogonality   max |ΦᵀKΦ − Λ| / max(|λ_max|, tiny).
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import type { ModalProjections, OrthogonalityCheck } from './modes-types.js';
import { residualsOf } from './rayleigh-ritz.js';
import { relativeResidual } from './residual-measure.js';
import { transposeTimes } from '../dense/block-ops.js';

export interface ShapeChecks {
  /** Eigenpair residual per mode (residual-measure.ts). */
  residuals: Float64Array;
  orthogonality: OrthogonalityCheck;
  projections: ModalProjections;
}

/** Residuals and orthogonality of mass-normalized shapes Φ (n×count) with eigenvalues Λ. */
export function checkShapes(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  eigenvalues: Float64Array,
  shapes: Float64Array,
  stiffnessNorm: number,
): ShapeChecks {
  const n = stiffness.n;
  const k = eigenvalues.length;
  if (k === 0) {
    const empty = new Float64Array(0);
    return { residuals: empty, orthogonality: { massMaxDeviation: 0, stiffnessMaxDeviation: 0 }, projections: { mass: empty, stiffness: empty } };
  }
  const kx = symMultiplyBlock(stiffness, shapes, k, new Float64Array(n * k));
  const mx = symMultiplyBlock(mass, shapes, k, new Float64Array(n * k));
  const norms = residualsOf(shapes, mx, kx, eigenvalues, k, n);
  const residuals = new Float64Array(k);
  // ρ_i per residual-measure.ts
  for (let i = 0; i < k; i++) {
    residuals[i] = relativeResidual(norms.residualNorms[i], norms.stiffnessNorms[i], norms.inertiaNorms[i], norms.vectorNorms[i], stiffnessNorm);
  }
  const mm = transposeTimes(shapes, mx, n, k, k);
  const kk = transposeTimes(shapes, kx, n, k, k);
  let lambdaMax = 0;
  for (let i = 0; i < k; i++) lambdaMax = Math.max(lambdaMax, Math.abs(eigenvalues[i]));
  let massMaxDeviation = 0;
  let stiffnessMaxDeviation = 0;
  // max over all entries of |ΦᵀMΦ − I| and |ΦᵀKΦ − Λ|
  for (let j = 0; j < k; j++) {
    for (let i = 0; i < k; i++) {
      const dm = Math.abs(mm[i + j * k] - (i === j ? 1 : 0));
      const dk = Math.abs(kk[i + j * k] - (i === j ? eigenvalues[i] : 0));
      if (dm > massMaxDeviation) massMaxDeviation = dm;
      if (dk > stiffnessMaxDeviation) stiffnessMaxDeviation = dk;
    }
  }
  const scale = Math.max(lambdaMax, Number.MIN_VALUE);
  return {
    residuals,
    orthogonality: { massMaxDeviation, stiffnessMaxDeviation: stiffnessMaxDeviation / scale },
    projections: { mass: mm, stiffness: kk },
  };
}

/**
 * Two eigenvalues count as one repeated eigenvalue (a cluster: the bending pair of a square tube,
 * a symmetric lattice tower or an axisymmetric part) when |a − b| ≤ 1e-8 · max(|a|, |b|), or when
 * both are rigid-body (zero) eigenvalues, |λ| ≤ `zero`. 1e-8 is our choice: eight digits is what
 * the solver's residual tolerance leaves of a converged eigenvalue with margin (the eigenvalue
 * error goes with the residual squared), and far below any frequency difference a gate reads.
 */
export const CLUSTER_RELATIVE_TOLERANCE = 1e-8;

export function sameEigenvalue(a: number, b: number, zero: number): boolean {
  if (Math.abs(a) <= zero && Math.abs(b) <= zero) return true;
  return Math.abs(a - b) <= CLUSTER_RELATIVE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
}

export interface SturmPlacement {
  shift: number;
  /** Eigenvalues expected below the shift: N, plus the rest of a cluster that straddles N. */
  expectedBelow: number;
  /** Estimates beyond λ_N that coincide with it (sameEigenvalue): the cluster continues past N. */
  clusterRest: number;
}

/**
 * A shift for the Sturm count after λ_N: a quarter of the way into the gap to the next
 * estimate (Ritz values converge from above, so the true λ_{N+1} may sit lower than its
 * estimate; a quarter keeps a margin). Estimates that coincide with λ_N (sameEigenvalue) belong
 * to its cluster: the shift goes past the whole cluster and `clusterRest` says how many more
 * values that is (the front door then returns them too).
 */
export function placeSturmShift(eigenvalues: Float64Array, beyond: number[], zero: number): SturmPlacement {
  const count = eigenvalues.length;
  const last = eigenvalues[count - 1];
  const scale = Math.max(Math.abs(last), ...Array.from(eigenvalues, Math.abs), Number.MIN_VALUE);
  const sortedBeyond = beyond.filter((v) => v >= last || sameEigenvalue(v, last, zero)).sort((a, b) => a - b);
  let top = last;
  let extra = 0;
  // values coinciding with λ_N belong to its cluster
  while (extra < sortedBeyond.length && sameEigenvalue(sortedBeyond[extra], last, zero)) top = Math.max(top, sortedBeyond[extra++]);
  const next = sortedBeyond[extra];
  // no estimate past the cluster: a relative margin, or for rigid-body (zero) eigenvalues the
  // zero threshold itself (their computed values are rounding, 1e-3 of them means nothing)
  const fallback = Math.abs(top) <= zero ? zero : Math.max(1e-3 * scale, Math.abs(top) * 1e-3);
  const gap = next !== undefined ? next - top : fallback;
  return { shift: top + 0.25 * gap, expectedBelow: count + extra, clusterRest: extra };
}
