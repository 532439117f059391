import { expect } from 'vitest';
import { massNormalization } from '../../src/rules/mass-normalization.js';
import { chainContext, exactModes } from './fake-model.js';
import { groundedChain } from './reference-chains.js';
import { testRule } from './rule-tester.js';

const chain = groundedChain();

testRule(massNormalization, {
  valid: [{ name: 'modes from a reference eigensolver (ml-matrix) have unit modal mass', context: () => chainContext(chain, exactModes(chain)), messageId: 'pass', limit: 1e-6 }],
  invalid: [
    {
      // φ scaled by 1.01 has φᵀMφ = 1.01² = 1.0201
      name: 'a shape scaled by 1.01 has |φᵀMφ − 1| = 0.0201',
      context: () => {
        const modes = exactModes(chain);
        for (let r = 0; r < 5; r++) modes.shapes[2 * 5 + r] *= 1.01;
        return chainContext(chain, modes);
      },
      status: 'fail',
      messageId: 'fail',
      measured: { closeTo: 0.0201, digits: 10 },
      limit: 1e-6,
      check: (o) => expect(o.details).toEqual({ mode: 3 }),
    },
  ],
  badOptions: [{ name: 'zero tolerance', options: { tolerance: 0 } }],
});
