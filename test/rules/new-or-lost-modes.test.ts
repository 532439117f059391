import { expect } from 'vitest';
import { newOrLostModes } from '../../src/rules/new-or-lost-modes.js';
import { comparisonContext, pair, unpaired } from './comparison-context.js';
import { testRule } from './rule-tester.js';

const pairs = [pair(1, 1, 10, 10), pair(2, 2, 20, 20)];

testRule(newOrLostModes, {
  valid: [
    { name: 'every mode has a partner', context: () => comparisonContext({ pairs }), messageId: 'pass', measured: 0, limit: 0 },
    { name: 'one new mode allowed by maxNew', context: () => comparisonContext({ pairs, newModes: [unpaired(3, 25)] }), options: { maxNew: 1 }, messageId: 'pass', measured: 1, limit: 1 },
  ],
  invalid: [
    {
      name: 'a lost baseline mode and a new one',
      context: () => comparisonContext({ pairs, lostModes: [unpaired(3, 30, 3, 0.4)], newModes: [unpaired(4, 35)] }),
      status: 'fail',
      messageId: 'fail',
      measured: 2,
      limit: 0,
      check: (o) => expect(o.details!.flagged).toEqual([{ baselineMode: 3 }, { currentMode: 4 }]),
    },
    { name: 'shapes not compared', context: () => comparisonContext({ pairs, shapesNotCompared: 'no DOF map' }), status: 'skip', messageId: 'notCompared' },
  ],
  badOptions: [{ name: 'negative maxLost', options: { maxLost: -1 } }],
});
