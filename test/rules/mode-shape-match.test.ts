import { expect } from 'vitest';
import { modeShapeMatch } from '../../src/rules/mode-shape-match.js';
import { comparisonContext, pair } from './comparison-context.js';
import { testRule } from './rule-tester.js';

const pairs = [pair(1, 1, 10, 10, 0.99), pair(2, 2, 20, 20, 0.8)];

// default MAC 0.9: a usual acceptance level for correlated modes (common practice)
testRule(modeShapeMatch, {
  valid: [
    { name: 'MAC 0.99 and 0.8 pass at 0.75', context: () => comparisonContext({ pairs }), options: { minMac: 0.75 }, messageId: 'pass', measured: 0.8, limit: 0.75 },
    { name: 'only mode 1 checked', context: () => comparisonContext({ pairs }), options: { modes: [1] }, messageId: 'pass', measured: 0.99 },
  ],
  invalid: [
    {
      name: 'MAC 0.8 below the default 0.9',
      context: () => comparisonContext({ pairs }),
      status: 'fail',
      messageId: 'fail',
      measured: 0.8,
      limit: 0.9,
      check: (o) => expect(o.details!.flagged).toEqual([{ baselineMode: 2, currentMode: 2 }]),
    },
    { name: 'shapes not compared', context: () => comparisonContext({ pairs, shapesNotCompared: 'no DOF map' }), status: 'skip', messageId: 'notCompared' },
    { name: 'no paired modes', context: () => comparisonContext({ pairs: [] }), status: 'skip', messageId: 'none' },
  ],
  badOptions: [{ name: 'minMac above 1', options: { minMac: 1.2 } }],
});
