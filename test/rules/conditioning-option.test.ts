/**
 * conditioning: the limit is `maxPivotDrop` (largest |diagonal / pivot| of the LDLᵀ factor); the
 * rule sets, the option listing and the config all use that name, and no other name is accepted.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parse } from 'yaml';
import { conditioning } from '../../src/rules/conditioning.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { InputError } from '../../src/io/errors.js';
import { formatRules } from '../../src/cli/rules.js';
import { chainContext, exactModes, springChain } from './fake-model.js';

const repo = resolve(import.meta.dirname, '../..');
const models = join(repo, 'test/config/models');
const work = mkdtempSync(join(tmpdir(), 'modalgate-pivot-drop-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('conditioning: maxPivotDrop', () => {
  it('passes at or below the limit and names the option when it fails', () => {
    const chain = springChain(4, 100, [1, 1, 1, 1], 100);
    const modes = exactModes(chain);
    const ctx = chainContext(chain, modes);
    modes.factor = { ...modes.factor, maxDiagonalToPivotRatio: 1e7, maxRatioDof: 1 };
    expect(conditioning.evaluate(ctx, conditioning.defaults).status).toBe('pass');
    modes.factor = { ...modes.factor, maxDiagonalToPivotRatio: 2e8, maxRatioDof: 1 };
    const o = conditioning.evaluate(ctx, conditioning.defaults);
    expect(o).toMatchObject({ status: 'fail', measured: 2e8, limit: 1e7 });
    expect(o.message).toBe('pivot drop (diagonal / pivot) 2.00e8 at dof 2 exceeds maxPivotDrop 1.00e7: about 8 digits are lost there (a weakly connected or badly scaled DOF).');
  });
  it('is the only name the rule sets, the schema and `modalgate rules` use', () => {
    expect(conditioning.defaults).toEqual({ maxPivotDrop: 1e7 });
    expect(Object.keys((conditioning.optionsSchema as { properties: object }).properties)).toEqual(['maxPivotDrop']);
    const audit = parse(readFileSync(join(repo, 'rules/handoff-audit.yaml'), 'utf8')) as { rules: Record<string, Record<string, unknown>> };
    expect(audit.rules.conditioning).toEqual({ severity: 'error', maxPivotDrop: 1e7 });
    expect(formatRules()).toMatch(/maxPivotDrop\s+number > 1\s+default 1e7/);
    for (const f of ['free-free.yaml', 'supported.yaml', 'handoff-audit.yaml', 'README.md']) expect(readFileSync(join(repo, 'rules', f), 'utf8'), f).not.toContain('maxRatio');
  });
  it('refuses the old name in a config, naming the key and the known one', () => {
    const p = join(work, 'old.yaml');
    writeFileSync(p, `models:\n  - { name: a, stiffness: ${models}/tiny.stiffness.mtx, mass: ${models}/tiny.mass.mtx, rules: { conditioning: { maxRatio: 1.0e7 } } }\n`);
    let error: unknown;
    try {
      loadConfig(p);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).where).toBe('models[0].rules.conditioning.maxRatio');
    expect((error as InputError).reason).toBe('is not a known key here (known keys: maxPivotDrop)');
  });
});
