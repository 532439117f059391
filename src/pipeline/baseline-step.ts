/**
 * The baseline stages of the per-model pipeline.
 *
 * Before the rules: compare the solved modes with the model's stored baseline when one is
 * configured, and explain what changed (the change map of K and M rows, and each frequency
 * change's first-order attribution to nodes, src/model/explain-changes.ts; the change map is
 * made even when no modes were solved) (`baseline.dir` or `check --baseline`). A missing baseline directory (the first pull
 * request of a new project) or a model without a baseline there yet only makes the baseline rules
 * skip, each saying why, and leaves a warning on the model; a broken baseline unit is an
 * InputError (the model ends with exit 2).
 *
 * After the rules: save this run's snapshot when asked (`check --save-baseline`), only when the
 * model's verdict is not `error`. A failed save never throws away the rule results: it comes
 * back as an InputError naming the directory and the cause, which the pipeline records as the
 * model's problem (exit 2) beside the rules.
 */
import { existsSync, statSync } from 'node:fs';
import type { BaselineJob, ModelJob } from './job-types.js';
import { InputError, oneLineMessage } from '../io/errors.js';
import { packageVersion } from '../io/package-root.js';
import type { ModesResult } from '../eigen/modes-types.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import type { DofMap } from '../io/dof-map.js';
import type { ComparisonFacts } from '../model/comparison-facts.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
// the baseline modules load only for a model with baseline settings (a run without baselines never needs them)
import type { SavedBaselineFiles } from '../model/baseline-store.js';
import type { DofMatch } from '../model/compare-baseline.js';
import type { ExplainedChanges } from '../model/change-facts.js';

/** The solved model as the baseline steps see it (constrained K/M and DOF map, as the rules do). */
export interface BaselineInput {
  modes?: ModesResult;
  mass: SymmetricCsc;
  /** The stiffness the modes were solved with (the change map and the attribution read it). */
  stiffness: SymmetricCsc;
  dofMap?: DofMap;
  geometry?: GeometryFacts;
}

export interface BaselineCompareResult {
  comparison?: ComparisonFacts;
  /** Change map and attribution (made whenever a baseline was loaded and K is known, even without modes). */
  changes?: ExplainedChanges;
  /** Why no comparison was made although one was asked for (shown as a warning; the baseline rules skip with it). */
  warning?: string;
}

export async function runBaselineComparison(job: ModelJob, input: BaselineInput): Promise<BaselineCompareResult> {
  const settings = job.baseline;
  const modes = input.modes;
  const dir = settings?.compareDir;
  if (!settings || dir === undefined) return {};
  if (!existsSync(dir) || !statSync(dir).isDirectory()) {
    return { warning: `baseline directory ${dir} not found: the baseline rules are skipped (a new project has none until a run with check --save-baseline)` };
  }
  const { baselineJsonFile, loadBaseline } = await import('../model/baseline-store.js');
  const { compareWithBaseline, defaultComparisonSettings, matchDofs } = await import('../model/compare-baseline.js');
  const { explainChanges } = await import('../model/explain-changes.js');
  const baseline = await loadBaseline(dir, job.name);
  if (!baseline) {
    return { warning: `no baseline for model "${job.name}" yet (${baselineJsonFile(dir, job.name)} is missing; save one with check --save-baseline)` };
  }
  const explain = (comparison?: ComparisonFacts, match?: DofMatch): ExplainedChanges =>
    explainChanges({ baseline, stiffness: input.stiffness, mass: input.mass, dofMap: input.dofMap, modes, comparison, lengthUnit: job.units?.length, match });
  if (!modes) return { changes: explain() };
  const comparison = defaultComparisonSettings({
    weighting: settings.weighting,
    minPairCorrelation: settings.minPairMac,
    windowPercent: settings.windowPercent,
    repeatedTolerancePercent: settings.repeatedTolerancePercent,
  });
  const current = { modes, mass: input.mass, dofMap: input.dofMap };
  const match = matchDofs(baseline, current);
  const facts = compareWithBaseline(baseline, current, comparison, match);
  return { comparison: facts, changes: explain(facts, match) };
}

export interface BaselineSaveResult {
  saved?: SavedBaselineFiles;
  /** Why the snapshot was not saved although it was asked for. */
  notSaved?: string;
  /** The save failed: InputError naming the directory or file and the cause. */
  failure?: InputError;
}

/** Save the snapshot after the rules ran; `verdict` is the model's verdict from its rules. Never throws. */
export async function runBaselineSave(job: ModelJob, input: BaselineInput, verdict: 'pass' | 'fail' | 'error'): Promise<BaselineSaveResult> {
  const settings = job.baseline;
  const dir = settings?.saveDir;
  if (!settings || dir === undefined) return {};
  if (verdict === 'error') return { notSaved: `baseline of ${job.name} not saved: the model's verdict is error (a rule could not be evaluated)` };
  const modes = input.modes;
  if (!modes) return { notSaved: `baseline of ${job.name} not saved: no modes were solved` };
  try {
    return { saved: await save(job, settings, dir, { ...input, modes }) };
  } catch (e) {
    if (e instanceof InputError) return { failure: e };
    const cause = e instanceof Error ? e.message.split('\n')[0] : oneLineMessage(e);
    return { failure: new InputError(dir, `could not save the baseline of model "${job.name}": ${cause}`) };
  }
}

async function save(job: ModelJob, settings: BaselineJob, dir: string, input: BaselineInput & { modes: ModesResult }): Promise<SavedBaselineFiles> {
  const { saveBaseline } = await import('../model/baseline-store.js');
  return saveBaseline(dir, {
    model: job.name,
    modes: input.modes,
    mass: input.mass,
    stiffness: input.stiffness,
    dofMap: input.dofMap,
    massProperties: input.geometry?.massProperties,
    selection: settings.shapes,
    maxDofs: settings.maxDofs,
    toolVersion: packageVersion(),
    configFile: job.configPath,
    where: settings.where,
  });
}
