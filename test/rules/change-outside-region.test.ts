/**
 * change-outside-region on a spring–mass chain whose spring 3 (between nodes 3 and 4, at x = 2
 * and x = 3) was stiffened: the change map (tested against closed forms in test/attribution)
 * flags nodes 3 and 4, so a region holding both passes and one that misses node 4 fails.
 */
import { expect } from 'vitest';
import { changeOutsideRegion } from '../../src/rules/change-outside-region.js';
import { frequencyDrift } from '../../src/rules/frequency-drift.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import { denseModes } from '../model/helpers.js';
import { explainAgainst, springChain } from '../attribution/chain-helpers.js';
import { comparisonContext } from './comparison-context.js';
import { testRule } from './rule-tester.js';

const springs = [900, 700, 1200, 500, 800, 1000];
const masses = [1.5, 1.0, 2.0, 1.2, 0.8, 1.1];
const base = springChain(springs, masses);
const baseModes = denseModes(base.stiffness, base.mass);
const after = springChain(springs.map((k, i) => (i === 3 ? k * 1.3 : k)), masses);
const afterModes = denseModes(after.stiffness, after.mass);
const { changes, comparison } = await explainAgainst(base, baseModes, after, afterModes);
const unchanged = await explainAgainst(base, baseModes, base, baseModes);

const context = (c = changes): RuleContext => ({ ...comparisonContext(comparison!), dofMap: after.dofMap, comparison, changes: c });

testRule(changeOutsideRegion, {
  valid: [
    { name: 'the changed nodes listed by id', context, options: { allowed: [{ nodes: [3, 4] }] }, messageId: 'pass', measured: 0 },
    { name: 'inside a box around x = 2..3', context, options: { allowed: [{ name: 'spring 3', region: { box: { min: [1.5, -1, -1], max: [3.5, 1, 1] } } }] }, messageId: 'pass' },
    { name: 'a node range and a plane together', context, options: { allowed: [{ nodeRange: [1, 3] }, { region: { plane: { axis: 'x', at: 3 } } }] }, messageId: 'pass' },
    { name: 'stiffness changes ignored', context, options: { allowed: [{ nodes: [1] }], ignore: ['stiffness'] }, messageId: 'pass' },
    { name: 'nothing changed', context: () => context(unchanged.changes), options: { allowed: [{ nodes: [1] }] }, messageId: 'none' },
  ],
  invalid: [
    {
      name: 'node 4 lies outside the allowed nodes',
      context,
      options: { allowed: [{ nodes: [3] }] },
      status: 'fail',
      messageId: 'fail',
      measured: 1,
      check: (o) => {
        expect(o.details!.outside).toEqual([{ node: 4, change: 'stiffness', region: 0, at: [3, 0, 0] }]);
        expect(o.message).toMatch(/at 1 of 2 changed nodes: stiffness at node 4 near \(3\.0, 0\.0, 0\.0\)/);
      },
    },
    { name: 'no baseline compared', context: () => ({ ...context(), changes: undefined }), options: { allowed: [{ nodes: [3] }] }, status: 'skip', messageId: 'noBaseline' },
    {
      name: 'a baseline without fingerprints',
      context: () => context({ ...changes, changeMap: null, changeMapMissing: 'the baseline holds no node fingerprints' }),
      options: { allowed: [{ nodes: [3] }] },
      status: 'skip',
      messageId: 'noMap',
    },
  ],
  badOptions: [
    { name: 'no allowed region', options: {} },
    { name: 'an empty selector', options: { allowed: [{ name: 'x' }] } },
    { name: 'an unknown kind to ignore', options: { allowed: [{ nodes: [1] }], ignore: ['geometry'] } },
  ],
});

// frequency-drift names the top region of a flagged mode (the attribution's, stiffness)
testRule(frequencyDrift, {
  valid: [{ name: 'within a wide limit', context, options: { maxChangePercent: 50 }, messageId: 'pass' }],
  invalid: [
    {
      name: 'a 30 % stiffer spring: the flagged modes name nodes 3–4 and stiffness',
      context,
      options: { maxChangePercent: 0.5 },
      status: 'fail',
      messageId: 'fail',
      check: (o) => {
        expect(o.message).toMatch(/first order [+−-]?[\d.]+ %: 100 % from nodes 3–4 near \(2\.5, 0\.0, 0\.0\), stiffness/);
        const flagged = o.details!.flagged as { cause?: { region: string; stiffnessShare: number } }[];
        expect(flagged.length).toBeGreaterThan(0);
        for (const f of flagged) expect(f.cause!.stiffnessShare).toBeCloseTo(1, 9);
      },
    },
  ],
});
