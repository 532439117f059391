/**
 * mode-shape-match: each paired mode's shape still matches its baseline shape:
 *   MAC(φ_baseline, ψ_current) ≥ minMac
 * (Allemang & Brown 1982, docs/sources.md §2 [C]; plain or mass-weighted as the baseline settings
 * say). For modes of a near-repeated group the value is the group's subspace MAC (smallest cos²
 * of the principal angles between the two spans, src/model/mac.ts), since single vectors of a
 * repeated pair are arbitrary. Skips, saying why, when the shapes could not be compared (the DOFs
 * of the baseline and of the model could not be matched).
 * Default 0.9: the cross-MAC used for pairing in practice (SEM/IMAC ch. 18, docs/sources.md §2 [C];
 * "> 0.9 consistent" is common practice, [CP]).
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export interface ModeShapeMatchOptions {
  minMac: number;
  /** Baseline modes to check (1-based); default every paired mode. */
  modes?: number[];
}

const messages = {
  pass: '{{count}} paired mode shapes match the baseline (lowest MAC {{worst}} at baseline mode {{worstMode}}, limit {{limit}}).',
  fail: '{{bad}} of {{count}} paired mode shapes differ from the baseline (MAC below {{limit}}): {{list}}.',
  differs: 'mode {{mode}}{{moved}} at MAC {{mac}}',
  moved: ' (now mode {{mode}})',
  none: 'no paired modes to compare with the baseline.',
  notCompared: 'not evaluated: {{reason}}.',
};
const { outcome, text } = ruleMessages(messages);

export const modeShapeMatch: RuleDefinition<ModeShapeMatchOptions> = {
  id: 'mode-shape-match',
  description: 'Each paired mode shape matches its baseline shape: MAC ≥ minMac.',
  optionsSchema: {
    type: 'object',
    properties: {
      minMac: { type: 'number', exclusiveMinimum: 0, maximum: 1 },
      modes: { type: 'array', items: { type: 'integer', minimum: 1 }, minItems: 1 },
    },
    additionalProperties: false,
  },
  defaults: { minMac: 0.9 },
  messages,
  needs: ['modes', 'baseline'],
  evaluate(context, o) {
    const c = context.comparison!;
    if (c.shapesNotCompared !== null) return outcome('skip', 'notCompared', { reason: c.shapesNotCompared });
    const wanted = o.modes ? new Set(o.modes) : null;
    const checked = c.pairs.filter((p): p is typeof p & { correlation: number } => p.correlation !== null && (!wanted || wanted.has(p.baselineMode)));
    if (checked.length === 0) return outcome('skip', 'none', {});
    const worst = checked.reduce((a, b) => (b.correlation < a.correlation ? b : a));
    const bad = checked.filter((p) => p.correlation < o.minMac);
    const details = {
      flagged: bad.map((p) => ({ baselineMode: p.baselineMode, currentMode: p.currentMode })),
      groups: c.groupMatches,
      pairs: checked.map((p) => ({ baselineMode: p.baselineMode, currentMode: p.currentMode, mac: p.mac, correlation: p.correlation, repeated: p.repeated, group: p.group })),
    };
    const values = { count: checked.length, limit: o.minMac };
    if (bad.length > 0) {
      const list = formatList(bad.map((p) => text('differs', { mode: String(p.baselineMode), moved: p.currentMode === p.baselineMode ? '' : text('moved', { mode: String(p.currentMode) }), mac: p.correlation })));
      return outcome('fail', 'fail', { ...values, bad: bad.length, list }, worst.correlation, o.minMac, details);
    }
    return outcome('pass', 'pass', { ...values, worst: worst.correlation, worstMode: worst.baselineMode }, worst.correlation, o.minMac, details);
  },
};
