/**
 * The config file `modalgate.yaml` / `modalgate.json` as written by the user (`RawConfig`, checked
 * against rules/schema/config.schema.json). The pipeline turns it into model jobs
 * (src/pipeline/job-types.ts: absolute paths, every rule's options merged and validated).
 */
import type { COMPONENTS } from './dof-map.js';

/** A rule's severity as written: `error` fails the gate, `warning` reports without failing, `off` does not run. */
export type RawSeverity = 'error' | 'warning' | 'off';

/** Component selectors accepted in a constraint set. */
export type ComponentSelector = (typeof COMPONENTS)[number] | 'all' | 'translations' | 'rotations';

/** A rule entry in a rule set or override: a severity, or options with an optional severity. */
export type RawRuleEntry = RawSeverity | ({ severity?: RawSeverity } & Record<string, unknown>);

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
  /** Units of this model's reports (over the top-level `units`, key by key). */
  units?: RawUnits;
}

/**
 * `units:` (top level or per model; the model's keys win): names for reporting and for mass
 * targets. `massScale`: how many of the model's mass units make one `mass` unit (kg model,
 * t reported: 1000). Lengths are not scaled; frequencies stay in Hz.
 */
export interface RawUnits {
  length?: string;
  mass?: string;
  massScale?: number;
}

/** A constraint set as written in the config (`dofsFile` relative to the config file). */
/** Nodes selected by where they are (coordinates of the DOF map, model units). */
export type NodeRegion =
  | { plane: { axis: 'x' | 'y' | 'z'; at: number }; tolerance?: number }
  | { box: { min: [number, number, number]; max: [number, number, number] }; tolerance?: number }
  | { cylinder: { axis: 'x' | 'y' | 'z'; through: [number, number, number]; radius: number; from?: number; to?: number }; tolerance?: number };

export interface RawConstraintSet {
  name?: string;
  nodes?: number[];
  nodeRange?: [number, number];
  /** Every node on a plane, in a box, or on a cylinder's surface (coordinates from the DOF map). */
  region?: NodeRegion;
  components?: ComponentSelector[];
  dofs?: number[];
  dofsFile?: string;
}

export interface RawConfig {
  $schema?: string;
  reports?: { junit?: string; json?: string; html?: string };
  defaults?: RawSolveSettings;
  baseline?: RawBaselineConfig;
  units?: RawUnits;
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

export interface RawRuleSet {
  $schema?: string;
  name?: string;
  description?: string;
  rules: Record<string, RawRuleEntry>;
}

export const CONFIG_FILE_NAMES = ['modalgate.yaml', 'modalgate.yml', 'modalgate.json'] as const;
