/**
 * Nodes of a model in one numbering: node ids ascending, and the node of each DOF. Without a
 * DOF map every DOF is its own node, with id = its 1-based DOF number.
 */
import type { DofMap } from '../io/dof-map.js';

export interface NodeIndex {
  /** Node ids, ascending. */
  ids: Int32Array;
  /** 0-based node (index into ids) of each DOF. */
  nodeOf: Int32Array;
}

export function nodeIndexOf(n: number, map?: DofMap | null): NodeIndex {
  if (!map) return { ids: Int32Array.from({ length: n }, (_v, d) => d + 1), nodeOf: Int32Array.from({ length: n }, (_v, d) => d) };
  const ids = Int32Array.from(new Set(map.node)).sort();
  const position = new Map<number, number>();
  ids.forEach((id, k) => position.set(id, k));
  const nodeOf = new Int32Array(n);
  // each DOF's node, by id
  for (let d = 0; d < n; d++) nodeOf[d] = position.get(map.node[d])!;
  return { ids, nodeOf };
}
