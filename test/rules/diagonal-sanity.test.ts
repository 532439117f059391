import { expect } from 'vitest';
import { diagonalSanity } from '../../src/rules/diagonal-sanity.js';
import { chainContext, lineDofMap, sparseFromDense, springChain } from './fake-model.js';
import { testRule } from './rule-tester.js';

/** 6 DOFs: DOF 6 has mass but no stiffness; DOFs 4 and 5 have stiffness but no mass. */
function brokenChain(withMap: boolean) {
  const k6 = springChain(5, 1000, [1, 1, 1, 1, 1]).denseK.map((row) => [...row, 0]);
  k6.push([0, 0, 0, 0, 0, 0]);
  const masses = [1, 1, 1, 0, 0, 1];
  const mass = sparseFromDense(masses.map((v, i) => masses.map((_, j) => (i === j ? v : 0))));
  return chainContext({ stiffness: sparseFromDense(k6), mass, denseK: k6, masses }, undefined, withMap ? lineDofMap(6) : undefined);
}

/** 6 DOFs, stiffness on all, DOFs 4..6 massless (rotations when 6 per node are assumed). */
function masslessRotations() {
  const chain = springChain(6, 1000, [1, 1, 1, 0, 0, 0]);
  return chainContext(chain);
}

testRule(diagonalSanity, {
  valid: [
    { name: 'a clean chain', context: () => chainContext(springChain(6, 10, new Array<number>(6).fill(1))), messageId: 'pass', measured: 0 },
    {
      name: 'massless rotations (no DOF map: 6 per node assumed) are allowed by default',
      context: masslessRotations,
      messageId: 'pass',
      check: (o) => expect(o.details!.counts).toMatchObject({ masslessRotations: 3 }),
    },
  ],
  invalid: [
    {
      name: 'zero stiffness and massless translations, named by node and component',
      context: () => brokenChain(true),
      status: 'fail',
      messageId: 'fail',
      measured: 3,
      check: (o) => {
        expect(o.details!.zeroStiffness).toEqual(['node 2 uz (dof 6)']);
        expect(o.details!.masslessTranslations).toEqual(['node 2 ux (dof 4)', 'node 2 uy (dof 5)']);
      },
    },
    {
      name: 'without a map DOFs 4 and 5 are rx, ry (allowed): only the zero stiffness fails',
      context: () => brokenChain(false),
      status: 'fail',
      messageId: 'fail',
      measured: 1,
      check: (o) => expect(o.details!.zeroStiffness).toEqual(['dof 6']),
    },
    { name: 'massless rotations when not allowed', context: masslessRotations, options: { allowMasslessRotations: false }, status: 'fail', messageId: 'fail', measured: 3 },
  ],
  badOptions: [
    { name: 'listLimit 0', options: { listLimit: 0 } },
    { name: 'allowMasslessRotations as text', options: { allowMasslessRotations: 'yes' } },
  ],
});
