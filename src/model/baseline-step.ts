/**
 * The baseline stage of the per-model pipeline (after the solve and the geometry facts, before
 * the rules): compare the solved modes with the model's stored baseline when one is configured
 * (`baseline.dir` or `check --baseline`), then save this run's snapshot when asked
 * (`check --save-baseline`). A changed DOF numbering or a broken baseline file is an InputError
 * (the model ends with exit 2); a model with no baseline in the directory yet only makes the
 * regression rules skip, saying so.
 */
import type { ModelJob } from '../io/config-types.js';
import { packageVersion } from '../io/package-root.js';
import type { RuleContext } from '../rules/rule-types.js';
import type { UnavailableInputs } from '../rules/engine.js';
import { baselineFiles, loadBaseline, saveBaseline } from './baseline-store.js';
import { compareWithBaseline, defaultComparisonSettings } from './compare-baseline.js';

export interface BaselineStepResult {
  /** Files written by --save-baseline. */
  saved?: { json: string; shapes: string };
}

export async function runBaselineStep(job: ModelJob, context: RuleContext, unavailable: UnavailableInputs): Promise<BaselineStepResult> {
  const settings = job.baseline;
  if (!settings || !context.modes) return {};
  if (settings.compareDir !== undefined) {
    const baseline = await loadBaseline(settings.compareDir, job.name);
    if (baseline) {
      const comparison = defaultComparisonSettings({
        weighting: settings.weighting,
        minPairCorrelation: settings.minPairMac,
        windowPercent: settings.windowPercent,
        repeatedTolerancePercent: settings.repeatedTolerancePercent,
      });
      context.comparison = compareWithBaseline(baseline, { modes: context.modes, mass: context.mass, dofMap: context.dofMap }, comparison);
    } else {
      const missing = baselineFiles(settings.compareDir, job.name).json;
      unavailable.baseline = { status: 'skip', reason: `not evaluated: no baseline for model "${job.name}" yet (${missing} is missing; save one with check --save-baseline).` };
    }
  }
  if (settings.saveDir === undefined) return {};
  const saved = await saveBaseline(settings.saveDir, {
    model: job.name,
    modes: context.modes,
    mass: context.mass,
    dofMap: context.dofMap,
    massProperties: context.geometry?.massProperties,
    selection: settings.shapes,
    maxDofs: settings.maxDofs,
    toolVersion: packageVersion(),
    configFile: job.configPath,
    where: settings.where,
  });
  return { saved };
}
