/**
 * The result of one `modalgate check` run, as the pipeline produces it and the reporters receive
 * it (src/report imports these types; the pipeline never imports src/report). Everything here is
 * already computed (by src/pipeline from src/model, src/eigen and src/rules); reporters only
 * format it.
 */
import type { RuleResult } from '../rules/engine.js';
import type { ClusterExtension, SturmCheck } from '../eigen/modes-types.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
import type { ComparisonFacts } from '../model/comparison-facts.js';
import type { ReportUnits } from '../rules/utils/units.js';
import type { ExplainedChanges } from '../model/change-facts.js';

export const CAUTION =
  'modalgate screens models and does not certify structures: its results support, never replace, review by a qualified engineer under the applicable codes.';

export type Verdict = 'pass' | 'fail' | 'error';

/** A defect that stopped a model (or the whole run) before its rules could run. */
export interface ProblemReport {
  /**
   * 'input' for bad files/config (InputError), 'limit' for a model stopped at a time or memory
   * limit, 'interrupted' for a run ended by SIGINT/SIGTERM, 'write' for a report or baseline that
   * could not be written, 'internal' for anything else.
   */
  kind: 'input' | 'limit' | 'interrupted' | 'write' | 'internal';
  message: string;
  file?: string;
  line?: number;
  where?: string;
}

export interface ModelStats {
  /** DOFs in the exported matrices. */
  dofs: number;
  /** DOFs solved: the exported ones less those constraint sets removed. */
  solvedDofs?: number;
  stiffnessNonzeros: number;
  massNonzeros: number;
  stiffnessFile: string;
  massFile: string;
  dofsFile?: string;
  /** Nodes in the DOF map, when one was given. */
  nodes?: number;
}

export interface SolveReport {
  method: string;
  ordering: string;
  requested: { count?: number; maxHz?: number };
  modesReturned: number;
  shifts: number[];
  iterations: number;
  sturm: SturmCheck;
  factorNonzeros: number;
  maxDiagonalToPivotRatio: number;
  timings: { totalMs: number; factorMs: number; iterateMs: number; verifyMs: number };
  massOrthogonality: number;
  stiffnessOrthogonality: number;
  warnings: string[];
  /** The solve's own course (e.g. a shift abandoned and the solve restarted): detail, not warnings. */
  diagnostics?: string[];
  /** The count ended inside a cluster of equal eigenvalues and the whole cluster was returned. */
  clusterExtension?: ClusterExtension;
  /** Which kernels ran: SIMD (WebAssembly, over the factor's memory) or the plain loops. */
  kernels?: { factor: 'simd' | 'plain'; sweeps: 'simd' | 'plain' };
}

export interface ModeRow {
  /** 1-based, counting rigid-body modes. */
  mode: number;
  eigenvalue: number;
  frequencyHz: number;
  residual: number;
}

export interface ModelReport {
  name: string;
  verdict: Verdict;
  /** Local time the model's check started, `YYYY-MM-DDThh:mm:ss` (JUnit form, no zone). */
  timestamp: string;
  timeMs: number;
  ruleSets: string[];
  stats?: ModelStats;
  solve?: SolveReport;
  modes?: ModeRow[];
  rules: RuleResult[];
  problem?: ProblemReport;
  /** Geometry facts (mass properties, participation, mechanisms), when the model has a DOF map. */
  geometry?: GeometryFacts;
  /** Comparison with the stored baseline, when one was compared. */
  comparison?: ComparisonFacts;
  /** Units of the config (`units:`) the texts show masses and lengths in; the facts stay in the model's units. */
  units?: ReportUnits;
  /** What changed since the baseline (change map) and where each frequency change came from (attribution). */
  changes?: ExplainedChanges;
  /** Baseline files written for this model by `check --save-baseline`. */
  baselineSaved?: { json: string; shapes: string; dofs?: string; massShapes?: string; nodes?: string };
  /** Why a baseline comparison asked for was not made (missing directory or baseline): a warning. */
  baselineWarning?: string;
  /** Why `check --save-baseline` saved nothing for this model (e.g. its verdict is error). */
  baselineNotSaved?: string;
}

export interface CheckReport {
  tool: { name: 'modalgate'; version: string };
  configPath?: string;
  /** First 16 hex digits of the SHA-256 of the config file: `merge` refuses reports of different configs. */
  configHash?: string;
  /** The run checked one shard of the models (`check --shard k/n`); `configModels`: all of them, in config order. */
  shard?: { index: number; count: number; configModels: string[] };
  timestamp: string;
  timeMs: number;
  hostname: string;
  verdict: Verdict;
  caution: string;
  models: ModelReport[];
  /** A defect of the run itself (bad config): no model could be checked. */
  problem?: ProblemReport;
}

/** The run's verdict from its models: any error → error, any failure → fail. */
export function runVerdict(models: ModelReport[], problem?: ProblemReport): Verdict {
  if (problem || models.some((m) => m.verdict === 'error')) return 'error';
  if (models.some((m) => m.verdict === 'fail')) return 'fail';
  return 'pass';
}

/** `YYYY-MM-DDThh:mm:ss` in local time, as JUnit consumers expect (no zone). */
export function junitTimestamp(d: Date): string {
  const p = (x: number) => String(x).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}:${p(d.getSeconds())}`;
}

/** Counts a reporter shows for one model. Warnings are rules that failed at severity `warning`. */
export function ruleCounts(rules: RuleResult[]): { total: number; passed: number; failed: number; warnings: number; errors: number; skipped: number } {
  const c = { total: rules.length, passed: 0, failed: 0, warnings: 0, errors: 0, skipped: 0 };
  for (const r of rules) {
    if (r.status === 'skip') c.skipped++;
    else if (r.severity === 'warning' && (r.status === 'fail' || r.status === 'error')) c.warnings++;
    else if (r.status === 'fail') c.failed++;
    else if (r.status === 'error') c.errors++;
    else c.passed++;
  }
  return c;
}
