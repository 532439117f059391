import { mkdirSync, readdirSync, renameSync, rmSync, writeFileSync, type Dirent } from 'node:fs';
import { dirname, join, basename } from 'node:path';
import { running } from './file-lock.js';

/**
 * Write a whole file so that readers see either the old file or the complete new one:
 * write to a temporary sibling, then rename over the target (atomic on one filesystem).
 */
export function writeFileAtomic(path: string, data: string | Uint8Array): void {
  const dir = dirname(path);
  mkdirSync(dir, { recursive: true });
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${Date.now()}.tmp`);
  try {
    writeFileSync(tmp, data);
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
}

/** The temporary sibling's name pattern of writeFileAtomic / writeChunksAtomic: `.<name>.<pid>.<ms>.tmp`. */
const TEMP_NAME = /^\..+\.(\d+)\.\d+\.tmp$/;

/**
 * Removes the temporary files this process (`pid`) left in `dirs` (and one level of
 * subfolders) when a write was cut short, and those of processes that no longer run (a run
 * killed outright leaves its temporary files for the next run to clear).
 */
export function removeTempFiles(dirs: string[], pid: number): void {
  const visit = (dir: string, depth: number): void => {
    let entries: Dirent[];
    try {
      entries = readdirSync(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      if (e.isDirectory() && depth > 0) visit(join(dir, e.name), depth - 1);
      const m = TEMP_NAME.exec(e.name);
      if (!m || !e.isFile()) continue;
      const owner = Number(m[1]);
      if (owner === pid || !running(owner)) rmSync(join(dir, e.name), { force: true });
    }
  };
  for (const d of dirs) visit(d, 1);
}
