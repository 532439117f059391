/**
 * Bench history: one JSON object per line (JSON Lines) in a file committed with the repository
 * (test/bench/history/, described by the README there), so that a run can be set beside the
 * previous run of the same model and a regression shows. Each line carries the run's stamp: date,
 * commit, whether the working tree had uncommitted changes, host, Node version, CPU and the load
 * average when the measurement started.
 */
import { execFileSync } from 'node:child_process';
import { appendFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export interface RunStamp {
  /** ISO 8601, UTC. */
  date: string;
  /** `git rev-parse --short HEAD`, or 'unknown' outside a git checkout. */
  commit: string;
  /** Uncommitted changes to tracked files other than the history itself. */
  dirty: boolean;
  host: string;
  node: string;
  cpu: string;
}

/** What a bench records of one model (beside the run's stamp). */
export interface EntryFields {
  /** 1-, 5- and 15-minute load averages just before this model's measurement. */
  loadAverage: number[];
  model: string;
  dofs: number;
  [field: string]: unknown;
}

export type HistoryEntry = RunStamp & EntryFields;

/** Date, commit and machine of this run. */
export function runStamp(repoRoot: string): RunStamp {
  const git = (...args: string[]): string | undefined => {
    try {
      return execFileSync('git', args, { cwd: repoRoot, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
    } catch {
      return undefined;
    }
  };
  const changes = git('status', '--porcelain', '--untracked-files=no', '--', '.', ':(exclude)test/bench/history');
  const cpus = os.cpus();
  return {
    date: new Date().toISOString().replace(/\.\d+Z$/, 'Z'),
    commit: git('rev-parse', '--short', 'HEAD') ?? 'unknown',
    dirty: changes === undefined ? false : changes.length > 0,
    host: os.hostname(),
    node: process.version,
    cpu: `${cpus.length} × ${cpus[0]?.model.trim() ?? 'unknown'}`,
  };
}

/** The 1-, 5- and 15-minute load averages now, to two decimals. */
export function loadAverageNow(): number[] {
  return os.loadavg().map((x) => Math.round(x * 100) / 100);
}

/** Every parsable entry of a history file, in file order (none when the file is missing). */
export function readHistory(file: string): HistoryEntry[] {
  if (!existsSync(file)) return [];
  const entries: HistoryEntry[] = [];
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    if (line.trim() === '') continue;
    try {
      const e = JSON.parse(line) as HistoryEntry;
      if (typeof e.model === 'string') entries.push(e);
    } catch {
      // a hand-edited or truncated line is skipped, not fatal
    }
  }
  return entries;
}

/** The latest entry of `model`, if any. */
export function previousEntry(entries: readonly HistoryEntry[], model: string): HistoryEntry | undefined {
  for (let i = entries.length - 1; i >= 0; i--) if (entries[i].model === model) return entries[i];
  return undefined;
}

/** Append one entry as one line. */
export function appendHistory(file: string, entry: HistoryEntry): void {
  mkdirSync(path.dirname(file), { recursive: true });
  appendFileSync(file, `${JSON.stringify(entry)}\n`);
}

/** "abc1234, 2026-12-05" — where a previous value came from. */
export function entryLabel(e: HistoryEntry): string {
  return `${e.commit}${e.dirty ? '+changes' : ''}, ${e.date.slice(0, 10)}`;
}
