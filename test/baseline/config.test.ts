/**
 * The `baseline` block of the config (top level and per model) and the command-line overrides:
 * paths resolved next to the config, the model's keys winning, the regression rules switched on
 * at their defaults when a baseline is compared (and still switchable per rule), bad entries as
 * InputErrors naming the config and the place in it.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { InputError } from '../../src/io/errors.js';
import { repoRoot } from '../cli/built-cli.js';

const work = mkdtempSync(join(tmpdir(), 'modalgate-baseline-config-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const models = join(repoRoot, 'test/config/models');
const model = (name: string, extra = ''): string => `  - { name: ${name}, stiffness: ${models}/tiny.stiffness.mtx, mass: ${models}/tiny.mass.mtx${extra} }\n`;

function write(name: string, text: string): string {
  const p = join(work, name);
  writeFileSync(p, text);
  return p;
}

const regression = ['frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes', 'mass-drift'];

describe('baseline config', () => {
  it('merges top-level and model settings and switches the regression rules on', () => {
    mkdirSync(join(work, 'base'), { recursive: true });
    mkdirSync(join(work, 'other'), { recursive: true });
    const p = write('a.yaml', `baseline: { dir: base, weighting: plain, maxDofs: 50 }\nmodels:\n${model('one')}${model('two', ', baseline: { dir: other, minPairMac: 0.7 }, rules: { mode-swap: warning, frequency-drift: off }')}${model('three')}`);
    const config = loadConfig(p);
    const [one, two] = config.models;
    expect(one.baseline).toMatchObject({ compareDir: join(work, 'base'), weighting: 'plain', maxDofs: 50, where: 'baseline' });
    expect(two.baseline).toMatchObject({ compareDir: join(work, 'other'), weighting: 'plain', minPairMac: 0.7, where: 'models[1].baseline' });
    expect(one.rules.map((r) => r.rule.id)).toEqual(regression);
    expect(one.rules.find((r) => r.rule.id === 'mode-shape-match')!.options).toEqual({ minMac: 0.9 });
    expect(two.rules.map((r) => [r.rule.id, r.severity])).toEqual([['mode-shape-match', 'error'], ['mode-swap', 'warning'], ['new-or-lost-modes', 'error'], ['mass-drift', 'error']]);
  });
  it('leaves the regression rules off without a baseline, and the command line can give one', () => {
    const p = write('b.yaml', `models:\n${model('one', ', rules: { matrix-finite: error }')}`);
    expect(loadConfig(p).models[0].rules.map((r) => r.rule.id)).toEqual(['matrix-finite']);
    expect(loadConfig(p).models[0].baseline).toBeUndefined();
    const withCli = loadConfig(p, { baselineDir: join(work, 'base'), saveBaselineDir: join(work, 'new') }).models[0];
    expect(withCli.baseline).toMatchObject({ compareDir: join(work, 'base'), saveDir: join(work, 'new') });
    expect(withCli.rules.map((r) => r.rule.id).filter((id) => id !== 'matrix-finite')).toEqual(regression);
    // saving alone compares with nothing: no regression rules
    expect(loadConfig(p, { saveBaselineDir: join(work, 'new') }).models[0].rules.map((r) => r.rule.id)).toEqual(['matrix-finite']);
    // and a model left with no rule at all is refused (a check without rules proves nothing)
    const bare = write('b2.yaml', `models:\n${model('one')}`);
    expect(() => loadConfig(bare, { saveBaselineDir: join(work, 'new') })).toThrow(/models\[0\]: model "one" has no rule to run/);
  });
  it('accepts a missing directory (the baseline rules skip with a warning when the model runs), rejects a file and bad settings', () => {
    const p = write('c.yaml', `baseline: { dir: nowhere }\nmodels:\n${model('one')}`);
    expect(loadConfig(p).models[0].baseline?.compareDir).toBe(join(work, 'nowhere'));
    const file = write('c2.yaml', `baseline: { dir: c.yaml }\nmodels:\n${model('one')}`);
    expect(() => loadConfig(file)).toThrow(InputError);
    expect(() => loadConfig(file)).toThrow(/c2\.yaml: baseline\.dir: baseline directory is a file: .*c\.yaml/);
    expect(loadConfig(p, { saveBaselineDir: join(work, 'nowhere') }).models[0].baseline?.compareDir).toBe(join(work, 'nowhere'));
    const bad = write('d.yaml', `baseline: { dir: base, weighting: heavy }\nmodels:\n${model('one')}`);
    expect(() => loadConfig(bad)).toThrow(/d\.yaml: baseline\.weighting/);
  });
});
