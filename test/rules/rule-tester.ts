/**
 * A small harness for rule tests, after the valid/invalid case lists of lint-rule testers: each
 * case gives a RuleContext and the options a config would set; the harness merges them over the
 * rule's defaults (exclusive option groups as the config loader treats them), validates the
 * result against the rule's `optionsSchema` with ajv (as the loader does), runs `evaluate` and
 * asserts the outcome's status and message id — which template the rule chose, not its prose —
 * plus `measured` / `limit` where a case gives them. `badOptions` lists option objects the schema
 * must refuse (a missing required option, a wrong type).
 */
import { describe, expect, it } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020.js';
import type { RuleContext, RuleDefinition, RuleOutcome, RuleStatus } from '../../src/rules/rule-types.js';

/** A number to match to `digits` decimal places (vitest toBeCloseTo), or an exact value. */
export type Expected = number | string | null | { closeTo: number; digits?: number };

export interface RuleCase {
  name: string;
  context: RuleContext | (() => RuleContext);
  options?: Record<string, unknown>;
  messageId?: string;
  measured?: Expected;
  limit?: Expected;
  /** Further checks on the outcome (details a case is about). */
  check?: (o: RuleOutcome) => void;
}

export interface InvalidCase extends RuleCase {
  status: Exclude<RuleStatus, 'pass'>;
  messageId: string;
}

export interface RuleCases {
  /** Cases the rule passes. */
  valid: RuleCase[];
  /** Cases the rule fails, skips or cannot evaluate. */
  invalid: InvalidCase[];
  /** Options the rule's schema refuses (the config loader would stop with a one-line error). */
  badOptions?: { name: string; options: Record<string, unknown> }[];
}

const ajv = new Ajv2020({ allErrors: true, strict: false });

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type SomeRule = RuleDefinition<any, any>;

/** Defaults ← case options, dropping defaults of an exclusive group the case does not use. */
export function mergedOptions(rule: SomeRule, options: Record<string, unknown> = {}): Record<string, unknown> {
  const merged: Record<string, unknown> = { ...(rule.defaults as Record<string, unknown>) };
  for (const group of rule.exclusiveOptions ?? []) {
    if (!group.some((k) => k in options)) continue;
    for (const other of rule.exclusiveOptions ?? []) if (other !== group) for (const k of other) delete merged[k];
  }
  return { ...merged, ...options };
}

/** Run one rule on one context with options validated against its schema. */
export function runRule(rule: SomeRule, context: RuleContext, options: Record<string, unknown> = {}): RuleOutcome {
  const merged = mergedOptions(rule, options);
  const validate = ajv.compile(rule.optionsSchema);
  if (!validate(merged)) throw new Error(`options refused by ${rule.id}'s schema: ${ajv.errorsText(validate.errors)}`);
  return rule.evaluate(context, merged);
}

function expectValue(actual: unknown, expected: Expected | undefined, what: string): void {
  if (expected === undefined) return;
  if (expected !== null && typeof expected === 'object') {
    expect(typeof actual, what).toBe('number');
    expect(actual as number, what).toBeCloseTo(expected.closeTo, expected.digits ?? 6);
  } else expect(actual, what).toEqual(expected);
}

function check(rule: SomeRule, c: RuleCase, status: RuleStatus): void {
  const context = typeof c.context === 'function' ? c.context() : c.context;
  const o = runRule(rule, context, c.options);
  expect(o.status).toBe(status);
  // every outcome names one of the rule's own templates and fills all its placeholders
  expect(o.messageId, 'messageId').toBeDefined();
  expect(Object.keys(rule.messages)).toContain(o.messageId);
  if (c.messageId !== undefined) expect(o.messageId).toBe(c.messageId);
  expect(o.message).not.toMatch(/\{\{/);
  expectValue(o.measured, c.measured, 'measured');
  expectValue(o.limit, c.limit, 'limit');
  c.check?.(o);
}

/** One `describe` per rule: an `it` per valid case, invalid case and refused option object. */
export function testRule(rule: SomeRule, cases: RuleCases): void {
  describe(rule.id, () => {
    describe('valid', () => {
      for (const c of cases.valid) it(c.name, () => check(rule, c, 'pass'));
    });
    describe('invalid', () => {
      for (const c of cases.invalid) it(c.name, () => check(rule, c, c.status));
    });
    if (cases.badOptions?.length) {
      describe('options refused by the schema', () => {
        for (const b of cases.badOptions!) {
          it(b.name, () => {
            const validate = ajv.compile(rule.optionsSchema);
            expect(validate(mergedOptions(rule, b.options))).toBe(false);
          });
        }
      });
    }
  });
}
