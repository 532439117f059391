/**
 * mass-orthogonality: solved shapes are M-orthogonal, max_{i≠j} |φᵢᵀMφⱼ| ≤ tolerance.
 * With unit modal masses this is the cosine of the M-angle between modes; 1e-6 is common
 * practice for computed modes ([CP] docs/sources.md §6; dense solvers reach O(nε)).
 */
import type { RuleDefinition } from './rule-types.js';
import { toleranceOptionsSchema, type ToleranceOptions } from './utils/tolerance-options.js';
import { ruleMessages } from './utils/outcome.js';
import { modalProducts } from './utils/modal-products.js';

const messages = {
  pass: 'largest |φᵢᵀMφⱼ| (i ≠ j) is {{measured}} (modes {{i}}, {{j}}), within {{tolerance}}.',
  fail: 'modes {{i}} and {{j}} are not M-orthogonal: |φᵢᵀMφⱼ| = {{measured}} exceeds {{tolerance}}.',
  single: 'only one mode was solved: nothing to compare.',
};
const { outcome } = ruleMessages(messages);

export const massOrthogonality: RuleDefinition<ToleranceOptions> = {
  id: 'mass-orthogonality',
  description: 'Mode shapes are mass-orthogonal: max |φᵢᵀMφⱼ|, i ≠ j, ≤ tolerance.',
  optionsSchema: toleranceOptionsSchema(),
  defaults: { tolerance: 1e-6 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const p = modalProducts(context.stiffness, context.mass, context.modes!);
    if (p.modes < 2) return outcome('skip', 'single', {});
    const w = largestOffDiagonal(p.massProjected, p.modes, 1);
    const values = { measured: w.value, i: w.i + 1, j: w.j + 1, tolerance: o.tolerance };
    const status = w.value <= o.tolerance ? 'pass' : 'fail';
    return outcome(status, status, values, w.value, o.tolerance, { modes: [w.i + 1, w.j + 1] });
  },
};

/** max_{i>j} |P(i,j)| / scale, with where it is. NaN counts as the worst. */
function largestOffDiagonal(p: Float64Array, m: number, scale: number): { value: number; i: number; j: number } {
  let value = 0;
  let bi = 1;
  let bj = 0;
  // scan the strict lower triangle of the modes × modes product
  for (let j = 0; j < m; j++) {
    for (let i = j + 1; i < m; i++) {
      const v = Math.abs(p[i + j * m]) / scale;
      if (v > value || Number.isNaN(v)) {
        value = v;
        bi = i;
        bj = j;
      }
    }
  }
  return { value, i: bi, j: bj };
}
