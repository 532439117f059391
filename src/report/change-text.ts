/**
 * Number texts both change reporters (markdown-changes.ts, html-changes.ts) print the same way.
 */
import { formatNumber } from '../rules/utils/message.js';
import type { ModeAttribution } from '../model/change-facts.js';

/** A share as percent with one decimal ("71.3"); "—" when unknown; never "-0.0". */
export function percentText(x: number | null): string {
  if (x === null) return '—';
  const t = (100 * x).toFixed(1);
  return t === '-0.0' ? '0.0' : t;
}

/** A change with its sign ("+0.17", "−" as formatNumber writes it). */
export function signedText(x: number): string {
  return `${x > 0 ? '+' : ''}${formatNumber(x)}`;
}

/**
 * "Mode 3 (now mode 4): measured −4.2 %, first order −4.1 % (the two δλ differ by 2.4 %);
 * estimated with its near-repeated group (baseline modes 3, 4)." — one changed mode's caption.
 */
export function modeChangeText(m: ModeAttribution): string {
  const moved = m.currentMode === m.baselineMode ? '' : ` (now mode ${m.currentMode})`;
  const agreement = m.disagreement === null ? 'no measured change' : `the two δλ differ by ${formatNumber(100 * m.disagreement)} %`;
  const group = m.group ? `; estimated with its near-repeated group (baseline modes ${m.group.join(', ')})` : '';
  return `Mode ${m.baselineMode}${moved}: measured ${signedText(m.measuredPercent)} %, first order ${signedText(m.estimatedPercent)} % (${agreement})${group}.`;
}
