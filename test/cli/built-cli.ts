/** Run the compiled CLI (`node dist/src/cli/main.js …`) from tests, building it first when stale. */
import { execFile, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

export const repoRoot = resolve(import.meta.dirname, '../..');
export const mainJs = join(repoRoot, 'dist/src/cli/main.js');

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

/** True when a TypeScript file under src/ is newer than its compiled JavaScript (or it is missing). */
function distIsStale(dir = join(repoRoot, 'src')): boolean {
  if (!existsSync(mainJs)) return true;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, entry.name);
    if (entry.isDirectory()) {
      if (distIsStale(p)) return true;
    } else if (entry.name.endsWith('.ts')) {
      const js = join(repoRoot, 'dist', p.slice(repoRoot.length + 1)).replace(/\.ts$/, '.js');
      if (!existsSync(js) || statSync(js).mtimeMs < statSync(p).mtimeMs) return true;
    }
  }
  return false;
}

/** Build when stale. tsc still emits when some file has type errors; those are reported, not fatal here. */
export function ensureBuilt(): void {
  if (!distIsStale()) return;
  const r = spawnSync('npx', ['tsc', '-p', '.'], { cwd: repoRoot, encoding: 'utf8' });
  if (r.status !== 0) console.warn(`tsc reported errors while building dist (the CLI tests run on what it emitted):\n${r.stdout}${r.stderr}`);
  if (!existsSync(mainJs)) throw new Error(`build failed: ${mainJs} is missing`);
}

export function runCli(args: string[], cwd = repoRoot, env: Record<string, string> = {}): Promise<CliRun> {
  return new Promise((done) => {
    execFile(process.execPath, [mainJs, ...args], { cwd, env: { ...process.env, MODALGATE_DEBUG: '', GITHUB_STEP_SUMMARY: '', NO_COLOR: '1', FORCE_COLOR: undefined, ...env } }, (err, stdout, stderr) => {
      done({ code: err ? ((err as { code?: number }).code ?? -1) : 0, stdout, stderr });
    });
  });
}

/** Many CLI runs, a few at a time (the machine is shared). */
export async function runMany(list: string[][], cwd = repoRoot, parallel = 3): Promise<CliRun[]> {
  const out: CliRun[] = new Array<CliRun>(list.length);
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < list.length) {
      const i = next++;
      out[i] = await runCli(list[i], cwd);
    }
  };
  await Promise.all(Array.from({ length: parallel }, worker));
  return out;
}
