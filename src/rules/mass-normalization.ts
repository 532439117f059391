/**
 * mass-normalization: every solved shape has unit modal mass, max_i |φᵢᵀMφᵢ − 1| ≤ tolerance.
 * Mass normalization φᵀMφ = I is what a type-1 generalized solver returns (LAPACK Users' Guide
 * §4.10, [C] docs/sources.md §6); the 1e-6 limit is common practice ([CP] docs/sources.md §6).
 */
import type { RuleDefinition } from './rule-types.js';
import { toleranceOptionsSchema, type ToleranceOptions } from './utils/tolerance-options.js';
import { ruleMessages } from './utils/outcome.js';
import { modalProducts } from './utils/modal-products.js';

const messages = {
  pass: 'largest |φᵀMφ − 1| is {{measured}} (mode {{mode}}), within {{tolerance}}.',
  fail: 'mode {{mode}} has modal mass φᵀMφ = {{modalMass}}: |φᵀMφ − 1| = {{measured}} exceeds {{tolerance}}.',
};
const { outcome } = ruleMessages(messages);

export const massNormalization: RuleDefinition<ToleranceOptions> = {
  id: 'mass-normalization',
  description: 'Every mode shape has unit modal mass: max |φᵢᵀMφᵢ − 1| ≤ tolerance.',
  optionsSchema: toleranceOptionsSchema(),
  defaults: { tolerance: 1e-6 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const p = modalProducts(context.stiffness, context.mass, context.modes!);
    let worst = 0;
    let mode = 0;
    // worst = max_i |P_M(i,i) − 1|
    for (let i = 0; i < p.modes; i++) {
      const d = Math.abs(p.massProjected[i + i * p.modes] - 1);
      if (d > worst || Number.isNaN(d)) {
        worst = d;
        mode = i;
      }
    }
    const values = { measured: worst, mode: mode + 1, tolerance: o.tolerance, modalMass: p.massProjected[mode + mode * p.modes] };
    const status = worst <= o.tolerance ? 'pass' : 'fail';
    return outcome(status, status, values, worst, o.tolerance, { mode: mode + 1 });
  },
};
