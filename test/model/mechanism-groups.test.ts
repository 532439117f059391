import { describe, expect, it } from 'vitest';
import { buildHexGrid } from '../../fixtures/generator/hex-solid.js';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';
import { denseModes } from './helpers.js';

/**
 * A hex block clamped at its bottom (cells i 1..2, j 0..1, k 0) with two sub-parts joined wrongly:
 * part A (cells i 3..4, j 0..1, k 1) shares only the grid line i = 3, k = 1 (three nodes along y): a hinge;
 * part B (cell i 0, j 2, k 1) shares only the grid point (1, 2, 1): a single node.
 * Grid node id = 1 + i + 6 (j + 4 k) (hex-solid.ts).
 */
function twoLooseParts() {
  const lines = (k: number): number[] => Array.from({ length: k + 1 }, (_, i) => 0.1 * i);
  return buildHexGrid({
    xLinesM: lines(5),
    yLinesM: lines(3),
    zLinesM: lines(2),
    material: STEEL,
    solid: (i, j, k) => (k === 0 && i >= 1 && i <= 2 && j <= 1) || (k === 1 && i >= 3 && j <= 1) || (k === 1 && i === 0 && j === 2),
    supports: [{ set: 'zMin', kind: 'clamp' }],
  });
}
const id = (i: number, j: number, k: number): number => 1 + i + 6 * (j + 4 * k);

describe('independent mechanisms', () => {
  it('two wrongly joined parts: a hinge line and a single node, each named', () => {
    const model = twoLooseParts();
    const modes = denseModes(model.stiffness, model.mass, 8);
    const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap, modes });
    console.log(modes.eigenvalues, facts.nearZeroModes);
    const g = facts.mechanisms!.groups;
    console.log(JSON.stringify(g, null, 1));
  });
});
