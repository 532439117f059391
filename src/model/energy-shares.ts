/**
 * Kinetic-energy shares of a set of motions, per node and per component.
 *
 * For M-orthonormal motions ψ_j the kinetic-energy share of DOF i is e_i = Σ_j ψ_ji (M ψ_j)_i
 * (Σ_i e_i = number of motions); a node's share is the sum over its DOFs, and its component
 * split is each DOF's part of that sum. Without a DOF map every DOF is its own "node", named
 * by its 1-based DOF number as in the matrix file.
 */
import { COMPONENTS, type DofMap } from '../io/dof-map.js';

export interface ComponentShare {
  component: string;
  /** Fraction of the node's own energy (0..1). */
  fraction: number;
}

export interface NodeShare {
  /** Node id, or the 1-based DOF number (as in the matrix file) when there is no DOF map. */
  node: number;
  /** 'node' with a DOF map, 'dof' without one (then `node` is a DOF number). */
  kind: 'node' | 'dof';
  /** Fraction of the motions' kinetic energy at this node (0..1). */
  energyFraction: number;
  /** The node's component with the largest share ('' without a DOF map). */
  component: string;
  /** Original 1-based DOF number of that component. */
  dof: number;
  /** The node's energy split by component, largest first, parts under 1 % left out. */
  components: ComponentShare[];
}

/** Who each row is: node and component from the DOF map, or the DOF itself. */
export interface DofLabels {
  n: number;
  /** Node id of each row, or its original 1-based DOF number without a map. */
  node: Int32Array;
  /** Component code of each row, null without a map. */
  component: Uint8Array | null;
  /** Original 0-based DOF of each row (identity when absent). */
  originalDofs?: Int32Array;
  map?: DofMap;
}

export function dofLabels(n: number, dofMap: DofMap | undefined, originalDofs?: Int32Array): DofLabels {
  if (dofMap) return { n, node: dofMap.node, component: dofMap.component, originalDofs, map: dofMap };
  const node = new Int32Array(n);
  // without a map, row r is named by its original DOF number
  for (let r = 0; r < n; r++) node[r] = (originalDofs ? originalDofs[r] : r) + 1;
  return { n, node, component: null, originalDofs };
}

/** A component part is named when it carries at least this fraction of the node's energy (our choice). */
const MIN_COMPONENT_FRACTION = 0.01;

/** Node shares of Σ_{j ∈ cols} ψ_ji (M ψ_j)_i (column-major n × ·), normalized to sum 1, largest `top`. */
export function energyShares(psi: Float64Array, mPsi: Float64Array, cols: readonly number[], labels: DofLabels, top: number): NodeShare[] {
  const n = labels.n;
  const perNode = new Map<number, { energy: number; parts: Map<string, number>; best: number; bestDof: number }>();
  let total = 0;
  // kinetic-energy share of each DOF (negative round-off of a consistent mass counted as 0), summed per node
  for (let i = 0; i < n; i++) {
    let e = 0;
    for (const c of cols) e += psi[c * n + i] * mPsi[c * n + i];
    e = Math.max(0, e);
    total += e;
    const node = labels.node[i];
    let entry = perNode.get(node);
    if (!entry) perNode.set(node, (entry = { energy: 0, parts: new Map(), best: -Infinity, bestDof: i }));
    entry.energy += e;
    const name = labels.component ? COMPONENTS[labels.component[i]] : '';
    entry.parts.set(name, (entry.parts.get(name) ?? 0) + e);
    if (e > entry.best) {
      entry.best = e;
      entry.bestDof = i;
    }
  }
  const norm = total > 0 ? total : 1;
  return [...perNode.entries()]
    .sort((p, q) => q[1].energy - p[1].energy)
    .slice(0, top)
    .map(([node, v]) => ({
      node,
      kind: labels.component ? ('node' as const) : ('dof' as const),
      energyFraction: v.energy / norm,
      component: labels.component ? COMPONENTS[labels.component[v.bestDof]] : '',
      dof: (labels.originalDofs ? labels.originalDofs[v.bestDof] : v.bestDof) + 1,
      components: componentSplit(v.parts, v.energy),
    }));
}

function componentSplit(parts: Map<string, number>, energy: number): ComponentShare[] {
  if (!(energy > 0)) return [];
  return [...parts.entries()]
    .filter(([name]) => name !== '')
    .map(([component, e]) => ({ component, fraction: e / energy }))
    .filter((p) => p.fraction >= MIN_COMPONENT_FRACTION)
    .sort((a, b) => b.fraction - a.fraction);
}

