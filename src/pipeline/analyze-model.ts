/**
 * One model's way through `modalgate check`:
 *
 *   read K, M (Matrix Market) and the DOF map (read-step)  →  screening (can the pencil be
 *   solved at all?)  →  [constraint sets] (constrain-step)  →  modes (solve-step)  →
 *   [geometry facts] (geometry-step)  →  [baseline comparison] (baseline-step)  →  rules
 *   →  [baseline save]
 *
 * Steps in brackets run when the config asks for them (constraint sets, a DOF map, a baseline).
 * Each step returns its facts; the rules get them together in one RuleContext, and the run
 * result (result-types.ts) carries them to the reporters. Bad input ends the model with a
 * `problem` (exit 2, JUnit <error>); a solver failure leaves the matrix rules running and turns
 * every rule that needs modes into `error`. Nothing here prints.
 */
import { problemOf } from './problem.js';
import { screenPencil } from '../model/screen-pencil.js';
import type { RuleContext } from '../rules/rule-types.js';
import { runRules, verdictOf, type RuleResult, type UnavailableInputs } from '../rules/engine.js';
import type { ModelJob } from './job-types.js';
import { junitTimestamp, type ModelReport } from './result-types.js';
import { modelStats, readModelInput } from './read-step.js';
import { applyConstraintStep } from './constrain-step.js';
import { modeRows, runSolveStep, solveReport, type SolveOutcome } from './solve-step.js';
import { runGeometryStep } from './geometry-step.js';
import { runBaselineComparison, runBaselineSave } from './baseline-step.js';

export interface AnalyzeOptions {
  onProgress?: (message: string) => void;
  /**
   * Sees every exception the pipeline catches and turns into a report entry (a problem of the
   * model, a failed solve), so the CLI can show its stack trace under MODALGATE_DEBUG.
   */
  onCaughtError?: (e: unknown) => void;
  /** The time of each phase, once the model's rules have run (not for a model that could not be read). */
  onPhases?: (times: PhaseTimes) => void;
  /**
   * Awaited between the steps (after reading, after the solve, before a baseline save): the
   * caller may end the model there by throwing ModelStopped, which leaves analyzeModel as it is
   * (model-runner.ts stops a model it runs on its own thread this way).
   */
  checkpoint?: () => Promise<void>;
}

/** Thrown by a checkpoint to end the model there; the caller reports why. */
export class ModelStopped extends Error {}

/**
 * Where one model's time went, milliseconds: reading K, M and the DOF map, the fill-reducing
 * ordering with the symbolic analysis (once per solve), the numeric factorizations (every shift),
 * the iteration, the verification, and the rules with the facts they need after the solve
 * (geometry facts, the baseline comparison). The solve's phases are missing when the modes
 * were not solved.
 */
export interface PhaseTimes {
  readMs: number;
  orderMs?: number;
  factorMs?: number;
  iterateMs?: number;
  verifyMs?: number;
  rulesMs: number;
}

export async function analyzeModel(job: ModelJob, options: AnalyzeOptions = {}): Promise<ModelReport> {
  const started = new Date();
  const t0 = performance.now();
  const report: ModelReport = { name: job.name, verdict: 'pass', timestamp: junitTimestamp(started), timeMs: 0, ruleSets: job.ruleSets, rules: [] };
  try {
    const readStart = performance.now();
    const input = await readModelInput(job);
    const readMs = performance.now() - readStart;
    await options.checkpoint?.();
    report.stats = modelStats(job, input);
    // constraint sets from the model entry reduce K, M and the DOF map before the solve
    const constrained = applyConstraintStep(job, input);
    report.stats.solvedDofs = constrained.stiffness.n;
    const unavailable: UnavailableInputs = {};
    const blocker = screenPencil(input.stiffnessSummary, input.massSummary, input.mass);
    let solved: SolveOutcome;
    if (blocker) solved = { notSolved: `not evaluated: the modes were not solved because ${blocker.file}: ${blocker.reason}.` };
    else solved = runSolveStep(job, constrained, { onProgress: options.onProgress, onError: options.onCaughtError });
    await options.checkpoint?.();
    const modes = solved.modes;
    // "rules": everything after the solve that feeds the rules (geometry facts, baseline comparison) and the rules
    const rulesStart = performance.now();
    if (modes) {
      report.solve = solveReport(modes, job);
      report.modes = modeRows(modes);
    } else unavailable.modes = { status: 'error', reason: solved.notSolved };
    // geometry facts (rigid-body energy, mass properties, participation, mechanisms) need the DOF map
    const geometry = runGeometryStep(job, constrained, modes);
    if (geometry) report.geometry = geometry;
    if (job.units) report.units = job.units;
    // baseline: compare with the stored snapshot before the rules
    const compared = await runBaselineComparison(job, { modes, mass: constrained.mass, stiffness: constrained.stiffness, dofMap: constrained.dofMap });
    const comparison = compared.comparison;
    if (comparison) report.comparison = comparison;
    if (compared.changes) report.changes = compared.changes;
    if (compared.warning) {
      report.baselineWarning = compared.warning;
      unavailable.baseline = { status: 'skip', reason: `not evaluated: ${compared.warning}.` };
    }
    const context: RuleContext = {
      modelName: job.name,
      stiffness: constrained.stiffness,
      mass: constrained.mass,
      stiffnessSummary: input.stiffnessSummary,
      massSummary: input.massSummary,
      dofMap: constrained.dofMap,
      keptDofs: constrained.reduced?.keptDofs,
      modes,
      geometry,
      comparison,
      units: job.units,
      changes: compared.changes,
    };
    report.rules = runRules(context, job.rules, unavailable);
    options.onPhases?.({ readMs, ...solvePhases(modes), rulesMs: performance.now() - rulesStart });
    // --save-baseline after the rules; a failed save keeps the rule results and ends in exit 2
    if (job.baseline?.saveDir) await options.checkpoint?.();
    const saved = await runBaselineSave(job, { modes, mass: constrained.mass, stiffness: constrained.stiffness, dofMap: constrained.dofMap, geometry }, verdictOf(report.rules));
    if (saved.saved) report.baselineSaved = saved.saved;
    if (saved.notSaved) report.baselineNotSaved = saved.notSaved;
    if (saved.failure) {
      options.onCaughtError?.(saved.failure);
      report.problem = problemOf(saved.failure);
    }
  } catch (e) {
    if (e instanceof ModelStopped) throw e;
    options.onCaughtError?.(e);
    report.problem = problemOf(e);
    const why = report.problem.kind === 'limit' ? 'the model was stopped at a resource limit' : "the model's input could not be read";
    report.rules = job.rules.map((r) => notEvaluated(r.rule.id, r.rule.description, r.severity, r.options, why));
  }
  report.timeMs = performance.now() - t0;
  report.verdict = report.problem ? 'error' : verdictOf(report.rules);
  return report;
}

function solvePhases(modes: SolveOutcome['modes']): Omit<PhaseTimes, 'readMs' | 'rulesMs'> {
  if (!modes) return {};
  // the ordering and the symbolic analysis run once, before the numeric factorizations that factorMs counts
  const orderMs = modes.factor.timings.orderingMs + modes.factor.timings.symbolicMs;
  return { orderMs, factorMs: modes.timings.factorMs, iterateMs: modes.timings.iterateMs, verifyMs: modes.timings.verifyMs };
}

function notEvaluated(ruleId: string, description: string, severity: RuleResult['severity'], options: Record<string, unknown>, why: string): RuleResult {
  return { ruleId, description, severity, options, status: 'skip', message: `not evaluated: ${why}.`, timeMs: 0 };
}

export { problemOf, stackOf } from './problem.js';
