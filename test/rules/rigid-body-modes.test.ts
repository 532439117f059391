import { expect } from 'vitest';
import { rigidBodyModes } from '../../src/rules/rigid-body-modes.js';
import { modesWithFrequencies } from './fake-model.js';
import { freeChainContext, frequenciesContext } from './reference-chains.js';
import { testRule } from './rule-tester.js';

const six = [1e-7, -2e-7, 3e-7, 1e-6, 2e-6, 4e-6];
const freqs = (hz: number[]) => () => frequenciesContext(modesWithFrequencies(hz));

// cutoffs from ECSS-E-ST-32-03C: separation f_rigid / f_elastic < 1e-4, absolute 0.005 Hz (docs/sources.md)
testRule(rigidBodyModes, {
  valid: [
    { name: 'six near-zero modes below 1e-4 × the first elastic frequency', context: freqs([...six, 12.3, 15, 40]), options: { expected: 6 }, messageId: 'pass', measured: 6, limit: 6 },
    { name: 'two rigid modes within min 1 .. max 3', context: freqs([1e-7, 2e-7, 3.1, 12.3]), options: { min: 1, max: 3 }, messageId: 'pass', measured: 2, limit: '1 to 3' },
    {
      name: 'the single rigid-body mode of a free–free chain solved by a reference eigensolver (ml-matrix)',
      context: freeChainContext,
      options: { expected: 1 },
      messageId: 'pass',
      measured: 1,
    },
  ],
  invalid: [
    { name: 'a seventh near-zero mode is a mechanism', context: freqs([...six, 5e-6, 12.3, 15]), options: { expected: 6 }, status: 'fail', messageId: 'tooMany', measured: 7, limit: 6 },
    {
      name: 'the absolute 0.005 Hz cutoff when asked',
      context: freqs([...six, 0.004, 12.3]),
      options: { expected: 6, cutoffBasis: 'hz' },
      status: 'fail',
      messageId: 'tooMany',
      measured: 7,
      check: (o) => expect(o.details).toMatchObject({ basis: 'hz', cutoffHz: 0.005, fellBack: false }),
    },
    {
      name: 'the rigid mode of a free–free chain where none is expected is located by DOF',
      context: freeChainContext,
      options: { expected: 0 },
      status: 'fail',
      messageId: 'tooMany',
      measured: 1,
      check: (o) => expect((o.details!.mechanismGroups as unknown[]).length).toBeGreaterThan(0),
    },
    { name: 'too few: grounded somewhere', context: freqs([1e-7, 2e-7, 3.1, 12.3]), options: { expected: 6 }, status: 'fail', messageId: 'tooFew', measured: 2 },
    { name: 'fewer solved modes than expected rigid ones', context: freqs([1e-7, 2e-7, 3e-7]), options: { expected: 6 }, status: 'fail', messageId: 'tooFew' },
    { name: 'every solved mode rigid: an error, not a pass', context: freqs([1e-7, 2e-7, 3e-7]), options: { expected: 3 }, status: 'error', messageId: 'allRigid' },
  ],
  badOptions: [
    { name: 'neither expected nor min nor max', options: {} },
    { name: 'a negative count', options: { expected: -1 } },
    { name: 'an unknown cutoff basis', options: { expected: 6, cutoffBasis: 'percent' } },
  ],
});
