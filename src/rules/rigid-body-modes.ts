/**
 * rigid-body-modes: the number of modes below the rigid-body cutoff equals `expected` (or lies in
 * `min..max`). A free-free 3-D model has 6 (ECSS-E-ST-32-03C "first six", [S] CRITERIA.md §1a);
 * a supported model has 0. More than expected means a mechanism or an unintended free part;
 * fewer means unintended grounding (a spring or constraint to ground).
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './outcome.js';
import { cutoffDefaults, cutoffSchemaProperties, splitRigidBodyModes, type RigidBodyCutoffOptions } from '../model/rigid-body-split.js';
import { mechanismLocation } from './geometry-common.js';
import { formatMessage } from './message.js';
import { mechanismGroupText, motionKindText, supportedNodesText } from './motion-text.js';
import { localizeNearZeroModesByDof } from '../model/mechanism-localization.js';

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
  noSupports:
    '{{count}} {{modesWord}} {{phrase}}, expected {{expectation}}: the model has no supports, so the whole model moves as a rigid body (six free rigid-body motions).',
  freeMotion: 'Free rigid-body motion: {{motion}}; {{supports}}.',
  mechanismGroups: '{{count}} independent {{mechanismWord}}: {{groups}}.',
  byDof: 'Near-zero motion (no DOF map, so named by DOF number): {{groups}}.',
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
      const g = context.geometry;
      const wholeBody = g?.freeMotions?.motion.kind === 'whole-body' && hi < 6;
      const failed = outcome('fail', wholeBody ? messages.noSupports : messages.tooMany, { ...values, extra: split.count - hi, extraHz }, split.count, limit, details);
      const sentences: string[] = [];
      const extra: Record<string, unknown> = {};
      // free rigid-body motions beyond the expected ones: which motion, which supports leave it free
      if (g?.freeMotions && g.freeRigidBodyMotions > hi && !wholeBody) {
        sentences.push(formatMessage(messages.freeMotion, { motion: motionKindText(g.freeMotions.motion), supports: supportedNodesText(g.freeMotions) }));
      }
      if (g?.freeMotions && g.freeRigidBodyMotions > hi) extra.freeRigidMotions = g.freeMotions;
      // where the mechanisms move (geometry facts, when a DOF map was given), one entry per moving part
      const where = mechanismLocation(g);
      if (where) {
        const groups = g!.mechanisms!.groups;
        if (groups.length > 0) {
          const mechanismWord = groups.length === 1 ? 'mechanism' : 'mechanisms';
          const unlisted = g!.mechanisms!.groupsNotListed;
          const count = unlisted > 0 ? `${groups.length + unlisted} (the first ${groups.length} named)` : groups.length;
          sentences.push(formatMessage(messages.mechanismGroups, { count, mechanismWord, groups: groups.map((x, k) => mechanismGroupText(x, k + 1)).join('; ') }));
        } else sentences.push(where.sentence);
        Object.assign(extra, { mechanisms: where.mechanisms, mechanismNodes: where.nodes, mechanismGroups: groups });
      }
      // no DOF map: the near-zero modes located by DOF number
      if (!g && context.stiffness && context.mass) {
        const { groups } = localizeNearZeroModesByDof(context.stiffness, context.mass, context.modes!, split.count);
        if (groups.length > 0) {
          sentences.push(formatMessage(messages.byDof, { groups: groups.map((x, k) => mechanismGroupText(x, k + 1)).join('; ') }));
          extra.mechanismGroups = groups;
        }
      }
      if (sentences.length > 0) failed.message += ` ${sentences.join(' ')}`;
      failed.details = { ...failed.details, ...extra };
      return failed;
    }
    if (split.firstElasticIndex === null && split.count >= lo) {
      return outcome('error', messages.allRigid, values, split.count, limit, details);
    }
    if (split.count < lo) return outcome('fail', messages.tooFew, values, split.count, limit, details);
    return outcome('pass', messages.pass, values, split.count, limit, details);
  },
};
