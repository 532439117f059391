/**
 * total-mass: the model's mass (mean of the three translational rigid-body masses rᵀMr) lies
 * within ± tolerancePercent of the expected value from the mass budget. Units: the config's
 * `units.mass` when given (the model's mass ÷ `units.massScale`: a kg model with `mass: t,
 * massScale: 1000` is compared in t), else the model's own mass unit (kg for SI models, t for
 * N-mm-t models). The tolerance comes from the project's budget;
 * the default 1 % is our choice (the ECSS mass-property tolerance was not recovered, [M]
 * docs/sources.md §1a).
 * The mass is that of the whole export (constraint sets do not change it); when constraint sets
 * removed DOFs, the mass on the kept DOFs, which mass participation is relative to, is stated
 * beside it. Mass at DOFs the FE program removed before export is in neither.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { geometryMessages, geometryOrSkip, isOutcome } from './utils/geometry-common.js';
import { massIn, withUnit } from './utils/units.js';

export interface TotalMassOptions {
  expected: number;
  tolerancePercent: number;
}

const messages = {
  ...geometryMessages,
  pass: 'total mass {{mass}} of the export{{kept}} is within {{tolerancePercent}} % of the expected {{expected}} ({{deviation}} %); {{note}}.',
  fail: 'total mass {{mass}} of the export{{kept}} differs from the expected {{expected}} by {{deviation}} % (allowed {{tolerancePercent}} %); {{note}}.',
  kept: ' ({{keptMass}} on the {{keptDofs}} solved DOFs, which mass participation uses)',
  limit: '{{expected}} ± {{tolerancePercent}} %',
  note: 'mass at DOFs removed before export is not counted',
};
const { outcome, text } = ruleMessages(messages);

export const totalMass: RuleDefinition<TotalMassOptions, 'expected'> = {
  id: 'total-mass',
  description: "The model's total mass lies within ± tolerancePercent of the expected value (in units.mass when the config sets it, else the model's mass unit).",
  optionsSchema: {
    type: 'object',
    properties: {
      expected: { type: 'number', exclusiveMinimum: 0, description: "expected mass in the config's units.mass (else the model's mass unit)" },
      tolerancePercent: { type: 'number', minimum: 0 },
    },
    required: ['expected'],
    additionalProperties: false,
  },
  defaults: { tolerancePercent: 1 },
  messages,
  needs: ['dofMap'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    const mp = g.massProperties;
    const u = context.units;
    // the comparison is made in the unit the target is written in
    const mass = massIn(u, mp.totalMass);
    const deviation = (100 * (mass - o.expected)) / o.expected;
    const kept = g.keptMass && g.constraints ? text('kept', { keptMass: withUnit(massIn(u, g.keptMass.totalMass), u?.mass), keptDofs: g.constraints.keptDofs }) : '';
    const values = { mass: withUnit(mass, u?.mass), kept, expected: withUnit(o.expected, u?.mass), deviation, tolerancePercent: o.tolerancePercent, note: text('note') };
    const details = {
      totalMass: mp.totalMass,
      translationalMass: mp.translationalMass,
      deviationPercent: deviation,
      keptMass: g.keptMass?.totalMass ?? mp.totalMass,
      keptDofs: g.constraints?.keptDofs ?? context.stiffness.n,
      exportedDofs: context.stiffnessSummary.n,
      note: text('note'),
      ...(u ? { units: u, totalMassInUnits: mass } : {}),
    };
    const status = Math.abs(deviation) <= o.tolerancePercent ? 'pass' : 'fail';
    const expected = u?.mass ? `${o.expected} ${u.mass}` : String(o.expected);
    return outcome(status, status, values, mass, text('limit', { expected, tolerancePercent: String(o.tolerancePercent) }), details);
  },
};
