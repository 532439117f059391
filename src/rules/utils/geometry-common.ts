/**
 * Shared piece of the geometry rules: the skip outcome when no geometry facts exist. Its template
 * is `geometryMessages.noGeometry`, which every geometry rule spreads into its own `messages`.
 */
import type { RuleContext, RuleOutcome } from '../rule-types.js';
import type { GeometryFacts } from '../../model/geometry-facts.js';
import { ruleMessages } from './outcome.js';

export const geometryMessages = {
  noGeometry: 'not evaluated: no geometry facts for this model (a DOF map is needed).',
};
const { outcome } = ruleMessages(geometryMessages);

export function geometryOrSkip(context: RuleContext): GeometryFacts | RuleOutcome {
  if (context.geometry) return context.geometry;
  return outcome('skip', 'noGeometry');
}

export function isOutcome(x: GeometryFacts | RuleOutcome): x is RuleOutcome {
  return 'status' in x;
}
