/**
 * matrix-symmetry: K and M are symmetric, max|a_ij − a_ji| ≤ tolerance · max|a| (1e-12 relative,
 * common practice [CP] docs/sources.md §6). Files declared `symmetric` store one triangle and pass by
 * construction; `general` files are measured when read (MatrixSummary.maxRelativeAsymmetry).
 * `check` reads with screening 'record', so the reader never refuses a `general` file for its
 * values (only for structure: bad indices, counts); this rule alone judges the asymmetry against
 * its `tolerance`, whatever it is set to (1e-6 works as well as 1e-14). The matrix solved is the
 * mean (A + Aᵀ)/2 either way.
 */
import type { RuleDefinition } from './rule-types.js';
import { toleranceOptionsSchema, type ToleranceOptions } from './utils/tolerance-options.js';
import type { MatrixSummary } from '../io/matrix-summary.js';
import { ruleMessages } from './utils/outcome.js';

const messages = {
  pass: 'K and M are symmetric (largest relative asymmetry {{measured}}, limit {{tolerance}}).',
  matrix: '{{matrix}} ({{file}})',
  fail: '{{which}} is not symmetric: |a_ij − a_ji| / max|a| = {{measured}} at row {{row}}, column {{col}} exceeds {{tolerance}}.',
};
const { outcome, text } = ruleMessages(messages);

export const matrixSymmetry: RuleDefinition<ToleranceOptions> = {
  id: 'matrix-symmetry',
  description: 'K and M are symmetric: max |a_ij − a_ji| / max |a| ≤ tolerance.',
  optionsSchema: toleranceOptionsSchema(true),
  defaults: { tolerance: 1e-12 },
  messages,
  needs: [],
  evaluate(context, o) {
    const pairs: [string, MatrixSummary][] = [
      ['K', context.stiffnessSummary],
      ['M', context.massSummary],
    ];
    const worst = pairs.reduce((a, b) => (b[1].maxRelativeAsymmetry > a[1].maxRelativeAsymmetry ? b : a));
    const [which, s] = worst;
    const measured = s.maxRelativeAsymmetry;
    const details = { stiffness: context.stiffnessSummary.maxRelativeAsymmetry, mass: context.massSummary.maxRelativeAsymmetry };
    if (measured > o.tolerance) {
      const values = { which: text('matrix', { matrix: which, file: s.file }), measured, row: s.asymmetryAt?.row ?? '?', col: s.asymmetryAt?.col ?? '?', tolerance: o.tolerance };
      return outcome('fail', 'fail', values, measured, o.tolerance, details);
    }
    return outcome('pass', 'pass', { measured, tolerance: o.tolerance }, measured, o.tolerance, details);
  },
};
