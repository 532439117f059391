import { expect } from 'vitest';
import { conditioning } from '../../src/rules/conditioning.js';
import { chainContext, exactModes, lineDofMap, springChain } from './fake-model.js';
import { testRule } from './rule-tester.js';

const chain = springChain(6, 10, new Array<number>(6).fill(1));
const withDrop = (drop: number | null) => () => {
  const modes = exactModes(chain);
  if (drop !== null) modes.factor = { ...modes.factor, maxDiagonalToPivotRatio: drop, maxRatioDof: 2 };
  return chainContext(chain, modes, lineDofMap(6));
};

// default 1e7: a drop of 10^k loses about k digits (docs/sources.md §1a; common practice)
testRule(conditioning, {
  valid: [
    { name: 'the fake factor drop 12 is within 1e7', context: withDrop(null), messageId: 'pass', measured: 12, limit: 1e7 },
    { name: 'a drop equal to the limit passes', context: withDrop(1e7), messageId: 'pass', measured: 1e7 },
  ],
  invalid: [
    {
      name: 'a drop of 3e9 fails, named by node and component (about 9 digits lost)',
      context: withDrop(3e9),
      status: 'fail',
      messageId: 'fail',
      measured: 3e9,
      limit: 1e7,
      check: (o) => expect(o.details).toMatchObject({ dof: 3, where: 'node 1 uz (dof 3)' }),
    },
    {
      name: 'after constraint sets removed DOFs, the DOF is named by its number in the exported matrices',
      context: () => ({ ...withDrop(3e9)(), dofMap: undefined, keptDofs: Int32Array.from([0, 4, 7, 9, 10, 11]) }),
      status: 'fail',
      messageId: 'fail',
      check: (o) => expect(o.details).toMatchObject({ dof: 8, where: 'dof 8' }),
    },
  ],
  badOptions: [
    { name: 'a limit of 1 or less', options: { maxPivotDrop: 1 } },
    { name: 'an unknown option', options: { maxRatio: 10 } },
  ],
});
