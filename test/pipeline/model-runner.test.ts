/**
 * A model the runner checks on this thread (model-runner.ts `here`, as run-models.ts chooses for
 * one small model at a time without a time limit) can still be stopped: the stop takes effect at
 * the next checkpoint between its steps (analyze-model.ts), and the report says why, as a stopped
 * worker's does. Runs on the TypeScript sources, where every model runs on this thread.
 */
import { describe, expect, it } from 'vitest';
import { resolve } from 'node:path';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { ModelRunner } from '../../src/pipeline/model-runner.js';
import { runsHere } from '../../src/pipeline/run-models.js';
import { ONE_THREAD_BELOW_DOFS } from '../../src/sparse/helper-thread.js';
import type { PhaseTimes } from '../../src/pipeline/analyze-model.js';

const demo = resolve(import.meta.dirname, '../../fixtures/demo');

function mastJob() {
  const job = loadConfig(resolve(demo, 'modalgate.yaml')).models.find((j) => j.name === 'mast');
  if (!job) throw new Error('the demo config has no model named mast');
  return job;
}

describe('a model checked on this thread', () => {
  it('stopped before its solve: the report is an error saying why, and no phase line is given', async () => {
    const phases: PhaseTimes[] = [];
    const run = new ModelRunner().run(mastJob(), { here: true, onPhases: (t) => phases.push(t) });
    // the stop comes while the model's files are being read: it ends at the checkpoint after reading
    run.stop({ kind: 'interrupted', message: 'stopped by SIGINT while it was being checked' });
    const report = await run.report;
    expect(report.verdict).toBe('error');
    expect(report.problem).toEqual({ kind: 'interrupted', message: 'stopped by SIGINT while it was being checked' });
    expect(report.rules).toEqual([]);
    expect(phases).toEqual([]);
  }, 60_000);

  it('not stopped: the full report, as on a worker', async () => {
    const report = await new ModelRunner().run(mastJob(), { here: true }).report;
    expect(report.problem).toBeUndefined();
    expect(report.rules.length).toBeGreaterThan(0);
    expect(report.modes?.length).toBeGreaterThan(0);
  }, 60_000);
});

describe('which models run on this thread (run-models.ts runsHere)', () => {
  it('one small model at a time without a time limit, or one whose size line cannot be read; every other on a worker', () => {
    const small = ONE_THREAD_BELOW_DOFS - 1;
    expect(runsHere(small, 1, undefined)).toBe(true);
    expect(runsHere(undefined, 1, undefined)).toBe(true);
    expect(runsHere(small, 2, undefined)).toBe(false);
    expect(runsHere(small, 1, 1000)).toBe(false);
    expect(runsHere(ONE_THREAD_BELOW_DOFS, 1, undefined)).toBe(false);
  });
});
