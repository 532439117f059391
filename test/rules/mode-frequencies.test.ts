import { expect } from 'vitest';
import { modeFrequencies } from '../../src/rules/mode-frequencies.js';
import { chainLambda, freeChainContext, hz } from './reference-chains.js';
import { testRule } from './rule-tester.js';

// third mode of the free–free chain, exact discrete result (docs/sources.md §7); default ± 5 % is the project's (rules/README.md)
const f3 = hz(chainLambda(2));

testRule(modeFrequencies, {
  valid: [
    { name: 'mode 3 within 5 % of a target 4 % above it', context: freeChainContext, options: { targets: [{ mode: 3, hz: f3 * 1.04 }] }, messageId: 'pass', limit: 5 },
    { name: 'a per-target tolerance', context: freeChainContext, options: { targets: [{ mode: 3, hz: f3 * 1.1, tolerancePercent: 10 }] }, messageId: 'pass' },
  ],
  invalid: [
    {
      name: 'mode 3 against a target 10 % above it',
      context: freeChainContext,
      options: { targets: [{ mode: 3, hz: f3 * 1.1 }] },
      status: 'fail',
      messageId: 'fail',
      // |f3 − 1.1 f3| / (1.1 f3) = 1/11
      measured: { closeTo: 100 / 11, digits: 9 },
      limit: 5,
    },
    { name: 'no targets listed', context: freeChainContext, status: 'skip', messageId: 'none' },
    { name: 'a target beyond the solved modes', context: freeChainContext, options: { targets: [{ mode: 99, hz: 1 }] }, status: 'error', messageId: 'missing', check: (o) => expect(o.measured).toBeUndefined() },
  ],
  badOptions: [
    { name: 'a target without hz', options: { targets: [{ mode: 1 }] } },
    { name: 'mode 0', options: { targets: [{ mode: 0, hz: 1 }] } },
  ],
});
