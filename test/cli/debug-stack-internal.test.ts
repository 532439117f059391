/**
 * An internal error inside a model's check (here: the geometry facts throw) becomes the model's
 * `internal` problem; MODALGATE_DEBUG adds its stack trace on stderr, a normal run only the line.
 * Runs `runCheck` in this process (under the test runner the models run on this thread).
 */
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runCheck } from '../../src/cli/check.js';

vi.mock('../../src/model/compute-geometry.js', () => ({
  computeGeometry: () => {
    throw new Error('geometry facts failed on purpose');
  },
}));

const demo = resolve(import.meta.dirname, '../../fixtures/demo');
let work: string;

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), 'modalgate-debug-internal-'));
  for (const f of ['mast-free.stiffness.mtx', 'mast-free.mass.mtx', 'mast-free.dofs.csv']) cpSync(join(demo, f), join(work, f));
  writeFileSync(
    join(work, 'modalgate.yaml'),
    'models:\n  - name: mast-free\n    stiffness: mast-free.stiffness.mtx\n    mass: mast-free.mass.mtx\n    dofs: mast-free.dofs.csv\n    count: 8\n    ruleSets: [free-free]\n',
  );
});

afterAll(() => rmSync(work, { recursive: true, force: true }));
afterEach(() => {
  vi.restoreAllMocks();
  delete process.env.MODALGATE_DEBUG;
});

async function checkCapturingStderr(): Promise<{ code: number; problem?: string; stderr: string }> {
  let stderr = '';
  vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => {
    stderr += String(chunk);
    return true;
  });
  const out = await runCheck({ cwd: work, print: () => {}, printError: () => {} });
  vi.restoreAllMocks();
  return { code: out.code, problem: out.report.models[0].problem?.kind, stderr };
}

describe('MODALGATE_DEBUG and an internal error inside a model check', () => {
  it('a normal run records the internal problem and prints no stack trace', async () => {
    const r = await checkCapturingStderr();
    expect(r.code).toBe(2);
    expect(r.problem).toBe('internal');
    expect(r.stderr).not.toMatch(/^\s+at \S/m);
  });

  it('with MODALGATE_DEBUG set, the stack trace goes to stderr', async () => {
    process.env.MODALGATE_DEBUG = '1';
    const r = await checkCapturingStderr();
    expect(r.code).toBe(2);
    expect(r.problem).toBe('internal');
    expect(r.stderr).toContain('Error: geometry facts failed on purpose');
    expect(r.stderr).toMatch(/^\s+at \S/m);
  });
});
