import { describe, expect, it } from 'vitest';
import { buildHexBox, buildHexGrid } from '../../fixtures/generator/hex-solid.js';
import { buildFrame } from '../../fixtures/generator/frame-builder.js';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { STEEL, rectangularSection, roundBarSection } from '../../fixtures/generator/sections.js';
import { rigidBodyVectorsAboutCenterOfMass } from '../../src/model/mass-properties.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('mass properties of a homogeneous rectangular block (hexahedral solid, consistent mass)', () => {
  // Block a × b × c along x, y, z, uneven grid lines: the trilinear consistent mass with 2×2×2 Gauss
  // points integrates ρ·(linear)² exactly, so the rigid-body mass matrix is discretization-free.
  const [a, b, c] = [0.3, 0.2, 0.5];
  const model = buildHexGrid({
    xLinesM: [0, 0.05, 0.17, 0.3],
    yLinesM: [0, 0.08, 0.2],
    zLinesM: [0, 0.1, 0.15, 0.31, 0.5],
    material: STEEL,
  });
  const { massProperties: mp } = rigidBodyVectorsAboutCenterOfMass(model.dofMap, model.mass);
  const m = STEEL.densityKgM3 * a * b * c;

  it('total mass in each translation equals ρ·volume (1e-12 relative)', () => {
    // Source: definition of mass of a homogeneous body, m = ρ V.
    for (const mk of mp.translationalMass) expect(rel(mk, m)).toBeLessThan(1e-12);
    expect(rel(mp.totalMass, model.structuralMassKg)).toBeLessThan(1e-12);
    expect(mp.translationalMassSpread).toBeLessThan(1e-12);
  });

  it('centre of mass is the block centre', () => {
    // Source: centroid of a homogeneous cuboid is its geometric centre (textbook statics).
    const expected = [a / 2, b / 2, c / 2];
    mp.centerOfMass.forEach((x, k) => expect(Math.abs(x - expected[k])).toBeLessThan(1e-12 * c));
  });

  it('inertia about the centre is m(b²+c²)/12, m(a²+c²)/12, m(a²+b²)/12 with zero products (1e-12 relative)', () => {
    // Source: moment of inertia of a homogeneous rectangular cuboid about its centroidal axes,
    // I_xx = m(b² + c²)/12 etc. (standard table in dynamics textbooks, common practice).
    const expected = [(m * (b * b + c * c)) / 12, (m * (a * a + c * c)) / 12, (m * (a * a + b * b)) / 12];
    const scale = Math.max(...expected);
    for (let r = 0; r < 3; r++) {
      for (let q = 0; q < 3; q++) {
        const want = r === q ? expected[r] : 0;
        expect(Math.abs(mp.inertiaAboutCenterOfMass[r * 3 + q] - want)).toBeLessThan(1e-12 * scale);
      }
    }
    const sorted = [...expected].sort((x, y) => x - y);
    mp.principalMoments.forEach((v, k) => expect(rel(v, sorted[k])).toBeLessThan(1e-12));
  });

  it('a free-free hex box has the same properties wherever the rotation point starts', () => {
    const box = buildHexBox({ sizeM: [a, b, c], elements: [2, 2, 3], material: STEEL });
    const p = rigidBodyVectorsAboutCenterOfMass(box.dofMap, box.mass, [10, -4, 3]).massProperties;
    expect(rel(p.totalMass, m)).toBeLessThan(1e-12);
    p.centerOfMass.forEach((x, k) => expect(Math.abs(x - [a / 2, b / 2, c / 2][k])).toBeLessThan(1e-11));
    const sorted = [b * b + c * c, a * a + c * c, a * a + b * b].map((q) => (m * q) / 12).sort((x, y) => x - y);
    p.principalMoments.forEach((v, k) => expect(rel(v, sorted[k])).toBeLessThan(1e-11));
  });
});

describe('mass properties of frames (6 DOF beam nodes, 3 DOF rod nodes)', () => {
  it('a free-free straight beam: m = ρAL, I = mL²/12 about transverse axes, ρ·Ip·L about its axis', () => {
    // Sources: thin rod about its centre, I = mL²/12 (textbook dynamics table, common practice);
    // the beam element's consistent mass has no bending rotary inertia but torsional inertia ρ Ip L
    // (see fixtures/generator/elements/beam3d.ts), so the axial moment is ρ (Iy + Iz) L.
    const L = 2;
    const beam = buildCantilever({ lengthM: L, elements: 7, widthM: 0.05, depthM: 0.08, clamped: false });
    const s = rectangularSection(0.05, 0.08);
    const m = STEEL.densityKgM3 * s.areaM2 * L;
    const mp = rigidBodyVectorsAboutCenterOfMass(beam.dofMap, beam.mass).massProperties;
    for (const mk of mp.translationalMass) expect(rel(mk, m)).toBeLessThan(1e-12);
    expect(Math.abs(mp.centerOfMass[0] - L / 2)).toBeLessThan(1e-12);
    const i = mp.inertiaAboutCenterOfMass;
    expect(rel(i[4], (m * L * L) / 12)).toBeLessThan(1e-12);
    expect(rel(i[8], (m * L * L) / 12)).toBeLessThan(1e-12);
    expect(rel(i[0], STEEL.densityKgM3 * (s.iyM4 + s.izM4) * L)).toBeLessThan(1e-12);
  });

  it('a mixed frame (beams plus rod-only nodes) with point masses: mass = Σ ρAL + point masses, all three agree', () => {
    const bar = roundBarSection(0.02);
    const tube = rectangularSection(0.04, 0.04);
    const frame = buildFrame({
      nodes: [
        { id: 1, x: 0, y: 0, z: 0 },
        { id: 2, x: 1, y: 0, z: 0 },
        { id: 3, x: 1, y: 1, z: 0 },
        { id: 4, x: 0.5, y: 0.5, z: 1 },
      ],
      members: [
        { kind: 'beam', nodes: [1, 2], section: tube, material: STEEL, segments: 3 },
        { kind: 'beam', nodes: [2, 3], section: tube, material: STEEL, segments: 2 },
        { kind: 'rod', nodes: [1, 4], section: bar, material: STEEL },
        { kind: 'rod', nodes: [2, 4], section: bar, material: STEEL },
        { kind: 'rod', nodes: [3, 4], section: bar, material: STEEL },
      ],
      pointMasses: [{ node: 4, massKg: 3.5 }],
    });
    const mp = rigidBodyVectorsAboutCenterOfMass(frame.dofMap, frame.mass).massProperties;
    for (const mk of mp.translationalMass) expect(rel(mk, frame.structuralMassKg)).toBeLessThan(1e-12);
    expect(mp.translationalMassSpread).toBeLessThan(1e-12);
  });

  it('missing mass on some uz DOFs shows as a spread of the translational masses', () => {
    const box = buildHexBox({ sizeM: [0.2, 0.2, 0.2], elements: [2, 2, 2], material: STEEL });
    // zero every mass entry in the rows and columns of the first node's uz DOF
    const uz = Array.from(box.dofMap.component).findIndex((c) => c === 2);
    const values = box.mass.values.slice();
    for (let j = 0; j < box.mass.n; j++) {
      for (let p = box.mass.colPtr[j]; p < box.mass.colPtr[j + 1]; p++) {
        if (j === uz || box.mass.rowIdx[p] === uz) values[p] = 0;
      }
    }
    const mp = rigidBodyVectorsAboutCenterOfMass(box.dofMap, { ...box.mass, values }).massProperties;
    expect(mp.translationalMass[2]).toBeLessThan(mp.translationalMass[0]);
    expect(mp.translationalMassSpread).toBeGreaterThan(1e-4);
  });
});
