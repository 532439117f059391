/**
 * modes-complete: the Sturm-sequence count proves no mode was missed. By Sylvester's law of
 * inertia the negative pivots of LDLᵀ(K − σM) equal the eigenvalues below σ (Bai et al.,
 * Templates §4, [C] CRITERIA.md §3); with σ just above the last returned mode the count must
 * equal the number of modes returned.
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './outcome.js';

const messages = {
  pass: 'Sturm count at σ = {{shift}} is {{countBelow}}, equal to the {{returned}} modes returned: no mode was missed.',
  missed:
    'Sturm count at σ = {{shift}} is {{countBelow}} but {{returned}} modes were returned: {{difference}} mode(s) below the last returned mode were missed.',
  extra: 'Sturm count at σ = {{shift}} is {{countBelow}} but {{returned}} modes were returned: the solver returned modes it cannot account for.',
  notOk: 'the solver could not confirm completeness with a Sturm count at σ = {{shift}} (count {{countBelow}}, {{returned}} modes returned).',
};

export const modesComplete: RuleDefinition<Record<string, never>> = {
  id: 'modes-complete',
  description: 'The Sturm-sequence (inertia) count proves no mode below the last returned one was missed.',
  optionsSchema: { type: 'object', properties: {}, additionalProperties: false },
  defaults: {},
  messages,
  needs: ['modes'],
  evaluate(context) {
    const s = context.modes!.sturm;
    const values = { shift: s.shift, countBelow: s.countBelow, returned: s.modesReturned, difference: s.countBelow - s.modesReturned };
    const details = { shift: s.shift, countBelow: s.countBelow, modesReturned: s.modesReturned };
    if (s.countBelow > s.modesReturned) return outcome('fail', messages.missed, values, s.countBelow, s.modesReturned, details);
    if (s.countBelow < s.modesReturned) return outcome('fail', messages.extra, values, s.countBelow, s.modesReturned, details);
    if (!s.ok) return outcome('fail', messages.notOk, values, s.countBelow, s.modesReturned, details);
    return outcome('pass', messages.pass, values, s.countBelow, s.modesReturned, details);
  },
};
