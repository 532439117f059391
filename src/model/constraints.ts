/**
 * Constraint sets: DOFs removed from K and M before solving (a support through the config,
 * so one exported free-free model can also be checked supported).
 *
 * Removing DOF set C (held at zero) leaves the kept block K_FF, M_FF, F = complement of C.
 * The map `keptDofs[r] = original DOF` lets reports name original DOFs; it is increasing,
 * so rows stay sorted and the diagonal stays first in every kept column.
 */
import type { SymmetricCsc } from '../sparse/csc.js';
import { principalSubmatrix } from '../sparse/permute.js';
import { COMPONENTS, type DofMap } from '../io/dof-map.js';
import { InputError } from '../io/errors.js';
import type { ComponentSelector, NodeRegion } from '../io/config-types.js';

export type { ComponentSelector, NodeRegion };

export interface ConstraintSet {
  /** Name shown in reports (e.g. "base clamp"). */
  name?: string;
  /** Node ids to hold. */
  nodes?: number[];
  /** Inclusive node id range [first, last]. */
  nodeRange?: [number, number];
  /** Nodes on a plane, in a box or on a cylinder's surface (DOF-map coordinates). */
  region?: NodeRegion;
  /** Components held at those nodes (default `all`). */
  components?: ComponentSelector[];
  /** 1-based DOF numbers (rows of K) to hold, e.g. read from a file. */
  dofs?: number[];
}

export interface ReducedModel {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap?: DofMap;
  /** Reduced DOF r is original DOF keptDofs[r] (0-based). */
  keptDofs: Int32Array;
  /** Original DOF i is reduced DOF reducedIndex[i], or −1 when removed. */
  reducedIndex: Int32Array;
  /** Removed original DOFs (0-based, ascending). */
  removedDofs: Int32Array;
}

/** Component codes a selector list stands for. */
function componentCodes(selectors: readonly ComponentSelector[] | undefined, where = 'components'): number[] {
  const codes = new Set<number>();
  // expand each selector to its component codes
  for (const s of selectors ?? ['all']) {
    if (s === 'all') [0, 1, 2, 3, 4, 5].forEach((c) => codes.add(c));
    else if (s === 'translations') [0, 1, 2].forEach((c) => codes.add(c));
    else if (s === 'rotations') [3, 4, 5].forEach((c) => codes.add(c));
    else {
      const c = COMPONENTS.indexOf(s);
      if (c < 0) throw new InputError('config', `unknown component "${String(s)}" (use ux uy uz rx ry rz, all, translations or rotations)`, { where });
      codes.add(c);
    }
  }
  return [...codes].sort();
}

/**
 * Mask (1 = removed) of the DOFs the constraint sets hold. Node selections need the DOF map;
 * a selection that matches no DOF is an input error (a typo in a node id must not pass silently).
 */
export function constrainedDofMask(n: number, dofMap: DofMap | undefined, sets: readonly ConstraintSet[], source = 'config'): Uint8Array {
  const mask = new Uint8Array(n);
  sets.forEach((set, k) => {
    const where = `constraints[${k}]${set.name ? ` (${set.name})` : ''}`;
    let matched = 0;
    // DOF numbers given directly
    for (const d of set.dofs ?? []) {
      if (!Number.isInteger(d) || d < 1 || d > n) throw new InputError(source, `DOF number ${d} is outside 1..${n}`, { where });
      if (!mask[d - 1]) matched++;
      mask[d - 1] = 1;
    }
    if (set.nodes === undefined && set.nodeRange === undefined && set.region === undefined) {
      if (!set.dofs?.length) throw new InputError(source, 'a constraint set needs nodes, nodeRange, region or dofs', { where });
      return;
    }
    if (!dofMap) throw new InputError(source, 'constraints by node or region need a DOF map (dof,node,component,x,y,z)', { where });
    const codes = new Set(componentCodes(set.components, `${where}.components`));
    const nodes = new Set(set.nodes ?? []);
    const [lo, hi] = set.nodeRange ?? [1, 0];
    const inRegion = set.region ? regionTest(set.region, dofMap) : () => false;
    let nodeHits = 0;
    // every DOF at a selected node with a selected component
    for (let i = 0; i < n; i++) {
      const node = dofMap.node[i];
      if (!nodes.has(node) && !(node >= lo && node <= hi) && !inRegion(i)) continue;
      nodeHits++;
      if (!codes.has(dofMap.component[i])) continue;
      mask[i] = 1;
      matched++;
    }
    if (nodeHits === 0) throw new InputError(source, set.region ? 'no node of the DOF map lies in the region (check its coordinates and tolerance)' : 'no DOF of the DOF map belongs to the listed nodes', { where });
    if (matched === 0) throw new InputError(source, 'the listed nodes carry none of the listed components', { where });
  });
  return mask;
}

/** Relative default tolerance of a region: this share of the model's largest extent (our choice). */
export const REGION_TOLERANCE_SHARE = 1e-6;

/** Whether DOF i's node lies in the region (see regionPointTest). */
function regionTest(region: NodeRegion, map: DofMap): (i: number) => boolean {
  const inside = regionPointTest(region, map);
  return (i) => inside(map.x[i], map.y[i], map.z[i]);
}

/**
 * Whether a point lies in the region: on the plane (|x_a − at| ≤ tol), in the box
 * (min − tol ≤ x ≤ max + tol componentwise), or on the cylinder's surface (| ‖p − c‖⊥ − r | ≤ tol,
 * the distance taken across the axis, and from − tol ≤ x_a ≤ to + tol when given). The default
 * tolerance is REGION_TOLERANCE_SHARE of the largest extent of `map`'s nodes.
 */
export function regionPointTest(region: NodeRegion, map: DofMap): (x: number, y: number, z: number) => boolean {
  const coords = [map.x, map.y, map.z];
  // the model's largest extent sets the default tolerance
  let extent = 0;
  for (const c of coords) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < map.n; i++) {
      lo = Math.min(lo, c[i]);
      hi = Math.max(hi, c[i]);
    }
    if (hi > lo) extent = Math.max(extent, hi - lo);
  }
  const tol = region.tolerance ?? REGION_TOLERANCE_SHARE * (extent > 0 ? extent : 1);
  const axisIndex = (a: 'x' | 'y' | 'z'): number => 'xyz'.indexOf(a);
  if ('plane' in region) {
    const a = axisIndex(region.plane.axis);
    return (...p) => Math.abs(p[a] - region.plane.at) <= tol;
  }
  if ('box' in region) {
    const { min, max } = region.box;
    return (...p) => p.every((c, k) => c >= min[k] - tol && c <= max[k] + tol);
  }
  const { axis, through, radius, from, to } = region.cylinder;
  const a = axisIndex(axis);
  const [u, v] = [0, 1, 2].filter((k) => k !== a);
  return (...p) => {
    const along = p[a];
    if (from !== undefined && along < from - tol) return false;
    if (to !== undefined && along > to + tol) return false;
    const r = Math.hypot(p[u] - through[u], p[v] - through[v]);
    return Math.abs(r - radius) <= tol;
  };
}

/** The DOF map restricted to the kept DOFs. */
function reduceDofMap(map: DofMap, keptDofs: Int32Array): DofMap {
  const m = keptDofs.length;
  const node = new Int32Array(m);
  const component = new Uint8Array(m);
  const x = new Float64Array(m);
  const y = new Float64Array(m);
  const z = new Float64Array(m);
  // gather each kept DOF's row of the map
  for (let r = 0; r < m; r++) {
    const i = keptDofs[r];
    node[r] = map.node[i];
    component[r] = map.component[i];
    x[r] = map.x[i];
    y[r] = map.y[i];
    z[r] = map.z[i];
  }
  return { n: m, node, component, x, y, z };
}

/** Remove the DOFs flagged in `removed` (1 = remove) from K, M and the DOF map. */
export function removeDofs(stiffness: SymmetricCsc, mass: SymmetricCsc, dofMap: DofMap | undefined, removed: Uint8Array): ReducedModel {
  const n = stiffness.n;
  const reducedIndex = new Int32Array(n);
  let kept = 0;
  // number the kept DOFs in original order
  for (let i = 0; i < n; i++) reducedIndex[i] = removed[i] ? -1 : kept++;
  const keptDofs = new Int32Array(kept);
  const removedDofs = new Int32Array(n - kept);
  for (let i = 0, k = 0, r = 0; i < n; i++) {
    if (reducedIndex[i] >= 0) keptDofs[k++] = i;
    else removedDofs[r++] = i;
  }
  return {
    stiffness: principalSubmatrix(stiffness, keptDofs),
    mass: principalSubmatrix(mass, keptDofs),
    dofMap: dofMap ? reduceDofMap(dofMap, keptDofs) : undefined,
    keptDofs,
    reducedIndex,
    removedDofs,
  };
}

/** Constraint sets → reduced model in one call. */
export function applyConstraints(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  dofMap: DofMap | undefined,
  sets: readonly ConstraintSet[],
  source = 'config',
): ReducedModel {
  return removeDofs(stiffness, mass, dofMap, constrainedDofMask(stiffness.n, dofMap, sets, source));
}
