/**
 * A renumbered model with the same physics shows no change at all: the DOFs in another order
 * and every node id changed (nodes then meet by position), and separately every value disturbed
 * at round-off level (relative 1e-15, as a re-export might). The change map lists no node and
 * the attribution finds no region and an estimate at the level of the solver's residuals.
 */
import { describe, expect, it } from 'vitest';
import { buildMast } from '../../fixtures/generator/index.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { permuteSymmetric } from '../../src/sparse/permute.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import type { DofMap } from '../../src/io/dof-map.js';
import { explainAgainst, type TestModel } from './chain-helpers.js';

const before = buildMast({ base: 'clamped', panels: 4 });
const beforeModes = solveModes(before.stiffness, before.mass, { count: 6 });

/** New DOF d is old DOF perm[d]; node ids become id + 5000. */
function renumbered(perm: Int32Array): TestModel {
  const m = before.dofMap;
  const pick = <T extends Int32Array | Uint8Array | Float64Array>(a: T): T => a.map((_v, d) => a[perm[d]]) as T;
  const dofMap: DofMap = { n: m.n, node: pick(m.node).map((id) => id + 5000), component: pick(m.component), x: pick(m.x), y: pick(m.y), z: pick(m.z) };
  return { stiffness: permuteSymmetric(before.stiffness, perm), mass: permuteSymmetric(before.mass, perm), dofMap };
}

function disturbed(a: SymmetricCsc, seed: number): SymmetricCsc {
  let s = seed;
  // relative changes of ±1e-15 from a small linear congruential sequence
  const values = a.values.map((v) => {
    s = (s * 1103515245 + 12345) % 2147483648;
    return v * (1 + (s / 2147483648 - 0.5) * 2e-15);
  });
  return { ...a, values };
}

async function expectNoChange(after: TestModel): Promise<string> {
  const afterModes = solveModes(after.stiffness, after.mass, { count: 6 });
  const { changes } = await explainAgainst(before, beforeModes, after, afterModes);
  expect(changes.attribution!.modes.length).toBeGreaterThan(0);
  const map = changes.changeMap!;
  expect([map.changedNodes, map.addedNodes, map.removedNodes, map.nodes.length, map.regions.length]).toEqual([0, 0, 0, 0, 0]);
  const a = changes.attribution!;
  expect(a.regions).toEqual([]);
  for (const m of a.modes) {
    expect(m.regions).toEqual([]);
    expect(Math.abs(m.estimatedDelta)).toBeLessThan(1e-8 * m.eigenvalue);
  }
  return map.matchedBy;
}

describe('a renumbered model with the same physics shows no change', () => {
  it('DOFs reversed and interleaved, node ids all changed: no changed node, no region, no attribution', async () => {
    const n = before.stiffness.n;
    const perm = Int32Array.from({ length: n }, (_v, d) => (d % 2 === 0 ? n - 1 - d / 2 : (d - 1) / 2));
    expect(await expectNoChange(renumbered(perm))).toBe('position');
  });

  it('every value of K and M disturbed at round-off (1e-15 relative): no change either', async () => {
    await expectNoChange({ stiffness: disturbed(before.stiffness, 7), mass: disturbed(before.mass, 11), dofMap: before.dofMap });
  });
});
