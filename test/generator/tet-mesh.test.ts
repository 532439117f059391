/**
 * Unstructured tetrahedral meshes and the models built on them: conformity, element shape,
 * irregularity, shuffled numbering, mass, the patch test on a mesh, and the lowest eigenvalues
 * of our solver against dense ml-matrix on small cases.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { buildTetBox, buildTetBracket } from '../../fixtures/generator/tet-bracket.js';
import { elementsPerNode, smallestJacobianRatio, type TetMesh } from '../../fixtures/generator/tet-mesh.js';
import { symMultiply } from '../../src/sparse/csc.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { denseOf, generalizedEigenvalues } from './dense-reference.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { buildTetSolid, type TetSolidModel } from '../../fixtures/generator/tet-solid.js';
import { STEEL } from '../../fixtures/generator/sections.js';

/** Triangular faces of the corner tetrahedra with the number of elements holding each. */
function faceCounts(mesh: TetMesh): Map<string, number> {
  const k = mesh.nodesPerElement;
  const faces = new Map<string, number>();
  for (let e = 0; e < mesh.elements.length / k; e++) {
    const c = [0, 1, 2, 3].map((q) => mesh.elements[k * e + q]);
    for (let skip = 0; skip < 4; skip++) {
      const key = c.filter((_, q) => q !== skip).sort((a, b) => a - b).join(',');
      faces.set(key, (faces.get(key) ?? 0) + 1);
    }
  }
  return faces;
}

function translationalMass(model: GeneratedModel, component: number): number {
  const r = Float64Array.from(model.dofMap.component, (c) => (c === component ? 1 : 0));
  const mr = symMultiply(model.mass, r);
  return r.reduce((s, v, i) => s + v * mr[i], 0);
}

const SIZE = [0.09, 0.05, 0.04] as const;

/** Cells per order: a few hundred DOFs, so dense references stay quick. */
const CELLS = { 1: [4, 3, 3], 2: [2, 2, 2] } as const;

describe.each([1, 2] as const)('tetrahedral box, order %i', (order) => {
  const model = buildTetBox({ sizeM: SIZE, cells: CELLS[order], order, seed: 5 });
  const mesh = model.mesh;

  it('is conforming: every face is shared by two elements or lies on the box surface', () => {
    // A conforming mesh of a solid: interior faces have exactly two neighbours (common practice).
    const onSurface = (n: number): string[] => {
      const out: string[] = [];
      [mesh.x[n], mesh.y[n], mesh.z[n]].forEach((v, d) => {
        if (v === 0) out.push(`${d}-`);
        if (v === SIZE[d]) out.push(`${d}+`);
      });
      return out;
    };
    for (const [key, count] of faceCounts(mesh)) {
      expect(count === 1 || count === 2).toBe(true);
      if (count === 1) {
        const [a, b, c] = key.split(',').map(Number);
        const common = onSurface(a).filter((p) => onSurface(b).includes(p) && onSurface(c).includes(p));
        expect(common.length).toBeGreaterThan(0);
      }
    }
  });

  it('has no inverted element and irregular vertex degrees; its volume is the box volume', () => {
    expect(smallestJacobianRatio(mesh)).toBeGreaterThan(0.02);
    const degrees = new Set(elementsPerNode(mesh));
    expect(degrees.size).toBeGreaterThan(6);
    expect(Math.abs(model.volumeM3 / (SIZE[0] * SIZE[1] * SIZE[2]) - 1)).toBeLessThan(1e-12);
  });

  it('total mass rᵀMr equals ρ·volume in each direction', () => {
    // consistent mass reproduces ∫ρ dV (partition of unity, common practice)
    for (let c = 0; c < 3; c++) expect(Math.abs(translationalMass(model, c) / model.structuralMassKg - 1)).toBeLessThan(1e-12);
  });

  it('ids are shuffled with gaps and DOFs are not in node or id order', () => {
    const ids = Array.from(model.idOfNode);
    expect(new Set(ids).size).toBe(ids.length);
    expect(Math.max(...ids) - Math.min(...ids) + 1).toBeGreaterThan(1.5 * ids.length);
    const ascending = ids.every((id, i) => i === 0 || id > ids[i - 1]);
    expect(ascending).toBe(false);
    const nodeColumn = Array.from(model.dofMap.node);
    expect(nodeColumn.every((id, i) => i === 0 || id >= nodeColumn[i - 1])).toBe(false);
  });

  it('the shuffled model is the mesh-ordered model renumbered (same entries by node and component)', () => {
    const plain = buildTetBox({ sizeM: SIZE, cells: CELLS[order], order, seed: 5, dofOrder: 'mesh' });
    const byComponent = buildTetBox({ sizeM: SIZE, cells: CELLS[order], order, seed: 5, dofOrder: 'by-component' });
    for (const other of [model, byComponent]) {
      const a = denseOf(plain.stiffness);
      const b = denseOf(other.stiffness);
      const to = (d: number): number => other.nodes.dofOf[plain.nodes.dofOf.indexOf(d)];
      const map = Array.from({ length: a.rows }, (_, d) => to(d));
      for (let i = 0; i < a.rows; i += 7) for (let j = 0; j < a.rows; j++) expect(b.get(map[i], map[j])).toBe(a.get(i, j));
    }
  });

  it('patch test: boundary nodes moved by a linear field, the interior follows it exactly', () => {
    // Conforming elements reproducing linear fields pass the patch test (Zienkiewicz & Taylor vol. 1 ch. 10).
    const K = denseOf(model.stiffness);
    const n = K.rows;
    const field = (x: number, y: number, z: number, c: number): number => [1e-5 + 2e-4 * x - 1e-4 * y + 3e-5 * z, -2e-6 + 5e-5 * x + 1e-4 * y, 4e-6 - 7e-5 * x + 2e-5 * y - 1.5e-4 * z][c];
    const u = Float64Array.from({ length: n }, (_, d) => field(model.dofMap.x[d], model.dofMap.y[d], model.dofMap.z[d], model.dofMap.component[d]));
    const boundary = (d: number): boolean => [model.dofMap.x[d], model.dofMap.y[d], model.dofMap.z[d]].some((v, c) => v === 0 || v === SIZE[c]);
    const inner = Array.from({ length: n }, (_, d) => d).filter((d) => !boundary(d));
    const outer = Array.from({ length: n }, (_, d) => d).filter(boundary);
    expect(inner.length).toBeGreaterThan(6);
    // K_ii u_i = −K_ib u_b
    const Kii = new Matrix(inner.map((i) => inner.map((j) => K.get(i, j))));
    const rhs = new Matrix(inner.map((i) => [-outer.reduce((s, j) => s + K.get(i, j) * u[j], 0)]));
    const ui = solve(Kii, rhs);
    inner.forEach((d, q) => expect(Math.abs(ui.get(q, 0) - u[d])).toBeLessThan(1e-10 * 1e-5));
  });

  it('free-free: our solver agrees with dense ml-matrix to 5e-9 and shows 6 rigid-body modes', () => {
    const dense = generalizedEigenvalues(model.stiffness, model.mass);
    const ours = solveModes(model.stiffness, model.mass, { count: 16, coordinates: model.coordinates });
    const ref = dense[6];
    for (let i = 0; i < 6; i++) expect(Math.abs(ours.eigenvalues[i])).toBeLessThan(1e-8 * ref);
    for (let i = 6; i < 16; i++) expect(Math.abs(ours.eigenvalues[i] / dense[i] - 1)).toBeLessThan(5e-9);
  });
});

describe('small tetrahedral cases against dense ml-matrix', () => {
  it.each([4, 10] as const)('one free %i-node element: six rigid-body modes, elastic eigenvalues agree to 5e-9', (nodes) => {
    const model = buildTetBox({ sizeM: [0.05, 0.04, 0.03], cells: [1, 1, 1], order: nodes === 4 ? 1 : 2, seed: 3 });
    // keep one element of the six: the sub-mesh of element 0
    const one = singleElement(model.mesh);
    const dense = generalizedEigenvalues(one.stiffness, one.mass);
    const count = one.stiffness.n - 2;
    const ours = solveModes(one.stiffness, one.mass, { count, coordinates: one.coordinates });
    for (let i = 0; i < 6; i++) expect(Math.abs(ours.eigenvalues[i])).toBeLessThan(1e-8 * dense[6]);
    for (let i = 6; i < count; i++) expect(Math.abs(ours.eigenvalues[i] / dense[i] - 1)).toBeLessThan(5e-9);
  });

  it('linear bracket of a few hundred DOFs, bolt face clamped: lowest 12 eigenvalues agree to 5e-9', () => {
    const model: TetSolidModel = buildTetBracket({ order: 1, cellM: 0.02 });
    expect(model.stiffness.n).toBeGreaterThan(300);
    const dense = generalizedEigenvalues(model.stiffness, model.mass);
    const ours = solveModes(model.stiffness, model.mass, { count: 12, coordinates: model.coordinates });
    for (let i = 0; i < 12; i++) expect(Math.abs(ours.eigenvalues[i] / dense[i] - 1)).toBeLessThan(5e-9);
  });
});

/** A model of element 0 of a mesh alone (free), through the same builder. */
function singleElement(mesh: TetMesh): TetSolidModel {
  const k = mesh.nodesPerElement;
  const nodes = Array.from(mesh.elements.subarray(0, k));
  const pick = (a: Float64Array): Float64Array => Float64Array.from(nodes, (n) => a[n]);
  const sub: TetMesh = {
    nodesPerElement: k,
    x: pick(mesh.x), y: pick(mesh.y), z: pick(mesh.z),
    elements: Int32Array.from({ length: k }, (_, a) => a),
    blockOfNode: new Int32Array(k), blockOfElement: new Int32Array(1),
  };
  return buildTetSolid({ mesh: sub, material: STEEL, seed: 2, description: 'one tetrahedron' });
}
