/**
 * Builds GeometryFacts for one model from K, M, the DOF map and (optionally) the solved modes:
 * rigid-body vectors about the centre of mass → mass properties → rigid-body energy →
 * participation and mechanism location when modes are known. All DOF numbers in the facts are
 * original DOF numbers when constraint sets reduced the model (`originalDofs`).
 */
import type { SymmetricCsc } from '../sparse/csc.js';
import type { DofMap } from '../io/dof-map.js';
import type { ModesResult } from '../eigen/modes-types.js';
import type { GeometryFacts, ConstraintFacts } from './geometry-facts.js';
import { RIGID_BODY_DIRECTIONS, representedDirections, type Point3, type RigidBodyDirection } from './rigid-body-vectors.js';
import { rigidBodyVectorsAboutCenterOfMass } from './mass-properties.js';
import { rigidBodyEnergy, stiffnessMassScale, type ReferenceEigenvalueSource } from './rigid-body-energy.js';
import { elasticEigenvalueEstimate } from './elastic-estimate.js';
import { modalParticipation } from './participation.js';
import { countNearZeroModes, freeRigidBodyDirections, localizeMechanisms } from './mechanism-localization.js';
import { describeFreeMotions, type HeldDof } from './free-motions.js';

export interface GeometryInput {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap: DofMap;
  modes?: ModesResult;
  /** Reduced DOF r is original DOF originalDofs[r] (from constraints.ts), when reduced. */
  originalDofs?: Int32Array;
  constraints?: ConstraintFacts;
  /** Rotation point instead of the centre of mass. */
  referencePoint?: Point3;
  /**
   * The model before constraint sets removed DOFs: mass properties (total mass, centre of mass,
   * inertia) then describe the whole model, supports included, and the rotations are taken
   * about its centre of mass.
   */
  unconstrained?: { mass: SymmetricCsc; dofMap: DofMap };
  /** Number of leading near-zero modes when the caller already knows it. */
  nearZeroModes?: number;
  /**
   * Rigid-body modes the model should have (e.g. 6 free-free), when configured. The reference
   * eigenvalue of the energy check is then mode max(nearZero, expected) + 1, so a weakly grounded
   * model is measured against its first truly elastic mode, not against the grounding mode.
   */
  expectedRigidBodyModes?: number;
  /** How many nodes the "where" lists carry (default 10). */
  top?: number;
  /** DOFs the constraint sets removed (node, component, position), to name the supported nodes. */
  heldDofs?: readonly HeldDof[];
}

export function computeGeometry(input: GeometryInput): GeometryFacts {
  const { stiffness, mass, dofMap, modes } = input;
  const top = input.top ?? 10;
  const whole = input.unconstrained ? rigidBodyVectorsAboutCenterOfMass(input.unconstrained.dofMap, input.unconstrained.mass, input.referencePoint) : null;
  const point = whole ? whole.massProperties.referencePoint : input.referencePoint;
  const { rigid, massProperties: own, massTimesR } = rigidBodyVectorsAboutCenterOfMass(dofMap, mass, point);
  const massProperties = whole ? whole.massProperties : own;
  // G of the solved (possibly reduced) model: energies, participation and mechanisms live on its DOFs
  const g = own.rigidBodyMass;
  const gDiagonal = [0, 1, 2, 3, 4, 5].map((k) => g[k * 6 + k]);
  const scale = stiffnessMassScale(stiffness, mass, dofMap);
  const nearZero = modes ? (input.nearZeroModes ?? countNearZeroModes(modes.eigenvalues, scale)) : null;
  const elasticIndex = nearZero === null ? null : Math.max(nearZero, input.expectedRigidBodyModes ?? 0);
  const firstElastic = modes && elasticIndex !== null && elasticIndex < modes.eigenvalues.length ? modes.eigenvalues[elasticIndex] : null;
  const reference = referenceEigenvalue(firstElastic, () => elasticEigenvalueEstimate(stiffness, mass, dofMap, rigid), scale);
  const energy = rigidBodyEnergy(stiffness, rigid, gDiagonal, dofMap, {
    referenceEigenvalue: reference.value,
    referenceSource: reference.source,
    originalDofs: input.originalDofs,
    top,
  });
  const free = freeRigidBodyDirections(energy.rigidBodyStiffness, g, energy.referenceEigenvalue);
  const has = representedDirections(dofMap);
  const represented = Object.fromEntries(RIGID_BODY_DIRECTIONS.map((d, k) => [d, has[k]])) as Record<RigidBodyDirection, boolean>;
  return {
    referencePoint: rigid.referencePoint,
    representedDirections: represented,
    massProperties,
    rigidBodyEnergy: energy,
    freeRigidBodyMotions: free.free,
    freeMotions: describeFreeMotions(free.w, free.free, rigid.referencePoint, dofMap, input.heldDofs ?? [], energy.largestResiduals),
    nearZeroModes: nearZero,
    supported: supportedReason(input.constraints, nearZero, input.expectedRigidBodyModes),
    constraints: input.constraints ?? null,
    keptMass: whole ? { translationalMass: own.translationalMass, totalMass: own.totalMass } : null,
    participation: modes ? modalParticipation(modes, massTimesR, gDiagonal) : null,
    mechanisms:
      modes && nearZero !== null
        ? localizeMechanisms(mass, modes, massTimesR, dofMap, {
            nearZeroModes: nearZero,
            freeDirections: free.w,
            freeCount: free.free,
            originalDofs: input.originalDofs,
            top,
            stiffness,
            rigidVectors: rigid.vectors,
          })
        : null,
  };
}

/** λ_ref: the first elastic mode, else the smooth-field Ritz estimate, else tr K / tr M. */
function referenceEigenvalue(
  firstElastic: number | null,
  estimate: () => number | null,
  scale: number,
): { value: number; source: ReferenceEigenvalueSource } {
  if (firstElastic !== null && firstElastic > 0) return { value: firstElastic, source: 'first-elastic-mode' };
  const ritz = estimate();
  if (ritz !== null) return { value: ritz, source: 'smooth-field-estimate' };
  return { value: scale, source: 'stiffness-mass-scale' };
}

/**
 * Why the model counts as supported (so free-free checks skip), or null: constraint sets held
 * DOFs; the config expects no rigid-body mode; or, when the config says nothing, no near-zero
 * mode was solved. A configured expectation of rigid-body modes keeps the model free even when
 * none was found (that is what grounding looks like).
 */
function supportedReason(constraints: ConstraintFacts | undefined, nearZero: number | null, expected: number | undefined): { reason: string } | null {
  if (constraints && constraints.removedDofs > 0) {
    return { reason: `the model is supported by constraint sets (${constraints.sets.join(', ')}; ${constraints.removedDofs} DOFs held)` };
  }
  if (expected === 0) return { reason: 'the config expects no rigid-body modes (rigid-body-modes expected: 0), so the model is supported' };
  if (expected === undefined && nearZero === 0) return { reason: 'the solved modes include no near-zero mode, so the model is supported' };
  return null;
}
