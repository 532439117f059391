/**
 * Scale-out on a CI server's parallel jobs, with the commands of the CI templates (ci/, as
 * `init --ci -o <config>` writes them): the refresh job saves baselines, then `check --shard k/3`
 * on the demo config (6 models) three times comparing with them, then `merge` of the three JSON
 * reports. The merged JUnit equals a single `check` run's (the template's shard command without
 * --shard), times and timestamps aside, and so does the exit code (1: the demo's intended
 * failure); under GitHub Actions merge writes the job summary. Also: the shards partition the models, the split is deterministic and balanced,
 * bad --shard values and bad merges exit 2 with one line, an empty shard passes with a note.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli, type CliRun } from './built-cli.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { assignShards, modelCosts, predictedCosts, readTimings, shardJobs, type ModelCost } from '../../src/pipeline/shard.js';
import { structuralProblems } from '../report/junit-validation.js';
import { ciJobFile } from '../../src/cli/init.js';
import { expandGlob, findCommand, templateCommands } from '../ci/template-commands.js';

const config = join(repoRoot, 'fixtures/demo/modalgate.yaml');
const demoModels = ['mast', 'mast-free', 'mast-guyed', 'mast-guyed-loose-anchor', 'mast-thin-brace', 'bracket'];
/** JUnit text without the attributes that differ from run to run. */
const withoutTimes = (xml: string) => xml.replace(/ (time|timestamp)="[^"]*"/g, '');

let work: string;
beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-shard-'));
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('check --shard k/n, then merge, as the CI templates run them', () => {
  let shards: CliRun[];
  let single: CliRun;
  let merged: CliRun;
  let saved: CliRun;
  const shardFile = (k: number) => `modalgate-report/shard-${k}.json`;
  const shardReport = (k: number) => JSON.parse(readFileSync(join(work, shardFile(k)), 'utf8')) as { models: { name: string; verdict: string }[]; shard: { index: number; count: number; configModels: string[] }; configHash: string };
  const template = ciJobFile('github', config);
  beforeAll(async () => {
    const save = findCommand(templateCommands('github', template), (a) => a.includes('--save-baseline')).argv;
    saved = await runCli([...save, '-q'], work);
    const shardArgv = (k: number) => findCommand(templateCommands('github', template, k, 3), (a) => a.includes('--shard')).argv;
    // the single-job variant: the shard command without --shard, with a JUnit report instead
    const singleArgv = shardArgv(1).filter((w, i, a) => w !== '--shard' && a[i - 1] !== '--shard').map((w, i, a) => (a[i - 1] === '--json' ? 'single.xml' : w === '--json' ? '--junit' : w));
    [single, ...shards] = await Promise.all([runCli([...singleArgv, '-q'], work), ...[1, 2, 3].map((k) => runCli([...shardArgv(k), '-q'], work))]);
    const merge = findCommand(templateCommands('github', template), (a) => a[0] === 'merge').argv;
    merged = await runCli(merge.flatMap((w) => expandGlob(w, work)), work, { GITHUB_STEP_SUMMARY: join(work, 'step-summary.md') });
  });

  it('the commands are the templates’: baselines saved, shards compared with them', () => {
    expect(saved.code, saved.stderr).toBe(1); // the demo's intended failure; the other models are saved
    expect(readdirSync(join(work, 'baselines')).filter((f) => f.endsWith('.baseline.json')).sort()).toEqual(demoModels.map((m) => `${m}.baseline.json`).sort());
    const merged = JSON.parse(readFileSync(join(work, 'modalgate-report/report.json'), 'utf8')) as { models: { name: string; rules: { ruleId: string; status: string }[] }[] };
    const drift = merged.models.map((m) => m.rules.find((r) => r.ruleId === 'frequency-drift')?.status);
    expect(drift).toEqual(demoModels.map(() => 'pass'));
  });

  it('the merged JUnit equals a single run’s, times and timestamps aside, and the exit code matches (1)', () => {
    expect(single.code, single.stderr).toBe(1);
    expect(merged.code, merged.stderr).toBe(single.code);
    const mergedXml = readFileSync(join(work, 'modalgate-report/junit.xml'), 'utf8');
    expect(structuralProblems(mergedXml)).toEqual([]);
    expect(withoutTimes(mergedXml)).toBe(withoutTimes(readFileSync(join(work, 'single.xml'), 'utf8')));
    const json = JSON.parse(readFileSync(join(work, 'modalgate-report/report.json'), 'utf8'));
    expect(json.verdict).toBe('fail');
    expect(json.models.map((m: { name: string }) => m.name)).toEqual(demoModels);
    expect(json.shard).toBeUndefined();
    expect(readFileSync(join(work, 'modalgate-report/summary.md'), 'utf8')).toContain('mast-guyed-loose-anchor');
    expect(readFileSync(join(work, 'step-summary.md'), 'utf8')).toBe(readFileSync(join(work, 'modalgate-report/summary.md'), 'utf8'));
    expect(readFileSync(join(work, 'modalgate-report/report.html'), 'utf8')).toContain('qualified engineer');
  });

  it('the shards partition the models: every model in exactly one shard', () => {
    // each shard's exit code is its own verdict: 1 when one of its models failed a rule, else 0
    shards.forEach((r, i) => expect(r.code, r.stderr).toBe(shardReport(i + 1).models.some((m) => m.verdict === 'fail') ? 1 : 0));
    const names = [1, 2, 3].flatMap((k) => shardReport(k).models.map((m) => m.name));
    expect([...names].sort()).toEqual([...demoModels].sort());
    for (const k of [1, 2, 3]) {
      expect(shardReport(k).shard).toEqual({ index: k, count: 3, configModels: demoModels });
      expect(shardReport(k).configHash).toMatch(/^[0-9a-f]{16}$/);
    }
  });

  it('the split is the deterministic one computed in-process, whatever the order of the models', async () => {
    const jobs = loadConfig(config).models;
    const reversed = [...jobs].reverse();
    for (const k of [1, 2, 3]) {
      const mine = (await shardJobs(jobs, { index: k, count: 3 })).map((j) => j.name);
      expect(mine).toEqual(shardReport(k).models.map((m) => m.name));
      expect((await shardJobs(reversed, { index: k, count: 3 })).map((j) => j.name).sort()).toEqual([...mine].sort());
    }
  });

  it('the predicted-cost balance is sane on the demo: the largest shard costs at most 2× the mean', async () => {
    const costs = await predictedCosts(loadConfig(config).models);
    expect(costs.every((c) => c.cost > 0)).toBe(true);
    const loads = assignShards(costs, 3).map((s) => s.reduce((a, m) => a + m.cost, 0));
    const mean = loads.reduce((a, b) => a + b, 0) / 3;
    expect(Math.max(...loads)).toBeLessThanOrEqual(2 * mean);
  });

  it('merge refuses a missing report, a duplicate, another config and a missing shard: exit 2, one line, a JUnit <error>', async () => {
    for (const k of [1, 2, 3]) copyFileSync(join(work, shardFile(k)), join(work, `s${k}.json`));
    const other = shardReport(2);
    writeFileSync(join(work, 'other.json'), JSON.stringify({ ...other, reportVersion: 1, configHash: '0123456789abcdef' }));
    writeFileSync(join(work, 'narrow.json'), JSON.stringify({ ...other, reportVersion: 1, shard: { ...other.shard, configModels: ['mast', 'bracket'] } }));
    const cases: [string[], RegExp][] = [
      [['s1.json', 'narrow.json', 's3.json'], /^modalgate: narrow\.json: was split from the models mast, bracket, but s1\.json from mast, /],
      [['s1.json', 's2.json', 'gone.json'], /^modalgate: gone\.json: no such file/],
      [['s1.json', 's2.json', 's3.json', 's3.json'], /^modalgate: s3\.json: is shard 3\/3, and so is s3\.json/],
      [['s1.json', 'other.json', 's3.json'], /^modalgate: other\.json: is a report of config .*hash 0123456789abcdef/],
      [['s1.json', 's3.json'], /^modalgate: shard\(s\) 2\/3 missing/],
    ];
    const runs = await Promise.all(cases.map(([files], i) => runCli(['merge', ...files, '--junit', `bad${i}.xml`, '-q'], work)));
    runs.forEach((r, i) => {
      expect(r.code, r.stderr).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(cases[i][1]);
      expect(readFileSync(join(work, `bad${i}.xml`), 'utf8')).toContain('<error');
    });
  });
});

describe('--shard values and the empty shard', () => {
  it('refuses k > n, n < 1, k < 1 and non-integers with one usage line, exit 2', async () => {
    const bad = ['4/3', '1/0', '0/3', '1.5/3', 'two/3', '3'];
    const runs = await Promise.all(bad.map((v) => runCli(['check', '-c', config, '--shard', v], work)));
    runs.forEach((r, i) => {
      expect(r.code).toBe(2);
      expect(r.stderr).toBe(`modalgate: --shard ${bad[i]}: expected k/n, whole numbers with 1 ≤ k ≤ n (e.g. --shard 2/4)\n`);
    });
  });

  it('refuses --timings without --shard', async () => {
    const r = await runCli(['check', '-c', config, '--timings', 'x.json'], work);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe('modalgate: --timings: only used to split the models, give --shard k/n with it\n');
  });

  it('a shard without models passes and says it is empty', async () => {
    const r = await runCli(['check', '-c', config, '--shard', '7/7', '--junit', 'empty.xml'], work);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain('shard 7/7 is empty: 6 model(s) for 7 shards');
  });
});

describe('the split itself', () => {
  it('deals longest first to the lightest shard, ties to the lowest index (hand-worked)', () => {
    // 7→1, 6→2, 5→2 (6 < 7), 4→1 (7 < 11), 3→1 (11 = 11: lowest index)
    const costs = [3, 5, 7, 4, 6].map((c) => ({ name: `m${c}`, cost: c }));
    expect(assignShards(costs, 2).map((s) => s.map((m) => m.name))).toEqual([['m7', 'm4', 'm3'], ['m6', 'm5']]);
    // equal costs: by name
    expect(assignShards([{ name: 'b', cost: 1 }, { name: 'a', cost: 1 }], 2).map((s) => s.map((m) => m.name))).toEqual([['a'], ['b']]);
  });

  it("stays within Graham's LPT bound (4/3 − 1/(3m)) × the best split, on small random cases", () => {
    // R. L. Graham, "Bounds on multiprocessing timing anomalies", SIAM J. Appl. Math. 17 (1969) 416–429 (from memory)
    let seed = 12345;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    for (let trial = 0; trial < 200; trial++) {
      const m = 2 + (trial % 3);
      const costs: ModelCost[] = Array.from({ length: 3 + (trial % 6) }, (_, i) => ({ name: `m${i}`, cost: 1 + Math.floor(rand() * 100) }));
      const lpt = Math.max(...assignShards(costs, m).map((s) => s.reduce((a, x) => a + x.cost, 0)));
      expect(lpt).toBeLessThanOrEqual((4 / 3 - 1 / (3 * m)) * bestMakespan(costs.map((c) => c.cost), m) + 1e-9);
    }
  });

  it('reads timings from a JSON report or a map name → seconds, and scales predicted costs for models it lacks', async () => {
    const mapFile = join(work, 'timings.json');
    writeFileSync(mapFile, JSON.stringify({ a: 2, b: 4 }));
    const reportFile = join(work, 'timings-report.json');
    writeFileSync(reportFile, JSON.stringify({ reportVersion: 1, models: [{ name: 'a', timeMs: 2000 }, { name: 'b', timeMs: 4000 }] }));
    expect(readTimings(mapFile)).toEqual(new Map([['a', 2], ['b', 4]]));
    expect(readTimings(reportFile)).toEqual(readTimings(mapFile));
    // a: 2 s for 100 units, b: 4 s for 100 units → median 30 ms per unit; c (50 units) → 1500 ms
    const predicted = [{ name: 'a', cost: 100 }, { name: 'b', cost: 100 }, { name: 'c', cost: 50 }];
    expect(modelCosts(predicted, readTimings(mapFile))).toEqual([{ name: 'a', cost: 2000 }, { name: 'b', cost: 4000 }, { name: 'c', cost: 1500 }]);
    // through shardJobs: a model that took 100 s last time gets a shard of its own
    const timedFile = join(work, 'timed.json');
    writeFileSync(timedFile, JSON.stringify(Object.fromEntries(demoModels.map((n) => [n, n === 'mast' ? 100 : 1]))));
    const jobs = loadConfig(config).models;
    expect((await shardJobs(jobs, { index: 1, count: 2 }, timedFile)).map((j) => j.name)).toEqual(['mast']);
    expect((await shardJobs(jobs, { index: 2, count: 2 }, timedFile)).map((j) => j.name)).toEqual(demoModels.filter((n) => n !== 'mast'));
    writeFileSync(mapFile, JSON.stringify({ a: 'slow' }));
    expect(() => readTimings(mapFile)).toThrow(/timings\.json: a: expected a number of seconds/);
  });
});

/** The least possible largest shard, by trying every assignment (small cases only). */
function bestMakespan(costs: number[], m: number): number {
  let best = Infinity;
  const loads = new Array<number>(m).fill(0);
  const place = (i: number): void => {
    if (i === costs.length) {
      best = Math.min(best, Math.max(...loads));
      return;
    }
    for (let s = 0; s < m; s++) {
      loads[s] += costs[i];
      if (loads[s] < best) place(i + 1);
      loads[s] -= costs[i];
      if (loads[s] === 0) break; // empty shards are interchangeable
    }
  };
  place(0);
  return best;
}
