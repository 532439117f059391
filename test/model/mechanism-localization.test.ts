import { describe, expect, it } from 'vitest';
import { buildFrame, type FrameSpec } from '../../fixtures/generator/frame-builder.js';
import { STEEL, rectangularSection, roundBarSection } from '../../fixtures/generator/sections.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';
import { countNearZeroModes } from '../../src/model/mechanism-localization.js';
import { denseModes } from './helpers.js';

/** A straight beam along x (nodes 1..9) with a rod hanging from node 4 to node 99: node 99 can swing freely in x and z. */
function beamWithDanglingRod(clamped: boolean): FrameSpec {
  const nodes = Array.from({ length: 9 }, (_, i) => ({ id: i + 1, x: 0.25 * i, y: 0, z: 0 }));
  nodes.push({ id: 99, x: 0.75, y: 0.6, z: 0 });
  const section = rectangularSection(0.05, 0.08);
  return {
    nodes,
    members: [
      ...nodes.slice(1, 9).map((n, i) => ({ kind: 'beam' as const, nodes: [i + 1, n.id] as const, section, material: STEEL, orientation: [0, 1, 0] as const })),
      { kind: 'rod', nodes: [4, 99], section: roundBarSection(0.01), material: STEEL },
    ],
    pointMasses: [{ node: 99, massKg: 2 }],
    supports: clamped ? [{ nodes: [1], kind: 'clamp' }] : [],
  };
}

describe('mechanism localization', () => {
  it('free-free beam with a swinging rod end: 6 free rigid-body motions, 2 mechanisms, node 99 first', () => {
    const model = buildFrame(beamWithDanglingRod(false));
    // Reference modes: dense eigen-decomposition with ml-matrix.
    const modes = denseModes(model.stiffness, model.mass, 14);
    const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap, modes });
    expect(facts.nearZeroModes).toBe(8);
    const m = facts.mechanisms!;
    expect(m.freeRigidBodyMotions).toBe(6);
    expect(m.mechanisms).toBe(2);
    expect(m.nodes[0].node).toBe(99);
    expect(m.nodes[0].energyFraction).toBeGreaterThan(0.3);
    expect(['ux', 'uz']).toContain(m.nodes[0].component);
    expect(m.nodes.length).toBeLessThanOrEqual(10);
  });

  it('supported beam with the same rod: no free rigid motion, 2 mechanisms, node 99 first', () => {
    const model = buildFrame(beamWithDanglingRod(true));
    const modes = denseModes(model.stiffness, model.mass, 8);
    const facts = computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap, modes });
    expect(facts.nearZeroModes).toBe(2);
    expect(facts.mechanisms!.freeRigidBodyMotions).toBe(0);
    expect(facts.mechanisms!.mechanisms).toBe(2);
    expect(facts.mechanisms!.nodes[0].node).toBe(99);
    expect(facts.supported).toBeNull();
  });

  it('countNearZeroModes: round-off zeros, a clear gap, or none', () => {
    const scale = 1e10;
    expect(countNearZeroModes(Float64Array.from([-1e-3, 2e-4, 5e-3, 1e4, 2e4]), scale)).toBe(3);
    // a weak (not round-off) mode below a factor-1e6 gap stays on the zero side
    expect(countNearZeroModes(Float64Array.from([1e-3, 1e-3, 10, 1e8, 2e8]), scale)).toBe(3);
    expect(countNearZeroModes(Float64Array.from([100, 400, 900]), scale)).toBe(0);
  });
});
