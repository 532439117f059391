/**
 * The geometry stage of the per-model pipeline (src/pipeline/analyze-model.ts), after the solve:
 * rigid-body vectors, mass properties, rigid-body energy, participation and mechanism location
 * (src/model/compute-geometry.ts), when the model has a DOF map.
 */
import type { ModelJob } from './job-types.js';
import type { DofMap } from '../io/dof-map.js';
import type { ModesResult } from '../eigen/modes-types.js';
import { computeGeometry } from '../model/compute-geometry.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
import type { ConstrainedInput } from './constrain-step.js';

/**
 * Geometry facts for the rules and reports when the constrained model has a DOF map (`modes`
 * absent when the solve failed). An exception here is an internal error of the model's check
 * (exit 2, one line), like any other pipeline stage.
 */
export function runGeometryStep(job: ModelJob, constrained: ConstrainedInput, modes: ModesResult | undefined): GeometryFacts | undefined {
  if (!constrained.dofMap) return undefined;
  const reduced = constrained.reduced;
  return computeGeometry({
    stiffness: constrained.stiffness,
    mass: constrained.mass,
    dofMap: constrained.dofMap,
    modes,
    originalDofs: reduced?.keptDofs,
    constraints: reduced ? { sets: constrained.setNames, removedDofs: reduced.removedDofs.length, keptDofs: reduced.keptDofs.length } : undefined,
    unconstrained: reduced && constrained.original.dofMap ? { mass: constrained.original.mass, dofMap: constrained.original.dofMap } : undefined,
    expectedRigidBodyModes: expectedRigidBodyModes(job),
    heldDofs: reduced && constrained.original.dofMap ? heldDofs(constrained.original.dofMap, reduced.removedDofs) : undefined,
  });
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
