/**
 * new-or-lost-modes: every mode in the frequency range both solutions cover has a partner.
 * A baseline mode with no partner although the current solve reached its frequency is lost; a
 * current mode with no partner below the baseline's highest mode is new (docs/sources.md §2
 * practice 3, [CP]). Modes above the other side's range are not counted: their partner may
 * simply not have been solved, and so are members of a near-repeated group that the other side's
 * solve cut at its highest mode (the group is compared as a subspace instead, see mode-shape-match).
 * Skips, saying why, when the shapes could not be compared (modes then pair by frequency order).
 */
import type { RuleDefinition } from './rule-types.js';
import type { UnpairedMode } from '../model/comparison-facts.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export interface NewOrLostModesOptions {
  maxNew: number;
  maxLost: number;
}

const messages = {
  notCompared: 'not evaluated: {{reason}}.',
  pass: 'every mode below {{rangeHz}} Hz has a partner in the baseline ({{newCount}} new, {{lostCount}} lost; allowed {{maxNew}} new, {{maxLost}} lost).',
  fail: '{{lost}} baseline mode(s) lost and {{added}} new mode(s) below {{rangeHz}} Hz without a partner: {{list}}.',
  unpaired: '{{side}} mode {{mode}} at {{hz}} Hz ({{best}})',
  bestPartner: 'best MAC {{mac}} with {{otherSide}} mode {{partner}}',
  noPartner: 'no correlated mode',
};
const { outcome, text } = ruleMessages(messages);

export const newOrLostModes: RuleDefinition<NewOrLostModesOptions> = {
  id: 'new-or-lost-modes',
  description: 'Every mode in the range both solutions cover has a partner (no new or lost modes).',
  optionsSchema: {
    type: 'object',
    properties: { maxNew: { type: 'integer', minimum: 0 }, maxLost: { type: 'integer', minimum: 0 } },
    additionalProperties: false,
  },
  defaults: { maxNew: 0, maxLost: 0 },
  messages,
  needs: ['modes', 'baseline'],
  evaluate(context, o) {
    const c = context.comparison!;
    if (c.shapesNotCompared !== null) return outcome('skip', 'notCompared', { reason: c.shapesNotCompared });
    const lost = c.lostModes.filter((m) => m.withinCompared);
    const added = c.newModes.filter((m) => m.withinCompared);
    const rangeHz = Math.min(c.baselineMaxHz, c.currentMaxHz);
    const details = {
      flagged: [...lost.map((m) => ({ baselineMode: m.mode })), ...added.map((m) => ({ currentMode: m.mode }))],
      lost,
      new: added,
    };
    const measured = lost.length + added.length;
    if (lost.length <= o.maxLost && added.length <= o.maxNew) {
      return outcome('pass', 'pass', { rangeHz, newCount: added.length, lostCount: lost.length, maxNew: o.maxNew, maxLost: o.maxLost }, measured, o.maxNew + o.maxLost, details);
    }
    const parts = [...lost.map((m) => describe('baseline', m)), ...added.map((m) => describe('new', m))];
    return outcome('fail', 'fail', { lost: String(lost.length), added: String(added.length), rangeHz, list: formatList(parts) }, measured, o.maxNew + o.maxLost, details);
  },
};

function describe(side: 'baseline' | 'new', m: UnpairedMode): string {
  const best = m.bestPartner === null ? text('noPartner') : text('bestPartner', { mac: m.bestCorrelation, otherSide: side === 'baseline' ? 'current' : 'baseline', partner: String(m.bestPartner) });
  return text('unpaired', { side, mode: String(m.mode), hz: m.hz, best });
}
