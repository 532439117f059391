/**
 * Number texts both change reporters (markdown-changes.ts, html-changes.ts) print the same way.
 */
import { formatNumber } from '../rules/utils/message.js';

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
