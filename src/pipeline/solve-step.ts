/**
 * The solve stage of the per-model pipeline: the lowest modes of the constrained pencil
 * (src/eigen/solve-modes.ts), with node coordinates for the ordering when a DOF map is present,
 * and the solve's part of the run result (SolveReport, ModeRow). A solver failure is not the end
 * of the model: it comes back as the reason the rules that need modes could not run. A
 * `--max-memory` refusal ends the model (it is thrown).
 */
import type { DofMap } from '../io/dof-map.js';
import { InputError, oneLineMessage } from '../io/errors.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import { MemoryLimitError } from '../sparse/memory-limit.js';
import { solveModes } from '../eigen/solve-modes.js';
import { IndefiniteMassError, type ModesRequest, type ModesResult } from '../eigen/modes-types.js';
import type { ModelJob } from './job-types.js';
import type { ModeRow, SolveReport } from './result-types.js';

export type SolveOutcome = { modes: ModesResult; notSolved?: undefined } | { modes?: undefined; notSolved: string };

/** Solve K φ = λ M φ for the job's modes; `onError` sees the exception of a failed solve. */
export function runSolveStep(
  job: ModelJob,
  model: { stiffness: SymmetricCsc; mass: SymmetricCsc; dofMap?: DofMap },
  hooks: { onProgress?: (message: string) => void; onError?: (e: unknown) => void } = {},
): SolveOutcome {
  const request: ModesRequest = { ...job.solve, onProgress: hooks.onProgress };
  if (model.dofMap) request.coordinates = interleavedCoordinates(model.dofMap);
  try {
    return { modes: solveModes(model.stiffness, model.mass, request) };
  } catch (e) {
    if (e instanceof MemoryLimitError) throw e;
    hooks.onError?.(e);
    const why = e instanceof InputError ? e.reason : e instanceof IndefiniteMassError ? `${job.massPath}: ${e.message}` : oneLineMessage(e);
    return { notSolved: `not evaluated: the eigensolver stopped: ${why}` };
  }
}

function interleavedCoordinates(map: DofMap): Float64Array {
  const c = new Float64Array(3 * map.n);
  // c = (x_0, y_0, z_0, x_1, ...) per DOF
  for (let i = 0; i < map.n; i++) {
    c[3 * i] = map.x[i];
    c[3 * i + 1] = map.y[i];
    c[3 * i + 2] = map.z[i];
  }
  return c;
}

export function solveReport(modes: ModesResult, job: ModelJob): SolveReport {
  return {
    method: modes.method,
    ordering: modes.factor.ordering,
    requested: { count: job.solve.count, maxHz: job.solve.maxHz },
    modesReturned: modes.eigenvalues.length,
    shifts: modes.shifts,
    iterations: modes.iterations,
    sturm: modes.sturm,
    factorNonzeros: modes.factor.nnzL,
    maxDiagonalToPivotRatio: modes.factor.maxDiagonalToPivotRatio,
    timings: modes.timings,
    massOrthogonality: modes.orthogonality.massMaxDeviation,
    stiffnessOrthogonality: modes.orthogonality.stiffnessMaxDeviation,
    warnings: modes.warnings,
    ...(modes.diagnostics?.length ? { diagnostics: modes.diagnostics } : {}),
    ...(modes.clusterExtension ? { clusterExtension: modes.clusterExtension } : {}),
    ...(modes.factor.kernels ? { kernels: modes.factor.kernels } : {}),
  };
}

export function modeRows(modes: ModesResult): ModeRow[] {
  return Array.from(modes.eigenvalues, (lambda, i) => ({ mode: i + 1, eigenvalue: lambda, frequencyHz: modes.frequenciesHz[i], residual: modes.residuals[i] }));
}
