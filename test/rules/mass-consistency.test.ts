import { massConsistency } from '../../src/rules/mass-consistency.js';
import { freeBlock, freeBlockContext, geometryContext, withoutGeometry } from './geometry-context.js';
import { testRule } from './rule-tester.js';
import { expect } from 'vitest';

/** The block with the uz mass removed at some DOFs (every fifth uz DOF, rows and columns). */
function missingUzMass() {
  const block = freeBlock();
  const uzDofs = new Set(Array.from(block.dofMap.component).flatMap((c, i) => (c === 2 && i % 5 === 0 ? [i] : [])));
  const values = block.mass.values.slice();
  for (let j = 0; j < block.mass.n; j++) {
    for (let p = block.mass.colPtr[j]; p < block.mass.colPtr[j + 1]; p++) if (uzDofs.has(j) || uzDofs.has(block.mass.rowIdx[p])) values[p] = 0;
  }
  return geometryContext({ ...block, mass: { ...block.mass, values } });
}

// a complete mass matrix moves the same mass with unit ux, uy and uz (rigid-body mass, common practice)
testRule(massConsistency, {
  valid: [{ name: 'the complete block mass', context: () => freeBlockContext(), messageId: 'pass', limit: 1e-6 }],
  invalid: [
    { name: 'uz mass missing on some DOFs', context: missingUzMass, status: 'fail', messageId: 'fail', check: (o) => expect(o.message).toMatch(/uz lacks mass/) },
    { name: 'no geometry facts', context: () => withoutGeometry(freeBlockContext()), status: 'skip', messageId: 'noGeometry' },
  ],
  badOptions: [{ name: 'negative spread', options: { maxRelativeSpread: -1 } }],
});
