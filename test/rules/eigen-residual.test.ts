import { expect } from 'vitest';
import { eigenResidual } from '../../src/rules/eigen-residual.js';
import { chainContext, exactModes, fakeModes } from './fake-model.js';
import { groundedChain } from './reference-chains.js';
import { testRule } from './rule-tester.js';

const chain = groundedChain();

testRule(eigenResidual, {
  valid: [{ name: 'modes from a reference eigensolver (ml-matrix) satisfy Kφ = λMφ', context: () => chainContext(chain, exactModes(chain)), messageId: 'pass', limit: 1e-8 }],
  invalid: [
    {
      name: 'an eigenvalue off by 1e-4 relative fails at that mode',
      context: () => {
        const modes = exactModes(chain);
        modes.eigenvalues[1] *= 1 + 1e-4;
        return chainContext(chain, modes);
      },
      status: 'fail',
      messageId: 'fail',
      limit: 1e-8,
      check: (o) => expect(o.details!.mode).toBe(2),
    },
    { name: 'no modes solved', context: () => chainContext(chain, fakeModes(5, new Float64Array(0))), status: 'skip', messageId: 'none' },
  ],
  badOptions: [{ name: 'zero tolerance', options: { tolerance: 0 } }],
});
