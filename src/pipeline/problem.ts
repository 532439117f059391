/**
 * What stopped a model or a run, as the reports show it: an InputError is bad input (file, line,
 * where), a MemoryLimitError a model over --max-memory, anything else an internal error. Kept
 * apart from the pipeline's steps so the main thread of `check` can use it without loading the
 * solver.
 */
import { InputError, oneLineMessage } from '../io/errors.js';
import { MemoryLimitError } from '../sparse/memory-limit.js';
import type { ProblemReport } from './result-types.js';

export function problemOf(e: unknown): ProblemReport {
  if (e instanceof InputError) return { kind: 'input', message: oneLineMessage(e), file: e.file, line: e.line, where: e.where };
  if (e instanceof MemoryLimitError) return { kind: 'limit', message: e.message };
  return { kind: 'internal', message: oneLineMessage(e) };
}

/** The stack trace of an exception (its text when it has none), for MODALGATE_DEBUG. */
export function stackOf(e: unknown): string {
  return e instanceof Error && e.stack ? e.stack : String(e);
}
