/**
 * Mode tracking on a generated cantilever frame (fixtures/generator) whose section is nearly
 * square: 50 mm along y × 51 mm along z, so bending in x–y (about z, I_z = d·w³/12, the smaller
 * second moment) is the lower mode of each bending pair (Euler–Bernoulli: f ∝ √(EI), Blevins,
 * *Formulas for Natural Frequency and Mode Shape*, Table 8-1, from memory). Stiffening the three
 * root members to 56 mm along y lifts x–y bending above x–z bending: the first two modes (and
 * the next bending pair) cross in order. Tracking must see each crossing as a swap with
 * MAC ≥ 0.95 on both pairs (the brief's acceptance value; shapes barely change), and frequency
 * changes measured between like shapes.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildFrame, type FrameNode } from '../../fixtures/generator/frame-builder.js';
import { rectangularSection, STEEL } from '../../fixtures/generator/sections.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { compareWithBaseline, defaultComparisonSettings } from '../../src/model/compare-baseline.js';

function cantileverFrame(rootWidthM: number) {
  const elements = 10;
  const nodes: FrameNode[] = Array.from({ length: elements + 1 }, (_, i) => ({ id: i + 1, x: (1.5 * i) / elements, y: 0, z: 0 }));
  const members = nodes.slice(1).map((node, i) => ({
    kind: 'beam' as const,
    nodes: [i + 1, node.id] as const,
    section: rectangularSection(i < 3 ? rootWidthM : 0.05, 0.051),
    material: STEEL,
    orientation: [0, 1, 0] as const,
  }));
  return buildFrame({ nodes, members, supports: [{ nodes: [1], kind: 'clamp' }], description: 'nearly square cantilever' });
}

const dir = mkdtempSync(join(tmpdir(), 'modalgate-swap-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('mode tracking through a crossing of close modes', () => {
  it('tracks the swapped bending pairs with MAC ≥ 0.95 and measures drift between like shapes', async () => {
    const before = cantileverFrame(0.05);
    const after = cantileverFrame(0.056);
    const m0 = solveModes(before.stiffness, before.mass, { count: 6, coordinates: before.coordinates });
    const m1 = solveModes(after.stiffness, after.mass, { count: 6, coordinates: after.coordinates });
    await saveBaseline(dir, { model: 'beam', modes: m0, mass: before.mass, dofMap: before.dofMap });
    const baseline = (await loadBaseline(dir, 'beam'))!;
    const facts = compareWithBaseline(baseline, { modes: m1, mass: after.mass, dofMap: after.dofMap }, defaultComparisonSettings());
    const byBaseline = new Map(facts.pairs.map((p) => [p.baselineMode, p]));
    expect(byBaseline.get(1)!.currentMode).toBe(2);
    expect(byBaseline.get(2)!.currentMode).toBe(1);
    expect(facts.swaps.map((s) => s.baselineModes)).toContainEqual([1, 2]);
    const firstSwap = facts.swaps.find((s) => s.baselineModes[0] === 1)!;
    expect(Math.min(...firstSwap.correlations)).toBeGreaterThanOrEqual(0.95);
    // the z-bending mode (baseline 2) sees only the small mass/stiffness change of the root: tiny drift
    const zPair = byBaseline.get(2)!;
    expect(Math.abs(zPair.changePercent!)).toBeLessThan(Math.abs(byBaseline.get(1)!.changePercent!));
    // drift is measured between the tracked pair, from the two independent solves
    expect(zPair.changePercent!).toBeCloseTo((100 * (m1.frequenciesHz[0] - m0.frequenciesHz[1])) / m0.frequenciesHz[1], 9);
    expect(facts.lostModes.filter((m) => m.withinCompared)).toEqual([]);
    expect(facts.newModes.filter((m) => m.withinCompared)).toEqual([]);
    expect(facts.mac.rows * facts.mac.cols).toBe(facts.mac.values.length);
  });
});
