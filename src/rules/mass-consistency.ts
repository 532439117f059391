/**
 * mass-consistency: the mass moving with a unit translation is the same along x, y and z
 * (rᵀMr for the three translations). Any FE mass matrix, lumped or consistent, gives equal
 * values; a difference means some DOFs lack mass in one direction (a lumped mass entered on
 * ux only, a missing component). Measured: (max − min) / max over the directions the DOF map
 * represents. Default 1e-6 relative — our choice, far above round-off, far below a real omission.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { geometryMessages, geometryOrSkip, isOutcome } from './utils/geometry-common.js';
import { massIn, unitSuffix } from './utils/units.js';

export interface MassConsistencyOptions {
  maxRelativeSpread: number;
}

const messages = {
  ...geometryMessages,
  pass: 'translational masses agree: {{masses}} (spread {{spread}}, limit {{limit}}).',
  fail: 'translational masses differ: {{masses}} (spread {{spread}}, limit {{limit}}): {{low}} lacks mass on some DOFs.',
  mass: '{{direction}} {{mass}}',
  none: 'not evaluated: the DOF map has fewer than two translational directions.',
};
const { outcome, text } = ruleMessages(messages);

export const massConsistency: RuleDefinition<MassConsistencyOptions> = {
  id: 'mass-consistency',
  description: 'The masses moving with unit x, y and z translations agree (no DOFs missing mass in one direction).',
  optionsSchema: {
    type: 'object',
    properties: { maxRelativeSpread: { type: 'number', minimum: 0 } },
    additionalProperties: false,
  },
  defaults: { maxRelativeSpread: 1e-6 },
  messages,
  needs: ['dofMap'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    const names = ['ux', 'uy', 'uz'] as const;
    const present = names.map((d, k) => ({ d, m: g.massProperties.translationalMass[k] })).filter((e) => g.representedDirections[e.d]);
    if (present.length < 2) return outcome('skip', 'none', {});
    const max = Math.max(...present.map((e) => e.m));
    const low = present.reduce((a, b) => (b.m < a.m ? b : a));
    const spread = max > 0 ? (max - low.m) / max : 0;
    const u = context.units;
    const masses = present.map((e) => text('mass', { direction: e.d, mass: `${massIn(u, e.m).toPrecision(6)}${unitSuffix(u?.mass)}` })).join(', ');
    const values = { masses, spread, limit: o.maxRelativeSpread, low: low.d };
    const details = { translationalMass: g.massProperties.translationalMass, relativeSpread: spread };
    const status = spread <= o.maxRelativeSpread ? 'pass' : 'fail';
    return outcome(status, status, values, spread, o.maxRelativeSpread, details);
  },
};
