import { expect } from 'vitest';
import { massParticipation } from '../../src/rules/mass-participation.js';
import { cantilever, denseModes, freeBlockContext, geometryContext, withoutGeometry } from './geometry-context.js';
import { testRule } from './rule-tester.js';

const beam = cantilever();
const firstPair = () => geometryContext(beam, denseModes(beam.stiffness, beam.mass, 2)); // first bending pair (y and z)
const allModes = () => geometryContext(beam, denseModes(beam.stiffness, beam.mass));

// cantilever first-mode effective mass ≈ 0.61 of the beam (handbook value; checked against it in test/model/participation.test.ts)
testRule(massParticipation, {
  valid: [
    { name: 'the first bending mode carries ~61 % in uy: passes 0.6', context: firstPair, options: { directions: ['uy'], minFraction: 0.6 }, messageId: 'pass', limit: 0.6 },
    { name: 'all modes carry all the mass', context: allModes, options: { directions: ['uy', 'uz'] }, messageId: 'pass', measured: { closeTo: 1, digits: 6 } },
  ],
  invalid: [
    { name: 'the first bending mode is short of 0.9', context: firstPair, options: { directions: ['uy'] }, status: 'fail', messageId: 'fail', limit: 0.9 },
    {
      name: 'maxHz limits the modes counted',
      context: allModes,
      options: { directions: ['uy'], maxHz: denseModes(beam.stiffness, beam.mass, 1).frequenciesHz[0] * 1.01 },
      status: 'fail',
      messageId: 'fail',
      check: (o) => expect(o.details!.modesConsidered as number).toBeLessThanOrEqual(2),
    },
    { name: 'a free-free model is skipped', context: () => freeBlockContext(true), status: 'skip', messageId: 'free' },
    { name: 'no modes solved', context: () => freeBlockContext(false), status: 'skip', messageId: 'noModes' },
    { name: 'no geometry facts', context: () => withoutGeometry(firstPair()), status: 'skip', messageId: 'noGeometry' },
  ],
  badOptions: [
    { name: 'an unknown direction', options: { directions: ['uw'] } },
    { name: 'minFraction above 1', options: { minFraction: 1.5 } },
  ],
});
