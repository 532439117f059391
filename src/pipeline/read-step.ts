/**
 * The reading stage of the per-model pipeline: K and M (Matrix Market) with their screening
 * summaries, and the DOF map when the model has one. Non-finite values and asymmetry are
 * recorded, not refused: the matrix rules judge them.
 */
import type { DofMap } from '../io/dof-map.js';
import { readDofMap } from '../io/dof-map-reader.js';
import { readStiffnessAndMass } from '../io/matrix-market-reader.js';
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

export async function readModelInput(job: ModelJob): Promise<ModelInput> {
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
