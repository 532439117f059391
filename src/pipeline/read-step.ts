/**
 * The reading stage of the per-model pipeline: K and M (Matrix Market) with their screening
 * summaries, and the DOF map when the model has one. Non-finite values and asymmetry are
 * recorded, not refused: the matrix rules judge them.
 */
import type { DofMap } from '../io/dof-map.js';
import { readDofMap } from '../io/dof-map-reader.js';
import { readStiffnessAndMass, stiffnessDofs } from '../io/matrix-market-reader.js';
import { prestartHelpers } from '../sparse/helper-thread.js';
import type { MatrixSummary } from '../io/matrix-summary.js';
import { fullNonzeros, type SymmetricCsc } from '../sparse/csc.js';
import type { ModelJob } from './job-types.js';
import type { ModelStats } from './result-types.js';

export interface ModelInput {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  stiffnessSummary: MatrixSummary;
  massSummary: MatrixSummary;
  dofMap?: DofMap;
}

/**
 * Starts the solver's helper threads for the model in `stiffnessPath` (by the DOFs of its size
 * line) so they load while the matrices are read; nothing when the line cannot be read (reading
 * the file will say why) or the model is solved on one thread. Judged on the file's DOFs: a model
 * that constraint sets bring below ONE_THREAD_BELOW_DOFS, or that is refused before its solve,
 * has started helpers it does not use (about 0.1 s of CPU each).
 */
export async function prestartSolverThreads(stiffnessPath: string): Promise<void> {
  const dofs = await stiffnessDofs(stiffnessPath);
  if (dofs !== undefined) prestartHelpers(dofs);
}

export async function readModelInput(job: ModelJob): Promise<ModelInput> {
  await prestartSolverThreads(job.stiffnessPath);
  const pair = await readStiffnessAndMass(job.stiffnessPath, job.massPath, { screening: 'record' });
  const input: ModelInput = {
    stiffness: pair.stiffness.matrix,
    mass: pair.mass.matrix,
    stiffnessSummary: pair.stiffness.summary,
    massSummary: pair.mass.summary,
  };
  if (job.dofsPath) input.dofMap = await readDofMap(job.dofsPath, input.stiffness.n);
  return input;
}

/** Sizes and files of the model as read; solvedDofs is the same until constraint sets remove DOFs (analyze-model sets it after them). */
export function modelStats(job: ModelJob, input: ModelInput): ModelStats {
  return {
    dofs: input.stiffness.n,
    solvedDofs: input.stiffness.n,
    stiffnessNonzeros: fullNonzeros(input.stiffness),
    massNonzeros: fullNonzeros(input.mass),
    stiffnessFile: job.stiffnessPath,
    massFile: job.massPath,
    dofsFile: job.dofsPath,
    nodes: input.dofMap ? new Set(input.dofMap.node).size : undefined,
  };
}
