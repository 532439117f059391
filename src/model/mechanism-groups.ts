/**
 * Independent mechanisms: the near-zero motions that are not rigid motions of the whole model,
 * split into the parts of the model that move, each named with its nodes, region and kind of
 * motion.
 *
 * 1. Localize. In a model that also has free rigid motions V = R W (n × f), a mechanism vector ψ
 *    is only defined up to a rigid motion of the whole: ψ − V a. The representative kept is
 *    the one that leaves the bulk of the model still: a = argmin Σ_i (ψ − V a)_i² over the DOFs
 *    (with mass) of nodes that do not move, found in passes: all DOFs, then the DOFs of
 *    nodes whose share (after the previous fit) is under 1e-1, 1e-2, 1e-4 and 1e-6 of the largest.
 * 2. Regions. A node moves when its share Σ_j Σ_{i ∈ node} d_i ψ_ji² is at least 1e-6 of the
 *    largest (amplitude 1e-3). Moving nodes joined through K's pattern (an element or spring
 *    couples their DOFs) form one region; disjoint regions are independent mechanisms.
 * 3. Motions of a region. With B = Ψ restricted to the region, the rank of BᵀDB (eigenvalues
 *    above 1e-6 of its largest) is the number of independent motions that live there, and its
 *    leading eigenvectors give a basis of them.
 * 4. Kind. Each basis motion is fitted with a rigid motion of the region, least squares over the
 *    region's DOFs plus the translations of the nodes bordering it (held at zero: the part
 *    turns about what it is attached to). When every motion is explained to 99 %, the set is
 *    classified by ./rigid-motion-kind.ts (rotation about a hinge line, about a pivot node, …).
 */
import { symMultiplyBlock, diagonalOf, type SymmetricCsc } from '../sparse/csc.js';
import { symmetricEigen } from '../dense/symmetric-eigen.js';
import { energyShares, type DofLabels, type NodeShare } from './energy-shares.js';
import { classifyRigidMotions, nodePoints, type RigidMotionKind } from './rigid-motion-kind.js';
import type { Point3 } from './rigid-body-vectors.js';
import { disjointSets } from './disjoint-sets.js';

export interface MechanismGroup {
  /** Independent near-zero motions that live in this part. */
  motions: number;
  /** Moving nodes of the part (DOFs without a DOF map). */
  nodeCount: number;
  /** Their ids (ascending, at most 200). */
  nodes: number[];
  /** Nodes with the largest share of the part's kinetic energy, with their component split. */
  topNodes: NodeShare[];
  /** Bounding box of the moving nodes (null without a DOF map). */
  region: { min: Point3; max: Point3 } | null;
  /** Smallest fraction of a motion (squared norm) that a rigid motion of the part explains. */
  rigidFit: number | null;
  /** Kind of motion when the part moves rigidly (null otherwise or without a DOF map). */
  motion: RigidMotionKind | null;
}

export interface FreeRigidMotions {
  /** R about the reference point, column-major n × 6. */
  rigidVectors: Float64Array;
  /** Free directions (column-major 6 × f). */
  w: Float64Array;
  f: number;
}

/** A node moves when its share is at least this fraction of the largest (amplitude 1e-3; our choice). */
const MOVING_NODE_ENERGY_RATIO = 1e-6;
/** Moving parts described one by one (the rest are counted; our choice). */
export const MAX_DESCRIBED_PARTS = 20;
/** A motion is a rigid motion of its part when a rigid fit explains this fraction of it (our choice). */
const RIGID_FIT_FRACTION = 0.99;

export function mechanismGroups(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  psi: Float64Array,
  m: number,
  labels: DofLabels,
  free: FreeRigidMotions | null,
  top = 3,
): { groups: MechanismGroup[]; unlisted: number } {
  const n = labels.n;
  if (m === 0) return { groups: [], unlisted: 0 };
  const d = diagonalOf(mass).map((x) => (x > 0 ? x : 0));
  const { nodeOfRow, count: nodeCount } = nodeIndex(labels);
  const local = free && free.f > 0 ? localize(psi, m, free, d, nodeOfRow, nodeCount) : psi;
  const energy = nodeEnergy(local, m, d, nodeOfRow, nodeCount);
  const biggest = Math.max(...energy);
  const moving = energy.map((e) => (e >= MOVING_NODE_ENERGY_RATIO * biggest ? 1 : 0));
  const { root, border } = movingRegions(stiffness, nodeOfRow, nodeCount, moving);
  const rowsOf = new Map<number, number[]>();
  // rows of each region, keyed by its root node
  for (let i = 0; i < n; i++) {
    const a = nodeOfRow[i];
    if (!moving[a]) continue;
    const r = root(a);
    (rowsOf.get(r) ?? rowsOf.set(r, []).get(r)!).push(i);
  }
  const regionEnergy = (rows: number[]): number => rows.reduce((s, i) => s + energy[nodeOfRow[i]], 0);
  // the most energetic regions first; each described region stores n × motions values, so at most MAX_DESCRIBED_PARTS
  const regions = [...rowsOf.entries()].map(([r, rows]) => ({ r, rows, e: regionEnergy(rows) })).sort((a, b) => b.e - a.e);
  const groups: MechanismGroup[] = [];
  for (const { r, rows } of regions.slice(0, MAX_DESCRIBED_PARTS)) {
    const g = regionMotions(mass, local, m, rows, d, labels, nodeOfRow, [...(border.get(r) ?? [])], top);
    if (g) groups.push(g);
  }
  return { groups: groups.sort((a, b) => b.motions - a.motions || b.nodeCount - a.nodeCount), unlisted: Math.max(0, regions.length - MAX_DESCRIBED_PARTS) };
}

/** Dense 0..N−1 index of each row's node. */
function nodeIndex(labels: DofLabels): { nodeOfRow: Int32Array; count: number } {
  const index = new Map<number, number>();
  const nodeOfRow = new Int32Array(labels.n);
  for (let i = 0; i < labels.n; i++) {
    let k = index.get(labels.node[i]);
    if (k === undefined) index.set(labels.node[i], (k = index.size));
    nodeOfRow[i] = k;
  }
  return { nodeOfRow, count: index.size };
}

/** Σ_j Σ_{i ∈ node} d_i ψ_ji². */
function nodeEnergy(psi: Float64Array, m: number, d: Float64Array, nodeOfRow: Int32Array, count: number): Float64Array {
  const n = nodeOfRow.length;
  const e = new Float64Array(count);
  for (let j = 0; j < m; j++) for (let i = 0; i < n; i++) e[nodeOfRow[i]] += d[i] * psi[j * n + i] ** 2;
  return e;
}

/** ψ_j − V a_j with a_j fitted on the DOFs of nodes that stay still (two passes). */
function localize(psi: Float64Array, m: number, free: FreeRigidMotions, d: Float64Array, nodeOfRow: Int32Array, count: number): Float64Array {
  const n = nodeOfRow.length;
  const f = free.f;
  const v = new Float64Array(n * f);
  // V = R W
  for (let c = 0; c < f; c++) for (let l = 0; l < 6; l++) {
    const w = free.w[c * 6 + l];
    if (w !== 0) for (let i = 0; i < n; i++) v[c * n + i] += w * free.rigidVectors[l * n + i];
  }
  // every DOF with mass counts alike (a node that moves is a node that moves, whatever its inertia)
  const unit = d.map((x) => (x > 0 ? 1 : 0));
  let weight = unit;
  let out = psi;
  // fit on all DOFs, then only on nodes moving less than 1e-1, 1e-2, 1e-4, 1e-6 of the largest (energy)
  for (const ratio of [1e-1, 1e-2, 1e-4, 1e-6, 0]) {
    out = Float64Array.from(psi);
    subtractFits(out, m, v, f, weight, n);
    if (ratio === 0) break;
    const e = nodeEnergy(out, m, d, nodeOfRow, count);
    const cut = ratio * Math.max(...e);
    const next = unit.map((x, i) => (e[nodeOfRow[i]] < cut ? x : 0));
    if (next.some((x) => x > 0)) weight = next;
  }
  return out;
}

/** x_j −= V a_j with (Vᵀ D V) a_j = Vᵀ D x_j (pseudo-inverse) for every column j < m; Vᵀ D V is formed and decomposed once. */
function subtractFits(x: Float64Array, m: number, v: Float64Array, f: number, weight: Float64Array, n: number): void {
  const a = new Float64Array(f * f);
  for (let p = 0; p < f; p++) {
    for (let q = 0; q <= p; q++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += v[p * n + i] * weight[i] * v[q * n + i];
      a[q * f + p] = a[p * f + q] = s;
    }
  }
  const eig = symmetricEigen(Float64Array.from(a), f);
  for (let j = 0; j < m; j++) {
    const b = new Float64Array(f);
    for (let p = 0; p < f; p++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += v[p * n + i] * weight[i] * x[j * n + i];
      b[p] = s;
    }
    const coef = pseudoSolve(eig, b, f);
    for (let p = 0; p < f; p++) if (coef[p] !== 0) for (let i = 0; i < n; i++) x[j * n + i] -= coef[p] * v[p * n + i];
  }
}

/** x = A⁺ b for symmetric A given by its eigenpairs (eigenvalues under 1e-10 of the largest dropped). */
function pseudoSolve(eig: { values: Float64Array; vectors: Float64Array }, b: Float64Array, f: number): Float64Array {
  const cut = 1e-10 * Math.max(0, ...eig.values);
  const x = new Float64Array(f);
  for (let e = 0; e < f; e++) {
    if (!(eig.values[e] > cut)) continue;
    let s = 0;
    for (let r = 0; r < f; r++) s += eig.vectors[e * f + r] * b[r];
    for (let r = 0; r < f; r++) x[r] += (s / eig.values[e]) * eig.vectors[e * f + r];
  }
  return x;
}

/** Union-find of moving nodes over K's pattern, and each region's still neighbours. */
function movingRegions(k: SymmetricCsc, nodeOfRow: Int32Array, count: number, moving: Uint8Array | number[] | Float64Array): { root: (a: number) => number; border: Map<number, Set<number>> } {
  const { find: root, join } = disjointSets(count);
  const edges: [number, number][] = [];
  // K_ij ≠ 0 joins the nodes of rows i and j
  for (let j = 0; j < k.n; j++) {
    for (let p = k.colPtr[j]; p < k.colPtr[j + 1]; p++) {
      if (k.values[p] === 0) continue;
      const a = nodeOfRow[k.rowIdx[p]];
      const b = nodeOfRow[j];
      if (a === b) continue;
      if (moving[a] && moving[b]) join(a, b);
      else if (moving[a] || moving[b]) edges.push(moving[a] ? [a, b] : [b, a]);
    }
  }
  const border = new Map<number, Set<number>>();
  for (const [a, b] of edges) {
    const r = root(a);
    (border.get(r) ?? border.set(r, new Set()).get(r)!).add(b);
  }
  return { root, border };
}

/** Motions living in one region: count, basis, shares, rigid fit and kind. */
function regionMotions(
  mass: SymmetricCsc,
  psi: Float64Array,
  m: number,
  rows: number[],
  d: Float64Array,
  labels: DofLabels,
  nodeOfRow: Int32Array,
  borderNodes: number[],
  top: number,
): MechanismGroup | null {
  const n = labels.n;
  const s = new Float64Array(m * m);
  // S = Bᵀ D B, B = Ψ restricted to the region's rows
  for (let p = 0; p < m; p++) for (let q = 0; q <= p; q++) {
    let sum = 0;
    for (const i of rows) sum += psi[p * n + i] * d[i] * psi[q * n + i];
    s[q * m + p] = s[p * m + q] = sum;
  }
  const eig = symmetricEigen(s, m);
  const largest = Math.max(...eig.values);
  if (!(largest > 0)) return null;
  const keep: number[] = [];
  for (let e = m - 1; e >= 0; e--) if (eig.values[e] > 1e-6 * largest) keep.push(e);
  const basis = new Float64Array(n * keep.length);
  // b_c = B u_e / √μ_e, zero outside the region
  keep.forEach((e, c) => {
    const scale = 1 / Math.sqrt(eig.values[e]);
    for (let q = 0; q < m; q++) {
      const u = eig.vectors[e * m + q] * scale;
      if (u !== 0) for (const i of rows) basis[c * n + i] += u * psi[q * n + i];
    }
  });
  const mb = symMultiplyBlock(mass, basis, keep.length);
  const ids = [...new Set(rows.map((i) => labels.node[i]))].sort((a, b) => a - b);
  const group: MechanismGroup = {
    motions: keep.length,
    nodeCount: ids.length,
    nodes: ids.slice(0, 200),
    topNodes: energyShares(basis, mb, keep.map((_, c) => c), labels, top),
    region: null,
    rigidFit: null,
    motion: null,
  };
  const map = labels.map;
  if (!map) return group;
  group.region = boundingBox(map.x, map.y, map.z, rows);
  const borderRows: number[] = [];
  const borderSet = new Set(borderNodes);
  // translations of the still nodes next to the region (their index is the dense node index)
  for (let i = 0; i < n; i++) if (borderSet.has(nodeOfRow[i]) && map.component[i] < 3) borderRows.push(i);
  const centroid = meanPoint(map.x, map.y, map.z, rows);
  const fit = rigidFit(basis, keep.length, rows, borderRows, map, centroid);
  group.rigidFit = fit.worst;
  if (fit.worst < RIGID_FIT_FRACTION) return group;
  const all = [...rows, ...borderRows];
  const size = Math.max(1e-12, ...all.map((i) => Math.hypot(map.x[i] - centroid[0], map.y[i] - centroid[1], map.z[i] - centroid[2])));
  group.motion = classifyRigidMotions(fit.motions, keep.length, centroid, size, nodePoints(map.node, map.x, map.y, map.z, all));
  return group;
}

/** Rigid motions (t, ω about `p`) fitted to each basis motion; the worst explained fraction. */
function rigidFit(
  basis: Float64Array,
  count: number,
  rows: number[],
  borderRows: number[],
  map: NonNullable<DofLabels['map']>,
  p: Point3,
): { motions: Float64Array; worst: number } {
  const n = map.n;
  const all = [...rows, ...borderRows];
  const rowOf = (i: number): number[] => rigidRow(map.component[i], map.x[i] - p[0], map.y[i] - p[1], map.z[i] - p[2]);
  const a = new Float64Array(36);
  // normal matrix Σ_i r_i r_iᵀ over the region's DOFs and the border's translations
  for (const i of all) {
    const r = rowOf(i);
    for (let q = 0; q < 6; q++) for (let s = 0; s < 6; s++) a[s * 6 + q] += r[q] * r[s];
  }
  const inRegion = new Set(rows);
  const motions = new Float64Array(6 * count);
  let worst = 1;
  for (let c = 0; c < count; c++) {
    const b = new Float64Array(6);
    for (const i of rows) {
      const r = rowOf(i);
      for (let q = 0; q < 6; q++) b[q] += r[q] * basis[c * n + i];
    }
    const x = pseudoSolve(symmetricEigen(Float64Array.from(a), 6), b, 6);
    motions.set(x, c * 6);
    let norm = 0;
    let residual = 0;
    // |b − R x|² over the region (the border's target is 0)
    for (const i of all) {
      const r = rowOf(i);
      let rx = 0;
      for (let q = 0; q < 6; q++) rx += r[q] * x[q];
      const target = inRegion.has(i) ? basis[c * n + i] : 0;
      norm += target * target;
      residual += (target - rx) ** 2;
    }
    worst = Math.min(worst, norm > 0 ? 1 - residual / norm : 0);
  }
  return { motions, worst };
}

/** Row of R for one DOF (component c, offset d from the rotation point), see ./rigid-body-vectors.ts. */
function rigidRow(c: number, dx: number, dy: number, dz: number): number[] {
  const r = [0, 0, 0, 0, 0, 0];
  r[c] = 1;
  if (c === 0) (r[4] = dz), (r[5] = -dy);
  else if (c === 1) (r[3] = -dz), (r[5] = dx);
  else if (c === 2) (r[3] = dy), (r[4] = -dx);
  return r;
}

function meanPoint(x: Float64Array, y: Float64Array, z: Float64Array, rows: number[]): Point3 {
  let sx = 0, sy = 0, sz = 0;
  for (const i of rows) (sx += x[i]), (sy += y[i]), (sz += z[i]);
  const k = Math.max(1, rows.length);
  return [sx / k, sy / k, sz / k];
}

function boundingBox(x: Float64Array, y: Float64Array, z: Float64Array, rows: number[]): { min: Point3; max: Point3 } {
  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  for (const i of rows) {
    const v = [x[i], y[i], z[i]];
    for (let r = 0; r < 3; r++) (min[r] = Math.min(min[r], v[r])), (max[r] = Math.max(max[r], v[r]));
  }
  return { min: min as unknown as Point3, max: max as unknown as Point3 };
}
