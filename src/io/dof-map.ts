/**
 * DOF map: which node, component and coordinates each row of K belongs to.
 * File form (CSV): header `dof,node,component,x,y,z`, dof 1-based row of K.
 * The reader lives in ./dof-map-reader.ts; this module holds the in-memory form.
 */
export const COMPONENTS = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] as const;
export type Component = (typeof COMPONENTS)[number];

/** Component code: 0..2 translations ux uy uz, 3..5 rotations rx ry rz. */
export type ComponentCode = 0 | 1 | 2 | 3 | 4 | 5;

export interface DofMap {
  /** Number of DOFs (= rows of K). Arrays below are indexed by 0-based DOF. */
  readonly n: number;
  /** Node id (as written in the file, any positive integer) of each DOF. */
  readonly node: Int32Array;
  /** Component code of each DOF (index into COMPONENTS). */
  readonly component: Uint8Array;
  /** Coordinates of each DOF's node. */
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly z: Float64Array;
}

/** "node 12 uz (dof 36)" — how DOFs are named in messages. `dof` is 0-based. */
export function describeDof(map: DofMap | undefined, dof: number): string {
  if (!map) return `dof ${dof + 1}`;
  return `node ${map.node[dof]} ${COMPONENTS[map.component[dof]]} (dof ${dof + 1})`;
}
