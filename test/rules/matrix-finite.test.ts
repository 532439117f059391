import { expect } from 'vitest';
import { matrixFinite } from '../../src/rules/matrix-finite.js';
import { chainContext, cleanSummary, springChain } from './fake-model.js';
import { testRule } from './rule-tester.js';

const chain = springChain(6, 10, new Array<number>(6).fill(1));
const withMass = (nonFiniteCount: number, nonFiniteAt?: { line: number; row: number; col: number }[]) => {
  const ctx = chainContext(chain);
  ctx.massSummary = cleanSummary('M.mtx', 6, { nonFiniteCount, ...(nonFiniteAt ? { nonFiniteAt } : {}) });
  return ctx;
};

testRule(matrixFinite, {
  valid: [{ name: 'every entry finite', context: () => chainContext(chain), messageId: 'pass', measured: 0, limit: 0 }],
  invalid: [
    { name: 'two non-finite mass entries are counted', context: () => withMass(2), status: 'fail', messageId: 'fail', measured: 2, limit: 0 },
    {
      name: 'names the file and line of the first entry',
      context: () => withMass(1, [{ line: 9, row: 3, col: 2 }]),
      status: 'fail',
      messageId: 'fail',
      measured: 1,
      check: (o) => expect(o.details!.locations).toEqual(['M.mtx:9 (3, 2)']),
    },
  ],
  badOptions: [{ name: 'no options exist', options: { tolerance: 1 } }],
});
