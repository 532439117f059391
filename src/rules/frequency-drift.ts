/**
 * frequency-drift: each paired mode's frequency stays within ± maxChangePercent of its baseline:
 *   |f_current − f_baseline| / f_baseline ≤ maxChangePercent / 100,
 * with pairs from mode tracking (MAC assignment, see src/model/compare-baseline.ts), so a swap of
 * close modes is not read as two large changes. When the shapes cannot be compared (DOFs added or
 * removed without DOF maps to match them), modes pair by frequency order (rigid-body with
 * rigid-body, elastic with elastic) and the messages say so: the drift is still checked.
 * Rigid-body modes (f ≈ 0) are not checked.
 * Default 5 %: the frequency agreement usually asked of significant modes (attributed to
 * NASA-STD-5002, clause unconfirmed — [M] docs/sources.md §1b); between revisions of one model the
 * right limit is the project's own choice.
 */
import type { RuleDefinition } from './rule-types.js';
import type { ModePair } from '../model/comparison-facts.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export interface FrequencyDriftOptions {
  maxChangePercent: number;
  /** Baseline modes to check (1-based); default every paired elastic mode. */
  modes?: number[];
}

const messages = {
  pass: '{{count}} paired modes within ± {{limit}} % of the baseline (largest change {{worst}} % at baseline mode {{worstMode}}).{{pairing}}',
  fail: '{{bad}} of {{count}} paired modes changed by more than ± {{limit}} % from the baseline: {{list}}.{{pairing}}',
  none: 'no paired elastic modes to compare with the baseline.',
  byOrder: ' Modes paired by frequency order: {{reason}}.',
  change: 'mode {{mode}}{{moved}} {{baselineHz}} → {{currentHz}} Hz ({{sign}}{{changePercent}} %)',
  moved: ' (now mode {{mode}})',
};
const { outcome, text } = ruleMessages(messages);

export const frequencyDrift: RuleDefinition<FrequencyDriftOptions> = {
  id: 'frequency-drift',
  description: 'Each paired mode stays within ± maxChangePercent of its baseline frequency.',
  optionsSchema: {
    type: 'object',
    properties: {
      maxChangePercent: { type: 'number', exclusiveMinimum: 0 },
      modes: { type: 'array', items: { type: 'integer', minimum: 1 }, minItems: 1 },
    },
    additionalProperties: false,
  },
  defaults: { maxChangePercent: 5 },
  messages,
  needs: ['modes', 'baseline'],
  evaluate(context, o) {
    const c = context.comparison!;
    const wanted = o.modes ? new Set(o.modes) : null;
    const checked = c.pairs.filter((p) => p.changePercent !== null && (!wanted || wanted.has(p.baselineMode)));
    if (checked.length === 0) return outcome('skip', 'none', {});
    const worst = checked.reduce((a, b) => (Math.abs(b.changePercent!) > Math.abs(a.changePercent!) ? b : a));
    const bad = checked.filter((p) => Math.abs(p.changePercent!) > o.maxChangePercent);
    const measured = Math.abs(worst.changePercent!);
    const details = { pairedBy: c.pairedBy, flagged: bad.map(flag), pairs: checked.map((p) => ({ baselineMode: p.baselineMode, currentMode: p.currentMode, baselineHz: p.baselineHz, currentHz: p.currentHz, changePercent: p.changePercent })) };
    const pairing = c.shapesNotCompared === null ? '' : text('byOrder', { reason: c.shapesNotCompared });
    const values = { count: checked.length, limit: o.maxChangePercent, pairing };
    if (bad.length > 0) return outcome('fail', 'fail', { ...values, bad: bad.length, list: formatList(bad.map(describe)) }, measured, o.maxChangePercent, details);
    return outcome('pass', 'pass', { ...values, worst: measured, worstMode: worst.baselineMode }, measured, o.maxChangePercent, details);
  },
};

function flag(p: ModePair): { baselineMode: number; currentMode: number } {
  return { baselineMode: p.baselineMode, currentMode: p.currentMode };
}

function describe(p: ModePair): string {
  const moved = p.currentMode === p.baselineMode ? '' : text('moved', { mode: String(p.currentMode) });
  return text('change', { mode: String(p.baselineMode), moved, baselineHz: p.baselineHz, currentHz: p.currentHz, sign: p.changePercent! > 0 ? '+' : '', changePercent: p.changePercent! });
}
