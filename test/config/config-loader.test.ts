import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { readFileSync } from 'node:fs';
import { parse } from 'yaml';
import { findConfig } from '../../src/io/config-loader.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { InputError } from '../../src/io/errors.js';
import { badCases } from './bad-configs.js';

const here = import.meta.dirname;
const goodPath = resolve(here, 'good/modalgate.yaml');
const repo = resolve(here, '../..');

describe('config loader: a good config', () => {
  const config = loadConfig(goodPath);
  const [tiny, free] = config.models;
  const rule = (m: typeof tiny, id: string) => m.rules.find((r) => r.rule.id === id);

  it('resolves paths relative to the config file', () => {
    expect(tiny.stiffnessPath).toBe(resolve(here, 'models/tiny.stiffness.mtx'));
    expect(tiny.dofsPath).toBe(resolve(here, 'models/tiny.dofs.csv'));
    expect(config.reports.junit).toBe(resolve(here, 'good/out/junit.xml'));
  });
  it('inherits defaults and lets a model switch count for maxHz', () => {
    expect(tiny.solve).toMatchObject({ count: 3 });
    expect(free.solve).toMatchObject({ maxHz: 50, count: undefined });
  });
  it('merges defaults ← rule sets ← defaults.rules ← model rules, and drops rules set off', () => {
    expect(rule(tiny, 'conditioning')).toBeUndefined();
    expect(rule(tiny, 'first-elastic-frequency')!.options).toMatchObject({ minHz: 0.5, maxHz: 100, cutoffRatio: 1e-4 });
    // the range form replaces `expected` from the supported rule set
    const rb = rule(tiny, 'rigid-body-modes')!.options;
    expect(rb).toMatchObject({ min: 0, max: 1, cutoffBasis: 'ratio' });
    expect('expected' in rb).toBe(false);
  });
  it('applies rule sets in order: handoff-audit tightens free-free, then the user file wins', () => {
    expect(rule(free, 'rigid-body-modes')!.options).toMatchObject({ expected: 6 });
    expect(rule(free, 'mass-normalization')!.options).toMatchObject({ tolerance: 1e-8 });
    expect(rule(free, 'conditioning')!.severity).toBe('error');
    expect(rule(free, 'eigen-residual')!.options).toMatchObject({ tolerance: 1e-9 });
    expect(rule(free, 'mode-frequencies')).toMatchObject({ severity: 'warning', options: { targets: [{ mode: 2, hz: 1.5 }], tolerancePercent: 5 } });
  });
  it('is found in the working directory', () => {
    expect(findConfig(undefined, resolve(here, 'good'))).toBe(goodPath);
    expect(() => findConfig(undefined, here)).toThrow(/no config found .* run `modalgate init`/);
  });
});

describe('config loader: the bad-config corpus', () => {
  const cases = badCases();
  it('has at least 12 cases', () => expect(cases.length).toBeGreaterThanOrEqual(12));
  for (const c of cases) {
    it(c.file, () => {
      let error: unknown;
      try {
        loadConfig(c.path);
      } catch (e) {
        error = e;
      }
      expect(error, 'must throw').toBeInstanceOf(InputError);
      const e = error as InputError;
      expect(e.file).toBe(c.blamed);
      expect(e.where).toBe(c.where);
      expect(e.reason).toContain(c.reason);
      expect(e.message.includes('\n')).toBe(false);
    });
  }
});

describe('JSON Schemas in rules/schema', () => {
  // strictRequired off: `anyOf: [{ required: [x] }, …]` names properties declared beside it
  const ajv = new Ajv2020({ strict: true, strictRequired: false, allErrors: true });
  const configSchema = ajv.compile(JSON.parse(readFileSync(join(repo, 'rules/schema/config.schema.json'), 'utf8')));
  const ruleSetSchema = ajv.compile(JSON.parse(readFileSync(join(repo, 'rules/schema/rule-set.schema.json'), 'utf8')));
  it('accept the built-in rule sets, the demo config and the starter config', async () => {
    for (const name of ['free-free', 'supported', 'handoff-audit']) {
      expect(ruleSetSchema(parse(readFileSync(join(repo, 'rules', `${name}.yaml`), 'utf8'))), name).toBe(true);
    }
    const { STARTER_CONFIG } = await import('../../src/cli/init.js');
    expect(configSchema(parse(STARTER_CONFIG))).toBe(true);
    expect(configSchema(parse(readFileSync(goodPath, 'utf8')))).toBe(true);
  });
  it('a JSON config works like YAML', () => {
    const dir = mkdtempSync(join(tmpdir(), 'modalgate-cfg-'));
    try {
      const p = join(dir, 'modalgate.json');
      const models = resolve(here, 'models');
      writeFileSync(p, JSON.stringify({ models: [{ name: 'j', stiffness: join(models, 'tiny.stiffness.mtx'), mass: join(models, 'tiny.mass.mtx'), ruleSets: ['free-free'] }] }));
      expect(findConfig(undefined, dir)).toBe(p);
      const c = loadConfig(p);
      expect(c.models[0].solve.count).toBe(20);
      expect(c.models[0].rules.length).toBe(12); // free-free: 10 numerical checks + rigid-body-energy + mass-consistency
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
