/**
 * Splitting a config's models over the parallel jobs of a CI server (`check --shard k/n`): the
 * CI system runs the jobs, modalgate only decides which models each one checks, the same way on
 * every job, and `modalgate merge` joins their JSON reports afterwards.
 *
 * Each model gets a cost: the seconds it took in an earlier run (a timings file), or else a cost
 * predicted from the Matrix Market size lines alone (no entry is read):
 *
 *   cost = (entries(K) + entries(M) + DOFs) × DOFs^(1/3)
 *
 * (our choice: the nonzeros of a nested-dissection factor of a 3-D mesh grow about as n^(4/3),
 * from memory, and a solve's work follows the factor). Only ratios matter. The models are then
 * dealt out greedily, longest first (LPT): sorted by cost descending, ties by name, each given
 * to the shard with the least cost so far, ties to the lowest shard index. Costs are whole
 * numbers, so every job computes the same split.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { readStructuredFile } from '../io/config-loader.js';
import { InputError } from '../io/errors.js';
import { readMatrixHeader } from '../io/matrix-market-reader.js';
import type { ModelJob } from './job-types.js';

/** Shard `index` (1-based) of `count`. */
export interface ShardSpec {
  index: number;
  count: number;
}

export interface ModelCost {
  name: string;
  cost: number;
}

/** "2/4" → { index: 2, count: 4 }; undefined unless both are whole numbers with 1 ≤ k ≤ n. */
export function parseShardSpec(text: string): ShardSpec | undefined {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!m) return undefined;
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (!Number.isSafeInteger(index) || !Number.isSafeInteger(count) || count < 1 || index < 1 || index > count) return undefined;
  return { index, count };
}

/**
 * Predicted cost of each model from the size lines of K and M. A model whose header cannot be
 * read costs 0 (it will stop with its input error in whichever shard it lands, quickly).
 */
export async function predictedCosts(jobs: ModelJob[]): Promise<ModelCost[]> {
  const out: ModelCost[] = [];
  for (const job of jobs) {
    let cost = 0;
    try {
      const k = await readMatrixHeader(job.stiffnessPath, { role: 'stiffness' });
      const m = await readMatrixHeader(job.massPath, { role: 'mass' });
      const dofs = k.size.rows;
      cost = Math.round((k.size.entries + m.size.entries + dofs) * Math.cbrt(dofs));
    } catch {
      cost = 0;
    }
    out.push({ name: job.name, cost });
  }
  return out;
}

/**
 * Seconds per model from a timings file: either a modalgate JSON report of an earlier run (from
 * `check --json` or `merge --json`; each model's `timeMs`), or a JSON/YAML map name → seconds.
 */
export function readTimings(path: string): Map<string, number> {
  const doc = readStructuredFile(path);
  const seconds = new Map<string, number>();
  if (doc !== null && typeof doc === 'object' && Array.isArray((doc as { models?: unknown }).models)) {
    const models = (doc as { models: unknown[] }).models;
    models.forEach((m, i) => {
      const { name, timeMs } = (m ?? {}) as { name?: unknown; timeMs?: unknown };
      if (typeof name !== 'string' || typeof timeMs !== 'number' || !(timeMs >= 0)) {
        throw new InputError(path, 'each model of a report needs a name and a timeMs of zero or more', { where: `models[${i}]` });
      }
      seconds.set(name, timeMs / 1000);
    });
    return seconds;
  }
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) {
    throw new InputError(path, 'expected a modalgate JSON report or a map of model name → seconds');
  }
  for (const [name, value] of Object.entries(doc)) {
    if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
      throw new InputError(path, 'expected a number of seconds (zero or more)', { where: name });
    }
    seconds.set(name, value);
  }
  return seconds;
}

/**
 * The cost of each model: its time in milliseconds when the timings know it; otherwise its
 * predicted cost scaled to milliseconds by the median ratio time/predicted over the models the
 * timings do know (when they know none, the predicted costs alone).
 */
export function modelCosts(predicted: ModelCost[], timings?: Map<string, number>): ModelCost[] {
  if (!timings) return predicted;
  const ratios = predicted.filter((p) => timings.has(p.name) && p.cost > 0).map((p) => (timings.get(p.name)! * 1000) / p.cost).sort((a, b) => a - b);
  if (ratios.length === 0) return predicted;
  const mid = ratios.length >> 1;
  const ratio = ratios.length % 2 === 1 ? ratios[mid] : (ratios[mid - 1] + ratios[mid]) / 2;
  return predicted.map((p) => ({ name: p.name, cost: Math.round(timings.has(p.name) ? timings.get(p.name)! * 1000 : p.cost * ratio) }));
}

/** Longest first, to the lightest shard: `count` lists of models (each in LPT order). */
export function assignShards(costs: ModelCost[], count: number): ModelCost[][] {
  const order = [...costs].sort((a, b) => b.cost - a.cost || (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  const loads = new Array<number>(count).fill(0);
  const shards = Array.from({ length: count }, (): ModelCost[] => []);
  for (const m of order) {
    let lightest = 0;
    for (let s = 1; s < count; s++) if (loads[s] < loads[lightest]) lightest = s;
    shards[lightest].push(m);
    loads[lightest] += m.cost;
  }
  return shards;
}

/** The jobs of one shard, in config order. */
export async function shardJobs(jobs: ModelJob[], spec: ShardSpec, timingsPath?: string): Promise<ModelJob[]> {
  const timings = timingsPath !== undefined ? readTimings(timingsPath) : undefined;
  const costs = modelCosts(await predictedCosts(jobs), timings);
  const mine = new Set(assignShards(costs, spec.count)[spec.index - 1].map((m) => m.name));
  return jobs.filter((j) => mine.has(j.name));
}

/** A short fingerprint of the config file's bytes (first 16 hex digits of its SHA-256), or undefined when unreadable. */
export function configDigest(path: string): string | undefined {
  try {
    return createHash('sha256').update(readFileSync(path)).digest('hex').slice(0, 16);
  } catch {
    return undefined;
  }
}
