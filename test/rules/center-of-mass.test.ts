import { centerOfMass } from '../../src/rules/center-of-mass.js';
import { blockCentre, freeBlockContext, withoutGeometry } from './geometry-context.js';
import { testRule } from './rule-tester.js';

const shifted: [number, number, number] = [blockCentre[0] + 0.01, blockCentre[1], blockCentre[2]];

// the centroid of a homogeneous cuboid is its centre (geometry-context.ts)
testRule(centerOfMass, {
  valid: [{ name: 'the block centre', context: () => freeBlockContext(), options: { expected: blockCentre, maxDistance: 1e-9 }, messageId: 'pass', limit: 1e-9 }],
  invalid: [
    { name: 'a point 1 cm away at 5 mm allowed', context: () => freeBlockContext(), options: { expected: shifted, maxDistance: 0.005 }, status: 'fail', messageId: 'fail', measured: { closeTo: 0.01, digits: 9 }, limit: 0.005 },
    { name: 'no geometry facts', context: () => withoutGeometry(freeBlockContext()), options: { expected: blockCentre, maxDistance: 1 }, status: 'skip', messageId: 'noGeometry' },
  ],
  badOptions: [
    { name: 'maxDistance missing (no default)', options: { expected: [0, 0, 0] } },
    { name: 'expected missing (no default)', options: { maxDistance: 1 } },
    { name: 'a point with two coordinates', options: { expected: [0, 0], maxDistance: 1 } },
  ],
});
