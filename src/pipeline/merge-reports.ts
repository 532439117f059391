/**
 * One run's report from the JSON reports of its shards (`modalgate merge`): the models of every
 * shard in config order (shard reports carry the config's model list; otherwise in the order the
 * reports were given), the earliest start, the longest shard's time (the jobs ran side by side),
 * and the verdict recomputed from the models. The merge refuses, as the run's problem (exit 2, a
 * JUnit <error>): reports of different configs, a model in two reports, shards of different
 * splits, a shard given twice or missing, and any shard's own problem.
 */
import { packageVersion } from '../io/package-root.js';
import { CAUTION, runVerdict, type CheckReport, type ModelReport, type ProblemReport } from './result-types.js';

export interface ShardReport {
  /** The file the report was read from, for messages. */
  file: string;
  report: CheckReport;
}

/** Merge the reports read; `unreadable`: the first report that could not be read (it makes the run an error). */
export function mergeReports(parts: ShardReport[], unreadable?: ProblemReport): CheckReport {
  const problem = unreadable ?? sameConfig(parts) ?? shardProblem(parts) ?? sameSplit(parts) ?? duplicateModel(parts);
  const models = orderedModels(parts);
  const first = parts[0]?.report;
  const hosts = [...new Set(parts.map((p) => p.report.hostname))];
  return {
    tool: first?.tool ?? { name: 'modalgate', version: packageVersion() },
    configPath: first?.configPath,
    configHash: parts.find((p) => p.report.configHash)?.report.configHash,
    timestamp: parts.map((p) => p.report.timestamp).sort()[0] ?? '',
    timeMs: Math.max(0, ...parts.map((p) => p.report.timeMs)),
    hostname: hosts.length > 0 ? hosts.join(', ') : 'localhost',
    verdict: runVerdict(models, problem),
    caution: CAUTION,
    models,
    problem,
  };
}

function inputProblem(file: string, message: string): ProblemReport {
  return { kind: 'input', file, message: `${file}: ${message}` };
}

/** Same config hash (when both reports carry one), else the same config path. */
function sameConfig(parts: ShardReport[]): ProblemReport | undefined {
  const a = parts[0];
  for (const b of parts.slice(1)) {
    const ra = a.report;
    const rb = b.report;
    const differ = ra.configHash && rb.configHash ? ra.configHash !== rb.configHash : ra.configPath !== rb.configPath;
    if (differ) {
      const what = ra.configHash && rb.configHash ? `config ${rb.configPath ?? '?'} (hash ${rb.configHash})` : `config ${rb.configPath ?? '(none)'}`;
      return inputProblem(b.file, `is a report of ${what}, but ${a.file} is of config ${ra.configPath ?? '(none)'}${ra.configHash && rb.configHash ? ` (hash ${ra.configHash})` : ''}; merge reports of one config only`);
    }
  }
  return undefined;
}

/** Shard reports: all of one split (k/n with the same n, from the same models), each shard once, none missing. */
function sameSplit(parts: ShardReport[]): ProblemReport | undefined {
  const sharded = parts.filter((p) => p.report.shard);
  if (sharded.length === 0) return undefined;
  const plain = parts.find((p) => !p.report.shard);
  if (plain) return inputProblem(plain.file, `is not a shard report (check --shard), but ${sharded[0].file} is; merge the shards of one split`);
  const n = sharded[0].report.shard!.count;
  const seen = new Map<number, string>();
  for (const p of parts) {
    const s = p.report.shard!;
    if (s.count !== n) return inputProblem(p.file, `is shard ${s.index}/${s.count}, but ${sharded[0].file} is shard ${sharded[0].report.shard!.index}/${n}; merge the shards of one split`);
    const from = sharded[0].report.shard!.configModels;
    if (s.configModels.join('\n') !== from.join('\n')) return inputProblem(p.file, `was split from the models ${s.configModels.join(', ')}, but ${sharded[0].file} from ${from.join(', ')}; run every shard with the same --model selection`);
    const twice = seen.get(s.index);
    if (twice !== undefined) return inputProblem(p.file, `is shard ${s.index}/${n}, and so is ${twice}`);
    seen.set(s.index, p.file);
  }
  const missing = Array.from({ length: n }, (_, i) => i + 1).filter((k) => !seen.has(k));
  if (missing.length > 0) return { kind: 'input', message: `shard(s) ${missing.map((k) => `${k}/${n}`).join(', ')} missing: no report given for them (given: ${parts.map((p) => p.file).join(', ')})` };
  return undefined;
}

function duplicateModel(parts: ShardReport[]): ProblemReport | undefined {
  const where = new Map<string, string>();
  for (const p of parts) {
    for (const m of p.report.models) {
      const other = where.get(m.name);
      if (other !== undefined) return inputProblem(p.file, `model ${m.name} is also in ${other}; each model may be in one report only`);
      where.set(m.name, p.file);
    }
  }
  return undefined;
}

/** The first shard that could not run (bad config, interrupt, report not written). */
function shardProblem(parts: ShardReport[]): ProblemReport | undefined {
  const p = parts.find((x) => x.report.problem);
  if (!p) return undefined;
  const problem = p.report.problem!;
  return { ...problem, message: `${p.file}: that run's own problem: ${problem.message}` };
}

/** Every model once (the first report wins), in config order when the reports know it. */
function orderedModels(parts: ShardReport[]): ModelReport[] {
  const byName = new Map<string, ModelReport>();
  for (const p of parts) for (const m of p.report.models) if (!byName.has(m.name)) byName.set(m.name, m);
  const order = parts.find((p) => p.report.shard)?.report.shard!.configModels ?? [];
  const out: ModelReport[] = [];
  for (const name of order) {
    const m = byName.get(name);
    if (m) {
      out.push(m);
      byName.delete(name);
    }
  }
  return [...out, ...byName.values()];
}
