/**
 * Every defect located in words: independent mechanisms (a hinge line, a pivot node), free
 * rigid-body motions with the supports that leave them free, no supports at all, grounding
 * suspects, a failing local mode, and DOF numbers when there is no DOF map. Each case checks the
 * rule message and the JSON field. Outside references: ml-matrix dense eigen for the near-zero
 * counts (test/model/helpers.ts), small-rotation rigid-body kinematics for the axes and pivots
 * (common practice), Hooke's law and f = √(k/m)/2π for the spring-mass mode (common practice).
 */
import { describe, expect, it } from 'vitest';
import { buildHexBox, buildHexGrid } from '../../fixtures/generator/hex-solid.js';
import { buildFrame, type FrameSpec } from '../../fixtures/generator/frame-builder.js';
import { STEEL, rectangularSection, roundBarSection } from '../../fixtures/generator/sections.js';
import { dofOfNode, type GeneratedModel } from '../../fixtures/generator/model-types.js';
import { applyConstraints } from '../../src/model/constraints.js';
import type { MechanismGroup } from '../../src/model/mechanism-groups.js';
import type { FreeMotionFacts } from '../../src/model/free-motions.js';
import type { NodeShare } from '../../src/model/energy-shares.js';
import { rigidBodyModes } from '../../src/rules/rigid-body-modes.js';
import { rigidBodyEnergy } from '../../src/rules/rigid-body-energy.js';
import { firstElasticFrequency } from '../../src/rules/first-elastic-frequency.js';
import { denseModes } from './helpers.js';
import { sampleReport } from '../report/sample-report.js';
import { formatConsole } from '../../src/report/console-reporter.js';
import { formatJunit } from '../../src/report/junit-reporter.js';
import { formatMarkdown } from '../../src/report/markdown.js';
import { geometryContext } from '../rules/geometry-context.js';
import { runRule as run } from '../rules/rule-tester.js';

/** The model's rule context; `extra` adds geometry inputs, `withMap: false` drops the DOF map. */
const contextOf = (model: Parameters<typeof geometryContext>[0], modes: Parameters<typeof geometryContext>[1], extra: Parameters<typeof geometryContext>[3] = {}, withMap = true) =>
  geometryContext(model, modes, undefined, extra, withMap);

/**
 * A hex block clamped at its bottom (cells i 1..2, j 0..1, k 0) with two sub-parts joined wrongly:
 * part A (cells i 3..4, j 0..1, k 1) shares only the grid line i = 3, k = 1 (nodes 28, 34, 40 along y),
 * part B (cell i 0, j 2, k 1) shares only grid point (1, 2, 1), node 38. Node id = 1 + i + 6 (j + 4 k).
 */
function twoLooseParts(): GeneratedModel {
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

/** A straight steel beam along x, nodes 1..9, 0.25 m apart. */
function beamSpec(): FrameSpec {
  const nodes = Array.from({ length: 9 }, (_, i) => ({ id: i + 1, x: 0.25 * i, y: 0, z: 0 }));
  const section = rectangularSection(0.05, 0.08);
  return {
    nodes,
    members: nodes.slice(1).map((n, i) => ({ kind: 'beam' as const, nodes: [i + 1, n.id] as const, section, material: STEEL, orientation: [0, 1, 0] as const })),
  };
}

/** The beam with node 99 (2 kg) on a rod from node `from`, at `at`; extra frame fields (supports, springs) as given. */
function beamWithRodEnd(from: number, at: { x: number; y: number; z: number }, extra: Partial<FrameSpec> = {}): FrameSpec {
  const spec = beamSpec();
  return {
    ...spec,
    nodes: [...spec.nodes, { id: 99, ...at }],
    members: [...spec.members, { kind: 'rod', nodes: [from, 99], section: roundBarSection(0.01), material: STEEL }],
    pointMasses: [{ node: 99, massKg: 2 }],
    ...extra,
  };
}

describe('independent mechanisms, each named', () => {
  const model = twoLooseParts();
  // ml-matrix dense reference: four zero modes (3 rotations of part B about its node + 1 of part A about its line)
  const modes = denseModes(model.stiffness, model.mass, 8);
  const context = contextOf(model, modes);

  it('a part held at a single node: one mechanism "rotates freely about node 38 (3 free rotations)"; a part on a line: "turns about the line of nodes 28, 34 and 40"', () => {
    expect(context.geometry!.nearZeroModes).toBe(4);
    const r = run(rigidBodyModes, context, { expected: 0 });
    expect(r.status).toBe('fail');
    expect(r.message).toContain('2 independent mechanisms: (1) part with nodes 37, 43, 44, 61 and 3 more (x 0..0.1, y 0.2..0.3, z 0.1..0.2) rotates freely about node 38 (3 free rotations)');
    expect(r.message).toContain('(2) part with nodes 29, 30, 35, 36 and 11 more (x 0.3..0.5, y 0..0.2, z 0.1..0.2) turns about the line of nodes 28, 34 and 40 (axis along y through (0.3, 0.1, 0.1)) (1 free rotation)');
    const groups = r.details!.mechanismGroups as MechanismGroup[];
    expect(groups.length).toBe(2);
    expect(groups[0].motions).toBe(3);
    expect(groups[0].motion!.kind).toBe('rotation-about-point');
    expect(groups[0].motion!.pivot!.node).toBe(38);
    // pivot at grid point (1, 2, 1) = (0.1, 0.2, 0.1) m
    groups[0].motion!.pivot!.point.forEach((v, k) => expect(v).toBeCloseTo([0.1, 0.2, 0.1][k], 9));
    expect(groups[1].motions).toBe(1);
    expect(groups[1].motion!.kind).toBe('rotation-about-axis');
    expect(groups[1].motion!.axis!.nodes).toEqual([28, 34, 40]);
    expect(groups[1].motion!.axis!.direction).toEqual([0, 1, 0]);
    expect(groups[1].nodeCount).toBe(15);
    expect(groups[0].nodeCount).toBe(7);
  });

  it('the console, JUnit and Markdown reports name both mechanisms', () => {
    const outcome = run(rigidBodyModes, context, { expected: 0 });
    const report = sampleReport();
    const model = report.models.find((m) => m.name === 'mast-guyed-loose-anchor')!;
    model.rules[0] = { ...model.rules[0], ...outcome, ruleId: 'rigid-body-modes' };
    const texts = [formatConsole(report, { colorLevel: 0 }), formatJunit(report), formatMarkdown(report)];
    for (const text of texts) {
      expect(text).toContain('(1) part with nodes 37, 43, 44, 61 and 3 more');
      expect(text).toContain('rotates freely about node 38 (3 free rotations)');
      expect(text).toContain('(2) part with nodes 29, 30, 35, 36 and 11 more');
      expect(text).toContain('turns about the line of nodes 28, 34 and 40');
    }
  });
});

describe('free rigid-body motions, described', () => {
  it('no supports at all: "the whole model moves as a rigid body (six free rigid-body motions)", not "a mechanism"', () => {
    const free = buildHexBox({ sizeM: [0.3, 0.2, 0.5], elements: [2, 2, 3], material: STEEL });
    const r = run(rigidBodyModes, contextOf(free, denseModes(free.stiffness, free.mass, 10)), { expected: 0 });
    expect(r.status).toBe('fail');
    expect(r.message).toContain('the model has no supports, so the whole model moves as a rigid body (six free rigid-body motions).');
    expect(r.message).not.toMatch(/mechanism/);
    expect((r.details!.freeRigidMotions as FreeMotionFacts).motion.kind).toBe('whole-body');
  });

  it('a frame pinned at its two end nodes turns about its own line: the axis, and "nodes 1 and 9 … do not hold rx"', () => {
    const model = buildFrame({ ...beamSpec(), supports: [{ nodes: [1, 9], kind: 'pin' }] });
    const modes = denseModes(model.stiffness, model.mass, 6);
    const r = run(rigidBodyModes, contextOf(model, modes), { expected: 0 });
    expect(r.status).toBe('fail');
    // torsion-free rotation about the line through both pins (common practice)
    expect(r.message).toContain('Free rigid-body motion: rotation about the axis along x through (1, 0, 0), the line of nodes 1, 2, 3, 4, 5 and 4 more (1 free rotation); supported nodes 1 and 9 lie on its axis and do not hold rx.');
    const facts = r.details!.freeRigidMotions as FreeMotionFacts;
    expect(facts.motion.kind).toBe('rotation-about-axis');
    expect(facts.supportedNodes.map((s) => [s.node, s.source, s.free, s.still])).toEqual([
      [1, 'missing-components', ['rx'], true],
      [9, 'missing-components', ['rx'], true],
    ]);
  });

  it('a hex box held by a constraint set on one edge line (translations) turns about that edge: the constraint set\'s nodes lie on the axis', () => {
    const whole = buildHexBox({ sizeM: [0.3, 0.2, 0.4], elements: [3, 2, 2], material: STEEL });
    // edge i = 0, k = 0 along y: node ids 1 + 4 j (hex-solid.ts numbering, nx = 3)
    const edge = [1, 5, 9];
    const reduced = applyConstraints(whole.stiffness, whole.mass, whole.dofMap, [{ name: 'edge hinge', nodes: edge, components: ['translations'] }]);
    const model = { stiffness: reduced.stiffness, mass: reduced.mass, dofMap: reduced.dofMap! };
    const modes = denseModes(model.stiffness, model.mass, 6);
    const heldDofs = Array.from(reduced.removedDofs, (i) => ({ node: whole.dofMap.node[i], component: whole.dofMap.component[i], x: whole.dofMap.x[i], y: whole.dofMap.y[i], z: whole.dofMap.z[i] }));
    const r = run(rigidBodyModes, contextOf(model, modes, { heldDofs, originalDofs: reduced.keptDofs }), { expected: 0 });
    expect(r.status).toBe('fail');
    expect(r.message).toContain('Free rigid-body motion: rotation about the axis along y through (0, ');
    expect(r.message).toContain('the line of nodes 1, 5 and 9 (1 free rotation); supported nodes 1, 5 and 9 lie on its axis.');
    const facts = r.details!.freeRigidMotions as FreeMotionFacts;
    expect(facts.motion.axis!.direction).toEqual([0, 1, 0]);
    expect(facts.supportedNodes.map((s) => s.source)).toEqual(['constraint-set', 'constraint-set', 'constraint-set']);
    expect(facts.supportedNodes[0].held).toEqual(['ux', 'uy', 'uz']);
  });
});

describe('shares with their component split, suspects down to 1 %, failing modes located, DOF numbers without a map', () => {
  it('grounding suspects: a single spring to ground is the only suspect (no round-off neighbours)', () => {
    const free = buildHexBox({ sizeM: [0.3, 0.2, 0.5], elements: [2, 2, 3], material: STEEL });
    const node = free.nodes.ids[17];
    const grounded = buildHexBox({ sizeM: [0.3, 0.2, 0.5], elements: [2, 2, 3], material: STEEL, springs: [{ node, component: 1, stiffness: 1e6 }] });
    const r = run(rigidBodyEnergy, contextOf(grounded, denseModes(grounded.stiffness, grounded.mass, 10), { expectedRigidBodyModes: 6 }));
    expect(r.status).toBe('fail');
    expect(r.message).toContain(`the model is grounded near node ${node} uy (100 %).`);
    expect((r.details!.largestResiduals as unknown[]).length).toBe(1);
  });

  it('a local mode failing first-elastic-frequency says where it lives, with the component split', () => {
    // clamped beam, node 99 (2 kg) on a rod from node 9, held sideways by soft springs: f = √(k/m)/2π (common practice)
    const model = buildFrame(beamWithRodEnd(9, { x: 2, y: 0.5, z: 0 }, {
      supports: [{ nodes: [1], kind: 'clamp' }],
      springs: [{ node: 99, component: 0, stiffness: 100 }, { node: 99, component: 2, stiffness: 400 }],
    }));
    const modes = denseModes(model.stiffness, model.mass, 4);
    const r = run(firstElasticFrequency, contextOf(model, modes), { minHz: 5 });
    expect(r.status).toBe('fail');
    // within 5 %: the rod's own mass (0.3 kg) rides along
    expect(Math.abs(modes.frequenciesHz[0] - Math.sqrt(100 / 2) / (2 * Math.PI)) / modes.frequenciesHz[0]).toBeLessThan(0.05);
    expect(r.message).toMatch(/The mode lives at node 99 \(\d+ %: 100 % ux\)/);
    const location = r.details!.location as NodeShare[];
    expect(location[0].node).toBe(99);
    expect(location[0].components[0]).toMatchObject({ component: 'ux' });
  });

  it('the loose node of a supported frame, with no DOF map: named by its DOF numbers (1-based)', () => {
    const model = buildFrame(beamWithRodEnd(4, { x: 0.75, y: 0.6, z: 0 }, { supports: [{ nodes: [1], kind: 'clamp' }] }));
    const modes = denseModes(model.stiffness, model.mass, 6);
    const r = run(rigidBodyModes, contextOf(model, modes, {}, false), { expected: 0 });
    expect(r.status).toBe('fail');
    const dofs = [0, 2].map((c) => dofOfNode(model, 99, c) + 1);
    // node 99 swings in x and z; K does not couple its ux and uz, so without a map they are two parts
    expect(r.message).toContain(
      `Near-zero motion (no DOF map, so named by DOF number): (1) part with DOF ${dofs[0]} moves without straining (1 near-zero motion); most motion at DOF ${dofs[0]} (100 %); (2) part with DOF ${dofs[1]}`,
    );
    const groups = r.details!.mechanismGroups as MechanismGroup[];
    expect(groups.map((g) => g.nodes)).toEqual([[dofs[0]], [dofs[1]]]);
    expect(groups[0].topNodes[0].kind).toBe('dof');
  });
});

describe('supports seen only in the stiffness, and a mechanism of a free-free model', () => {
  it('springs to ground at the nodes of one edge line: the spring nodes are named as the supports on the axis', () => {
    const edge = [1, 5, 9];
    const model = buildHexBox({
      sizeM: [0.3, 0.2, 0.4],
      elements: [3, 2, 2],
      material: STEEL,
      springs: edge.flatMap((node) => [0, 1, 2].map((component) => ({ node, component, stiffness: 1e9 }))),
    });
    const modes = denseModes(model.stiffness, model.mass, 6);
    const r = run(rigidBodyModes, contextOf(model, modes), { expected: 0 });
    expect(r.status).toBe('fail');
    expect(r.message).toContain('Free rigid-body motion: rotation about the axis along y through (0, ');
    expect(r.message).toMatch(/supported nodes [159], [159] and [159] lie on its axis\./);
    const facts = r.details!.freeRigidMotions as FreeMotionFacts;
    expect(facts.supportedNodes.map((s) => s.node).sort()).toEqual(edge);
    expect(new Set(facts.supportedNodes.map((s) => s.source))).toEqual(new Set(['stiffness-residual']));
  });

  it('free-free beam with a rod end swinging about node 4: one part, node 99, rotating about node 4 (2 free rotations)', () => {
    const model = buildFrame(beamWithRodEnd(4, { x: 0.75, y: 0.6, z: 0 }));
    const modes = denseModes(model.stiffness, model.mass, 12);
    const r = run(rigidBodyModes, contextOf(model, modes), { expected: 6 });
    expect(r.status).toBe('fail');
    expect(r.message).toContain('1 independent mechanism: (1) part with node 99 (x 0.75, y 0.6, z 0) rotates freely about node 4 (2 free rotations)');
    expect(r.message).not.toContain('Free rigid-body motion');
    const groups = r.details!.mechanismGroups as MechanismGroup[];
    expect(groups.map((g) => [g.nodes, g.motions, g.motion?.pivot?.node])).toEqual([[[99], 2, 4]]);
  });
});
