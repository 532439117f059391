/**
 * `check --jobs`: how many models run at once and how many solver threads each gets
 * (src/pipeline/job-threads.ts): jobs × threads never exceeds the cores, every model gets at
 * least one thread, a MODALGATE_THREADS the user set caps the threads, and small models get one.
 */
import { Worker } from 'node:worker_threads';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { ensureBuilt, repoRoot } from '../cli/built-cli.js';
import { concurrentJobs, ONE_THREAD_BELOW_DOFS, parseJobs, solverThreads, threadsForModel, userThreadCap } from '../../src/pipeline/job-threads.js';

describe('--jobs and the solver threads of each model', () => {
  it('parses --jobs: whole numbers ≥ 1, auto and 0 (one per core); anything else is refused', () => {
    expect(parseJobs('1')).toBe(1);
    expect(parseJobs(' 4 ')).toBe(4);
    expect(parseJobs('auto')).toBe('auto');
    expect(parseJobs('AUTO')).toBe('auto');
    expect(parseJobs('0')).toBe('auto');
    for (const bad of ['', '-1', '1.5', 'two', '2x', '1e3']) expect(parseJobs(bad), bad).toBeUndefined();
  });

  it('runs at most the models there are, and auto means one per core', () => {
    expect(concurrentJobs(4, 8, 10)).toBe(4);
    expect(concurrentJobs(4, 8, 3)).toBe(3);
    expect(concurrentJobs('auto', 8, 20)).toBe(8);
    expect(concurrentJobs('auto', 16, 5)).toBe(5);
    expect(concurrentJobs(2, 2, 0)).toBe(1);
  });

  it('threads = max(1, floor(cores / jobs)): jobs × threads ≤ cores whenever jobs ≤ cores', () => {
    expect(solverThreads(2, 1)).toBe(2);
    expect(solverThreads(2, 2)).toBe(1);
    expect(solverThreads(16, 3)).toBe(5);
    expect(solverThreads(8, 3)).toBe(2);
    expect(solverThreads(4, 8)).toBe(1); // more jobs than cores: still one thread each
    for (let cores = 1; cores <= 64; cores++) {
      for (let jobs = 1; jobs <= cores; jobs++) {
        const t = solverThreads(cores, jobs);
        expect(t).toBeGreaterThanOrEqual(1);
        expect(jobs * t).toBeLessThanOrEqual(cores);
        // and no core is left that a thread more per job would have fitted into
        expect(jobs * (t + 1)).toBeGreaterThan(cores);
      }
    }
  });

  it("a MODALGATE_THREADS the user set is an upper bound, never raises the share", () => {
    expect(userThreadCap('3')).toBe(3);
    expect(userThreadCap(undefined)).toBeUndefined();
    expect(userThreadCap('0')).toBeUndefined();
    expect(userThreadCap('many')).toBeUndefined();
    expect(solverThreads(16, 2, 3)).toBe(3);
    expect(solverThreads(16, 2, 1)).toBe(1);
    expect(solverThreads(4, 2, 8)).toBe(2);
  });

  it('a model too small to gain from more threads gets one; an unknown size keeps the share', () => {
    expect(threadsForModel(4, ONE_THREAD_BELOW_DOFS - 1)).toBe(1);
    expect(threadsForModel(4, ONE_THREAD_BELOW_DOFS)).toBe(4);
    expect(threadsForModel(4, undefined)).toBe(4);
  });
});

describe('the one thread rule of every solve (sparse/helper-thread.ts withThreadsForDofs)', () => {
  it('runs a model below ONE_THREAD_BELOW_DOFS on one thread, a larger one on N, and restores N afterwards (compiled modules: helpers exist there)', async () => {
    ensureBuilt();
    const url = pathToFileURL(join(repoRoot, 'dist/src/sparse/helper-thread.js')).href;
    // in a fresh thread: the module's N is set there and nothing else sees it
    const code = `import(${JSON.stringify(url)}).then((m) => {
      m.setThreadCount(3);
      const seen = [m.withThreadsForDofs(m.ONE_THREAD_BELOW_DOFS - 1, () => m.availableThreads()), m.withThreadsForDofs(m.ONE_THREAD_BELOW_DOFS, () => m.availableThreads())];
      try { m.withThreadsForDofs(10, () => { throw new Error('solve failed'); }); } catch {}
      seen.push(m.availableThreads(), m.ONE_THREAD_BELOW_DOFS);
      require('node:worker_threads').parentPort.postMessage(seen);
    })`;
    const worker = new Worker(code, { eval: true });
    const seen = await new Promise<number[]>((resolve, reject) => {
      worker.once('message', (v: number[]) => void worker.terminate().then(() => resolve(v)));
      worker.once('error', reject);
    });
    expect(seen).toEqual([1, 3, 3, ONE_THREAD_BELOW_DOFS]);
  }, 120_000);
});
