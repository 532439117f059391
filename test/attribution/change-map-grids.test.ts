/**
 * The change map's two quantization grids (src/model/change-map.ts): a mass that sits exactly on
 * a boundary of one grid, exported once a rounding unit below and once above it (what another
 * assembly order does to a value), must not flag its node; a real change of a part in a million
 * must. Values are built from their IEEE 754 bits (28 kept mantissa bits: the step at [1, 2) is
 * 2⁻²⁸, the rounding unit 2⁻⁵²).
 */
import { describe, expect, it } from 'vitest';
import { compareFingerprints, nodeFingerprints } from '../../src/model/change-map.js';
import { springChain } from './chain-helpers.js';

const SPRINGS = [900, 700, 1200, 500];
const ULP = 2 ** -52;

function changedNodes(massBefore: number, massAfter: number): number[] {
  const before = springChain(SPRINGS, [1.0, 1.25, massBefore, 0.75]);
  const after = springChain(SPRINGS, [1.0, 1.25, massAfter, 0.75]);
  const map = compareFingerprints(
    { fingerprints: nodeFingerprints(before.stiffness, before.mass, before.dofMap), dofMap: before.dofMap },
    { fingerprints: nodeFingerprints(after.stiffness, after.mass, after.dofMap), dofMap: after.dofMap },
    after.stiffness,
    after.mass,
  );
  return map.nodes.map((n) => n.node);
}

describe('change map: round-off at a quantization boundary is not a change', () => {
  it('a value on a rounding boundary (half a step), one unit below and one above: no change', () => {
    const boundary = 1.5 + 2 ** -29; // mantissa (2²⁷ + ½) steps: where rounding to nearest flips
    expect(changedNodes(boundary - ULP, boundary + ULP)).toEqual([]);
  });

  it('a value on a truncation boundary (a whole step), one unit below and one above: no change', () => {
    expect(changedNodes(1.5 - ULP, 1.5 + ULP)).toEqual([]);
  });

  it('a value just below a power of two against one just above: no change', () => {
    expect(changedNodes(2 - ULP, 2 + 2 * ULP)).toEqual([]);
  });

  it('a change of one part in a million is seen, on its node alone', () => {
    expect(changedNodes(1.5, 1.5 * (1 + 1e-6))).toEqual([3]);
  });
});
