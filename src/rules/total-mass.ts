/**
 * total-mass: the model's mass (mean of the three translational rigid-body masses rᵀMr) lies
 * within ± tolerancePercent of the expected value from the mass budget. Units: the model's mass
 * unit (kg for SI models, t for N-mm-t models). The tolerance comes from the project's budget;
 * the default 1 % is our choice (the ECSS mass-property tolerance was not recovered, [M]
 * CRITERIA.md §1a).
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './outcome.js';
import { geometryOrSkip, isOutcome } from './geometry-common.js';

export interface TotalMassOptions {
  expected: number;
  tolerancePercent: number;
}

const messages = {
  pass: 'total mass {{mass}} is within {{tolerancePercent}} % of the expected {{expected}} ({{deviation}} %).',
  fail: 'total mass {{mass}} differs from the expected {{expected}} by {{deviation}} % (allowed {{tolerancePercent}} %).',
};

export const totalMass: RuleDefinition<TotalMassOptions> = {
  id: 'total-mass',
  description: "The model's total mass lies within ± tolerancePercent of the expected value (model mass unit).",
  optionsSchema: {
    type: 'object',
    properties: {
      expected: { type: 'number', exclusiveMinimum: 0, description: "expected mass in the model's mass unit" },
      tolerancePercent: { type: 'number', minimum: 0 },
    },
    required: ['expected'],
    additionalProperties: false,
  },
  defaults: { tolerancePercent: 1 } as TotalMassOptions,
  messages,
  needs: ['dofMap'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    const mp = g.massProperties;
    const deviation = (100 * (mp.totalMass - o.expected)) / o.expected;
    const values = { mass: mp.totalMass, expected: o.expected, deviation, tolerancePercent: o.tolerancePercent };
    const details = { totalMass: mp.totalMass, translationalMass: mp.translationalMass, deviationPercent: deviation };
    const status = Math.abs(deviation) <= o.tolerancePercent ? 'pass' : 'fail';
    return outcome(status, status === 'pass' ? messages.pass : messages.fail, values, mp.totalMass, `${o.expected} ± ${o.tolerancePercent} %`, details);
  },
};
