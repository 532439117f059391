/**
 * Generated models shared by the ordering and sparse benches (fixtures/generator), so both
 * measure the same matrices.
 */
import { buildFrame, type FrameMember, type FrameNode } from '../../fixtures/generator/frame-builder.js';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { buildTetBracket } from '../../fixtures/generator/tet-bracket.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { circularHollowSection, STEEL } from '../../fixtures/generator/sections.js';

/** Steel hex solid of 40×32×30 hexahedra, 4 × 3.2 × 3 m, clamped on its xMin face (122 760 DOFs). */
export function clampedHexSolid(): GeneratedModel {
  return buildHexBox({ sizeM: [4, 3.2, 3], elements: [40, 32, 30], material: STEEL, clampFace: 'xMin' });
}

/** Free-free steel hex box of 39×39×24 hexahedra (40×40×25 nodes, 120 000 DOFs). */
export function freeHexBox(): GeneratedModel {
  return buildHexBox({ sizeM: [3.9, 3.9, 2.4], elements: [39, 39, 24], material: STEEL });
}

/**
 * Rigid-jointed space frame of steel tubes (CHS 100 × 5) on a 22×22×21-node lattice of 1 m,
 * beams along the three axes, clamped at its base (≈ 58k DOFs, 6 per node).
 */
export function latticeFrame(): GeneratedModel {
  const [nx, ny, nz] = [22, 22, 21];
  const id = (i: number, j: number, k: number) => 1 + i + nx * (j + ny * k);
  const nodes: FrameNode[] = [];
  const members: FrameMember[] = [];
  const section = circularHollowSection(0.1, 0.005);
  const base: number[] = [];
  // nodes on a 1 m lattice, beams along the three axes
  for (let k = 0; k < nz; k++)
    for (let j = 0; j < ny; j++)
      for (let i = 0; i < nx; i++) {
        nodes.push({ id: id(i, j, k), x: i, y: j, z: k });
        if (k === 0) base.push(id(i, j, k));
        const beam = (b: number): void => {
          members.push({ kind: 'beam', nodes: [id(i, j, k), b], section, material: STEEL });
        };
        if (i + 1 < nx) beam(id(i + 1, j, k));
        if (j + 1 < ny) beam(id(i, j + 1, k));
        if (k + 1 < nz) beam(id(i, j, k + 1));
      }
  return buildFrame({ nodes, members, supports: [{ nodes: base, kind: 'clamp' }] });
}

/**
 * Steel radio-unit bracket (fixtures/generator/tet-bracket.ts) meshed with 10-node tetrahedra:
 * unstructured (random split patterns, jittered interior), node ids shuffled with gaps, DOFs
 * numbered in a random node order. At cellM = 7.2 mm: 24 090 DOFs clamped (bolt face), 26 265 free.
 */
export function tetBracket26k(clamped = true): GeneratedModel {
  return buildTetBracket({ order: 2, cellM: 0.0072, clamped, seed: 31 });
}

/** The same bracket at cellM = 4.1 mm: 94 626 DOFs clamped, 100 359 free. */
export function tetBracket100k(clamped = true): GeneratedModel {
  return buildTetBracket({ order: 2, cellM: 0.0041, clamped, seed: 32 });
}

/**
 * Steel hex bar of nx×ny×nz cubic hexahedra of 0.1 m (the modes bench's hex family, all of the
 * 300k model's 8:3:3 shape), free-free or clamped on its xMin face. 27×10×10: 10 164 DOFs free,
 * 9 801 clamped; 40×15×15: 31 488 / 30 720; 64×24×24: 121 875; 88×33×33: 308 652.
 */
export function hexBar(elements: readonly [number, number, number], clamped: boolean): GeneratedModel {
  const sizeM = [elements[0] / 10, elements[1] / 10, elements[2] / 10] as const;
  return buildHexBox({ sizeM, elements, material: STEEL, clampFace: clamped ? 'xMin' : undefined });
}

/**
 * Rigid-jointed space frame of steel tubes (CHS 200 × 10) on a 17×17×34-node lattice, 4 m bays
 * and 3 m storeys, beams along the three axes: 58 956 DOFs free-free (the modes bench's frame).
 */
export function spaceFrame60k(clamped: boolean): GeneratedModel {
  const [nx, ny, nz] = [17, 17, 34];
  const id = (i: number, j: number, k: number) => 1 + i + nx * (j + ny * k);
  const nodes: FrameNode[] = [];
  const members: FrameMember[] = [];
  const section = circularHollowSection(0.2, 0.01);
  const base: number[] = [];
  const beam = (p: number, q: number, vertical: boolean): FrameMember => ({ kind: 'beam', nodes: [p, q], section, material: STEEL, orientation: vertical ? [1, 0, 0] : [0, 0, 1] });
  // grid nodes, then members along x, y and z between neighbouring nodes
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) nodes.push({ id: id(i, j, k), x: 4 * i, y: 4 * j, z: 3 * k });
  for (let k = 0; k < nz; k++)
    for (let j = 0; j < ny; j++)
      for (let i = 0; i < nx; i++) {
        if (k === 0) base.push(id(i, j, k));
        if (i + 1 < nx) members.push(beam(id(i, j, k), id(i + 1, j, k), false));
        if (j + 1 < ny) members.push(beam(id(i, j, k), id(i, j + 1, k), false));
        if (k + 1 < nz) members.push(beam(id(i, j, k), id(i, j, k + 1), true));
      }
  return buildFrame({ nodes, members, supports: clamped ? [{ nodes: base, kind: 'clamp' }] : [], description: `space frame ${nx}×${ny}×${nz} nodes` });
}
