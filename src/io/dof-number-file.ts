/**
 * A file of DOF numbers (rows of K, 1-based), e.g. the DOFs a constraint set holds: integers
 * separated by whitespace, commas, semicolons or newlines; `#` or `%` starts a comment.
 */
import { readFileSync } from 'node:fs';
import { InputError } from './errors.js';

/** Read and parse a DOF-number file; a missing file or a bad token is an InputError. */
export function readDofNumberFile(path: string): number[] {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    throw new InputError(path, 'the DOF number file cannot be read');
  }
  return parseDofNumbers(text, path);
}

/** Bad tokens are input errors naming the line. */
export function parseDofNumbers(text: string, file: string): number[] {
  const dofs: number[] = [];
  const lines = text.split(/\r?\n/);
  // each line: strip the comment, split into tokens, each a positive integer
  lines.forEach((raw, k) => {
    const line = raw.replace(/[#%].*$/, '').trim();
    if (!line) return;
    for (const token of line.split(/[\s,;]+/)) {
      if (!token) continue;
      if (!/^\d+$/.test(token) || Number(token) < 1) {
        throw new InputError(file, `"${token}" is not a DOF number (a positive integer, 1-based)`, { line: k + 1 });
      }
      dofs.push(Number(token));
    }
  });
  return dofs;
}
