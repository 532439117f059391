/**
 * Message templates of the rules: `{{name}}` placeholders filled from a values object.
 * Numbers are written with four significant digits (exponent form when tiny or huge), the
 * way an analyst reads them in a CI log.
 */

/** Replace each `{{key}}` with `values[key]` (numbers through `formatNumber`). Unknown keys stay visible. */
export function formatMessage(template: string, values: Record<string, unknown>): string {
  return template.replace(/\{\{\s*([A-Za-z0-9_]+)\s*\}\}/g, (whole, key: string) => {
    if (!(key in values)) return whole;
    const v = values[key];
    return typeof v === 'number' ? formatNumber(v) : String(v);
  });
}

/** 4 significant digits; exponent form below 1e-3 or from 1e6 on; integers as integers. */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  if (Number.isInteger(x) && Math.abs(x) < 1e6) return String(x);
  const a = Math.abs(x);
  if (a < 1e-3 || a >= 1e6) return x.toExponential(2).replace('e+', 'e');
  return String(Number(x.toPrecision(4)));
}

/** "a, b and c" for short lists; the rest summarised as "… and N more". */
export function formatList(items: string[], cap = 5): string {
  if (items.length === 0) return '';
  const shown = items.slice(0, cap);
  const rest = items.length - shown.length;
  if (rest > 0) return `${shown.join(', ')} and ${rest} more`;
  if (shown.length === 1) return shown[0];
  return `${shown.slice(0, -1).join(', ')} and ${shown[shown.length - 1]}`;
}
