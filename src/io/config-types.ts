/**
 * The config file `modalgate.yaml` / `modalgate.json` as written by the user (`RawConfig`, checked
 * against rules/schema/config.schema.json) and as the check command uses it (`LoadedConfig`:
 * absolute paths, every rule's options merged and validated).
 */
import type { ResolvedRule } from '../rules/engine.js';
import type { Severity } from '../rules/rule-types.js';
import type { ComponentSelector, ConstraintSet } from '../model/constraints.js';

/** A rule entry in a rule set or override: a severity, or options with an optional severity. */
export type RawRuleEntry = Severity | ({ severity?: Severity } & Record<string, unknown>);

export interface RawSolveSettings {
  count?: number;
  maxHz?: number;
  method?: 'lanczos' | 'subspace';
  tolerance?: number;
  ruleSets?: string[];
  rules?: Record<string, RawRuleEntry>;
}

export interface RawModelConfig extends RawSolveSettings {
  name: string;
  stiffness: string;
  mass: string;
  dofs?: string;
  baseline?: RawBaselineConfig;
  /** Constraint sets removing DOFs before the solve (src/model/constraints.ts). */
  constraints?: RawConstraintSet[];
}

/** A constraint set as written in the config (`dofsFile` relative to the config file). */
export interface RawConstraintSet {
  name?: string;
  nodes?: number[];
  nodeRange?: [number, number];
  components?: ComponentSelector[];
  dofs?: number[];
  dofsFile?: string;
}

/** A constraint set with its DOF-number file (if any) as an absolute, existing path. */
export interface ConstraintJob extends ConstraintSet {
  dofsPath?: string;
}

export interface RawConfig {
  $schema?: string;
  reports?: { junit?: string; json?: string; html?: string };
  defaults?: RawSolveSettings;
  baseline?: RawBaselineConfig;
  models: RawModelConfig[];
}

/** `baseline:` (top level or per model; the model's keys win): where the baseline is, how to compare. */
export interface RawBaselineConfig {
  /** Compare with `<dir>/<model>.baseline.json` (relative to the config). */
  dir?: string;
  /** DOFs whose shape values a saved baseline keeps: `all` (default), `auto`, or listed nodes. */
  shapes?: 'auto' | 'all' | { nodes: number[]; components?: string[] };
  /** Most DOFs of the automatic selection (default 2000). */
  maxDofs?: number;
  /** MAC weighting: `mass` (default) or `plain`. */
  weighting?: 'mass' | 'plain';
  /** Pairs below this MAC are not paired (default 0.5). */
  minPairMac?: number;
  /** Largest |Δf|/f (%) for a pair (default: no window). */
  windowPercent?: number;
  /** Consecutive modes closer than this (%) are treated as near-repeated (default 0.1). */
  repeatedTolerancePercent?: number;
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

export interface RawRuleSet {
  $schema?: string;
  name?: string;
  description?: string;
  rules: Record<string, RawRuleEntry>;
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

/** One model, ready for src/model/analyze-model.ts. Paths are absolute. */
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

export const CONFIG_FILE_NAMES = ['modalgate.yaml', 'modalgate.yml', 'modalgate.json'] as const;
