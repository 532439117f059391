/**
 * What the pipeline runs: one `ModelJob` per model of the config, with absolute paths, the
 * enabled rules with merged and validated options, constraint sets and baseline settings
 * (built by src/pipeline/load-config.ts from the parsed config).
 */
import type { RawBaselineConfig } from '../io/config-types.js';
import type { ConstraintSet } from '../model/constraints.js';
import type { ResolvedRule } from '../rules/engine.js';
import type { ReportUnits } from '../rules/utils/units.js';

/** A constraint set with its DOF-number file (if any) as an absolute, existing path. */
export interface ConstraintJob extends ConstraintSet {
  dofsPath?: string;
}

/** The baseline settings of one model, resolved (absolute paths). */
export interface BaselineJob {
  /** Compare with the baseline of this model in this directory. */
  compareDir?: string;
  /** Save this run's snapshot of the model into this directory (`check --save-baseline`). */
  saveDir?: string;
  shapes?: RawBaselineConfig['shapes'];
  maxDofs?: number;
  weighting?: 'mass' | 'plain';
  minPairMac?: number;
  windowPercent?: number;
  repeatedTolerancePercent?: number;
  /** Where the settings were written (`baseline` or `models[2].baseline`), for messages. */
  where: string;
}

/** What to solve for one model (the eigen layer's ModesRequest without the callbacks). */
export interface SolveSettings {
  /** Set from the command line (--max-memory), not from the config file. */
  memoryLimitBytes?: number;
  count?: number;
  maxHz?: number;
  method?: 'lanczos' | 'subspace';
  tolerance?: number;
}

/** One model, ready for src/pipeline/analyze-model.ts. Paths are absolute. */
export interface ModelJob {
  name: string;
  stiffnessPath: string;
  massPath: string;
  dofsPath?: string;
  solve: SolveSettings;
  /** Enabled rules (severity error or warning), in registry order. */
  rules: ResolvedRule[];
  /** Rule sets applied, as written in the config. */
  ruleSets: string[];
  /** The config file and the model's place in it, for error messages (`models[2]`). */
  configPath: string;
  where: string;
  /** Constraint sets of the model entry, in config order (empty: none). */
  constraints: ConstraintJob[];
  /** Baseline comparison / saving for this model, when configured or asked for on the command line. */
  baseline?: BaselineJob;
  /** Units for reporting and mass targets (`units:` of the config), when given. */
  units?: ReportUnits;
}

export interface LoadedConfig {
  path: string;
  dir: string;
  /** Absolute report paths from the config (command-line options override them). */
  reports: { junit?: string; json?: string; html?: string };
  models: ModelJob[];
}

/** Solve this many modes when a model sets neither count nor maxHz (our choice). */
export const DEFAULT_MODE_COUNT = 20;
