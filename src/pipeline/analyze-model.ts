/**
 * The per-model pipeline of `modalgate check`:
 *
 *   read K, M (Matrix Market) and the DOF map  →  screening (can the pencil be solved at all?)
 *   →  [constraint sets]  →  solveModes  →  [geometry facts]  →  [baseline comparison]  →  rules
 *
 * Steps in brackets are hook points for the geometry-aware checks and the baseline regression
 * (marked HOOK below). Bad input ends the model with a `problem` (exit 2, JUnit <error>); a solver
 * failure leaves the matrix rules running and turns every rule that needs modes into `error`.
 */
import { hostname } from 'node:os';
import type { ModelJob } from './job-types.js';
import { InputError, oneLineMessage } from '../io/errors.js';
import type { DofMap } from '../io/dof-map.js';
import { readStiffnessAndMass } from '../io/matrix-market-reader.js';
import { readDofMap } from '../io/dof-map-reader.js';
import { solveModes } from '../eigen/solve-modes.js';
import { MemoryLimitError } from '../sparse/memory-limit.js';
import { IndefiniteMassError, type ModesRequest, type ModesResult } from '../eigen/modes-types.js';
import { screenPencil } from '../model/screen-pencil.js';
import { fullNonzeros, type SymmetricCsc } from '../sparse/csc.js';
import type { MatrixSummary } from '../io/matrix-summary.js';
import type { RuleContext } from '../rules/rule-types.js';
import { runRules, verdictOf, type RuleResult, type UnavailableInputs } from '../rules/engine.js';
import type { ModelReport, ModeRow, ProblemReport, SolveReport } from './result-types.js';
import { junitTimestamp } from './result-types.js';
import { runBaselineComparison, runBaselineSave } from './baseline-step.js';
import { applyConstraintStep, runGeometryStep } from './geometry-step.js';

export interface AnalyzeOptions {
  onProgress?: (message: string) => void;
}

export async function analyzeModel(job: ModelJob, options: AnalyzeOptions = {}): Promise<ModelReport> {
  const started = new Date();
  const t0 = performance.now();
  const report: ModelReport = { name: job.name, verdict: 'pass', timestamp: junitTimestamp(started), timeMs: 0, ruleSets: job.ruleSets, rules: [] };
  try {
    const input = await readModelInput(job);
    report.stats = {
      dofs: input.stiffness.n,
      solvedDofs: input.stiffness.n,
      stiffnessNonzeros: fullNonzeros(input.stiffness),
      massNonzeros: fullNonzeros(input.mass),
      stiffnessFile: job.stiffnessPath,
      massFile: job.massPath,
      dofsFile: job.dofsPath,
      nodes: input.dofMap ? new Set(input.dofMap.node).size : undefined,
    };
    // constraint sets from the model entry reduce K, M and the DOF map before the solve
    const constrained = applyConstraintStep(job, input);
    report.stats.solvedDofs = constrained.stiffness.n;
    const context: RuleContext = {
      modelName: job.name,
      stiffness: constrained.stiffness,
      mass: constrained.mass,
      stiffnessSummary: input.stiffnessSummary,
      massSummary: input.massSummary,
      dofMap: constrained.dofMap,
      keptDofs: constrained.reduced?.keptDofs,
    };
    const unavailable: UnavailableInputs = {};
    const blocker = screenPencil(input.stiffnessSummary, input.massSummary, input.mass);
    if (blocker) unavailable.modes = { status: 'error', reason: `not evaluated: the modes were not solved because ${blocker.file}: ${blocker.reason}.` };
    else solveInto(context, job, constrained.dofMap, unavailable, report, options);
    // geometry facts (rigid-body energy, mass properties, participation, mechanisms) need the DOF map
    const geometry = runGeometryStep(job, context, constrained);
    if (geometry) report.geometry = geometry;
    // baseline: compare with the stored snapshot (context.comparison) before the rules
    const compared = await runBaselineComparison(job, context, unavailable);
    if (context.comparison) report.comparison = context.comparison;
    if (compared.warning) report.baselineWarning = compared.warning;
    report.rules = runRules(context, job.rules, unavailable);
    // --save-baseline after the rules; a failed save keeps the rule results and ends in exit 2
    const saved = await runBaselineSave(job, context, verdictOf(report.rules));
    if (saved.saved) report.baselineSaved = saved.saved;
    if (saved.notSaved) report.baselineNotSaved = saved.notSaved;
    if (saved.failure) report.problem = problemOf(saved.failure);
  } catch (e) {
    report.problem = problemOf(e);
    const why = report.problem.kind === 'limit' ? 'the model was stopped at a resource limit' : "the model's input could not be read";
    report.rules = job.rules.map((r) => notEvaluated(r.rule.id, r.rule.description, r.severity, r.options, why));
  }
  report.timeMs = performance.now() - t0;
  report.verdict = report.problem ? 'error' : verdictOf(report.rules);
  return report;
}

interface ModelInput {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  stiffnessSummary: MatrixSummary;
  massSummary: MatrixSummary;
  dofMap?: DofMap;
}

async function readModelInput(job: ModelJob): Promise<ModelInput> {
  // record (not refuse) non-finite values and asymmetry: the matrix rules judge them
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

function solveInto(context: RuleContext, job: ModelJob, dofMap: DofMap | undefined, unavailable: UnavailableInputs, report: ModelReport, options: AnalyzeOptions): void {
  const request: ModesRequest = { ...job.solve, onProgress: options.onProgress };
  if (dofMap) request.coordinates = interleavedCoordinates(dofMap);
  let modes: ModesResult;
  try {
    modes = solveModes(context.stiffness, context.mass, request);
  } catch (e) {
    if (e instanceof MemoryLimitError) throw e;
    const why = e instanceof InputError ? e.reason : e instanceof IndefiniteMassError ? `${job.massPath}: ${e.message}` : oneLineMessage(e);
    unavailable.modes = { status: 'error', reason: `not evaluated: the eigensolver stopped: ${why}` };
    return;
  }
  context.modes = modes;
  report.solve = solveReport(modes, job);
  report.modes = modeRows(modes);
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

function solveReport(modes: ModesResult, job: ModelJob): SolveReport {
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
  };
}

function modeRows(modes: ModesResult): ModeRow[] {
  return Array.from(modes.eigenvalues, (lambda, i) => ({ mode: i + 1, eigenvalue: lambda, frequencyHz: modes.frequenciesHz[i], residual: modes.residuals[i] }));
}

export function problemOf(e: unknown): ProblemReport {
  if (e instanceof InputError) return { kind: 'input', message: oneLineMessage(e), file: e.file, line: e.line, where: e.where };
  if (e instanceof MemoryLimitError) return { kind: 'limit', message: e.message };
  return { kind: 'internal', message: oneLineMessage(e) };
}

function notEvaluated(ruleId: string, description: string, severity: RuleResult['severity'], options: Record<string, unknown>, why: string): RuleResult {
  return { ruleId, description, severity, options, status: 'skip', message: `not evaluated: ${why}.`, timeMs: 0 };
}

export function currentHostname(): string {
  try {
    return hostname() || 'localhost';
  } catch {
    return 'localhost';
  }
}
