/**
 * eigen-residual: every solved pair satisfies K φ ≈ λ M φ,
 *   max_i ‖Kφᵢ − λᵢMφᵢ‖ / ((‖K‖₁ + |λᵢ|‖M‖₁)‖φᵢ‖) ≤ tolerance.
 * Form after the LAPACK acceptance ratio ([C] CRITERIA.md §3/§6); limit ~1e-8 common practice
 * ([CP] CRITERIA.md §6). Recomputed here from K, M and the shapes, independent of the solver's
 * own residual figures (which go into the details for comparison).
 */
import type { RuleDefinition } from './rule-types.js';
import { toleranceOptionsSchema, type ToleranceOptions } from './tolerance-options.js';
import { outcome, argMax } from './outcome.js';
import { modalProducts } from './modal-products.js';

const messages = {
  pass: 'largest relative residual {{measured}} (mode {{mode}}), within {{tolerance}}.',
  fail: 'mode {{mode}} ({{hz}} Hz) has relative residual {{measured}}, above {{tolerance}}: the pair does not satisfy Kφ = λMφ.',
};

export const eigenResidual: RuleDefinition<ToleranceOptions> = {
  id: 'eigen-residual',
  description: 'Every mode satisfies Kφ = λMφ: max ‖Kφ − λMφ‖ / ((‖K‖ + |λ|‖M‖)‖φ‖) ≤ tolerance.',
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
    if (w.index < 0) return outcome('skip', 'no modes were solved.', {});
    const status = w.value <= o.tolerance ? 'pass' : 'fail';
    const values = { measured: w.value, mode: w.index + 1, hz: modes.frequenciesHz[w.index], tolerance: o.tolerance };
    return outcome(status, messages[status], values, w.value, o.tolerance, {
      mode: w.index + 1,
      relativeResiduals: Array.from(r),
      solverResiduals: Array.from(modes.residuals),
    });
  },
};
