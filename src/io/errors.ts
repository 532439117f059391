/**
 * Errors that describe a defect in the user's input (a matrix file, a DOF map, a config).
 * They carry where the defect is (file, line, or a path inside a structured file) and one
 * plain sentence. The CLI turns them into one stderr line, exit code 2 and a JUnit <error>.
 */
export class InputError extends Error {
  readonly file: string;
  readonly line: number | undefined;
  /** A location inside a structured file, e.g. `models[1].rules.first-elastic-frequency.minHz`. */
  readonly where: string | undefined;
  readonly reason: string;

  constructor(file: string, reason: string, location: { line?: number; where?: string } = {}) {
    super(formatLocation(file, location.line, location.where) + reason);
    this.name = 'InputError';
    this.file = file;
    this.line = location.line;
    this.where = location.where;
    this.reason = reason;
  }
}

function formatLocation(file: string, line: number | undefined, where: string | undefined): string {
  let s = file;
  if (line !== undefined) s += `:${line}`;
  s += ': ';
  if (where !== undefined && where !== '') s += `${where}: `;
  return s;
}

/** One line, whatever was thrown: never a stack trace. */
export function oneLineMessage(e: unknown): string {
  if (e instanceof InputError) return e.message.replace(/\s*\n\s*/g, ' ');
  if (e instanceof Error) return `internal error: ${e.message}`.replace(/\s*\n\s*/g, ' ');
  return `internal error: ${String(e)}`;
}
