/**
 * Multilevel separator runs of the ordering (src/sparse/ordering/multilevel-bisection.ts) on the
 * helper threads (helper-thread.ts).
 */
import { multilevelSeparator } from './ordering/multilevel-bisection.js';
import type { WeightedGraph } from './ordering/coarsen-graph.js';
import { expectAnswer, postJob, startHelpers, type Answer } from './helper-thread.js';

/** Independent separator runs of `graph`, one per seed. */
export interface SeparatorRunsJob {
  kind: 'separatorRuns';
  graph: WeightedGraph;
  seeds: number[];
}

/** The runs' labellings, in seed order. */
interface Separators extends Answer {
  kind: 'separators';
  wheres: Uint8Array[];
}

/**
 * Starts independent multilevel separator runs (src/sparse/ordering/multilevel-bisection.ts) with
 * the given seeds on helper `helper` (0 … N − 2; one job in flight per helper) and returns a
 * function that waits for their labellings, in seed order; null without that helper (the caller
 * runs them here). The graph is copied.
 */
export function startSeparatorRuns(graph: WeightedGraph, seeds: number[], helper: number): (() => Uint8Array[]) | null {
  if (seeds.length === 0) return null;
  const h = startHelpers(helper + 1)[helper];
  if (h === undefined) return null;
  const wait = postJob(h, { kind: 'separatorRuns', graph, seeds } satisfies SeparatorRunsJob);
  return () => expectAnswer<Separators>(wait(), 'separators').wheres;
}

/** The helper's handler of this job (helper-worker.ts). */
export const separatorJobHandlers = {
  separatorRuns(job: SeparatorRunsJob): Separators {
    return { kind: 'separators', wheres: job.seeds.map((seed) => multilevelSeparator(job.graph, seed)) };
  },
};
