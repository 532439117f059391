/**
 * The baseline stages of the per-model pipeline.
 *
 * Before the rules: compare the solved modes with the model's stored baseline when one is
 * configured (`baseline.dir` or `check --baseline`). A missing baseline directory (the first pull
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
import type { RuleContext } from '../rules/rule-types.js';
import type { UnavailableInputs } from '../rules/engine.js';
import { baselineJsonFile, loadBaseline, saveBaseline, type SavedBaselineFiles } from '../model/baseline-store.js';
import { compareWithBaseline, defaultComparisonSettings } from '../model/compare-baseline.js';

export interface BaselineCompareResult {
  /** Why no comparison was made although one was asked for (shown as a warning). */
  warning?: string;
}

export async function runBaselineComparison(job: ModelJob, context: RuleContext, unavailable: UnavailableInputs): Promise<BaselineCompareResult> {
  const settings = job.baseline;
  const modes = context.modes;
  const dir = settings?.compareDir;
  if (!settings || dir === undefined || !modes) return {};
  if (!existsSync(dir) || !statSync(dir).isDirectory()) {
    const warning = `baseline directory ${dir} not found: the baseline rules are skipped (a new project has none until a run with check --save-baseline)`;
    unavailable.baseline = { status: 'skip', reason: `not evaluated: ${warning}.` };
    return { warning };
  }
  const baseline = await loadBaseline(dir, job.name);
  if (!baseline) {
    const warning = `no baseline for model "${job.name}" yet (${baselineJsonFile(dir, job.name)} is missing; save one with check --save-baseline)`;
    unavailable.baseline = { status: 'skip', reason: `not evaluated: ${warning}.` };
    return { warning };
  }
  const comparison = defaultComparisonSettings({
    weighting: settings.weighting,
    minPairCorrelation: settings.minPairMac,
    windowPercent: settings.windowPercent,
    repeatedTolerancePercent: settings.repeatedTolerancePercent,
  });
  context.comparison = compareWithBaseline(baseline, { modes, mass: context.mass, dofMap: context.dofMap }, comparison);
  return {};
}

export interface BaselineSaveResult {
  saved?: SavedBaselineFiles;
  /** Why the snapshot was not saved although it was asked for. */
  notSaved?: string;
  /** The save failed: InputError naming the directory or file and the cause. */
  failure?: InputError;
}

/** Save the snapshot after the rules ran; `verdict` is the model's verdict from its rules. Never throws. */
export async function runBaselineSave(job: ModelJob, context: RuleContext, verdict: 'pass' | 'fail' | 'error'): Promise<BaselineSaveResult> {
  const settings = job.baseline;
  const dir = settings?.saveDir;
  if (!settings || dir === undefined) return {};
  if (verdict === 'error') return { notSaved: `baseline of ${job.name} not saved: the model's verdict is error (a rule could not be evaluated)` };
  if (!context.modes) return { notSaved: `baseline of ${job.name} not saved: no modes were solved` };
  try {
    return { saved: await save(job, settings, dir, context) };
  } catch (e) {
    if (e instanceof InputError) return { failure: e };
    const cause = e instanceof Error ? e.message.split('\n')[0] : oneLineMessage(e);
    return { failure: new InputError(dir, `could not save the baseline of model "${job.name}": ${cause}`) };
  }
}

function save(job: ModelJob, settings: BaselineJob, dir: string, context: RuleContext): Promise<SavedBaselineFiles> {
  return saveBaseline(dir, {
    model: job.name,
    modes: context.modes!,
    mass: context.mass,
    dofMap: context.dofMap,
    massProperties: context.geometry?.massProperties,
    selection: settings.shapes,
    maxDofs: settings.maxDofs,
    toolVersion: packageVersion(),
    configFile: job.configPath,
    where: settings.where,
  });
}
