/**
 * eigen-residual: every solved pair satisfies K φ ≈ λ M φ, measured by the eigenpair residual
 *   ρ_i = ‖Kφᵢ − λᵢMφᵢ‖ / (‖Kφᵢ‖ + |λᵢ|‖Mφᵢ‖)   (floor for rigid-body modes: src/eigen/residual-measure.ts)
 *   max_i ρ_i ≤ tolerance.
 * The same measure the solver converges on and `modalgate modes` prints, formed once by the
 * verification (src/eigen/verification.ts). The denominator is the size of the forces that must
 * balance, so a shape mixed with another mode shows ρ of the order of the mix — the LAPACK-style
 * ratio with ‖K‖‖φ‖ below would pass it (residual-measure.ts). Limit 1e-8 common practice
 * ([CP] docs/sources.md §6).
 */
import type { RuleDefinition } from './rule-types.js';
import { toleranceOptionsSchema, type ToleranceOptions } from './utils/tolerance-options.js';
import { ruleMessages, argMax } from './utils/outcome.js';
import { modalProducts } from './utils/modal-products.js';

const messages = {
  pass: 'largest eigenpair residual {{measured}} (mode {{mode}}), within {{tolerance}}.',
  none: 'no modes were solved.',
  fail: 'mode {{mode}} ({{hz}} Hz) has eigenpair residual ‖Kφ − λMφ‖ / (‖Kφ‖ + |λ|‖Mφ‖) = {{measured}}, above {{tolerance}}: the pair does not satisfy Kφ = λMφ.',
};
const { outcome } = ruleMessages(messages);

export const eigenResidual: RuleDefinition<ToleranceOptions> = {
  id: 'eigen-residual',
  description: 'Every mode satisfies Kφ = λMφ: max ‖Kφ − λMφ‖ / (‖Kφ‖ + |λ|‖Mφ‖) ≤ tolerance (rigid-body floor).',
  optionsSchema: toleranceOptionsSchema(),
  defaults: { tolerance: 1e-8 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const modes = context.modes!;
    const p = modalProducts(context.stiffness, context.mass, modes);
    const r = p.relativeResiduals;
    // a NaN residual is the worst residual
    const nan = Array.from(r).findIndex((x) => Number.isNaN(x));
    const w = nan >= 0 ? { index: nan, value: NaN } : argMax(r);
    if (w.index < 0) return outcome('skip', 'none');
    const status = w.value <= o.tolerance ? 'pass' : 'fail';
    const values = { measured: w.value, mode: w.index + 1, hz: modes.frequenciesHz[w.index], tolerance: o.tolerance };
    return outcome(status, status, values, w.value, o.tolerance, {
      mode: w.index + 1,
      measure: 'eigenpair residual',
      relativeResiduals: Array.from(r),
    });
  },
};
