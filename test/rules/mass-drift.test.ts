import { expect } from 'vitest';
import { massDrift } from '../../src/rules/mass-drift.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import { freeBlockContext, withoutGeometry } from './geometry-context.js';
import { comparison } from './comparison-context.js';
import { testRule } from './rule-tester.js';

/** The block now against a baseline whose mass properties are changed by `edit`. */
function against(edit: (p: Record<string, unknown>) => Record<string, unknown> | null): () => RuleContext {
  return () => {
    const c = freeBlockContext();
    const before = edit(structuredClone(c.geometry!.massProperties) as unknown as Record<string, unknown>);
    return { ...c, comparison: comparison({ baselineMassProperties: before }) };
  };
}

testRule(massDrift, {
  valid: [{ name: 'the same mass properties', context: against((p) => p), messageId: 'pass', measured: 0, limit: 'mass ± 1 %, centre 1 %, inertia 1 %' }],
  invalid: [
    {
      // now m against a baseline of 0.95 m: 100 (m − 0.95 m) / 0.95 m = 5.263 %
      name: 'a baseline 5 % lighter',
      context: against((p) => ({ ...p, totalMass: (p.totalMass as number) * 0.95 })),
      status: 'fail',
      messageId: 'fail',
      measured: { closeTo: 100 * (1 / 0.95 - 1), digits: 9 },
      check: (o) => expect(o.details!.massChangePercent as number).toBeCloseTo(100 * (1 / 0.95 - 1), 9),
    },
    { name: 'a baseline without mass properties', context: against(() => null), status: 'skip', messageId: 'noBaseline' },
    { name: 'no geometry facts', context: () => ({ ...withoutGeometry(freeBlockContext()), comparison: comparison({}) }), status: 'skip', messageId: 'noGeometry' },
  ],
  badOptions: [{ name: 'negative limit', options: { maxMassChangePercent: -1 } }],
});
