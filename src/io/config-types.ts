/**
 * The config file `modalgate.yaml` / `modalgate.json` as written by the user (`RawConfig`, checked
 * against rules/schema/config.schema.json) and as the check command uses it (`LoadedConfig`:
 * absolute paths, every rule's options merged and validated).
 */
import type { ResolvedRule } from '../rules/engine.js';
import type { Severity } from '../rules/rule-types.js';

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
}

export interface RawConfig {
  $schema?: string;
  reports?: { junit?: string; json?: string };
  defaults?: RawSolveSettings;
  models: RawModelConfig[];
}

export interface RawRuleSet {
  $schema?: string;
  name?: string;
  description?: string;
  rules: Record<string, RawRuleEntry>;
}

/** What to solve for one model (the eigen layer's ModesRequest without the callbacks). */
export interface SolveSettings {
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
  /** The model's entry as written, for later pipeline stages (constraints, baseline) to read. */
  raw: RawModelConfig;
}

export interface LoadedConfig {
  path: string;
  dir: string;
  /** Absolute report paths from the config (command-line options override them). */
  reports: { junit?: string; json?: string };
  models: ModelJob[];
}

/** Solve this many modes when a model sets neither count nor maxHz (our choice). */
export const DEFAULT_MODE_COUNT = 20;

export const CONFIG_FILE_NAMES = ['modalgate.yaml', 'modalgate.yml', 'modalgate.json'] as const;
