/**
 * Rigid-body energy: does the stiffness resist a rigid motion (unintended grounding)?
 *
 * For each rigid-body vector r_k (column of R) the strain energy is E_k = ½ r_kᵀ K r_k and the
 * residual (reaction) forces are f_k = K r_k; a free-free model has E_k = 0 and f_k = 0 up to
 * round-off. The energy is compared with the kinetic-energy scale of the same motion,
 *   E_ref,k = ½ λ_ref r_kᵀ M r_k,   so   E_k / E_ref,k = (rᵀKr / rᵀMr) / λ_ref = (f_r / f_ref)²,
 * the squared ratio of the rigid vector's Rayleigh frequency to a reference frequency.
 * λ_ref is the first elastic eigenvalue when modes are known; otherwise the Rayleigh–Ritz
 * value of smooth deformation fields (./elastic-estimate.ts, an upper bound of λ₇, so the check
 * is somewhat looser); failing that, the stiffness/mass scale tr_t(K) / tr_t(M) over
 * translational DOFs (an upper-spectrum scale: a much looser check, reported as such).
 *
 * Where: residuals of the mass-normalized vectors r̂_k = r_k / √(r_kᵀ M r_k) make the six
 * directions comparable; each DOF scores max_k |(K r̂_k)_i|, each node its largest DOF score.
 */
import { symMultiplyBlock, diagonalOf, type SymmetricCsc } from '../sparse/csc.js';
import { COMPONENTS, type DofMap } from '../io/dof-map.js';
import { RIGID_BODY_DIRECTIONS, type RigidBodyDirection, type RigidBodyVectors } from './rigid-body-vectors.js';

export type ReferenceEigenvalueSource = 'first-elastic-mode' | 'smooth-field-estimate' | 'stiffness-mass-scale';

export interface DirectionEnergy {
  direction: RigidBodyDirection;
  /** ½ rᵀ K r for the unit rigid motion (unit translation, or 1 rad about the axis). */
  strainEnergy: number;
  /** ½ λ_ref rᵀ M r. */
  referenceEnergy: number;
  /** strainEnergy / referenceEnergy (null when the direction carries no mass). */
  relativeEnergy: number | null;
}

export interface ResidualAtNode {
  node: number;
  /** Component of the node's largest residual (ux … rz). */
  component: string;
  /** Original 1-based DOF number of that component. */
  dof: number;
  /** Rigid-body direction whose motion loads it most. */
  direction: RigidBodyDirection;
  /** |K r̂|_i for the mass-normalized rigid vector (comparable across nodes and directions). */
  normalizedResidual: number;
  /** (K r)_i for the unit rigid motion of that direction (a force, or a moment on rotation DOFs). */
  residualForce: number;
}

export interface RigidBodyEnergy {
  referenceEigenvalue: number;
  referenceSource: ReferenceEigenvalueSource;
  directions: DirectionEnergy[];
  maxRelativeEnergy: number;
  worstDirection: RigidBodyDirection | null;
  /** Rᵀ K R, row-major 6 × 6 (twice the strain energies of the rigid motions and their couplings). */
  rigidBodyStiffness: number[];
  /** Nodes with the largest residuals, largest first (at most `top`). */
  largestResiduals: ResidualAtNode[];
}

export interface RigidBodyEnergyOptions {
  referenceEigenvalue: number;
  referenceSource: ReferenceEigenvalueSource;
  /** Original DOF number of each row (after constraints); identity when absent. */
  originalDofs?: Int32Array;
  top?: number;
}

/**
 * λ scale without modes: Σ K_ii / Σ M_ii over translational DOFs with mass (all DOFs when
 * the map is absent or has no translations). Units of an eigenvalue, (rad/s)².
 */
export function stiffnessMassScale(stiffness: SymmetricCsc, mass: SymmetricCsc, dofMap?: DofMap): number {
  const k = diagonalOf(stiffness);
  const m = diagonalOf(mass);
  let sk = 0;
  let sm = 0;
  let translations = false;
  if (dofMap) for (let i = 0; i < dofMap.n; i++) if (dofMap.component[i] < 3) translations = true;
  // traces over the DOFs that share the units of a translation
  for (let i = 0; i < k.length; i++) {
    if (translations && dofMap && dofMap.component[i] >= 3) continue;
    if (!(m[i] > 0)) continue;
    sk += k[i];
    sm += m[i];
  }
  return sm > 0 ? sk / sm : 0;
}

export function rigidBodyEnergy(
  stiffness: SymmetricCsc,
  rigid: RigidBodyVectors,
  rigidBodyMassDiagonal: readonly number[],
  dofMap: DofMap,
  options: RigidBodyEnergyOptions,
): RigidBodyEnergy {
  const n = rigid.n;
  const kr = symMultiplyBlock(stiffness, rigid.vectors, 6);
  const lambda = options.referenceEigenvalue;
  const directions: DirectionEnergy[] = [];
  let maxRelativeEnergy = 0;
  let worstDirection: RigidBodyDirection | null = null;
  // energy of each unit rigid motion against its kinetic-energy scale
  for (let k = 0; k < 6; k++) {
    let rkr = 0;
    for (let i = 0, o = k * n; i < n; i++) rkr += rigid.vectors[o + i] * kr[o + i];
    const mk = rigidBodyMassDiagonal[k];
    const strainEnergy = 0.5 * rkr;
    const referenceEnergy = 0.5 * lambda * mk;
    const relativeEnergy = mk > 0 && referenceEnergy > 0 ? strainEnergy / referenceEnergy : null;
    directions.push({ direction: RIGID_BODY_DIRECTIONS[k], strainEnergy, referenceEnergy, relativeEnergy });
    if (relativeEnergy !== null && Math.abs(relativeEnergy) > Math.abs(maxRelativeEnergy)) {
      maxRelativeEnergy = relativeEnergy;
      worstDirection = RIGID_BODY_DIRECTIONS[k];
    }
  }
  if (worstDirection === null) maxRelativeEnergy = 0;
  const rigidBodyStiffness = new Array<number>(36).fill(0);
  // (RᵀKR)_kl = r_kᵀ (K r_l), symmetrized
  for (let k = 0; k < 6; k++) {
    for (let l = 0; l <= k; l++) {
      let s = 0;
      let t = 0;
      for (let i = 0, ok = k * n, ol = l * n; i < n; i++) {
        s += rigid.vectors[ok + i] * kr[ol + i];
        t += rigid.vectors[ol + i] * kr[ok + i];
      }
      rigidBodyStiffness[k * 6 + l] = rigidBodyStiffness[l * 6 + k] = 0.5 * (s + t);
    }
  }
  return {
    referenceEigenvalue: lambda,
    referenceSource: options.referenceSource,
    directions,
    maxRelativeEnergy,
    worstDirection,
    rigidBodyStiffness,
    largestResiduals: largestResiduals(kr, rigidBodyMassDiagonal, dofMap, options.originalDofs, options.top ?? 10),
  };
}

/** Nodes are listed down to this fraction of the largest residual (our choice). */
const RESIDUAL_LIST_RATIO = 0.01;

/** Top nodes by residual of the mass-normalized rigid vectors. */
function largestResiduals(
  kr: Float64Array,
  g: readonly number[],
  dofMap: DofMap,
  originalDofs: Int32Array | undefined,
  top: number,
): ResidualAtNode[] {
  const n = dofMap.n;
  const scale = g.map((gk) => (gk > 0 ? 1 / Math.sqrt(gk) : 0));
  const best = new Map<number, ResidualAtNode>();
  // each DOF: its largest normalized residual over the six directions; keep the node's largest
  for (let i = 0; i < n; i++) {
    let score = 0;
    let dir = 0;
    for (let k = 0; k < 6; k++) {
      const s = Math.abs(kr[k * n + i]) * scale[k];
      if (s > score) {
        score = s;
        dir = k;
      }
    }
    if (!(score > 0)) continue;
    const node = dofMap.node[i];
    const prev = best.get(node);
    if (prev && prev.normalizedResidual >= score) continue;
    best.set(node, {
      node,
      component: COMPONENTS[dofMap.component[i]],
      dof: (originalDofs ? originalDofs[i] : i) + 1,
      direction: RIGID_BODY_DIRECTIONS[dir],
      normalizedResidual: score,
      residualForce: kr[dir * n + i],
    });
  }
  const sorted = [...best.values()].sort((a, b) => b.normalizedResidual - a.normalizedResidual);
  // suspects down to 1 % of the largest residual: the round-off neighbours of a free model stay out
  const cut = sorted.length ? RESIDUAL_LIST_RATIO * sorted[0].normalizedResidual : 0;
  return sorted.filter((r) => r.normalizedResidual >= cut).slice(0, top);
}
