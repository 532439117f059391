import { expect, it } from 'vitest';
import { firstElasticFrequency } from '../../src/rules/first-elastic-frequency.js';
import { modesWithFrequencies } from './fake-model.js';
import { chainLambda, freeChainContext, frequenciesContext, hz } from './reference-chains.js';
import { runRule, testRule } from './rule-tester.js';

// first elastic frequency of the free–free chain, exact discrete result (docs/sources.md §7)
const exact = hz(chainLambda(1));

testRule(firstElasticFrequency, {
  valid: [
    {
      name: 'the free–free chain (ml-matrix modes) matches the closed form to 1e-12 and passes minHz 0.99 × it',
      context: freeChainContext,
      options: { minHz: exact * 0.99 },
      messageId: 'pass',
      limit: exact * 0.99,
      check: (o) => expect(Math.abs((o.measured as number) - exact) / exact).toBeLessThan(1e-12),
    },
    { name: 'within minHz..maxHz', context: freeChainContext, options: { minHz: exact * 0.5, maxHz: exact * 2 }, messageId: 'pass' },
  ],
  invalid: [
    {
      name: 'below the minimum, with where the mode lives',
      context: freeChainContext,
      options: { minHz: exact * 1.01 },
      status: 'fail',
      messageId: 'low',
      measured: { closeTo: exact, digits: 9 },
      limit: exact * 1.01,
      check: (o) => expect((o.details!.location as unknown[]).length).toBeGreaterThan(0),
    },
    { name: 'above the maximum', context: freeChainContext, options: { minHz: 0, maxHz: exact * 0.5 }, status: 'fail', messageId: 'high', limit: exact * 0.5 },
    { name: 'no elastic mode solved', context: () => frequenciesContext(modesWithFrequencies([1e-7, 2e-7])), options: { minHz: 5 }, status: 'error', messageId: 'none', measured: null },
  ],
  badOptions: [
    { name: 'minHz missing (it has no default: the project gives it)', options: {} },
    { name: 'maxHz zero', options: { minHz: 1, maxHz: 0 } },
  ],
});

it('refuses to run without minHz, as the config loader would', () => {
  expect(() => runRule(firstElasticFrequency, freeChainContext())).toThrow(/minHz/);
});
