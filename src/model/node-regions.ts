/**
 * Nodes in groups: connected regions of flagged nodes (two nodes linked when a matrix has an
 * entry between their DOFs; union–find over the stored entries, O(nnz)), node-id runs and
 * centroids for naming a group.
 */
import type { DofMap } from '../io/dof-map.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import type { NodeIndex } from './node-index.js';
import type { NodeRanges } from './change-facts.js';
import { disjointSets } from './disjoint-sets.js';

/** Coordinates of each node (first DOF of the node in the map), or null without a map. */
export function nodeCoordinates(ids: Int32Array, map: DofMap | null | undefined): [number, number, number][] | null {
  if (!map) return null;
  const place = new Map<number, [number, number, number]>();
  for (let d = 0; d < map.n; d++) if (!place.has(map.node[d])) place.set(map.node[d], [map.x[d], map.y[d], map.z[d]]);
  return Array.from(ids, (id) => place.get(id) ?? [NaN, NaN, NaN]);
}

/** Region number (0-based) of each flagged node, −1 for the others; numbered by descending size, then lowest node. */
export function connectedRegions(flagged: Int8Array, index: NodeIndex, matrices: SymmetricCsc[]): Int32Array {
  const nNodes = flagged.length;
  const { find, join } = disjointSets(nNodes);
  // link two flagged nodes that share an entry of K or M
  for (const a of matrices) {
    for (let j = 0; j < a.n; j++) {
      const nj = index.nodeOf[j];
      if (!flagged[nj]) continue;
      for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
        const ni = index.nodeOf[a.rowIdx[p]];
        if (ni !== nj && flagged[ni]) join(ni, nj);
      }
    }
  }
  const members = new Map<number, number[]>();
  for (let q = 0; q < nNodes; q++) {
    if (!flagged[q]) continue;
    const r = find(q);
    const list = members.get(r) ?? [];
    list.push(q);
    members.set(r, list);
  }
  const ordered = [...members.values()].sort((u, v) => v.length - u.length || u[0] - v[0]);
  const regionOf = new Int32Array(nNodes).fill(-1);
  ordered.forEach((list, r) => list.forEach((q) => (regionOf[q] = r)));
  return regionOf;
}

/** Ascending runs of consecutive ids: [first, last] pairs. */
export function nodeRanges(ids: number[]): NodeRanges {
  const sorted = [...ids].sort((a, b) => a - b);
  const out: NodeRanges = [];
  for (const id of sorted) {
    const last = out[out.length - 1];
    if (last && id === last[1] + 1) last[1] = id;
    else if (!last || id !== last[1]) out.push([id, id]);
  }
  return out;
}

/** Mean position of nodes with coordinates, or null. */
export function centroid(nodes: { at: [number, number, number] | null }[]): [number, number, number] | null {
  const placed = nodes.filter((t) => t.at !== null && t.at.every(Number.isFinite));
  if (placed.length === 0) return null;
  const s = [0, 1, 2].map((k) => placed.reduce((sum, t) => sum + t.at![k], 0) / placed.length);
  return [s[0], s[1], s[2]];
}


/** "1201–1240, 1250" (at most `cap` runs, then "and N more nodes"). */
export function describeRanges(ranges: NodeRanges, cap = 4): string {
  const shown = ranges.slice(0, cap).map(([lo, hi]) => (lo === hi ? String(lo) : `${lo}–${hi}`));
  const rest = ranges.slice(cap).reduce((s, [lo, hi]) => s + hi - lo + 1, 0);
  return rest > 0 ? `${shown.join(', ')} and ${rest} more` : shown.join(', ');
}

/** "(2.0, 0.4, 1.1)": three significant digits, at least one decimal; −0 shown as 0. */
export function describePoint(p: readonly [number, number, number]): string {
  const f = (v: number): string => {
    const r = Number(v.toPrecision(3));
    const t = Math.abs(r) < 1e-12 ? '0' : String(r);
    return /[.e]/.test(t) ? t : `${t}.0`;
  };
  return `(${p.map(f).join(', ')})`;
}

/**
 * How a group of nodes is named in messages and reports: "nodes 1201–1240 near (2.0, 0.4, 1.1)",
 * with the length unit's name after the point when the config names one ("… (2.0, 0.4, 1.1) m").
 */
export function regionLabel(ranges: NodeRanges, at: readonly [number, number, number] | null, lengthUnit?: string): string {
  const count = ranges.reduce((s, [lo, hi]) => s + hi - lo + 1, 0);
  const unit = lengthUnit ? ` ${lengthUnit}` : '';
  return `${count === 1 ? 'node' : 'nodes'} ${describeRanges(ranges)}${at ? ` near ${describePoint(at)}${unit}` : ''}`;
}
