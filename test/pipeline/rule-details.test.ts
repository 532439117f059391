/**
 * The rule details the reporters show are read through src/pipeline/rule-details.ts. These
 * checks run the real rules and make sure every key read there is still written by its rule,
 * so renaming a key in a rule fails here instead of silently dropping a plot line or a label.
 * Values are only checked for presence and plausibility here; the rules' numbers are checked
 * against outside references in test/rules and test/baseline.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { analyzeModel } from '../../src/pipeline/analyze-model.js';
import { findRule } from '../../src/rules/registry.js';
import { runRules, type ResolvedRule } from '../../src/rules/engine.js';
import { loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { compareWithBaseline } from '../../src/model/compare-baseline.js';
import { FLAGGING_RULES, firstElasticDetails, flaggedModes, participationDetails, relativeResiduals, rigidBodyModeCount } from '../../src/pipeline/rule-details.js';
import { chainContext, exactModes, springChain } from '../rules/fake-model.js';

const demoConfig = resolve(import.meta.dirname, '../../fixtures/demo/modalgate.yaml');
const dir = mkdtempSync(join(tmpdir(), 'modalgate-details-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function resolved(id: string, options: Record<string, unknown> = {}): ResolvedRule {
  const rule = findRule(id)!;
  return { rule, severity: 'error', options: { ...(rule.defaults as object), ...options } };
}

describe('rule details the reporters read', () => {
  it('first-elastic-frequency, rigid-body-modes, eigen-residual and mass-participation on the demo mast', async () => {
    const job = loadConfig(demoConfig).models.find((m) => m.name === 'mast')!;
    const report = await analyzeModel({ ...job, rules: [...job.rules, resolved('mass-participation', { minFraction: 0.1 })] });
    const rule = (id: string) => report.rules.find((r) => r.ruleId === id);
    const first = firstElasticDetails(rule('first-elastic-frequency'));
    expect(first.frequencyHz).toBeGreaterThan(0);
    expect(first.minHz).toBe(4);
    expect(rigidBodyModeCount(rule('rigid-body-modes'))).toBe(0);
    expect(relativeResiduals(rule('eigen-residual'))).toHaveLength(report.modes!.length);
    const participation = participationDetails(rule('mass-participation'));
    expect(participation.directions).toEqual(['ux', 'uy']);
    expect(participation.modesConsidered).toBeGreaterThan(0);
    // an accessor answers only for its own rule
    expect(rigidBodyModeCount(rule('first-elastic-frequency'))).toBeUndefined();
  });

  it('every flagging regression rule lists its flagged modes (a chain with a lost mode and drift)', async () => {
    // fixed–free spring–mass chain, exact modes from ml-matrix (test/rules/fake-model.ts)
    const before = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.2], 1000);
    const after = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.5], 1000);
    const beforeModes = exactModes(before);
    const afterModes = exactModes(after);
    await saveBaseline(dir, { model: 'chain', modes: beforeModes, mass: before.mass });
    const facts = compareWithBaseline((await loadBaseline(dir, 'chain'))!, { modes: afterModes, mass: after.mass });
    const options: Record<string, Record<string, unknown>> = { 'frequency-drift': { maxChangePercent: 0.01 }, 'mode-shape-match': { minMac: 0.9999999 } };
    const results = runRules({ ...chainContext(after, afterModes), comparison: facts }, FLAGGING_RULES.map((id) => resolved(id, options[id])));
    for (const id of ['frequency-drift', 'mode-shape-match'] as const) {
      const r = results.find((x) => x.ruleId === id)!;
      expect(r.status).toBe('fail');
      expect(flaggedModes(r).length, id).toBeGreaterThan(0);
      expect(flaggedModes(r).every((f) => f.baselineMode !== undefined)).toBe(true);
    }
  });
});
