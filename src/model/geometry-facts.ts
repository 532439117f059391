/**
 * Geometry-aware facts about a model, computed by ./compute-geometry.ts when a DOF map is
 * given and read by the geometry rules (rigid-body-energy, total-mass, center-of-mass,
 * mass-consistency, mass-participation) and by rigid-body-modes (mechanism location).
 * Plain numbers and arrays only, so the JSON report can carry them as they are.
 */
import type { Point3, RigidBodyDirection } from './rigid-body-vectors.js';
import type { MassProperties } from './mass-properties.js';
import type { RigidBodyEnergy } from './rigid-body-energy.js';
import type { Participation } from './participation.js';
import type { MechanismReport } from './mechanism-localization.js';
import type { FreeMotionFacts } from './free-motions.js';

export interface ConstraintFacts {
  /** Names (or positions) of the constraint sets applied before solving. */
  sets: string[];
  /** DOFs removed (held at zero). */
  removedDofs: number;
  /** DOFs kept (the size of the solved model). */
  keptDofs: number;
}

export interface GeometryFacts {
  /** Point the rotations are taken about (the centre of mass unless configured). */
  referencePoint: Point3;
  /** Which of ux uy uz rx ry rz the DOF map can represent (a planar model lacks some). */
  representedDirections: Record<RigidBodyDirection, boolean>;
  massProperties: MassProperties;
  rigidBodyEnergy: RigidBodyEnergy;
  /**
   * Rigid motions the stiffness does not resist: eigen-directions of (RᵀKR) v = μ (RᵀMR) v with
   * μ ≤ λ_ref / 1e6. Six for a free-free 3-D model, fewer when grounded or supported.
   */
  freeRigidBodyMotions: number;
  /** Which motions those are (translation, rotation about an axis, …) and which supported nodes leave them free; null when none. */
  freeMotions: FreeMotionFacts | null;
  /**
   * Leading solved modes with λ ≈ 0 (round-off zeros plus any below a clear gap), or null
   * when no modes were solved.
   */
  nearZeroModes: number | null;
  /** Set when the model is supported (constraint sets applied, or no near-zero mode solved). */
  supported: { reason: string } | null;
  /** Set when constraint sets removed DOFs before solving; DOF numbers in facts are original. */
  constraints: ConstraintFacts | null;
  /**
   * Mass on the kept (solved) DOFs, when constraint sets removed some: what participation is
   * relative to. `massProperties` then describes the whole export.
   */
  keptMass: { translationalMass: [number, number, number]; totalMass: number } | null;
  /** Present when modes were solved. */
  participation: Participation | null;
  /** Present when modes were solved (mechanisms = 0 when every near-zero mode is rigid). */
  mechanisms: MechanismReport | null;
}
