/**
 * What `modalgate check` adds for a CI log and a CI job page: one plain line per model saying
 * where its time went (when no live progress line can be drawn), the Markdown summary appended
 * to the file GitHub Actions names in GITHUB_STEP_SUMMARY, and report paths shown relative to
 * the working directory.
 */
import { appendFileSync } from 'node:fs';
import { isAbsolute, relative, sep } from 'node:path';
import type { PhaseTimes } from '../pipeline/analyze-model.js';

/** "mast: read 0.2 s · order 0.1 s · factor 0.4 s · iterate 1.1 s · verify 0.3 s · rules 0.05 s" */
export function phaseLine(model: string, t: PhaseTimes): string {
  const parts: [string, number | undefined][] = [
    ['read', t.readMs],
    ['order', t.orderMs],
    ['factor', t.factorMs],
    ['iterate', t.iterateMs],
    ['verify', t.verifyMs],
    ['rules', t.rulesMs],
  ];
  const shown = parts.filter((p): p is [string, number] => p[1] !== undefined).map(([name, ms]) => `${name} ${seconds(ms)}`);
  return `${model}: ${shown.join(' · ')}`;
}

function seconds(ms: number): string {
  const s = ms / 1000;
  if (s >= 10) return `${s.toFixed(0)} s`;
  if (s >= 0.1) return `${s.toFixed(1)} s`;
  return `${s.toFixed(2)} s`;
}

/** GitHub Actions shows up to 1 MiB of a step's summary. */
export const STEP_SUMMARY_LIMIT = 1024 * 1024;

/**
 * The Markdown summary cut to fit `limit` bytes: at a line boundary, with a closing line that
 * says it was cut and where the full report is (`fullReport`, when one was written).
 */
export function fitStepSummary(markdown: string, fullReport: string | undefined, limit = STEP_SUMMARY_LIMIT): string {
  if (Buffer.byteLength(markdown) <= limit) return markdown;
  const note = `\n_The summary was cut here to fit the ${Math.round(limit / 1024)} KiB a job summary may hold${fullReport ? `; the full report is ${fullReport}` : '; write the full report with --markdown, --html or --json'}._\n`;
  const room = limit - Buffer.byteLength(note);
  const bytes = Buffer.from(markdown);
  let end = Math.max(0, room);
  // back to the end of a whole line
  while (end > 0 && bytes[end - 1] !== 0x0a) end--;
  return bytes.subarray(0, end).toString('utf8') + note;
}

/** Appends the summary to the step-summary file; a failure comes back as its message. */
export function appendStepSummary(file: string, markdown: string, fullReport: string | undefined): void {
  appendFileSync(file, fitStepSummary(markdown, fullReport));
}

/** A path as the user would type it from `cwd`: relative when inside it, absolute otherwise. */
export function shownPath(p: string, cwd: string): string {
  const r = relative(cwd, p);
  return r === '' || r.startsWith('..') || isAbsolute(r) ? p : r;
}

/**
 * A copy of the report for the texts people read (JUnit, Markdown, HTML, the job summary): every
 * path under `cwd` written relative to it, in fields and inside messages. The JSON report keeps the
 * absolute paths (its fields stay what they say).
 */
export function withShownPaths<T>(report: T, cwd: string): T {
  const prefix = cwd.endsWith(sep) ? cwd : cwd + sep;
  const walk = (v: unknown): unknown => {
    if (typeof v === 'string') return v.includes(prefix) ? v.split(prefix).join('') : v;
    if (Array.isArray(v)) return v.map(walk);
    if (v !== null && typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype) {
      return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]));
    }
    return v;
  };
  return walk(report) as T;
}
