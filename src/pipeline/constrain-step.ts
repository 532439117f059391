/**
 * The constraint stage of the per-model pipeline, before the solve: `constraints:` of the model
 * entry remove DOFs from K, M and the DOF map (src/model/constraints.ts), so one exported
 * free-free model can also be checked supported. A constraint set that names unknown nodes, or a
 * DOF-number file that cannot be read, is an InputError naming the config entry or the file
 * (exit 2); a missing file is caught when the config is loaded.
 */
import type { ConstraintJob, ModelJob } from './job-types.js';
import type { DofMap } from '../io/dof-map.js';
import { readDofNumberFile } from '../io/dof-number-file.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import { applyConstraints, type ConstraintSet, type ReducedModel } from '../model/constraints.js';

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
