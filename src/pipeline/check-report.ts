/**
 * The result of a whole `modalgate check` run, from the model reports and the run's own problem
 * (a bad config, an interrupt): the typed `CheckReport` every reporter formats.
 */
import { hostname } from 'node:os';
import { packageVersion } from '../io/package-root.js';
import { CAUTION, junitTimestamp, runVerdict, type CheckReport, type ModelReport, type ProblemReport } from './result-types.js';

export interface CheckRun {
  configPath?: string;
  /** When the run started. */
  started: Date;
  timeMs: number;
  models: ModelReport[];
  problem?: ProblemReport;
}

export function checkReport(run: CheckRun): CheckReport {
  return {
    tool: { name: 'modalgate', version: packageVersion() },
    configPath: run.configPath,
    timestamp: junitTimestamp(run.started),
    timeMs: run.timeMs,
    hostname: currentHostname(),
    verdict: runVerdict(run.models, run.problem),
    caution: CAUTION,
    models: run.models,
    problem: run.problem,
  };
}

function currentHostname(): string {
  try {
    return hostname() || 'localhost';
  } catch {
    return 'localhost';
  }
}
