/**
 * matrix-finite: K and M hold no NaN or infinite entries (tool policy, [CP] CRITERIA.md §4).
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './outcome.js';

const messages = {
  pass: 'every entry of K and M is finite.',
  fail: '{{list}}: non-finite entries (NaN or infinity) make every result meaningless.',
};

export const matrixFinite: RuleDefinition<Record<string, never>> = {
  id: 'matrix-finite',
  description: 'K and M contain no NaN or infinite entries.',
  optionsSchema: { type: 'object', properties: {}, additionalProperties: false },
  defaults: {},
  messages,
  needs: [],
  evaluate(context) {
    const k = context.stiffnessSummary.nonFiniteCount;
    const m = context.massSummary.nonFiniteCount;
    const parts = [];
    if (k > 0) parts.push(`K has ${k}`);
    if (m > 0) parts.push(`M has ${m}`);
    const details = { stiffness: k, mass: m };
    if (parts.length > 0) return outcome('fail', messages.fail, { list: parts.join(', ') }, k + m, 0, details);
    return outcome('pass', messages.pass, {}, 0, 0, details);
  },
};
