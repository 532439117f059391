import { expect, it } from 'vitest';
import { totalMass } from '../../src/rules/total-mass.js';
import { blockMassKg, freeBlockContext, withoutGeometry } from './geometry-context.js';
import { runRule, testRule } from './rule-tester.js';

// the expected mass is ρ V of the homogeneous block (geometry-context.ts)
testRule(totalMass, {
  valid: [
    { name: 'ρ V of the block', context: () => freeBlockContext(), options: { expected: blockMassKg }, messageId: 'pass', measured: { closeTo: blockMassKg, digits: 6 }, limit: `${blockMassKg} ± 1 %` },
    { name: '2 % off within a 3 % tolerance', context: () => freeBlockContext(), options: { expected: blockMassKg * 1.02, tolerancePercent: 3 }, messageId: 'pass' },
  ],
  invalid: [
    {
      name: '2 % off at the default 1 %',
      context: () => freeBlockContext(),
      options: { expected: blockMassKg * 1.02 },
      status: 'fail',
      messageId: 'fail',
      check: (o) => expect(o.details!.deviationPercent as number).toBeCloseTo(100 * (1 / 1.02 - 1), 6),
    },
    { name: 'no geometry facts', context: () => withoutGeometry(freeBlockContext()), options: { expected: 1 }, status: 'skip', messageId: 'noGeometry' },
  ],
  badOptions: [
    { name: 'expected missing (it has no default: the mass budget gives it)', options: {} },
    { name: 'expected zero', options: { expected: 0 } },
  ],
});

it('total-mass refuses to run without expected, as the config loader would', () => {
  expect(() => runRule(totalMass, freeBlockContext())).toThrow(/expected/);
});
