/**
 * Text that is safe inside XML 1.0: characters outside the Char production
 * (#x9 | #xA | #xD | [#x20–#xD7FF] | [#xE000–#xFFFD] | [#x10000–#x10FFFF], W3C XML 1.0 §2.2)
 * are removed; long texts are capped so one report stays small (docs/sources.md §5).
 * Escaping of <, &, > and quotes is done by the XML builder.
 */

// eslint-disable-next-line no-control-regex
const ILLEGAL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

export function xmlSafe(text: string, maxChars = 4000): string {
  const clean = text.replace(ILLEGAL, '');
  if (clean.length <= maxChars) return clean;
  return `${clean.slice(0, maxChars)}\n… (${clean.length - maxChars} more characters in the JSON report)`;
}

/** One line for attributes (newlines would be normalised to spaces by XML readers anyway). */
export function xmlAttribute(text: string, maxChars = 500): string {
  return xmlSafe(text.replace(/\s*[\r\n]+\s*/g, ' '), maxChars);
}

/** Seconds with three decimals and no exponent, as strict JUnit schemas require (`0.012`). */
export function junitSeconds(ms: number): string {
  return (Math.max(0, ms) / 1000).toFixed(3);
}
