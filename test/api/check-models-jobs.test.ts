/**
 * `checkModels(config, dir, { jobs })` from the compiled package (model workers exist only there):
 * three demo models checked two at a time give the report of one at a time, in config order —
 * the same verdicts and rule outcomes, frequencies equal to rounding (the two runs may use
 * different solver thread counts, which agree to rounding: DEVELOPERS.md "Two threads").
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { parse } from 'yaml';
import { beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, repoRoot } from '../cli/built-cli.js';
import type { RawConfig } from '../../src/io/config-types.js';

const demo = join(repoRoot, 'fixtures/demo');
const chosen = ['mast', 'mast-guyed-loose-anchor', 'bracket'];

let checkModels: typeof import('../../src/index.js').checkModels;
beforeAll(async () => {
  ensureBuilt();
  ({ checkModels } = (await import(pathToFileURL(join(repoRoot, 'dist/src/index.js')).href)) as typeof import('../../src/index.js'));
}, 120_000);

describe('checkModels with jobs', () => {
  it('jobs: 2 gives the report of jobs: 1, in config order', async () => {
    const config = parse(readFileSync(join(demo, 'modalgate.yaml'), 'utf8')) as RawConfig;
    const one = await checkModels(config, demo, { models: chosen });
    const two = await checkModels(config, demo, { models: chosen, jobs: 2 });
    expect(two.problem).toBeUndefined();
    expect(two.verdict).toBe(one.verdict);
    expect(two.models.map((m) => m.name)).toEqual(chosen);
    for (const [i, m] of two.models.entries()) {
      const o = one.models[i];
      expect(m.rules.map((r) => [r.ruleId, r.status, r.messageId])).toEqual(o.rules.map((r) => [r.ruleId, r.status, r.messageId]));
      expect(m.modes).toHaveLength(o.modes!.length);
      m.modes!.forEach((mode, k) => expect(Math.abs(mode.frequencyHz - o.modes![k].frequencyHz)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(o.modes![k].frequencyHz))));
    }
  }, 180_000);
});
