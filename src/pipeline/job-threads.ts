/**
 * How many models `check --jobs` runs at once, and how many solver threads each gets, so that
 * jobs × threads does not exceed the cores:
 *
 *   jobs    = the number asked for (auto or 0: the cores), never more than the models to check
 *   threads = max(1, floor(cores / jobs)), at most a MODALGATE_THREADS the user set,
 *             and 1 for a model too small to gain from a second thread (ONE_THREAD_BELOW_DOFS,
 *             the rule every solve follows: sparse/helper-thread.ts withThreadsForDofs)
 *
 * Each model worker gets `threads` as its MODALGATE_THREADS, which the solver reads in the
 * thread where it runs.
 */
import { ONE_THREAD_BELOW_DOFS, threadCapOf } from '../sparse/helper-thread.js';

/** A model below this many DOFs is solved on one thread (the solver's one rule, sparse/helper-thread.ts). */
export { ONE_THREAD_BELOW_DOFS };

/** `--jobs` text: a whole number ≥ 1, or `auto` / `0` (choose from the cores); undefined when it is neither. */
export function parseJobs(text: string): number | 'auto' | undefined {
  const t = text.trim().toLowerCase();
  if (t === 'auto' || t === '0') return 'auto';
  if (!/^\d+$/.test(t)) return undefined;
  const n = Number(t);
  return Number.isSafeInteger(n) && n >= 1 ? n : undefined;
}

/** Models checked at once: `requested` (auto: one per core), at least 1 and at most `models`. */
export function concurrentJobs(requested: number | 'auto', cores: number, models: number): number {
  const asked = requested === 'auto' ? cores : requested;
  return Math.max(1, Math.min(asked, models));
}

/** A MODALGATE_THREADS the user set: a whole number ≥ 1, else undefined (unset or not a number: no cap); read as the solver reads it. */
export const userThreadCap = threadCapOf;

/** Solver threads of each of `jobs` concurrent models on `cores` cores: max(1, floor(cores / jobs)), at most `cap`. */
export function solverThreads(cores: number, jobs: number, cap?: number): number {
  const share = Math.max(1, Math.floor(cores / Math.max(1, jobs)));
  return cap !== undefined ? Math.max(1, Math.min(share, cap)) : share;
}

/** The threads one model gets: its share, or 1 when it has fewer than ONE_THREAD_BELOW_DOFS (unknown size: its share). */
export function threadsForModel(share: number, dofs: number | undefined): number {
  return dofs !== undefined && dofs < ONE_THREAD_BELOW_DOFS ? 1 : share;
}
