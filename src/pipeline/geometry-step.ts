/**
 * The geometry stages of the per-model pipeline (src/model/analyze-model.ts):
 *
 *   constraint sets  — before the solve: `constraints:` of the model entry remove DOFs from K, M
 *                      and the DOF map (constraints.ts), so one exported free-free model can also
 *                      be checked supported;
 *   geometry facts   — after the solve: rigid-body vectors, mass properties, rigid-body energy,
 *                      participation and mechanism location (compute-geometry.ts), when the
 *                      model has a DOF map.
 * A constraint set that names unknown nodes, or a DOF-number file that cannot be read, is an
 * InputError naming the config entry or the file (exit 2); a missing file is caught by the config
 * loader.
 */
import type { ConstraintJob, ModelJob } from './job-types.js';
import type { DofMap } from '../io/dof-map.js';
import { readDofNumberFile } from '../io/dof-number-file.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import type { RuleContext } from '../rules/rule-types.js';
import { applyConstraints, type ConstraintSet, type ReducedModel } from '../model/constraints.js';
import { computeGeometry } from '../model/compute-geometry.js';
import type { GeometryFacts } from '../model/geometry-facts.js';

export interface ConstrainedInput {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap?: DofMap;
  /** Present when constraint sets removed DOFs. */
  reduced?: ReducedModel;
  setNames: string[];
  /** The model as read, for mass properties of the whole model. */
  original: { mass: SymmetricCsc; dofMap?: DofMap };
}

/** Apply the model's constraint sets (none → the input unchanged). */
export function applyConstraintStep(job: ModelJob, input: { stiffness: SymmetricCsc; mass: SymmetricCsc; dofMap?: DofMap }): ConstrainedInput {
  const base = { stiffness: input.stiffness, mass: input.mass, dofMap: input.dofMap, setNames: [], original: { mass: input.mass, dofMap: input.dofMap } };
  if (job.constraints.length === 0) return base;
  const sets = job.constraints.map(withListedDofs);
  const reduced = applyConstraints(input.stiffness, input.mass, input.dofMap, sets, job.configPath);
  const setNames = sets.map((s, k) => s.name ?? `constraints[${k}]`);
  return { ...base, stiffness: reduced.stiffness, mass: reduced.mass, dofMap: reduced.dofMap, reduced, setNames };
}

/** The set with the DOF numbers of its file (if any) added to `dofs`. */
function withListedDofs({ dofsPath, ...set }: ConstraintJob): ConstraintSet {
  if (dofsPath === undefined) return set;
  return { ...set, dofs: [...(set.dofs ?? []), ...readDofNumberFile(dofsPath)] };
}

/**
 * Geometry facts for the rules (context.geometry) when a DOF map is present. An exception here
 * is an internal error of the model's check (exit 2, one line), like any other pipeline stage.
 */
export function runGeometryStep(job: ModelJob, context: RuleContext, constrained: ConstrainedInput): GeometryFacts | undefined {
  if (!context.dofMap) return undefined;
  const reduced = constrained.reduced;
  context.geometry = computeGeometry({
    stiffness: context.stiffness,
    mass: context.mass,
    dofMap: context.dofMap,
    modes: context.modes,
    originalDofs: reduced?.keptDofs,
    constraints: reduced ? { sets: constrained.setNames, removedDofs: reduced.removedDofs.length, keptDofs: reduced.keptDofs.length } : undefined,
    unconstrained: reduced && constrained.original.dofMap ? { mass: constrained.original.mass, dofMap: constrained.original.dofMap } : undefined,
    expectedRigidBodyModes: expectedRigidBodyModes(job),
    heldDofs: reduced && constrained.original.dofMap ? heldDofs(constrained.original.dofMap, reduced.removedDofs) : undefined,
  });
  return context.geometry;
}

/** Node, component and position of each DOF the constraint sets removed. */
function heldDofs(map: DofMap, removed: ArrayLike<number>): { node: number; component: number; x: number; y: number; z: number }[] {
  return Array.from(removed, (i) => ({ node: map.node[i], component: map.component[i], x: map.x[i], y: map.y[i], z: map.z[i] }));
}

/** `expected` of the rigid-body-modes rule when it is enabled with one. */
function expectedRigidBodyModes(job: ModelJob): number | undefined {
  const rule = job.rules.find((r) => r.rule.id === 'rigid-body-modes');
  const expected = rule?.options.expected;
  return typeof expected === 'number' ? expected : undefined;
}
