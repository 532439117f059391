import { matrixSymmetry } from '../../src/rules/matrix-symmetry.js';
import { chainContext, cleanSummary, springChain } from './fake-model.js';
import { testRule } from './rule-tester.js';

const chain = springChain(6, 10, new Array<number>(6).fill(1));
const asymmetric = (maxRelativeAsymmetry: number) => () => {
  const ctx = chainContext(chain);
  ctx.stiffnessSummary = cleanSummary('K.mtx', 6, { symmetry: 'general', maxRelativeAsymmetry, asymmetryAt: { row: 4, col: 2 } });
  return ctx;
};

// limit 1e-12 relative: common practice for matrices written in full precision
testRule(matrixSymmetry, {
  valid: [
    { name: 'symmetric K and M', context: () => chainContext(chain), messageId: 'pass', measured: 0, limit: 1e-12 },
    { name: 'asymmetry below a looser tolerance', context: asymmetric(3e-9), options: { tolerance: 1e-8 }, messageId: 'pass', measured: 3e-9 },
  ],
  invalid: [
    {
      name: 'asymmetry 3e-9 above 1e-12',
      context: asymmetric(3e-9),
      status: 'fail',
      messageId: 'fail',
      measured: 3e-9,
      limit: 1e-12,
    },
  ],
  badOptions: [
    { name: 'negative tolerance', options: { tolerance: -1 } },
    { name: 'tolerance as text', options: { tolerance: 'tight' } },
  ],
});
