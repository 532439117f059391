/**
 * Writing the reports of a run (check and merge): JUnit, JSON, Markdown and HTML atomically, the
 * GitHub job summary, and the one-line cause of a failed write. Each reporter is loaded only when
 * its report is written: a run that writes none loads none (the JUnit reporter's XML builder,
 * fast-xml-parser, alone costs about 40 ms of CPU to load).
 */
import { writeFileAtomic } from '../io/atomic-write.js';
import type { CheckReport, ProblemReport } from '../pipeline/result-types.js';
import { appendStepSummary, shownPath, withShownPaths } from './ci-output.js';

/** Where each report goes (or went). */
export type ReportTargets = { junit?: string; json?: string; markdown?: string; html?: string };

const formatMarkdown = async () => (await import('../report/markdown.js')).formatMarkdown;

/**
 * Writes every report it can. A report that cannot be written (a full disk, a read-only folder)
 * is named with its cause; the others still stand, and the run exits 2.
 */
export async function writeReports(report: CheckReport, targets: ReportTargets, markdownAll = false, cwd = process.cwd()): Promise<{ written: ReportTargets; failures: ProblemReport[] }> {
  const written: ReportTargets = {};
  const failures: ProblemReport[] = [];
  // JSON keeps absolute paths; the texts people read show them relative to the working directory
  const shown = withShownPaths(report, cwd);
  const formats: Record<keyof ReportTargets, () => Promise<() => string>> = {
    junit: async () => {
      const { formatJunit } = await import('../report/junit-reporter.js');
      return () => formatJunit(shown);
    },
    json: async () => {
      const { formatJson } = await import('../report/json-reporter.js');
      return () => formatJson(report);
    },
    markdown: async () => {
      const format = await formatMarkdown();
      return () => format(shown, { allModes: markdownAll });
    },
    html: async () => {
      const { formatHtml } = await import('../report/html-reporter.js');
      return () => formatHtml(shown);
    },
  };
  for (const kind of ['junit', 'json', 'markdown', 'html'] as const) {
    const path = targets[kind];
    if (!path) continue;
    const format = await formats[kind]();
    try {
      writeFileAtomic(path, format());
      written[kind] = path;
    } catch (e) {
      failures.push({ kind: 'write', file: path, message: writeFailureMessage(path, e) });
    }
  }
  return { written, failures };
}

/**
 * Appends the Markdown summary to GITHUB_STEP_SUMMARY's file when one is given (check and merge),
 * naming the fullest report written; a failure joins the write failures.
 */
export async function writeStepSummary(
  report: CheckReport,
  written: Partial<Record<'junit' | 'json' | 'markdown' | 'html', string>>,
  failures: ProblemReport[],
  opts: { stepSummary?: string; markdownAll?: boolean },
  cwd: string,
): Promise<void> {
  if (!opts.stepSummary) return;
  const format = await formatMarkdown();
  try {
    const full = written.markdown ?? written.html ?? written.json ?? written.junit;
    appendStepSummary(opts.stepSummary, format(withShownPaths(report, cwd), { allModes: opts.markdownAll }), full ? shownPath(full, cwd) : undefined);
  } catch (e) {
    failures.push({ kind: 'write', file: opts.stepSummary, message: writeFailureMessage(`${opts.stepSummary} (GITHUB_STEP_SUMMARY)`, e) });
  }
}

/** "cannot write /x/junit.xml: ENOSPC (no space left on device)" */
export function writeFailureMessage(path: string, e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  const causes: Record<string, string> = {
    ENOSPC: 'no space left on device',
    EROFS: 'read-only file system',
    EACCES: 'permission denied',
    EPERM: 'operation not permitted',
    EDQUOT: 'disk quota exceeded',
    ENOENT: 'a folder on the path does not exist',
    ENOTDIR: 'a part of the path is a file, not a folder',
    EISDIR: 'the path is a folder',
    EIO: 'input/output error',
  };
  const cause = code ? `${code} (${causes[code] ?? (e as Error).message})` : (e as Error).message;
  return `cannot write ${path}: ${cause}`;
}
