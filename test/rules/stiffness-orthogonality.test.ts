import { stiffnessOrthogonality } from '../../src/rules/stiffness-orthogonality.js';
import { chainContext, exactModes } from './fake-model.js';
import { groundedChain } from './reference-chains.js';
import { testRule } from './rule-tester.js';

const chain = groundedChain();
const t = 1e-3;

testRule(stiffnessOrthogonality, {
  valid: [{ name: 'modes from a reference eigensolver (ml-matrix): ΦᵀKΦ = diag(λ)', context: () => chainContext(chain, exactModes(chain)), messageId: 'pass', limit: 1e-6 }],
  invalid: [
    {
      // φ₂ ← cos t φ₂ + sin t φ₁: φ₁ᵀKφ₂ = sin t · λ₁, relative to max|λ| well above 1e-6
      name: 'mode 2 mixed with mode 1 departs from diag(λ)',
      context: () => {
        const modes = exactModes(chain);
        for (let r = 0; r < 5; r++) modes.shapes[5 + r] = Math.cos(t) * modes.shapes[5 + r] + Math.sin(t) * modes.shapes[r];
        return chainContext(chain, modes);
      },
      status: 'fail',
      messageId: 'fail',
      limit: 1e-6,
    },
  ],
  badOptions: [{ name: 'zero tolerance', options: { tolerance: 0 } }],
});
