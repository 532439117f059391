/**
 * mode-frequencies: listed modes lie within ± tolerancePercent of target frequencies:
 *   |f_i − f_target| / f_target ≤ tol/100.
 * Default 5 %: the frequency agreement usually asked of significant modes in test–analysis
 * correlation (attributed to NASA-STD-5002, clause unconfirmed — [M] docs/sources.md §1b).
 * `mode` counts every solved mode from 1, rigid-body modes included.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export interface ModeTarget {
  mode: number;
  hz: number;
  tolerancePercent?: number;
}

export interface ModeFrequenciesOptions {
  targets: ModeTarget[];
  tolerancePercent: number;
}

const messages = {
  pass: 'all {{count}} listed modes within tolerance (largest deviation {{worst}} % at mode {{worstMode}}).',
  fail: '{{bad}} of {{count}} listed modes outside tolerance: {{list}}.',
  outside: 'mode {{mode}} at {{hz}} Hz vs {{targetHz}} Hz ({{deviationPercent}} %, limit ± {{tolerancePercent}} %)',
  missing: 'mode {{mode}} was listed but only {{solved}} modes were solved: solve more modes.',
  none: 'no target frequencies listed (set targets: [{ mode, hz }]).',
};
const { outcome, text } = ruleMessages(messages);

export const modeFrequencies: RuleDefinition<ModeFrequenciesOptions> = {
  id: 'mode-frequencies',
  description: 'Listed modes lie within ± tolerancePercent of their target frequencies.',
  optionsSchema: {
    type: 'object',
    properties: {
      targets: {
        type: 'array',
        items: {
          type: 'object',
          properties: {
            mode: { type: 'integer', minimum: 1 },
            hz: { type: 'number', exclusiveMinimum: 0 },
            tolerancePercent: { type: 'number', exclusiveMinimum: 0 },
          },
          required: ['mode', 'hz'],
          additionalProperties: false,
        },
      },
      tolerancePercent: { type: 'number', exclusiveMinimum: 0 },
    },
    additionalProperties: false,
  },
  defaults: { targets: [], tolerancePercent: 5 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    if (o.targets.length === 0) return outcome('skip', 'none', {});
    const f = context.modes!.frequenciesHz;
    const rows = [];
    for (const t of o.targets) {
      if (t.mode > f.length) return outcome('error', 'missing', { mode: t.mode, solved: f.length });
      const hz = f[t.mode - 1];
      const deviationPercent = (100 * (hz - t.hz)) / t.hz;
      const tol = t.tolerancePercent ?? o.tolerancePercent;
      rows.push({ mode: t.mode, targetHz: t.hz, hz, deviationPercent, tolerancePercent: tol, ok: Math.abs(deviationPercent) <= tol });
    }
    const worst = rows.reduce((a, b) => (Math.abs(b.deviationPercent) > Math.abs(a.deviationPercent) ? b : a));
    const bad = rows.filter((r) => !r.ok);
    const details = { targets: rows };
    const measured = Math.abs(worst.deviationPercent);
    if (bad.length > 0) {
      const list = formatList(
        bad.map((r) => text('outside', { mode: String(r.mode), hz: r.hz, targetHz: r.targetHz, deviationPercent: r.deviationPercent, tolerancePercent: String(r.tolerancePercent) })),
      );
      return outcome('fail', 'fail', { bad: bad.length, count: rows.length, list }, measured, o.tolerancePercent, details);
    }
    return outcome('pass', 'pass', { count: rows.length, worst: measured, worstMode: worst.mode }, measured, o.tolerancePercent, details);
  },
};
