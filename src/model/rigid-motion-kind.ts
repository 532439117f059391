/**
 * What kind of rigid motion a set of free motions is: translations, a rotation about an axis,
 * rotations about a point (a pivot), or the whole six.
 *
 * Each motion is a 6-vector c = (t, ω) about a point p: a point x moves u = t + ω × (x − p)
 * (small-rotation kinematics, common practice). For a set of f motions (columns, each scaled to
 * |t|² + L²|ω|² = 1, L a length of the part):
 *  - rotations: the rank r of the ω parts (eigenvalues of L² ΩᵀΩ above 1e-6); the combinations
 *    in its null space are pure translations, their t's span the free translation directions;
 *  - a common centre y = x₀ − p solves t_k + ω_k × y = 0 for every motion, in the least-squares
 *    sense: Σ A_kᵀ A_k y = −Σ A_kᵀ t_k with A_k y = ω_k × y; the minimum-norm solution is the point of the axis (r = 1) nearest p.
 *    When the residual is small the motions are rotations about that axis (r = 1) or point (r ≥ 2).
 * Nodes within 1e-3 L of the axis (or of the centre) are named: the hinge line or the pivot node.
 */
import { symmetricEigen } from '../dense/symmetric-eigen.js';
import type { Point3 } from './rigid-body-vectors.js';

export type RigidMotionKindName = 'translation' | 'rotation-about-axis' | 'rotation-about-point' | 'translation-and-rotation' | 'whole-body';

export interface RigidMotionKind {
  kind: RigidMotionKindName;
  /** Number of independent motions. */
  count: number;
  /** Unit directions spanning the free translations (may be empty). */
  translations: Point3[];
  /** Unit directions spanning the free rotation axes (may be empty). */
  rotationAxes: Point3[];
  /** rotation-about-axis: a point of the axis (nearest the reference point) and the nodes on it. */
  axis: { direction: Point3; point: Point3; nodes: number[] } | null;
  /** rotation-about-point: the centre and the node at it (null when no node is there). */
  pivot: { point: Point3; node: number | null } | null;
}

/** Node positions to name axes and pivots with. */
export interface NodePoints {
  ids: number[];
  xyz: Float64Array;
}

/** A motion with an ω part at least this large (relative, squared) is a rotation (our choice). */
const ROTATION_RANK_TOLERANCE = 1e-6;
/** Relative residual of the common-centre fit below which the motions share an axis or centre (our choice). */
const CENTRE_TOLERANCE = 1e-4;
/** Nodes closer than this times L to an axis or centre are on it (our choice). */
const ON_AXIS_TOLERANCE = 1e-3;

/**
 * Classify f motions (column-major 6 × f, rows t_x t_y t_z ω_x ω_y ω_z) about point p.
 * `lengthM` is a size of the moving part (scales ω against t).
 */
export function classifyRigidMotions(motions: Float64Array, f: number, p: Point3, lengthM: number, nodes: NodePoints): RigidMotionKind {
  const L = lengthM > 0 ? lengthM : 1;
  const c = new Float64Array(6 * f);
  // scale each motion to |t|² + L²|ω|² = 1
  for (let k = 0; k < f; k++) {
    let s = 0;
    for (let r = 0; r < 6; r++) s += (r < 3 ? 1 : L * L) * motions[k * 6 + r] ** 2;
    const inv = s > 0 ? 1 / Math.sqrt(s) : 0;
    for (let r = 0; r < 6; r++) c[k * 6 + r] = motions[k * 6 + r] * inv;
  }
  const gram = new Float64Array(f * f);
  // L² ΩᵀΩ
  for (let a = 0; a < f; a++) for (let b = 0; b < f; b++) {
    let s = 0;
    for (let r = 3; r < 6; r++) s += c[a * 6 + r] * c[b * 6 + r];
    gram[b * f + a] = L * L * s;
  }
  const eig = symmetricEigen(gram, f);
  const rotationCombos: Float64Array[] = [];
  const translationCombos: Float64Array[] = [];
  // split the span into pure translations (ω ≈ 0) and rotations
  for (let e = 0; e < f; e++) {
    const v = new Float64Array(6);
    for (let k = 0; k < f; k++) for (let r = 0; r < 6; r++) v[r] += eig.vectors[e * f + k] * c[k * 6 + r];
    (eig.values[e] > ROTATION_RANK_TOLERANCE ? rotationCombos : translationCombos).push(v);
  }
  const translations = spanDirections(translationCombos.map((v) => [v[0], v[1], v[2]] as Point3));
  const rotationAxes = spanDirections(rotationCombos.map((v) => [v[3], v[4], v[5]] as Point3));
  const base = { count: f, translations, rotationAxes, axis: null, pivot: null };
  if (f >= 6) return { ...base, kind: 'whole-body' };
  if (rotationCombos.length === 0) return { ...base, kind: 'translation' };
  if (translationCombos.length > 0) return { ...base, kind: 'translation-and-rotation' };
  const centre = commonCentre(rotationCombos, L);
  if (centre === null) return { ...base, kind: 'translation-and-rotation' };
  const x0: Point3 = [p[0] + centre[0], p[1] + centre[1], p[2] + centre[2]];
  if (rotationCombos.length === 1) {
    const w = rotationCombos[0];
    const direction = unit([w[3], w[4], w[5]]);
    return { ...base, kind: 'rotation-about-axis', axis: { direction, point: x0, nodes: nodesOnLine(nodes, x0, direction, ON_AXIS_TOLERANCE * L) } };
  }
  return { ...base, kind: 'rotation-about-point', pivot: { point: x0, node: nearestNode(nodes, x0, ON_AXIS_TOLERANCE * L) } };
}

/** y with t_k + ω_k × y ≈ 0 for all k (minimum norm), or null when the residual is not small. */
function commonCentre(motions: Float64Array[], L: number): Point3 | null {
  const a = new Float64Array(9);
  const b = new Float64Array(3);
  // Σ A_kᵀ A_k and −Σ A_kᵀ t_k, A_k y = ω_k × y, A_kᵀ A_k = |ω|² I − ω ωᵀ, A_kᵀ t = t × ω
  for (const v of motions) {
    const w = [v[3], v[4], v[5]];
    const t = [v[0], v[1], v[2]];
    const ww = w[0] ** 2 + w[1] ** 2 + w[2] ** 2;
    for (let r = 0; r < 3; r++) for (let s = 0; s < 3; s++) a[s * 3 + r] += (r === s ? ww : 0) - w[r] * w[s];
    const txw = cross(t, w);
    for (let r = 0; r < 3; r++) b[r] -= txw[r];
  }
  const eig = symmetricEigen(a, 3);
  const cut = 1e-9 * Math.max(...eig.values);
  const y = [0, 0, 0];
  // pseudo-inverse: y = Σ_e (q_eᵀ b / μ_e) q_e over μ_e above the cut
  for (let e = 0; e < 3; e++) {
    if (!(eig.values[e] > cut)) continue;
    let s = 0;
    for (let r = 0; r < 3; r++) s += eig.vectors[e * 3 + r] * b[r];
    for (let r = 0; r < 3; r++) y[r] += (s / eig.values[e]) * eig.vectors[e * 3 + r];
  }
  let residual = 0;
  let size = 0;
  // Σ |t_k + ω_k × y|² against Σ (|t_k|² + L²|ω_k|²)
  for (const v of motions) {
    const wy = cross([v[3], v[4], v[5]], y);
    for (let r = 0; r < 3; r++) residual += (v[r] + wy[r]) ** 2;
    for (let r = 0; r < 6; r++) size += (r < 3 ? 1 : L * L) * v[r] ** 2;
  }
  return residual <= CENTRE_TOLERANCE * size ? [y[0], y[1], y[2]] : null;
}

/** Orthonormal directions spanning the given vectors (eigenvectors of Σ v vᵀ above 1e-6 of the largest). */
function spanDirections(vectors: Point3[]): Point3[] {
  if (vectors.length === 0) return [];
  const s = new Float64Array(9);
  for (const v of vectors) for (let r = 0; r < 3; r++) for (let q = 0; q < 3; q++) s[q * 3 + r] += v[r] * v[q];
  const eig = symmetricEigen(s, 3);
  const top = Math.max(...eig.values);
  const out: Point3[] = [];
  for (let e = 2; e >= 0; e--) if (eig.values[e] > 1e-6 * top) out.push(tidy([eig.vectors[e * 3], eig.vectors[e * 3 + 1], eig.vectors[e * 3 + 2]]));
  // a full span is named by the global axes
  if (out.length === 3) return [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
  return out.slice(0, vectors.length);
}

/** Unit vector with the sign making its largest component positive, round-off cleared. */
function tidy(v: Point3): Point3 {
  const u = unit(v);
  const big = [0, 1, 2].reduce((m, r) => (Math.abs(u[r]) > Math.abs(u[m]) ? r : m), 0);
  const sign = u[big] < 0 ? -1 : 1;
  return u.map((x) => (Math.abs(x) < 1e-9 ? 0 : sign * x)) as unknown as Point3;
}

function unit(v: readonly number[]): Point3 {
  const l = Math.hypot(v[0], v[1], v[2]) || 1;
  return tidyZero([v[0] / l, v[1] / l, v[2] / l]);
}

function tidyZero(v: number[]): Point3 {
  const big = [0, 1, 2].reduce((m, r) => (Math.abs(v[r]) > Math.abs(v[m]) ? r : m), 0);
  const sign = v[big] < 0 ? -1 : 1;
  return [0, 1, 2].map((r) => (Math.abs(v[r]) < 1e-9 ? 0 : sign * v[r])) as unknown as Point3;
}

function cross(a: readonly number[], b: readonly number[]): number[] {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

/** Ids of the nodes within `tol` of the line x0 + s d (d unit), ordered along it. */
function nodesOnLine(nodes: NodePoints, x0: Point3, d: Point3, tol: number): number[] {
  const hits: { id: number; s: number }[] = [];
  // distance to the line: |(x − x0) − ((x − x0)·d) d|
  nodes.ids.forEach((id, k) => {
    const r = [nodes.xyz[3 * k] - x0[0], nodes.xyz[3 * k + 1] - x0[1], nodes.xyz[3 * k + 2] - x0[2]];
    const s = r[0] * d[0] + r[1] * d[1] + r[2] * d[2];
    if (Math.hypot(r[0] - s * d[0], r[1] - s * d[1], r[2] - s * d[2]) <= tol) hits.push({ id, s });
  });
  return hits.sort((a, b) => a.s - b.s).map((h) => h.id);
}

function nearestNode(nodes: NodePoints, x0: Point3, tol: number): number | null {
  let best: number | null = null;
  let bestDistance = tol;
  nodes.ids.forEach((id, k) => {
    const d = Math.hypot(nodes.xyz[3 * k] - x0[0], nodes.xyz[3 * k + 1] - x0[1], nodes.xyz[3 * k + 2] - x0[2]);
    if (d <= bestDistance) {
      bestDistance = d;
      best = id;
    }
  });
  return best;
}

/** Distinct nodes of a DOF map subset with their positions (first DOF of each node gives it). */
export function nodePoints(node: Int32Array, x: Float64Array, y: Float64Array, z: Float64Array, rows?: Iterable<number>): NodePoints {
  const seen = new Set<number>();
  const ids: number[] = [];
  const xyz: number[] = [];
  const list = rows ?? Array.from({ length: node.length }, (_, i) => i);
  for (const i of list) {
    if (seen.has(node[i])) continue;
    seen.add(node[i]);
    ids.push(node[i]);
    xyz.push(x[i], y[i], z[i]);
  }
  return { ids, xyz: Float64Array.from(xyz) };
}
