/**
 * mode-swap: the modes keep their order: no two paired modes cross, i.e. no baseline modes
 * a < b whose partners come in the opposite order p(a) > p(b) (mode tracking, docs/sources.md §2
 * practice 3, [CP]). Crossings inside a group of near-repeated modes are not swaps. Set the rule
 * to `warning` to report swaps without failing. Skips, saying why, when the shapes could not be
 * compared (pairs by frequency order cannot cross).
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export type ModeSwapOptions = Record<string, never>;

const messages = {
  notCompared: 'not evaluated: {{reason}}.',
  pass: 'the {{count}} paired modes keep their baseline order.',
  swap: 'baseline modes {{b1}} and {{b2}} are now modes {{c1}} and {{c2}} (MAC {{mac1}}, {{mac2}})',
  fail: '{{swaps}} mode order change(s) against the baseline: {{list}}.',
};
const { outcome, text } = ruleMessages(messages);

export const modeSwap: RuleDefinition<ModeSwapOptions> = {
  id: 'mode-swap',
  description: 'Paired modes keep their baseline order (no swaps of close modes).',
  optionsSchema: { type: 'object', properties: {}, additionalProperties: false },
  defaults: {},
  messages,
  needs: ['modes', 'baseline'],
  evaluate(context) {
    const c = context.comparison!;
    if (c.shapesNotCompared !== null) return outcome('skip', 'notCompared', { reason: c.shapesNotCompared });
    const flagged = c.swaps.flatMap((s) => [
      { baselineMode: s.baselineModes[0], currentMode: s.currentModes[0] },
      { baselineMode: s.baselineModes[1], currentMode: s.currentModes[1] },
    ]);
    const details = { flagged, swaps: c.swaps };
    if (c.swaps.length === 0) return outcome('pass', 'pass', { count: c.pairs.length }, 0, 0, details);
    const list = formatList(
      c.swaps.map((s) => text('swap', { b1: String(s.baselineModes[0]), b2: String(s.baselineModes[1]), c1: String(s.currentModes[0]), c2: String(s.currentModes[1]), mac1: s.correlations[0], mac2: s.correlations[1] })),
    );
    return outcome('fail', 'fail', { swaps: c.swaps.length, list }, c.swaps.length, 0, details);
  },
};
