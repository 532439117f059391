import { expect } from 'vitest';
import { modeSwap } from '../../src/rules/mode-swap.js';
import { comparisonContext, pair } from './comparison-context.js';
import { testRule } from './rule-tester.js';

const inOrder = [pair(1, 1, 10, 10), pair(2, 2, 20, 20)];
const swapped = [pair(1, 2, 10, 10.2), pair(2, 1, 10.1, 10)];

testRule(modeSwap, {
  valid: [{ name: 'modes keep their order', context: () => comparisonContext({ pairs: inOrder }), messageId: 'pass', measured: 0, limit: 0 }],
  invalid: [
    {
      name: 'baseline modes 1 and 2 are now modes 2 and 1',
      context: () => comparisonContext({ pairs: swapped, swaps: [{ baselineModes: [1, 2], currentModes: [2, 1], correlations: [0.98, 0.97] }] }),
      status: 'fail',
      messageId: 'fail',
      measured: 1,
      check: (o) => expect(o.details!.flagged).toEqual([{ baselineMode: 1, currentMode: 2 }, { baselineMode: 2, currentMode: 1 }]),
    },
    { name: 'shapes not compared', context: () => comparisonContext({ pairs: inOrder, shapesNotCompared: 'no DOF map' }), status: 'skip', messageId: 'notCompared' },
  ],
  badOptions: [{ name: 'no options exist', options: { maxSwaps: 1 } }],
});
