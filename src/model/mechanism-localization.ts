/**
 * Where is a mechanism? Near-zero modes beyond the rigid-body motions, located by their
 * kinetic energy.
 *
 * Near-zero space. Z = the solved modes with λ ≈ 0 (see `countNearZeroModes`), M-orthonormal.
 * Free rigid motions. The rigid motions R the model can actually make without strain: the
 * 6 × 6 pencil (RᵀKR) v = μ (RᵀMR) v, directions with μ ≤ 1e-6 · λ_ref (λ_ref the first elastic
 * eigenvalue) — six for a free-free 3-D model, none for a supported one. With W those
 * directions (WᵀGW = I, G = RᵀMR), R_F = R W is M-orthonormal.
 * Rigid part of Z. B = Zᵀ M R_F (k × f); A = B Bᵀ = Zᵀ M P_F Z, P_F the M-orthogonal projector
 * onto span(R_F); its eigenvalues are cos² of the principal angles between Z and span(R_F).
 * Eigenvectors u with cos² ≥ ½ are the free rigid motions; the others span the mechanisms
 * ψ = Z u, M-orthogonal to them: the rigid component has been removed. For a free-free model
 * this is the M-orthogonal projection onto the complement of span(R); for a supported model
 * every near-zero mode is a mechanism.
 * Where. For M-orthonormal ψ_j the kinetic-energy share of DOF i is e_i = Σ_j ψ_ji (M ψ_j)_i
 * (Σ_i e_i = number of mechanisms; invariant to how the solver mixed degenerate modes);
 * nodes are ranked by the sum of their DOFs' shares (./energy-shares.ts, with the component split).
 * Which parts move, and how (hinge line, pivot node, …): ./mechanism-groups.ts.
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import type { DofMap } from '../io/dof-map.js';
import type { ModesResult } from '../eigen/modes-types.js';
import { symmetricEigen } from '../dense/symmetric-eigen.js';
import { dofLabels, energyShares, type NodeShare } from './energy-shares.js';
import { mechanismGroups, type MechanismGroup } from './mechanism-groups.js';

export type { NodeShare } from './energy-shares.js';

/** Eigenvalues at most this times the stiffness/mass scale are round-off zeros (our choice). */
const ROUND_OFF_ZERO_RATIO = 1e-10;
/** A jump λ_{i+1}/λ_i at least this large (frequency ratio 1000) separates near-zero modes (our choice). */
const NEAR_ZERO_GAP_RATIO = 1e6;

/**
 * Directions of span(R) the model is free to move in: (RᵀKR) v = μ G v with μ ≤ λ_ref / 1e6.
 * Returns W (column-major 6 × f, WᵀGW = I) and the μ of every represented direction, ascending.
 */
export function freeRigidBodyDirections(
  rigidBodyStiffness: readonly number[],
  rigidBodyMass: readonly number[],
  referenceEigenvalue: number,
): { w: Float64Array; free: number; ratios: number[] } {
  const d = [0, 1, 2, 3, 4, 5].map((k) => (rigidBodyMass[k * 7] > 0 ? 1 / Math.sqrt(rigidBodyMass[k * 7]) : 0));
  const s = new Float64Array(36);
  // D G D, unit diagonal where a direction has mass
  for (let r = 0; r < 6; r++) for (let c = 0; c < 6; c++) s[c * 6 + r] = d[r] * rigidBodyMass[r * 6 + c] * d[c];
  const gEig = symmetricEigen(Float64Array.from(s), 6);
  const cut = 1e-10 * Math.max(...gEig.values);
  const keep: number[] = [];
  for (let e = 0; e < 6; e++) if (gEig.values[e] > cut) keep.push(e);
  const q = keep.length;
  const x = new Float64Array(6 * q);
  // X = D U Σ^(−1/2): XᵀGX = I on the represented directions
  keep.forEach((e, c) => {
    for (let r = 0; r < 6; r++) x[c * 6 + r] = (d[r] * gEig.vectors[e * 6 + r]) / Math.sqrt(gEig.values[e]);
  });
  const h = new Float64Array(q * q);
  // H = Xᵀ (RᵀKR) X
  for (let a = 0; a < q; a++) {
    for (let b = 0; b < q; b++) {
      let sum = 0;
      for (let r = 0; r < 6; r++) for (let c = 0; c < 6; c++) sum += x[a * 6 + r] * rigidBodyStiffness[r * 6 + c] * x[b * 6 + c];
      h[b * q + a] = sum;
    }
  }
  const hEig = symmetricEigen(Float64Array.from(h), q);
  const limit = referenceEigenvalue / NEAR_ZERO_GAP_RATIO;
  const freeColumns: number[] = [];
  for (let e = 0; e < q; e++) if (hEig.values[e] <= limit) freeColumns.push(e);
  const w = new Float64Array(6 * freeColumns.length);
  // W = X Y_free
  freeColumns.forEach((e, c) => {
    for (let r = 0; r < 6; r++) {
      let sum = 0;
      for (let a = 0; a < q; a++) sum += x[a * 6 + r] * hEig.vectors[e * q + a];
      w[c * 6 + r] = sum;
    }
  });
  const ratios = Array.from(hEig.values, (mu) => (referenceEigenvalue > 0 ? mu / referenceEigenvalue : mu));
  return { w, free: freeColumns.length, ratios };
}

/**
 * Number of leading solved modes that are near zero: every |λ| ≤ 1e-10 · scale, then, among
 * the rest, up to the largest jump λ_{i+1}/λ_i when it is ≥ 1e6 (a weak, not exactly zero,
 * mechanism or grounding stays on the zero side of a clear gap).
 */
export function countNearZeroModes(eigenvalues: Float64Array, stiffnessMassScale: number): number {
  const count = eigenvalues.length;
  const zero = ROUND_OFF_ZERO_RATIO * stiffnessMassScale;
  let z = 0;
  // leading round-off zeros
  while (z < count && Math.abs(eigenvalues[z]) <= zero) z++;
  let bestRatio = NEAR_ZERO_GAP_RATIO;
  let split = z;
  // the largest clear gap among the remaining positive eigenvalues
  for (let i = z; i + 1 < count; i++) {
    if (!(eigenvalues[i] > 0)) continue;
    const ratio = eigenvalues[i + 1] / eigenvalues[i];
    if (ratio >= bestRatio) {
      bestRatio = ratio;
      split = i + 1;
    }
  }
  return split;
}

export interface MechanismReport {
  /** Near-zero modes examined (the first k solved modes). */
  nearZeroModes: number;
  /** Of those, how many are free rigid-body motions (cos² ≥ ½ with span(R)). */
  freeRigidBodyMotions: number;
  /** Near-zero motions that are not rigid: mechanisms. */
  mechanisms: number;
  /** cos² of the principal angles between the near-zero space and span(R), descending. */
  rigidAlignment: number[];
  /** Nodes carrying most of the mechanisms' kinetic energy, largest first. */
  nodes: NodeShare[];
  /** Per mechanism, its top nodes (basis chosen by the projection; degenerate ones may mix). */
  perMechanism: NodeShare[][];
  /** Independent mechanisms: the parts that move, each with its motions, nodes and kind (./mechanism-groups.ts). */
  groups: MechanismGroup[];
  /** Further moving parts found but not described (beyond MAX_DESCRIBED_PARTS). */
  groupsNotListed: number;
}

export interface MechanismOptions {
  nearZeroModes: number;
  /** Free rigid directions from `freeRigidBodyDirections` (column-major 6 × free). */
  freeDirections: Float64Array;
  freeCount: number;
  originalDofs?: Int32Array;
  top?: number;
  /** K (its pattern joins moving nodes into parts) and R (n × 6), for the independent mechanisms. */
  stiffness?: SymmetricCsc;
  rigidVectors?: Float64Array;
}

export function localizeMechanisms(
  mass: SymmetricCsc,
  modes: ModesResult,
  massTimesR: Float64Array,
  dofMap: DofMap,
  options: MechanismOptions,
): MechanismReport {
  const n = modes.n;
  const k = Math.min(options.nearZeroModes, modes.eigenvalues.length);
  const top = options.top ?? 10;
  const z = modes.shapes.subarray(0, n * k);
  const a = rigidProjectionGram(z, massTimesR, options.freeDirections, options.freeCount, n, k);
  const eig = symmetricEigen(Float64Array.from(a), k);
  const mechanismColumns: number[] = [];
  const alignment: number[] = [];
  // eigenvalues of A ascending: small cos² = mechanism directions
  for (let j = 0; j < k; j++) {
    alignment.push(Math.min(1, Math.max(0, eig.values[j])));
    if (eig.values[j] < 0.5) mechanismColumns.push(j);
  }
  alignment.reverse();
  const psi = combine(z, eig.vectors, mechanismColumns, n, k);
  const mPsi = symMultiplyBlock(mass, psi, mechanismColumns.length);
  const all = mechanismColumns.map((_, j) => j);
  const labels = dofLabels(n, dofMap, options.originalDofs);
  const free = options.rigidVectors && options.freeCount > 0 ? { rigidVectors: options.rigidVectors, w: options.freeDirections, f: options.freeCount } : null;
  const parts = options.stiffness ? mechanismGroups(options.stiffness, mass, psi, mechanismColumns.length, labels, free) : { groups: [], unlisted: 0 };
  return {
    nearZeroModes: k,
    freeRigidBodyMotions: k - mechanismColumns.length,
    mechanisms: mechanismColumns.length,
    rigidAlignment: alignment,
    nodes: mechanismColumns.length ? energyShares(psi, mPsi, all, labels, top) : [],
    perMechanism: all.map((j) => energyShares(psi, mPsi, [j], labels, Math.min(top, 3))),
    groups: parts.groups,
    groupsNotListed: parts.unlisted,
  };
}

/**
 * Without a DOF map: the first k solved modes taken as they are (no rigid motions can be
 * formed), split into independent parts by K's pattern, named by DOF numbers.
 */
export function localizeNearZeroModesByDof(stiffness: SymmetricCsc, mass: SymmetricCsc, modes: ModesResult, k: number, originalDofs?: Int32Array): { groups: MechanismGroup[]; unlisted: number } {
  const count = Math.min(k, modes.eigenvalues.length);
  if (count === 0) return { groups: [], unlisted: 0 };
  return mechanismGroups(stiffness, mass, modes.shapes.subarray(0, modes.n * count), count, dofLabels(modes.n, undefined, originalDofs), null);
}

/** Top nodes (or DOFs) of one solved mode by kinetic-energy share, with their component split. */
export function modeLocation(mass: SymmetricCsc, modes: ModesResult, index: number, dofMap: DofMap | undefined, top = 3, originalDofs?: Int32Array): NodeShare[] {
  const n = modes.n;
  const phi = modes.shapes.slice(index * n, (index + 1) * n);
  const mPhi = symMultiplyBlock(mass, phi, 1);
  return energyShares(phi, mPhi, [0], dofLabels(n, dofMap, originalDofs), top);
}

/** A = B Bᵀ with B = Zᵀ (M R) W (k × f), W the free rigid directions. */
function rigidProjectionGram(z: Float64Array, mr: Float64Array, w: Float64Array, f: number, n: number, k: number): Float64Array {
  const zmr = new Float64Array(k * 6);
  // (Zᵀ M R)_jl = z_jᵀ (M r_l)
  for (let j = 0; j < k; j++) {
    for (let l = 0; l < 6; l++) {
      let s = 0;
      for (let i = 0, oj = j * n, ol = l * n; i < n; i++) s += z[oj + i] * mr[ol + i];
      zmr[j * 6 + l] = s;
    }
  }
  const b = new Float64Array(k * f);
  // B = (Zᵀ M R) W
  for (let j = 0; j < k; j++) for (let c = 0; c < f; c++) {
    let s = 0;
    for (let l = 0; l < 6; l++) s += zmr[j * 6 + l] * w[c * 6 + l];
    b[j * f + c] = s;
  }
  const a = new Float64Array(k * k);
  // A_pq = Σ_c B_pc B_qc
  for (let p = 0; p < k; p++) for (let q = 0; q < k; q++) {
    let s = 0;
    for (let c = 0; c < f; c++) s += b[p * f + c] * b[q * f + c];
    a[q * k + p] = s;
  }
  return a;
}

/** Ψ = Z U(:, cols), column-major n × |cols|. */
function combine(z: Float64Array, u: Float64Array, cols: number[], n: number, k: number): Float64Array {
  const psi = new Float64Array(n * cols.length);
  // ψ_c = Σ_j z_j u_jc
  cols.forEach((col, c) => {
    for (let j = 0; j < k; j++) {
      const w = u[col * k + j];
      if (w === 0) continue;
      for (let i = 0, oz = j * n, op = c * n; i < n; i++) psi[op + i] += w * z[oz + i];
    }
  });
  return psi;
}
