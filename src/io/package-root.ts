/**
 * The installed package's root folder (where package.json, rules/ and fixtures/ live), found by
 * walking up from this module — the same from src/ (tests) and dist/src/ (the built CLI), and
 * from any working directory.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | undefined;

export function packageRoot(): string {
  if (cached) return cached;
  let dir = dirname(fileURLToPath(import.meta.url));
  // climb until a package.json naming this package
  for (;;) {
    const candidate = join(dir, 'package.json');
    if (existsSync(candidate) && isOurs(candidate)) return (cached = dir);
    const up = dirname(dir);
    if (up === dir) throw new Error('cannot find the modalgate package root');
    dir = up;
  }
}

function isOurs(file: string): boolean {
  try {
    return (JSON.parse(readFileSync(file, 'utf8')) as { name?: string }).name === 'modalgate';
  } catch {
    return false;
  }
}

export function packageVersion(): string {
  return (JSON.parse(readFileSync(join(packageRoot(), 'package.json'), 'utf8')) as { version: string }).version;
}
