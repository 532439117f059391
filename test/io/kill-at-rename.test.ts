/**
 * SIGKILL at the rename point of an atomic write: a child process replaces fs.renameSync with a
 * SIGKILL of itself (syncBuiltinESMExports makes the ES-module binding follow), then writes over an
 * existing file. Nothing can run after SIGKILL, so what it leaves is exactly what a kill between
 * "temporary file written" and "renamed into place" leaves: the old file whole, and a temporary
 * file, which the next run's clean-up (removeTempFiles, run by every `check`) removes because
 * its owner no longer runs. Also for the streamed writer (baseline shapes and DOF maps).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { removeTempFiles } from '../../src/io/atomic-write.js';
import { ensureBuilt, repoRoot } from '../cli/built-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'modalgate-kill-rename-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs `body` (an ES module snippet) in a child whose renameSync kills the process. */
function killAtRename(body: string): ReturnType<typeof spawnSync> {
  const script = `
    import fs from 'node:fs';
    import { syncBuiltinESMExports } from 'node:module';
    fs.renameSync = () => { process.kill(process.pid, 'SIGKILL'); };
    syncBuiltinESMExports();
    ${body}
  `;
  return spawnSync(process.execPath, ['--input-type=module', '-e', script], { cwd: repoRoot, encoding: 'utf8' });
}

const temps = (): string[] => readdirSync(dir).filter((f) => f.endsWith('.tmp'));

describe('SIGKILL at the rename point', () => {
  it('writeFileAtomic: the old file stays whole; the next run removes the temporary file', () => {
    ensureBuilt();
    const target = join(dir, 'junit.xml');
    writeFileSync(target, '<old/>\n');
    const r = killAtRename(`const { writeFileAtomic } = await import('./dist/src/io/atomic-write.js'); writeFileAtomic(${JSON.stringify(target)}, '<new/>\\n');`);
    expect(r.signal).toBe('SIGKILL');
    expect(readFileSync(target, 'utf8')).toBe('<old/>\n');
    expect(temps()).toHaveLength(1);
    removeTempFiles([dir], process.pid);
    expect(temps()).toEqual([]);
    expect(readFileSync(target, 'utf8')).toBe('<old/>\n');
  });

  it('writeChunksAtomic (gzip stream): the same', () => {
    const target = join(dir, 'shapes.mtx.gz');
    writeFileSync(target, 'old');
    const r = killAtRename(`const { writeChunksAtomic } = await import('./dist/src/io/atomic-stream-write.js'); await writeChunksAtomic(${JSON.stringify(target)}, ['a\\n', 'b\\n']);`);
    expect(r.signal).toBe('SIGKILL');
    expect(readFileSync(target, 'utf8')).toBe('old');
    expect(temps()).toHaveLength(1);
    removeTempFiles([dir], process.pid);
    expect(temps()).toEqual([]);
  });
});
