/**
 * conditioning: the largest ratio of a matrix diagonal to its LDLᵀ pivot, max_j |a_jj / d_j|,
 * stays below a limit. About log10(ratio) digits are lost in the factorization ([CP]); a limit
 * of 1e7 is often quoted for this check (ECSS-E-ST-32-03C, value from memory — [M] CRITERIA.md §1a).
 * The ratio is measured on the solver's last factor of K − σM.
 */
import type { RuleDefinition } from './rule-types.js';
import { describeDof } from '../io/dof-map.js';
import { outcome } from './outcome.js';

export interface ConditioningOptions {
  maxRatio: number;
}

const messages = {
  pass: 'largest diagonal-to-pivot ratio {{measured}} at {{where}}, below {{maxRatio}}.',
  fail: 'diagonal-to-pivot ratio {{measured}} at {{where}} exceeds {{maxRatio}}: about {{digits}} digits are lost there (a weakly connected or badly scaled DOF).',
};

export const conditioning: RuleDefinition<ConditioningOptions> = {
  id: 'conditioning',
  description: 'The largest diagonal-to-pivot ratio of the LDLᵀ factor, max |a_jj / d_j|, is below maxRatio.',
  optionsSchema: {
    type: 'object',
    properties: { maxRatio: { type: 'number', exclusiveMinimum: 1 } },
    additionalProperties: false,
  },
  defaults: { maxRatio: 1e7 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const f = context.modes!.factor;
    const ratio = f.maxDiagonalToPivotRatio;
    const where = describeDof(context.dofMap, f.maxRatioDof);
    const values = { measured: ratio, where, maxRatio: o.maxRatio, digits: Math.round(Math.log10(Math.max(ratio, 1))) };
    const details = { dof: f.maxRatioDof + 1, where };
    const ok = ratio <= o.maxRatio;
    return outcome(ok ? 'pass' : 'fail', ok ? messages.pass : messages.fail, values, ratio, o.maxRatio, details);
  },
};
