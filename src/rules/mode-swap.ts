/**
 * mode-swap: the modes keep their order: no two paired modes cross, i.e. no baseline modes
 * a < b whose partners come in the opposite order p(a) > p(b) (mode tracking, CRITERIA.md §2
 * practice 3, [CP]). Crossings inside a group of near-repeated modes are not swaps. Set the rule
 * to `warning` to report swaps without failing. Skips, saying why, when the shapes could not be
 * compared (pairs by frequency order cannot cross).
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './utils/outcome.js';
import { formatList, formatNumber } from './utils/message.js';

export type ModeSwapOptions = Record<string, never>;

const messages = {
  notCompared: 'not evaluated: {{reason}}.',
  pass: 'the {{count}} paired modes keep their baseline order.',
  fail: '{{swaps}} mode order change(s) against the baseline: {{list}}.',
};

export const modeSwap: RuleDefinition<ModeSwapOptions> = {
  id: 'mode-swap',
  description: 'Paired modes keep their baseline order (no swaps of close modes).',
  optionsSchema: { type: 'object', properties: {}, additionalProperties: false },
  defaults: {},
  messages,
  needs: ['modes', 'baseline'],
  evaluate(context) {
    const c = context.comparison!;
    if (c.shapesNotCompared !== null) return outcome('skip', messages.notCompared, { reason: c.shapesNotCompared });
    const flagged = c.swaps.flatMap((s) => [
      { baselineMode: s.baselineModes[0], currentMode: s.currentModes[0] },
      { baselineMode: s.baselineModes[1], currentMode: s.currentModes[1] },
    ]);
    const details = { flagged, swaps: c.swaps };
    if (c.swaps.length === 0) return outcome('pass', messages.pass, { count: c.pairs.length }, 0, 0, details);
    const list = formatList(
      c.swaps.map((s) => `baseline modes ${s.baselineModes[0]} and ${s.baselineModes[1]} are now modes ${s.currentModes[0]} and ${s.currentModes[1]} (MAC ${formatNumber(s.correlations[0])}, ${formatNumber(s.correlations[1])})`),
    );
    return outcome('fail', messages.fail, { swaps: c.swaps.length, list }, c.swaps.length, 0, details);
  },
};
