import { expect } from 'vitest';
import { massOrthogonality } from '../../src/rules/mass-orthogonality.js';
import { chainContext, exactModes } from './fake-model.js';
import { groundedChain } from './reference-chains.js';
import { testRule } from './rule-tester.js';

const chain = groundedChain();
const t = 1e-3;
/** φ₂ ← cos t φ₂ + sin t φ₁ keeps unit modal mass; then φ₁ᵀMφ₂ = sin t. */
function mixedModes() {
  const modes = exactModes(chain);
  for (let r = 0; r < 5; r++) modes.shapes[5 + r] = Math.cos(t) * modes.shapes[5 + r] + Math.sin(t) * modes.shapes[r];
  return chainContext(chain, modes);
}

testRule(massOrthogonality, {
  valid: [{ name: 'modes from a reference eigensolver (ml-matrix) are M-orthogonal', context: () => chainContext(chain, exactModes(chain)), messageId: 'pass' }],
  invalid: [
    { name: 'mode 2 mixed with mode 1: |φ₁ᵀMφ₂| = sin t', context: mixedModes, status: 'fail', messageId: 'fail', measured: { closeTo: Math.sin(t), digits: 9 }, limit: 1e-6, check: (o) => expect(o.details).toEqual({ modes: [2, 1] }) },
    { name: 'a single mode has nothing to compare', context: () => chainContext(chain, exactModes(chain, 1)), status: 'skip', messageId: 'single' },
  ],
  badOptions: [{ name: 'negative tolerance', options: { tolerance: -1e-6 } }],
});
