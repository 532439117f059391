import { expect } from 'vitest';
import { frequencyDrift } from '../../src/rules/frequency-drift.js';
import { comparisonContext, pair } from './comparison-context.js';
import { testRule } from './rule-tester.js';

const within = [pair(1, 1, 10, 10.3), pair(2, 2, 20, 19.5)]; // +3 %, −2.5 %
const drifted = [pair(1, 1, 10, 10.3), pair(2, 3, 20, 22)]; // +3 %, +10 % (now mode 3)

// default 5 %: the agreement usually asked of significant modes (docs/sources.md §1b)
testRule(frequencyDrift, {
  valid: [
    { name: 'changes of +3 % and −2.5 % within 5 %', context: () => comparisonContext({ pairs: within }), messageId: 'pass', measured: { closeTo: 3, digits: 9 }, limit: 5 },
    {
      name: 'paired by frequency order, still checked',
      context: () => comparisonContext({ pairs: within, pairedBy: 'frequency order', shapesNotCompared: 'the DOF counts differ' }),
      messageId: 'pass',
      check: (o) => expect(o.details!.pairedBy).toBe('frequency order'),
    },
  ],
  invalid: [
    {
      name: 'a +10 % change fails and flags that pair',
      context: () => comparisonContext({ pairs: drifted }),
      status: 'fail',
      messageId: 'fail',
      measured: { closeTo: 10, digits: 9 },
      limit: 5,
      check: (o) => expect(o.details!.flagged).toEqual([{ baselineMode: 2, currentMode: 3 }]),
    },
    { name: 'only the listed modes are checked', context: () => comparisonContext({ pairs: drifted }), options: { modes: [2] }, status: 'fail', messageId: 'fail' },
    { name: 'no paired elastic modes', context: () => comparisonContext({ pairs: [] }), status: 'skip', messageId: 'none' },
  ],
  badOptions: [
    { name: 'zero limit', options: { maxChangePercent: 0 } },
    { name: 'an empty mode list', options: { modes: [] } },
  ],
});
