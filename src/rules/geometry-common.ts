/**
 * Shared pieces of the geometry rules: the skip outcome when no geometry facts exist and the
 * way nodes are listed in messages ("node 18 uy, node 5 ux and node 7 uz").
 */
import type { RuleContext, RuleOutcome } from './rule-types.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
import { formatList } from './message.js';

export function geometryOrSkip(context: RuleContext): GeometryFacts | RuleOutcome {
  if (context.geometry) return context.geometry;
  return { status: 'skip', message: 'not evaluated: no geometry facts for this model (a DOF map is needed).' };
}

export function isOutcome(x: GeometryFacts | RuleOutcome): x is RuleOutcome {
  return 'status' in x;
}

/** "node 18 uy, node 5 ux and node 7 uz" from the first `cap` entries. */
export function nodeList(entries: readonly { node: number; component: string }[], cap = 3): string {
  return formatList(entries.slice(0, cap).map((e) => `node ${e.node} ${e.component}`), cap);
}
