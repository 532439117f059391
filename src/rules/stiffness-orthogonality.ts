/**
 * stiffness-orthogonality: ΦᵀKΦ is diagonal with the eigenvalues on it, measured relative to the
 * largest solved eigenvalue: max_{i,j} |φᵢᵀKφⱼ − λᵢδᵢⱼ| / max|λ| ≤ tolerance. The same scaling
 * is used by the solver's own orthogonality figure; 1e-6 mirrors the mass check ([CP]).
 */
import type { RuleDefinition } from './rule-types.js';
import { toleranceOptionsSchema, type ToleranceOptions } from './utils/tolerance-options.js';
import { ruleMessages } from './utils/outcome.js';
import { modalProducts } from './utils/modal-products.js';

const messages = {
  pass: 'largest |φᵢᵀKφⱼ − λᵢδᵢⱼ| / max|λ| is {{measured}} (modes {{i}}, {{j}}), within {{tolerance}}.',
  fail: 'ΦᵀKΦ departs from diag(λ) at modes {{i}}, {{j}}: {{measured}} relative to max|λ| exceeds {{tolerance}}.',
};
const { outcome } = ruleMessages(messages);

export const stiffnessOrthogonality: RuleDefinition<ToleranceOptions> = {
  id: 'stiffness-orthogonality',
  description: 'Mode shapes are stiffness-orthogonal: max |φᵢᵀKφⱼ − λᵢδᵢⱼ| / max|λ| ≤ tolerance.',
  optionsSchema: toleranceOptionsSchema(),
  defaults: { tolerance: 1e-6 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const modes = context.modes!;
    const p = modalProducts(context.stiffness, context.mass, modes);
    const m = p.modes;
    let scale = 0;
    for (let i = 0; i < m; i++) scale = Math.max(scale, Math.abs(modes.eigenvalues[i]));
    scale = Math.max(scale, Number.MIN_VALUE);
    let value = 0;
    let bi = 0;
    let bj = 0;
    // max over the lower triangle of |P_K(i,j) − λ_i δ_ij| / scale
    for (let j = 0; j < m; j++) {
      for (let i = j; i < m; i++) {
        const v = Math.abs(p.stiffnessProjected[i + j * m] - (i === j ? modes.eigenvalues[i] : 0)) / scale;
        if (v > value || Number.isNaN(v)) {
          value = v;
          bi = i;
          bj = j;
        }
      }
    }
    const status = value <= o.tolerance ? 'pass' : 'fail';
    const values = { measured: value, i: bi + 1, j: bj + 1, tolerance: o.tolerance };
    return outcome(status, status, values, value, o.tolerance, { modes: [bi + 1, bj + 1], eigenvalueScale: scale });
  },
};
