/**
 * A model that runs no rule is a config error (exit 2, one line naming the config file and the
 * model, a JUnit <error>, the JSON report's `problem`), not a pass with "0/0 rules passed".
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runCheck } from '../../src/cli/check.js';

const models = resolve(import.meta.dirname, 'models');
let work: string;
beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), 'modalgate-norules-'));
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function check(yaml: string) {
  const config = join(work, `c${Math.random().toString(36).slice(2)}.yaml`);
  writeFileSync(config, yaml);
  const errors: string[] = [];
  const printed: string[] = [];
  const out = await runCheck({ config, junit: join(work, 'j.xml'), json: join(work, 'r.json'), print: (t) => printed.push(t), printError: (l) => errors.push(l) });
  return { config, out, errors, printed: printed.join(''), junit: readFileSync(join(work, 'j.xml'), 'utf8'), json: JSON.parse(readFileSync(join(work, 'r.json'), 'utf8')) };
}

describe('a model without rules', () => {
  it('is refused as a config error, not passed with 0/0 rules', async () => {
    const r = await check(`models:\n  - name: ok\n    stiffness: ${models}/tiny.stiffness.mtx\n    mass: ${models}/tiny.mass.mtx\n    ruleSets: [supported]\n    rules: { first-elastic-frequency: { minHz: 0.1 } }\n  - name: bare\n    stiffness: ${models}/tiny.stiffness.mtx\n    mass: ${models}/tiny.mass.mtx\n`);
    expect(r.out.code).toBe(2);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0].trim().split('\n')).toHaveLength(1);
    expect(r.errors[0]).toContain(`${r.config}: models[1]: model "bare" has no rule to run`);
    expect(r.printed).not.toContain('0/0 rules passed');
    expect(r.junit).toContain('<error message=');
    expect(r.junit).toContain('model &quot;bare&quot; has no rule to run');
    expect(r.json.verdict).toBe('error');
    expect(r.json.problem).toMatchObject({ kind: 'input', file: r.config, where: 'models[1]' });
    expect(r.json.problem.message).toContain('model "bare" has no rule to run');
  });
  it('is refused when every rule it names is off', async () => {
    const r = await check(`defaults: { rules: { matrix-finite: off } }\nmodels:\n  - name: quiet\n    stiffness: ${models}/tiny.stiffness.mtx\n    mass: ${models}/tiny.mass.mtx\n`);
    expect(r.out.code).toBe(2);
    expect(r.errors[0]).toContain('models[0]: model "quiet" has no rule to run: its rule sets and rules leave every rule off');
    expect(r.json.problem.where).toBe('models[0]');
  });
});
