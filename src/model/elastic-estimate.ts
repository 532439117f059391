/**
 * An upper estimate of the first elastic eigenvalue without solving: Rayleigh–Ritz over smooth
 * deformation fields that are M-orthogonal to the rigid-body vectors.
 *
 * Basis: the six rigid-body vectors R, then quadratic displacement fields u_a = p(ξ) for each
 * translation a and p ∈ {ξ², η², ζ², ξη, ηζ, ζξ} (ξ = (x − c_x)/L, L the model's extent), and,
 * when the model has rotational DOFs, linear rotation fields θ_k = p for p ∈ {ξ, η, ζ} (together
 * they contain beam bending, v = ξ², θ = dv/dx). Modified Gram–Schmidt in the M inner product
 * (twice) makes the basis M-orthonormal with R first; Q₂ = the columns after R. By the
 * Courant–Fischer theorem the smallest eigenvalue of Q₂ᵀ K Q₂ bounds from above the smallest
 * eigenvalue of K on the M-orthogonal complement of span(R) — for a free-free model, λ₇.
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import type { DofMap } from '../io/dof-map.js';
import type { RigidBodyVectors } from './rigid-body-vectors.js';
import { symmetricEigen } from '../dense/symmetric-eigen.js';

/** Smallest Rayleigh–Ritz value over smooth fields M-orthogonal to R, or null when none exists. */
export function elasticEigenvalueEstimate(stiffness: SymmetricCsc, mass: SymmetricCsc, dofMap: DofMap, rigid: RigidBodyVectors): number | null {
  const n = dofMap.n;
  const fields = smoothFields(dofMap, rigid);
  const q = fields.length / n;
  const basis = new Float64Array(rigid.vectors.length + fields.length);
  basis.set(rigid.vectors, 0);
  basis.set(fields, rigid.vectors.length);
  const { vectors, kept, rigidKept } = mOrthonormalize(mass, basis, 6 + q, 6);
  const elastic = kept - rigidKept;
  if (elastic <= 0) return null;
  const q2 = vectors.subarray(rigidKept * n, kept * n);
  const kq = symMultiplyBlock(stiffness, q2, elastic);
  const h = new Float64Array(elastic * elastic);
  // H = Q₂ᵀ K Q₂, symmetrized
  for (let a = 0; a < elastic; a++) {
    for (let b = 0; b <= a; b++) {
      let s = 0;
      for (let i = 0, oa = a * n, ob = b * n; i < n; i++) s += q2[oa + i] * kq[ob + i] + q2[ob + i] * kq[oa + i];
      h[a * elastic + b] = h[b * elastic + a] = 0.5 * s;
    }
  }
  const lowest = symmetricEigen(Float64Array.from(h), elastic).values[0];
  return lowest > 0 ? lowest : null;
}

/** Quadratic translation fields and linear rotation fields about the reference point, column-major. */
function smoothFields(dofMap: DofMap, rigid: RigidBodyVectors): Float64Array {
  const n = dofMap.n;
  const [cx, cy, cz] = rigid.referencePoint;
  let extent = 0;
  let rotations = false;
  // the model's extent from the reference point, and whether rotational DOFs exist
  for (let i = 0; i < n; i++) {
    extent = Math.max(extent, Math.abs(dofMap.x[i] - cx), Math.abs(dofMap.y[i] - cy), Math.abs(dofMap.z[i] - cz));
    if (dofMap.component[i] >= 3) rotations = true;
  }
  const scale = extent > 0 ? 1 / extent : 1;
  const q = 18 + (rotations ? 9 : 0);
  const out = new Float64Array(q * n);
  // each DOF's value in each field: quadratic monomials on translations, linear ones on rotations
  for (let i = 0; i < n; i++) {
    const c = dofMap.component[i];
    const xi = (dofMap.x[i] - cx) * scale;
    const eta = (dofMap.y[i] - cy) * scale;
    const zeta = (dofMap.z[i] - cz) * scale;
    if (c < 3) {
      const quad = [xi * xi, eta * eta, zeta * zeta, xi * eta, eta * zeta, zeta * xi];
      for (let p = 0; p < 6; p++) out[(6 * c + p) * n + i] = quad[p];
    } else if (rotations) {
      const lin = [xi, eta, zeta];
      for (let p = 0; p < 3; p++) out[(18 + 3 * (c - 3) + p) * n + i] = lin[p];
    }
  }
  return out;
}

/**
 * Modified Gram–Schmidt in the M inner product, two passes, M q_k kept for every accepted
 * column (one M-product per column); columns that lose all but 1e-8 of their M-norm are
 * dropped. Returns the kept columns packed in front and how many of the first `rigidCount`
 * survived.
 */
function mOrthonormalize(mass: SymmetricCsc, v: Float64Array, count: number, rigidCount: number): { vectors: Float64Array; kept: number; rigidKept: number } {
  const n = mass.n;
  const mq = new Float64Array(count * n);
  const work = new Float64Array(n);
  let kept = 0;
  let rigidKept = 0;
  // orthogonalize column j against the kept ones, then normalize or drop it
  for (let j = 0; j < count; j++) {
    const col = v.subarray(j * n, j * n + n);
    const original = mNorm(mass, col, work);
    if (!(original > 0)) continue;
    for (let pass = 0; pass < 2; pass++) {
      for (let k = 0; k < kept; k++) {
        const qk = v.subarray(k * n, k * n + n);
        const mqk = mq.subarray(k * n, k * n + n);
        let dot = 0;
        for (let i = 0; i < n; i++) dot += col[i] * mqk[i];
        for (let i = 0; i < n; i++) col[i] -= dot * qk[i];
      }
    }
    const norm = mNorm(mass, col, work);
    if (!(norm > 1e-8 * original)) continue;
    const target = v.subarray(kept * n, kept * n + n);
    const mTarget = mq.subarray(kept * n, kept * n + n);
    // q = col / ‖col‖_M and M q = work / ‖col‖_M (work holds M col from mNorm)
    for (let i = 0; i < n; i++) {
      target[i] = col[i] / norm;
      mTarget[i] = work[i] / norm;
    }
    if (j < rigidCount) rigidKept++;
    kept++;
  }
  return { vectors: v, kept, rigidKept };
}

/** ‖x‖_M; leaves M x in `work`. */
function mNorm(mass: SymmetricCsc, x: Float64Array, work: Float64Array): number {
  symMultiplyBlock(mass, x, 1, work);
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * work[i];
  return Math.sqrt(Math.max(0, s));
}
