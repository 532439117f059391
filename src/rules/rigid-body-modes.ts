/**
 * rigid-body-modes: the number of modes below the rigid-body cutoff equals `expected` (or lies in
 * `min..max`). A free-free 3-D model has 6 (ECSS-E-ST-32-03C "first six", [S] CRITERIA.md §1a);
 * a supported model has 0. More than expected means a mechanism or an unintended free part;
 * fewer means unintended grounding (a spring or constraint to ground).
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './outcome.js';
import { cutoffDefaults, cutoffSchemaProperties, splitRigidBodyModes, type RigidBodyCutoffOptions } from './rigid-body-split.js';
import { mechanismLocation } from './geometry-common.js';

export interface RigidBodyModesOptions extends RigidBodyCutoffOptions {
  expected?: number;
  min?: number;
  max?: number;
}

const messages = {
  pass: '{{count}} {{modesWord}} {{phrase}}, as expected ({{expectation}}).',
  tooMany:
    '{{count}} {{modesWord}} {{phrase}}, expected {{expectation}}: the model has a mechanism or an unintended free part ({{extra}} extra near-zero mode(s): {{extraHz}} Hz).',
  tooFew:
    '{{count}} {{modesWord}} {{phrase}}, expected {{expectation}}: the model is grounded somewhere it should be free (a spring or constraint to ground).',
  allRigid:
    'all {{count}} solved modes are {{phrase}}, so the count may be incomplete: solve more modes (expected {{expectation}}).',
};

export const rigidBodyModes: RuleDefinition<RigidBodyModesOptions> = {
  id: 'rigid-body-modes',
  description: 'The number of modes below the rigid-body cutoff equals `expected` (or lies in min..max).',
  optionsSchema: {
    type: 'object',
    properties: {
      expected: { type: 'integer', minimum: 0 },
      min: { type: 'integer', minimum: 0 },
      max: { type: 'integer', minimum: 0 },
      ...cutoffSchemaProperties,
    },
    anyOf: [{ required: ['expected'] }, { required: ['min'] }, { required: ['max'] }],
    additionalProperties: false,
  },
  defaults: { ...cutoffDefaults },
  exclusiveOptions: [['expected'], ['min', 'max']],
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const f = context.modes!.frequenciesHz;
    const split = splitRigidBodyModes(f, o);
    const lo = o.expected ?? o.min ?? 0;
    const hi = o.expected ?? o.max ?? Infinity;
    const expectation = o.expected !== undefined ? String(o.expected) : hi === Infinity ? `at least ${lo}` : `${lo} to ${hi}`;
    const frequencies = Array.from(f.subarray(0, split.count));
    const details = { count: split.count, cutoffHz: split.cutoffHz, basis: split.basis, fellBack: split.fellBack, rigidBodyFrequenciesHz: frequencies };
    const values = { count: split.count, modesWord: split.count === 1 ? 'mode' : 'modes', phrase: split.phrase, expectation };
    const limit = o.expected !== undefined ? o.expected : expectation;
    if (split.count > hi) {
      const extraHz = frequencies.slice(hi).map((x) => x.toExponential(2)).join(', ');
      const failed = outcome('fail', messages.tooMany, { ...values, extra: split.count - hi, extraHz }, split.count, limit, details);
      // where the mechanism moves (geometry facts, when a DOF map was given)
      const where = mechanismLocation(context.geometry);
      if (where) {
        failed.message += ` ${where.sentence}`;
        failed.details = { ...failed.details, mechanisms: where.mechanisms, mechanismNodes: where.nodes };
      }
      return failed;
    }
    if (split.firstElasticIndex === null && split.count >= lo) {
      return outcome('error', messages.allRigid, values, split.count, limit, details);
    }
    if (split.count < lo) return outcome('fail', messages.tooFew, values, split.count, limit, details);
    return outcome('pass', messages.pass, values, split.count, limit, details);
  },
};
