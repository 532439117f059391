/**
 * Shared pieces of the geometry rules: the skip outcome when no geometry facts exist and the
 * way nodes are listed in messages ("node 18 uy, node 5 ux and node 7 uz").
 */
import type { RuleContext, RuleOutcome } from '../rule-types.js';
import type { GeometryFacts } from '../../model/geometry-facts.js';
import { formatList } from './message.js';
import { shareText } from './motion-text.js';

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

/**
 * Where the mechanisms move, for rigid-body-modes' failure message: "largest mechanism motion
 * (share of kinetic energy) at node 902 (100 %: 75 % uy, 25 % ux), …", up to 3 in the sentence (those after the
 * first only with ≥ 1 % of the energy), top 10 in `nodes`.
 * Null when there are no geometry facts or no mechanism.
 */
export function mechanismLocation(geometry: GeometryFacts | undefined): { sentence: string; nodes: unknown[]; mechanisms: number } | null {
  const m = geometry?.mechanisms;
  if (!m || m.mechanisms === 0 || m.nodes.length === 0) return null;
  // the first node always; the next two only when they carry at least 1 % of the energy
  const shown = m.nodes
    .slice(0, 3)
    .filter((e, k) => k === 0 || e.energyFraction >= 0.01)
    .map(shareText);
  return {
    sentence: `Largest mechanism motion (share of kinetic energy) at ${formatList(shown, 3)}.`,
    nodes: m.nodes,
    mechanisms: m.mechanisms,
  };
}
