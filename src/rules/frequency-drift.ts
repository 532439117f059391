/**
 * frequency-drift: each paired mode's frequency stays within ± maxChangePercent of its baseline:
 *   |f_current − f_baseline| / f_baseline ≤ maxChangePercent / 100,
 * with pairs from mode tracking (MAC assignment, see src/model/compare-baseline.ts), so a swap of
 * close modes is not read as two large changes. When the shapes cannot be compared (DOFs added or
 * removed without DOF maps to match them), modes pair by frequency order (rigid-body with
 * rigid-body, elastic with elastic) and the messages say so: the drift is still checked.
 * Rigid-body modes (f ≈ 0) are not checked.
 * A flagged mode's text names where its change came from when the attribution is known
 * (src/model/change-attribution.ts): the first-order estimate and the region with the largest
 * share, split into stiffness and mass when the baseline stored M₀φ ("mode 3 8.289 → 8.273 Hz
 * (−0.19 %; first order −0.19 %: 98 % from nodes 5, 1003 near (0.2, −0.1, 0.8), stiffness)").
 * Default 5 %: the frequency agreement usually asked of significant modes (attributed to
 * NASA-STD-5002, clause unconfirmed — [M] docs/sources.md §1b); between revisions of one model the
 * right limit is the project's own choice.
 */
import type { RuleDefinition } from './rule-types.js';
import type { ModePair } from '../model/comparison-facts.js';
import type { AttributionFacts, ModeAttribution } from '../model/change-facts.js';
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
  change: 'mode {{mode}}{{moved}} {{baselineHz}} → {{currentHz}} Hz ({{sign}}{{changePercent}} %{{cause}})',
  moved: ' (now mode {{mode}})',
  cause: '; first order {{sign}}{{estimatedPercent}} %: {{share}} % from {{region}}{{kind}}',
  causeElsewhere: '; first order {{sign}}{{estimatedPercent}} %, from no changed region',
  stiffness: ', stiffness',
  mass: ', mass',
  both: ', stiffness {{stiffness}} % and mass {{mass}} %',
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
    const attribution = context.changes?.attribution ?? null;
    const details = { pairedBy: c.pairedBy, flagged: bad.map((p) => flag(p, attribution)), pairs: checked.map((p) => ({ baselineMode: p.baselineMode, currentMode: p.currentMode, baselineHz: p.baselineHz, currentHz: p.currentHz, changePercent: p.changePercent })) };
    const pairing = c.shapesNotCompared === null ? '' : text('byOrder', { reason: c.shapesNotCompared });
    const values = { count: checked.length, limit: o.maxChangePercent, pairing };
    if (bad.length > 0) return outcome('fail', 'fail', { ...values, bad: bad.length, list: formatList(bad.map((p) => describe(p, attribution))) }, measured, o.maxChangePercent, details);
    return outcome('pass', 'pass', { ...values, worst: measured, worstMode: worst.baselineMode }, measured, o.maxChangePercent, details);
  },
};

function attributed(p: ModePair, a: AttributionFacts | null): ModeAttribution | undefined {
  return a?.modes.find((m) => m.baselineMode === p.baselineMode && m.currentMode === p.currentMode);
}

function flag(p: ModePair, a: AttributionFacts | null): { baselineMode: number; currentMode: number; cause?: { estimatedPercent: number; region: string; share: number; stiffnessShare: number | null } } {
  const m = attributed(p, a);
  const top = m?.regions[0];
  if (!m || !top || !a) return { baselineMode: p.baselineMode, currentMode: p.currentMode };
  const stiffnessShare = top.stiffnessDelta === null || top.deltaEigenvalue === 0 ? null : top.stiffnessDelta / top.deltaEigenvalue;
  return { baselineMode: p.baselineMode, currentMode: p.currentMode, cause: { estimatedPercent: m.estimatedPercent, region: a.regions[top.region].label, share: top.share, stiffnessShare } };
}

function describe(p: ModePair, a: AttributionFacts | null): string {
  const moved = p.currentMode === p.baselineMode ? '' : text('moved', { mode: String(p.currentMode) });
  return text('change', { mode: String(p.baselineMode), moved, baselineHz: p.baselineHz, currentHz: p.currentHz, sign: p.changePercent! > 0 ? '+' : '', changePercent: p.changePercent!, cause: cause(p, a) });
}

/** "; first order −4.1 %: 71 % from nodes 1201–1240 near (2.0, 0.4, 1.1), stiffness", or '' without an attribution. */
function cause(p: ModePair, a: AttributionFacts | null): string {
  const m = attributed(p, a);
  if (!m || !a) return '';
  const sign = m.estimatedPercent > 0 ? '+' : '';
  const top = m.regions[0];
  if (!top) return text('causeElsewhere', { sign, estimatedPercent: m.estimatedPercent });
  return text('cause', { sign, estimatedPercent: m.estimatedPercent, share: Math.round(100 * top.share), region: a.regions[top.region].label, kind: kindOf(top.stiffnessDelta, top.deltaEigenvalue) });
}

/** ", stiffness" when the stiffness part is at least 90 % of the region's part, ", mass" at most 10 % (our choice), else both shares. */
function kindOf(stiffnessDelta: number | null, delta: number): string {
  if (stiffnessDelta === null || delta === 0) return '';
  const s = stiffnessDelta / delta;
  if (s >= 0.9) return text('stiffness');
  if (s <= 0.1) return text('mass');
  return text('both', { stiffness: Math.round(100 * s), mass: Math.round(100 * (1 - s)) });
}
