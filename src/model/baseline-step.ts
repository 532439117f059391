/**
 * The baseline stage of the per-model pipeline (after the solve and the geometry facts, before
 * the rules): compare the solved modes with the model's stored baseline when one is configured
 * (`baseline.dir` or `check --baseline`), then save this run's snapshot when asked
 * (`check --save-baseline`). A changed DOF numbering or a broken baseline file is an InputError
 * (the model ends with exit 2); a model with no baseline in the directory yet only makes the
 * regression rules skip, saying so.
 */
import { existsSync } from 'node:fs';
import type { BaselineJob, ModelJob } from '../io/config-types.js';
import { packageVersion } from '../io/package-root.js';
import type { ModesResult } from '../eigen/modes-types.js';
import type { RuleContext } from '../rules/rule-types.js';
import type { UnavailableInputs } from '../rules/engine.js';
import { baselineFiles, loadBaseline, saveBaseline, type LoadedBaseline } from './baseline-store.js';
import { compareWithBaseline, defaultComparisonSettings } from './compare-baseline.js';

export interface BaselineStepResult {
  /** Files written by --save-baseline. */
  saved?: { json: string; shapes: string };
}

export async function runBaselineStep(job: ModelJob, context: RuleContext, unavailable: UnavailableInputs): Promise<BaselineStepResult> {
  const settings = job.baseline;
  const modes = context.modes;
  if (!settings || !modes) return {};
  let failure: unknown;
  try {
    if (settings.compareDir !== undefined) compareInto(job.name, settings, settings.compareDir, modes, context, unavailable, await baselineOrNull(job.name, settings, settings.compareDir));
  } catch (e) {
    // a renumbered model can still be re-baselined in the same run; the error stands
    if (settings.saveDir === undefined) throw e;
    failure = e;
  }
  const saved = settings.saveDir === undefined ? undefined : await save(job, settings, settings.saveDir, modes, context);
  if (failure !== undefined) throw failure;
  return { saved };
}

/** The stored baseline, or null when there is none yet (also on the first save into the configured directory). */
async function baselineOrNull(model: string, settings: BaselineJob, dir: string): Promise<LoadedBaseline | null> {
  if (dir === settings.saveDir && !existsSync(dir)) return null;
  return loadBaseline(dir, model);
}

function compareInto(model: string, settings: BaselineJob, dir: string, modes: ModesResult, context: RuleContext, unavailable: UnavailableInputs, baseline: LoadedBaseline | null): void {
  if (!baseline) {
    const missing = baselineFiles(dir, model).json;
    unavailable.baseline = { status: 'skip', reason: `not evaluated: no baseline for model "${model}" yet (${missing} is missing; save one with check --save-baseline).` };
    return;
  }
  const comparison = defaultComparisonSettings({
    weighting: settings.weighting,
    minPairCorrelation: settings.minPairMac,
    windowPercent: settings.windowPercent,
    repeatedTolerancePercent: settings.repeatedTolerancePercent,
  });
  context.comparison = compareWithBaseline(baseline, { modes, mass: context.mass, dofMap: context.dofMap }, comparison);
}

function save(job: ModelJob, settings: BaselineJob, dir: string, modes: ModesResult, context: RuleContext): Promise<{ json: string; shapes: string }> {
  return saveBaseline(dir, {
    model: job.name,
    modes,
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
