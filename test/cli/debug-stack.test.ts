/**
 * MODALGATE_DEBUG shows the stack trace of an error `check` catches, also when it is caught
 * inside a model's check (on the worker thread) and turned into a JUnit <error>; without it the
 * run prints one line per error and no stack trace (binding rule: bad input never shows a trace).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureBuilt, repoRoot, runCli } from './built-cli.js';

let work: string;

beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-debug-'));
  for (const f of ['mast-free.mass.mtx', 'mast-free.dofs.csv']) cpSync(join(repoRoot, 'fixtures/demo', f), join(work, f));
  // a stiffness file whose one entry is not a number: an InputError inside the model's check
  writeFileSync(join(work, 'broken.stiffness.mtx'), '%%MatrixMarket matrix coordinate real symmetric\n684 684 1\n1 1 stiff\n');
  writeFileSync(
    join(work, 'modalgate.yaml'),
    'reports:\n  junit: junit.xml\nmodels:\n  - name: broken\n    stiffness: broken.stiffness.mtx\n    mass: mast-free.mass.mtx\n    ruleSets: [free-free]\n',
  );
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

/** A V8 stack frame line ("    at readStiffnessAndMass (file:…)"). */
const STACK_FRAME = /^\s+at \S/m;

describe('MODALGATE_DEBUG with check', () => {
  it('prints no stack trace in a normal run: one line naming the file, exit 2', async () => {
    const r = await runCli(['check'], work);
    expect(r.code).toBe(2);
    expect(r.stdout).toContain('broken.stiffness.mtx');
    expect(r.stdout + r.stderr).not.toMatch(STACK_FRAME);
  });

  it('prints the stack trace of the error caught inside the model check when set', async () => {
    const r = await runCli(['check'], work, { MODALGATE_DEBUG: '1' });
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/InputError/);
    expect(r.stderr).toMatch(STACK_FRAME);
    expect(r.stderr).toContain('broken.stiffness.mtx');
    // the console report is as in a normal run
    expect(r.stdout).not.toMatch(STACK_FRAME);
  });
});
