/** The bad-config corpus: each file in ./bad states in its header what the error must say. */
import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

export const badDir = resolve(import.meta.dirname, 'bad');

export interface BadCase {
  file: string;
  path: string;
  /** The file the error must name (the config unless a rule-set file is at fault). */
  blamed: string;
  where: string | undefined;
  reason: string;
}

export function badCases(): BadCase[] {
  return readdirSync(badDir)
    .sort()
    .map((file) => {
      const path = join(badDir, file);
      if (file.endsWith('.json')) return { file, path, blamed: path, where: undefined, reason: 'is not valid JSON' };
      const text = readFileSync(path, 'utf8');
      const header = (key: string) => text.match(new RegExp(`^# ${key}:(.*)$`, 'm'))?.[1].trim();
      const blamedRel = header('file');
      const where = header('where');
      return { file, path, blamed: blamedRel ? resolve(badDir, blamedRel) : path, where: where === '' ? undefined : where, reason: header('reason') ?? '' };
    });
}
