import { describe, expect, it } from 'vitest';
import { runRules, verdictOf, type ResolvedRule } from '../../src/rules/engine.js';
import { builtInRules, findRule, ruleIds } from '../../src/rules/registry.js';
import type { RuleDefinition } from '../../src/rules/rule-types.js';
import { InputError } from '../../src/io/errors.js';
import { chainContext, exactModes, springChain } from './fake-model.js';
import { formatMessage, formatNumber } from '../../src/rules/utils/message.js';
import { existsSync } from 'node:fs';

const chain = springChain(4, 10, [1, 1, 1, 1], 5);

function resolved(id: string, severity: 'error' | 'warning' = 'error', options?: Record<string, unknown>): ResolvedRule {
  const rule = findRule(id)!;
  return { rule, severity, options: options ?? { ...(rule.defaults as object) } };
}

describe('registry', () => {
  it('holds every rule of the issue exactly once, each with a schema, defaults and messages', () => {
    const wanted = ['rigid-body-modes', 'first-elastic-frequency', 'mode-frequencies', 'mass-normalization', 'mass-orthogonality', 'stiffness-orthogonality', 'eigen-residual', 'modes-complete', 'matrix-symmetry', 'matrix-finite', 'diagonal-sanity', 'conditioning', 'frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes'];
    const ids = ruleIds();
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of wanted) expect(ids).toContain(id);
    for (const r of builtInRules) {
      expect(r.optionsSchema.type).toBe('object');
      expect(Object.keys(r.messages).length).toBeGreaterThan(0);
      expect(r.description.length).toBeGreaterThan(10);
    }
  });
  it('has one test file per rule, test/rules/<rule-id>.test.ts', () => {
    const missing = ruleIds().filter((id) => !existsSync(new URL(`./${id}.test.ts`, import.meta.url)));
    expect(missing).toEqual([]);
  });
  it('marks options without a default as required in the schema (the loader then refuses a config without them)', () => {
    for (const r of builtInRules) {
      const properties = Object.keys((r.optionsSchema.properties as object) ?? {});
      const required = (r.optionsSchema.required as string[] | undefined) ?? [];
      const defaults = r.defaults as Record<string, unknown>;
      for (const key of required) expect(defaults, `${r.id}.${key}`).not.toHaveProperty(key);
      for (const key of required) expect(properties, `${r.id}.${key}`).toContain(key);
    }
    expect(findRule('first-elastic-frequency')!.optionsSchema.required).toEqual(['minHz']);
    expect(findRule('total-mass')!.optionsSchema.required).toEqual(['expected']);
    expect(findRule('center-of-mass')!.optionsSchema.required).toEqual(['expected', 'maxDistance']);
  });
});

describe('engine', () => {
  it('skips rules whose inputs are missing and says why', () => {
    const results = runRules(chainContext(chain), [resolved('matrix-finite'), resolved('eigen-residual')]);
    expect(results.map((r) => r.status)).toEqual(['pass', 'skip']);
    expect(results[1].message).toContain('no modes were solved');
  });
  it('turns a failed solve into rule errors, and an error verdict', () => {
    const results = runRules(chainContext(chain), [resolved('eigen-residual')], { modes: { status: 'error', reason: 'not evaluated: the eigensolver stopped: boom' } });
    expect(results[0]).toMatchObject({ status: 'error', message: 'not evaluated: the eigensolver stopped: boom' });
    expect(verdictOf(results)).toBe('error');
  });
  it('records a throwing rule as error with its sentence', () => {
    const broken: RuleDefinition = { id: 'broken', description: 'throws', optionsSchema: { type: 'object' }, defaults: {}, messages: {}, needs: [], evaluate: () => { throw new InputError('x.csv', 'bad thing'); } };
    const [r] = runRules(chainContext(chain), [{ rule: broken, severity: 'error', options: {} }]);
    expect(r.status).toBe('error');
    expect(r.message).toContain('x.csv: bad thing');
  });
  it('warning-severity failures do not fail the gate', () => {
    const ctx = chainContext(chain, exactModes(chain));
    const results = runRules(ctx, [resolved('first-elastic-frequency', 'warning', { ...findRule('first-elastic-frequency')!.defaults, minHz: 1e6 }), resolved('modes-complete')]);
    expect(results[0].status).toBe('fail');
    expect(verdictOf(results)).toBe('pass');
    results[0].severity = 'error';
    expect(verdictOf(results)).toBe('fail');
    expect(results.every((r) => r.timeMs >= 0)).toBe(true);
  });
});

describe('messages', () => {
  it('fills placeholders and writes numbers readably', () => {
    expect(formatMessage('{{a}} and {{b}} and {{c}}', { a: 0.000012345, b: 12.3456, c: 'x' })).toBe('1.23e-5 and 12.35 and x');
    expect(formatNumber(1e7)).toBe('1.00e7');
    expect(formatNumber(123456)).toBe('123456');
    expect(formatNumber(3.2e9 + 0.5)).toBe('3.20e9');
  });
});
