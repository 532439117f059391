/**
 * Geometric rigid-body vectors from the DOF map.
 *
 * A rigid motion of the whole model is a translation t plus a small rotation ω about a
 * reference point p: a node at x moves u = t + ω × (x − p) and turns by ω. Column k of
 * R (n × 6, column-major) is the motion for one unit component of (t, ω):
 *   k = 0..2  translation along x, y, z    — translational DOFs of that direction get 1;
 *   k = 3..5  rotation about x, y, z axes through p — translational DOF of direction a gets
 *             (e_k × (x − p))_a, rotational DOF of axis k gets 1.
 * Solids (3 DOFs per node), frames (6 DOFs per node) and mixed models are handled alike,
 * because each row only looks at its own component.
 *
 * The default reference point is the centre of mass, found by two passes: vectors about the
 * mean node position → mass properties → centre of mass → vectors about it.
 */
import type { DofMap } from '../io/dof-map.js';

export type Point3 = readonly [number, number, number];

/** Names of the six rigid-body directions, in column order of R. */
export const RIGID_BODY_DIRECTIONS = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] as const;
export type RigidBodyDirection = (typeof RIGID_BODY_DIRECTIONS)[number];

export interface RigidBodyVectors {
  n: number;
  /** Column-major n × 6: translations x y z, then rotations about x y z through `referencePoint`. */
  vectors: Float64Array;
  referencePoint: Point3;
}

/** R (n × 6) for rotations about `referencePoint`. */
export function rigidBodyVectors(dofMap: DofMap, referencePoint: Point3): RigidBodyVectors {
  const n = dofMap.n;
  const r = new Float64Array(6 * n);
  const [px, py, pz] = referencePoint;
  // each DOF row: its share of the three translations and three rotations
  for (let i = 0; i < n; i++) {
    const c = dofMap.component[i];
    if (c >= 3) {
      r[(c) * n + i] = 1; // rotation DOF about axis c−3 follows ω directly (column 3 + (c−3) = c)
      continue;
    }
    r[c * n + i] = 1; // translation along its own direction
    const dx = dofMap.x[i] - px;
    const dy = dofMap.y[i] - py;
    const dz = dofMap.z[i] - pz;
    // component c of e_k × d for k = x, y, z:  e_x×d = (0,−dz,dy), e_y×d = (dz,0,−dx), e_z×d = (−dy,dx,0)
    if (c === 0) {
      r[4 * n + i] = dz;
      r[5 * n + i] = -dy;
    } else if (c === 1) {
      r[3 * n + i] = -dz;
      r[5 * n + i] = dx;
    } else {
      r[3 * n + i] = dy;
      r[4 * n + i] = -dx;
    }
  }
  return { n, vectors: r, referencePoint: [px, py, pz] };
}

/** Mean position of the DOFs' nodes (each DOF counted once; a neutral first reference point). */
export function meanDofPosition(dofMap: DofMap): Point3 {
  let sx = 0;
  let sy = 0;
  let sz = 0;
  // sum of the coordinates carried by every DOF
  for (let i = 0; i < dofMap.n; i++) {
    sx += dofMap.x[i];
    sy += dofMap.y[i];
    sz += dofMap.z[i];
  }
  const k = Math.max(1, dofMap.n);
  return [sx / k, sy / k, sz / k];
}

/** Which of the six directions the DOF map can represent at all (a planar model may lack uz, rx, ry). */
export function representedDirections(dofMap: DofMap): boolean[] {
  const has = [false, false, false, false, false, false];
  const hasComponent = [false, false, false, false, false, false];
  // components present anywhere in the model
  for (let i = 0; i < dofMap.n; i++) hasComponent[dofMap.component[i]] = true;
  has[0] = hasComponent[0];
  has[1] = hasComponent[1];
  has[2] = hasComponent[2];
  // a rotation is represented by its rotational DOFs or by the two translations it moves
  has[3] = hasComponent[3] || (hasComponent[1] && hasComponent[2]);
  has[4] = hasComponent[4] || (hasComponent[0] && hasComponent[2]);
  has[5] = hasComponent[5] || (hasComponent[0] && hasComponent[1]);
  return has;
}
