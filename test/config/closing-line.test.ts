/**
 * The console's closing line counts every model: when one model errors, the others' failures are
 * still counted ("3 model(s): 1 passed, 1 failed, 1 error"), matching the JSON report's verdicts.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runCheck } from '../../src/cli/check.js';

const models = resolve(import.meta.dirname, 'models');
const work = mkdtempSync(join(tmpdir(), 'modalgate-closing-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('closing line', () => {
  it('counts failures beside errors', async () => {
    writeFileSync(join(work, 'broken.mass.mtx'), '%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 1\n0 2 1\n');
    const config = join(work, 'modalgate.yaml');
    const tiny = `stiffness: ${models}/tiny.stiffness.mtx, mass: ${models}/tiny.mass.mtx`;
    writeFileSync(
      config,
      `defaults: { count: 3, ruleSets: [supported], rules: { first-elastic-frequency: { minHz: 0.5 } } }\nmodels:\n` +
        `  - { name: fine, ${tiny} }\n` +
        `  - { name: too-soft, ${tiny}, rules: { first-elastic-frequency: { minHz: 1000 } } }\n` +
        `  - { name: unreadable, stiffness: ${models}/tiny.stiffness.mtx, mass: broken.mass.mtx }\n`,
    );
    let printed = '';
    const json = join(work, 'r.json');
    const out = await runCheck({ config, json, print: (t) => (printed += t), printError: () => {} });
    expect(out.code).toBe(2);
    const report = JSON.parse(readFileSync(json, 'utf8'));
    expect(report.verdict).toBe('error');
    expect(report.models.map((m: { verdict: string }) => m.verdict)).toEqual(['pass', 'fail', 'error']);
    expect(printed).toContain('modalgate: ERROR — 3 model(s): 1 passed, 1 failed, 1 error (could not be checked).');
    const quiet = await runCheck({ config, quiet: true, print: (t) => (printed = t), printError: () => {} });
    expect(quiet.code).toBe(2);
    expect(printed.trim().split('\n').at(-1)).toBe('modalgate: ERROR — 3 model(s): 1 passed, 1 failed, 1 error (could not be checked).');
  });
});
