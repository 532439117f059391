/**
 * `check --jobs n` on the built CLI: the demo config (6 models) checked two at a time gives the
 * same JUnit (times and timestamps aside) and the same exit code (1: the demo's intended failure)
 * as one at a time, with the models in config order and one phase line per model, each starting
 * with its model's name; with --shard the shard's models run the same way; bad values exit 2
 * with one line. Interruption, --time-limit and --max-memory with --jobs: test/cli/interrupt.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli, type CliRun } from './built-cli.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { shardJobs } from '../../src/pipeline/shard.js';

const config = join(repoRoot, 'fixtures/demo/modalgate.yaml');
const demoModels = ['mast', 'mast-free', 'mast-guyed', 'mast-guyed-loose-anchor', 'mast-thin-brace', 'bracket'];
const withoutTimes = (xml: string) => xml.replace(/ (time|timestamp)="[^"]*"/g, '');
const PHASE_LINE = /^(\S+): read \d/;

let work: string;
let one: CliRun;
let two: CliRun;
beforeAll(async () => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-jobs-'));
  // one after the other: the machine is shared, and --jobs 2 wants both cores
  one = await runCli(['check', '-c', config, '--junit', 'one.xml', '--json', 'one.json'], work);
  two = await runCli(['check', '-c', config, '--junit', 'two.xml', '--json', 'two.json', '--jobs', '2'], work);
}, 240_000);
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('check --jobs', () => {
  it('--jobs 2 gives the JUnit and exit code of --jobs 1, models in config order', () => {
    expect(one.code, one.stderr).toBe(1);
    expect(two.code, two.stderr).toBe(one.code);
    expect(withoutTimes(readFileSync(join(work, 'two.xml'), 'utf8'))).toBe(withoutTimes(readFileSync(join(work, 'one.xml'), 'utf8')));
    const names = (f: string) => (JSON.parse(readFileSync(join(work, f), 'utf8')) as { models: { name: string }[] }).models.map((m) => m.name);
    expect(names('two.json')).toEqual(demoModels);
    expect(names('one.json')).toEqual(demoModels);
  });

  it('outside a TTY each model gets one whole phase line that starts with its name', () => {
    const models = two.stdout.split('\n').filter((l) => PHASE_LINE.test(l)).map((l) => l.match(PHASE_LINE)![1]);
    expect([...models].sort()).toEqual([...demoModels].sort());
    expect(two.stdout).toContain(' · rules ');
  });

  it('--shard with --jobs checks the shard’s models, with the verdicts of the whole run', async () => {
    const r = await runCli(['check', '-c', config, '--shard', '1/2', '--jobs', '2', '--json', 's1.json', '-q'], work);
    expect([0, 1], r.stderr).toContain(r.code);
    const report = (f: string) => JSON.parse(readFileSync(join(work, f), 'utf8')) as { models: { name: string; verdict: string }[]; shard?: { configModels: string[] } };
    const shard = report('s1.json');
    const expected = (await shardJobs(loadConfig(config).models, { index: 1, count: 2 })).map((j) => j.name);
    expect(shard.models.map((m) => m.name)).toEqual(expected);
    const whole = new Map(report('one.json').models.map((m) => [m.name, m.verdict]));
    for (const m of shard.models) expect(m.verdict, m.name).toBe(whole.get(m.name));
    expect(r.code).toBe(shard.models.some((m) => m.verdict === 'fail') ? 1 : 0);
  }, 240_000);

  it.each([['-1'], ['two'], ['1.5']])('refuses --jobs %s: exit 2, one line', async (value) => {
    const r = await runCli(['check', '-c', config, '--jobs', value], work);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`modalgate: --jobs ${value}: expected a whole number ≥ 1, or auto (or 0) for one per core\n`);
  }, 60_000);
});
