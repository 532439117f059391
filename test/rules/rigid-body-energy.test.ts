import { expect } from 'vitest';
import { rigidBodyEnergy } from '../../src/rules/rigid-body-energy.js';
import { cantilever, denseModes, freeBlock, freeBlockContext, geometryContext, withoutGeometry } from './geometry-context.js';
import { testRule } from './rule-tester.js';

/** The block grounded by a spring at one node in ux, and that node's id. */
function groundedBlock() {
  const node = freeBlock().nodes.ids[22];
  const block = freeBlock([{ node, component: 0, stiffness: 5e5 }]);
  return { node, context: geometryContext(block, denseModes(block.stiffness, block.mass, 10), 6) };
}

// limit 1e-8 = (1e-4)², the ECSS separation ratio squared (docs/sources.md; rules/README.md)
testRule(rigidBodyEnergy, {
  valid: [{ name: 'the free-free block (modes from ml-matrix)', context: () => freeBlockContext(true), messageId: 'pass', limit: 1e-8 }],
  invalid: [
    {
      name: 'a block grounded by a spring names that node first',
      context: () => groundedBlock().context,
      status: 'fail',
      messageId: 'fail',
      limit: 1e-8,
      check: (o) => {
        const list = o.details!.largestResiduals as { node: number; component: string }[];
        expect(list[0]).toMatchObject({ node: groundedBlock().node, component: 'ux' });
        expect(list.length).toBeLessThanOrEqual(10);
      },
    },
    {
      name: 'a supported model is skipped',
      context: () => {
        const beam = cantilever();
        return geometryContext(beam, denseModes(beam.stiffness, beam.mass, 6));
      },
      status: 'skip',
      messageId: 'skipped',
    },
    { name: 'no geometry facts', context: () => withoutGeometry(freeBlockContext()), status: 'skip', messageId: 'noGeometry' },
  ],
  badOptions: [
    { name: 'zero limit', options: { maxRelativeEnergy: 0 } },
    { name: 'onlyFreeFree as text', options: { onlyFreeFree: 'yes' } },
  ],
});
