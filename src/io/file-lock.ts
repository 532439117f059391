/**
 * An exclusive lock held as a file: created with O_CREAT | O_EXCL (`wx`), so of two processes
 * exactly one creates it; the file holds the owner's pid. A lock whose owner no longer runs (a
 * killed run) is stale and is broken: renamed aside (one rename succeeds), checked to be the
 * same stale file, then removed. Waiters poll until `timeoutMs`, then get an InputError.
 */
import { closeSync, linkSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, writeSync } from 'node:fs';
import { dirname } from 'node:path';
import { InputError } from './errors.js';

export interface FileLock {
  path: string;
  release(): void;
}

const POLL_MS = 50;

export async function acquireFileLock(path: string, what: string, timeoutMs = 120_000): Promise<FileLock> {
  mkdirSync(dirname(path), { recursive: true });
  const started = Date.now();
  for (;;) {
    if (tryCreate(path)) return { path, release: () => releaseIfOurs(path) };
    const owner = ownerOf(path);
    if (owner !== null && !running(owner)) breakStale(path, owner);
    else if (Date.now() - started > timeoutMs) {
      throw new InputError(path, `${what} is locked by another modalgate run (pid ${owner ?? 'unknown'}) for more than ${Math.round(timeoutMs / 1000)} s; if no such run is alive, delete the lock file`);
    } else await new Promise((r) => setTimeout(r, POLL_MS));
  }
}

function tryCreate(path: string): boolean {
  let fd: number;
  try {
    fd = openSync(path, 'wx');
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw new InputError(path, `cannot create the lock file: ${(e as Error).message}`);
  }
  try {
    writeSync(fd, `${process.pid}\n`);
  } finally {
    closeSync(fd);
  }
  return true;
}

function ownerOf(path: string): number | null {
  try {
    const pid = Number.parseInt(readFileSync(path, 'utf8'), 10);
    return Number.isInteger(pid) && pid > 0 ? pid : null;
  } catch {
    return null;
  }
}

/** Whether process `pid` still runs (signal 0 probes it; EPERM means it runs under another user). */
export function running(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function breakStale(path: string, stalePid: number): void {
  const aside = `${path}.${process.pid}.stale`;
  try {
    renameSync(path, aside);
  } catch {
    return; // someone else broke or took it: try again
  }
  if (ownerOf(aside) !== stalePid) {
    // we moved a live lock taken meanwhile: put it back unless another one exists already
    try {
      linkSync(aside, path);
    } catch {
      // a new lock exists: the two owners were already racing; leave it
    }
  }
  rmSync(aside, { force: true });
}

/** Removes the lock at `path` if this process holds it (e.g. for a worker thread that was stopped). */
export function releaseIfOurs(path: string): void {
  if (ownerOf(path) === process.pid) rmSync(path, { force: true });
}
