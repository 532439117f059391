/**
 * center-of-mass: the centre of mass (from the rigid-body mass matrix RᵀMR) lies within
 * maxDistance of the expected point (model length unit, named in messages by the config's
 * `units.length`). Both numbers come from the project's mass budget; there is no default distance.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { geometryMessages, geometryOrSkip, isOutcome } from './utils/geometry-common.js';
import { unitSuffix, withUnit } from './utils/units.js';

export interface CenterOfMassOptions {
  expected: [number, number, number];
  maxDistance: number;
}

const messages = {
  ...geometryMessages,
  pass: 'centre of mass ({{x}}, {{y}}, {{z}}){{unit}} is {{distance}} from the expected point (allowed {{maxDistance}}).',
  fail: 'centre of mass ({{x}}, {{y}}, {{z}}){{unit}} is {{distance}} from the expected ({{ex}}, {{ey}}, {{ez}}){{unit}}; allowed {{maxDistance}}.',
};
const { outcome } = ruleMessages(messages);

export const centerOfMass: RuleDefinition<CenterOfMassOptions, 'expected' | 'maxDistance'> = {
  id: 'center-of-mass',
  description: 'The centre of mass lies within maxDistance of the expected point (model length unit).',
  optionsSchema: {
    type: 'object',
    properties: {
      expected: { type: 'array', items: { type: 'number' }, minItems: 3, maxItems: 3 },
      maxDistance: { type: 'number', minimum: 0 },
    },
    required: ['expected', 'maxDistance'],
    additionalProperties: false,
  },
  defaults: {},
  messages,
  needs: ['dofMap'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    const c = g.massProperties.centerOfMass;
    const distance = Math.hypot(c[0] - o.expected[0], c[1] - o.expected[1], c[2] - o.expected[2]);
    const length = context.units?.length;
    const values = { x: c[0], y: c[1], z: c[2], ex: o.expected[0], ey: o.expected[1], ez: o.expected[2], unit: unitSuffix(length), distance: withUnit(distance, length), maxDistance: withUnit(o.maxDistance, length) };
    const details = { centerOfMass: c, expected: o.expected, distance };
    const status = distance <= o.maxDistance ? 'pass' : 'fail';
    return outcome(status, status, values, distance, o.maxDistance, details);
  },
};
