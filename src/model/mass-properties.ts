/**
 * Mass properties from the rigid-body mass matrix G = Rᵀ M R (6 × 6).
 *
 * With R about a reference point p and the mass density ρ (any mass matrix that integrates
 * ρ u·v exactly for rigid fields: lumped, consistent, beam rotary inertia):
 *   G[a][a]       = mass moving with translation a (a = x, y, z)       — the three should agree;
 *   G[a][3+b]     = ε_abc S_c with S = Σ m (x − p), the first moment   — gives the centre of mass;
 *   G[3+a][3+b]   = I_p[a][b] = Σ m (|d|² δ_ab − d_a d_b), d = x − p   — inertia tensor about p.
 * The tensor about the centre of mass c follows from the parallel-axis theorem
 * I_c = I_p − m (|c − p|² I − (c − p)(c − p)ᵀ). Principal moments are the eigenvalues of I_c.
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import type { DofMap } from '../io/dof-map.js';
import { rigidBodyVectors, meanDofPosition, type Point3, type RigidBodyVectors } from './rigid-body-vectors.js';
import { symmetricEigen } from '../dense/symmetric-eigen.js';

export interface MassProperties {
  /** Mass moving with a unit translation along x, y, z (G diagonal). */
  translationalMass: [number, number, number];
  /** Mean of the nonzero translational masses (the model's total mass). */
  totalMass: number;
  /** max |m_a − m_b| / max m_a over the three directions (0 when they agree). */
  translationalMassSpread: number;
  centerOfMass: Point3;
  /** Row-major 3 × 3 inertia tensor about the centre of mass (rotational DOF inertia included). */
  inertiaAboutCenterOfMass: number[];
  /** Eigenvalues of the tensor above, ascending, and their axes (row k = axis of moment k). */
  principalMoments: [number, number, number];
  principalAxes: [Point3, Point3, Point3];
  /** Rᵀ M R about `referencePoint`, row-major 6 × 6. */
  rigidBodyMass: number[];
  referencePoint: Point3;
}

/** G = Rᵀ M R, row-major 6 × 6, and M R (column-major n × 6) for reuse. */
function rigidBodyMassMatrix(mass: SymmetricCsc, rigid: RigidBodyVectors): { g: number[]; massTimesR: Float64Array } {
  const n = rigid.n;
  const mr = symMultiplyBlock(mass, rigid.vectors, 6);
  const g = new Array<number>(36).fill(0);
  // g_kl = r_kᵀ (M r_l)
  for (let k = 0; k < 6; k++) {
    for (let l = 0; l < 6; l++) {
      let s = 0;
      for (let i = 0, ok = k * n, ol = l * n; i < n; i++) s += rigid.vectors[ok + i] * mr[ol + i];
      g[k * 6 + l] = s;
    }
  }
  // symmetrize the round-off
  for (let k = 0; k < 6; k++) for (let l = k + 1; l < 6; l++) g[k * 6 + l] = g[l * 6 + k] = 0.5 * (g[k * 6 + l] + g[l * 6 + k]);
  return { g, massTimesR: mr };
}

/** Mass properties from G about the reference point of `rigid`. */
function massPropertiesFromRigidBodyMass(g: number[], referencePoint: Point3): MassProperties {
  const m: [number, number, number] = [g[0], g[7], g[14]];
  const positive = m.filter((v) => v > 0);
  const totalMass = positive.length ? positive.reduce((a, b) => a + b, 0) / positive.length : 0;
  const mMax = Math.max(...m.map(Math.abs));
  const spread = mMax > 0 ? (Math.max(...m) - Math.min(...m)) / mMax : 0;
  // first moment S_c from the two entries ε_abc S_c (a, b) carrying it, each over its own mass
  const offset = [0, 0, 0];
  const pairs: [number, number, number, number][] = [
    // [c, a, b, sign]: G[a][3+b] = sign · m_a · offset_c
    [0, 1, 2, 1],
    [0, 2, 1, -1],
    [1, 2, 0, 1],
    [1, 0, 2, -1],
    [2, 0, 1, 1],
    [2, 1, 0, -1],
  ];
  const sums = [0, 0, 0];
  const counts = [0, 0, 0];
  // average the estimates of each centre-of-mass offset over the directions that carry mass
  for (const [c, a, b, sign] of pairs) {
    if (!(m[a] > 0)) continue;
    sums[c] += (sign * g[a * 6 + 3 + b]) / m[a];
    counts[c]++;
  }
  for (let c = 0; c < 3; c++) offset[c] = counts[c] ? sums[c] / counts[c] : 0;
  const centerOfMass: Point3 = [referencePoint[0] + offset[0], referencePoint[1] + offset[1], referencePoint[2] + offset[2]];
  const d2 = offset[0] ** 2 + offset[1] ** 2 + offset[2] ** 2;
  const inertia = new Array<number>(9);
  // parallel-axis shift from p to the centre of mass
  for (let a = 0; a < 3; a++) {
    for (let b = 0; b < 3; b++) {
      const shift = totalMass * ((a === b ? d2 : 0) - offset[a] * offset[b]);
      inertia[a * 3 + b] = g[(3 + a) * 6 + 3 + b] - shift;
    }
  }
  const eig = symmetricEigen(Float64Array.from(inertia), 3);
  const axis = (k: number): Point3 => [eig.vectors[k * 3], eig.vectors[k * 3 + 1], eig.vectors[k * 3 + 2]];
  return {
    translationalMass: m,
    totalMass,
    translationalMassSpread: spread,
    centerOfMass,
    inertiaAboutCenterOfMass: inertia,
    principalMoments: [eig.values[0], eig.values[1], eig.values[2]],
    principalAxes: [axis(0), axis(1), axis(2)],
    rigidBodyMass: g,
    referencePoint,
  };
}

export interface RigidBodyAboutCenterOfMass {
  rigid: RigidBodyVectors;
  massProperties: MassProperties;
  /** M R for the final vectors (column-major n × 6). */
  massTimesR: Float64Array;
}

/**
 * Two passes: R about the mean node position gives the centre of mass; R is rebuilt about it
 * and the mass properties are taken from that second G (so the rotations are about the CoM).
 * `referencePoint` overrides the centre of mass as the rotation point.
 */
export function rigidBodyVectorsAboutCenterOfMass(
  dofMap: DofMap,
  mass: SymmetricCsc,
  referencePoint?: Point3,
): RigidBodyAboutCenterOfMass {
  let point = referencePoint;
  if (!point) {
    const first = rigidBodyVectors(dofMap, meanDofPosition(dofMap));
    const { g } = rigidBodyMassMatrix(mass, first);
    point = massPropertiesFromRigidBodyMass(g, first.referencePoint).centerOfMass;
  }
  const rigid = rigidBodyVectors(dofMap, point);
  const { g, massTimesR } = rigidBodyMassMatrix(mass, rigid);
  return { rigid, massProperties: massPropertiesFromRigidBodyMass(g, point), massTimesR };
}
