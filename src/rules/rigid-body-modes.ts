/**
 * rigid-body-modes: the number of modes below the rigid-body cutoff equals `expected` (or lies in
 * `min..max`). A free-free 3-D model has 6 (ECSS-E-ST-32-03C "first six", [S] docs/sources.md §1a);
 * a supported model has 0. More than expected means a mechanism or an unintended free part;
 * fewer means unintended grounding (a spring or constraint to ground).
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
import { cutoffDefaults, cutoffMessages, cutoffPhrase, cutoffSchemaProperties, splitRigidBodyModes, type RigidBodyCutoffOptions } from './utils/rigid-body-split.js';
import { formatList } from './utils/message.js';
import { mechanismGroupText, motionKindText, motionMessages, shareText, supportedNodesText } from './utils/motion-text.js';
import { localizeNearZeroModesByDof } from '../model/mechanism-localization.js';

export interface RigidBodyModesOptions extends RigidBodyCutoffOptions {
  expected?: number;
  min?: number;
  max?: number;
}

const messages = {
  ...cutoffMessages,
  ...motionMessages,
  pass: '{{count}} {{modesWord}} {{phrase}}, as expected ({{expectation}}).',
  tooMany:
    '{{count}} {{modesWord}} {{phrase}}, expected {{expectation}}: the model has a mechanism or an unintended free part ({{extra}} extra near-zero mode(s): {{extraHz}} Hz).{{where}}',
  tooFew:
    '{{count}} {{modesWord}} {{phrase}}, expected {{expectation}}: the model is grounded somewhere it should be free (a spring or constraint to ground).',
  noSupports:
    '{{count}} {{modesWord}} {{phrase}}, expected {{expectation}}: the model has no supports, so the whole model moves as a rigid body (six free rigid-body motions).{{where}}',
  freeMotion: 'Free rigid-body motion: {{motion}}; {{supports}}.',
  mechanismGroups: '{{count}} independent {{mechanismWord}}: {{groups}}.',
  groupsNamed: '{{total}} (the first {{named}} named)',
  largestMotion: 'Largest mechanism motion (share of kinetic energy) at {{nodes}}.',
  byDof: 'Near-zero motion (no DOF map, so named by DOF number): {{groups}}.',
  expectAtLeast: 'at least {{min}}',
  expectRange: '{{min}} to {{max}}',
  allRigid:
    'all {{count}} solved modes are {{phrase}}, so the count may be incomplete: solve more modes (expected {{expectation}}).',
};
const { outcome, text } = ruleMessages(messages);

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
    const expectation = o.expected !== undefined ? String(o.expected) : hi === Infinity ? text('expectAtLeast', { min: String(lo) }) : text('expectRange', { min: String(lo), max: String(hi) });
    const frequencies = Array.from(f.subarray(0, split.count));
    const details = { count: split.count, cutoffHz: split.cutoffHz, basis: split.basis, fellBack: split.fellBack, rigidBodyFrequenciesHz: frequencies };
    const values = { count: split.count, modesWord: split.count === 1 ? 'mode' : 'modes', phrase: cutoffPhrase(split), expectation };
    const limit = o.expected !== undefined ? o.expected : expectation;
    if (split.count > hi) {
      const extraHz = frequencies.slice(hi).map((x) => x.toExponential(2)).join(', ');
      const g = context.geometry;
      const wholeBody = g?.freeMotions?.motion.kind === 'whole-body' && hi < 6;
      const sentences: string[] = [];
      const extra: Record<string, unknown> = {};
      // free rigid-body motions beyond the expected ones: which motion, which supports leave it free
      if (g?.freeMotions && g.freeRigidBodyMotions > hi && !wholeBody) {
        sentences.push(text('freeMotion', { motion: motionKindText(g.freeMotions.motion), supports: supportedNodesText(g.freeMotions) }));
      }
      if (g?.freeMotions && g.freeRigidBodyMotions > hi) extra.freeRigidMotions = g.freeMotions;
      // where the mechanisms move (geometry facts, when a DOF map was given), one entry per moving part
      const where = mechanismLocation(g);
      if (where) {
        const groups = g!.mechanisms!.groups;
        if (groups.length > 0) {
          const mechanismWord = groups.length === 1 ? 'mechanism' : 'mechanisms';
          const unlisted = g!.mechanisms!.groupsNotListed;
          const count = unlisted > 0 ? text('groupsNamed', { total: groups.length + unlisted, named: groups.length }) : groups.length;
          sentences.push(text('mechanismGroups', { count, mechanismWord, groups: groups.map((x, k) => mechanismGroupText(x, k + 1)).join('; ') }));
        } else sentences.push(text('largestMotion', { nodes: where.shown }));
        Object.assign(extra, { mechanisms: where.mechanisms, mechanismNodes: where.nodes, mechanismGroups: groups });
      }
      // no DOF map: the near-zero modes located by DOF number
      if (!g && context.stiffness && context.mass) {
        const { groups } = localizeNearZeroModesByDof(context.stiffness, context.mass, context.modes!, split.count);
        if (groups.length > 0) {
          sentences.push(text('byDof', { groups: groups.map((x, k) => mechanismGroupText(x, k + 1)).join('; ') }));
          extra.mechanismGroups = groups;
        }
      }
      const located = { ...values, extra: split.count - hi, extraHz, where: sentences.length > 0 ? ` ${sentences.join(' ')}` : '' };
      return outcome('fail', wholeBody ? 'noSupports' : 'tooMany', located, split.count, limit, { ...details, ...extra });
    }
    if (split.firstElasticIndex === null && split.count >= lo) {
      return outcome('error', 'allRigid', values, split.count, limit, details);
    }
    if (split.count < lo) return outcome('fail', 'tooFew', values, split.count, limit, details);
    return outcome('pass', 'pass', values, split.count, limit, details);
  },
};

/**
 * Where the mechanisms move, for the failure message: "node 902 (100 %: 75 % uy, 25 % ux), …",
 * up to 3 (those after the first only with ≥ 1 % of the kinetic energy), top 10 in `nodes`.
 * Null when there are no geometry facts or no mechanism.
 */
function mechanismLocation(geometry: GeometryFacts | undefined): { shown: string; nodes: unknown[]; mechanisms: number } | null {
  const m = geometry?.mechanisms;
  if (!m || m.mechanisms === 0 || m.nodes.length === 0) return null;
  // the first node always; the next two only when they carry at least 1 % of the energy
  const shown = m.nodes
    .slice(0, 3)
    .filter((e, k) => k === 0 || e.energyFraction >= 0.01)
    .map(shareText);
  return { shown: formatList(shown, 3), nodes: m.nodes, mechanisms: m.mechanisms };
}
