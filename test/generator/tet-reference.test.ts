/**
 * Tetrahedral parts of about 5k DOFs (linear and quadratic, shuffled numbering, clamped, and the
 * wrongly jointed bracket) against reference eigenvalues from SciPy: eigsh in shift-invert mode,
 * cross-checked by dense eigh (test/reference/make_tet_reference.py, values in
 * test/reference/tet-reference-eigenvalues.json, models in test/reference/tet-reference-models.ts).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { TET_REFERENCE_MODELS } from '../reference/tet-reference-models.js';
import { buildJointedTetBracket, type JointedBracket } from '../../fixtures/generator/tet-bracket.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { symMultiply, type SymmetricCsc } from '../../src/sparse/csc.js';

interface ReferenceEntry {
  n: number;
  storedEntriesK: number;
  storedEntriesM: number;
  traceK: number;
  traceM: number;
  eigenvalues: number[];
}
const reference = JSON.parse(readFileSync(new URL('../reference/tet-reference-eigenvalues.json', import.meta.url), 'utf8')) as { models: Record<string, ReferenceEntry> };

const trace = (a: SymmetricCsc): number => {
  let t = 0;
  for (let j = 0; j < a.n; j++) t += a.values[a.colPtr[j]];
  return t;
};

describe.each(TET_REFERENCE_MODELS.map((m) => [m.name, m] as const))('%s', (name, entry) => {
  it(`lowest eigenvalues agree with SciPy to 5e-9 (elastic) and zero modes stay zero`, () => {
    const ref = reference.models[name];
    const model = entry.build();
    // the same matrices as the reference was made from
    expect(model.stiffness.n).toBe(ref.n);
    expect(model.stiffness.colPtr[model.stiffness.n]).toBe(ref.storedEntriesK);
    expect(model.mass.colPtr[model.mass.n]).toBe(ref.storedEntriesM);
    expect(Math.abs(trace(model.stiffness) / ref.traceK - 1)).toBeLessThan(1e-12);
    expect(Math.abs(trace(model.mass) / ref.traceM - 1)).toBeLessThan(1e-12);
    const ours = solveModes(model.stiffness, model.mass, { count: entry.count, coordinates: model.coordinates });
    const top = ref.eigenvalues[entry.count - 1];
    for (let i = 0; i < entry.count; i++) {
      const r = ref.eigenvalues[i];
      if (Math.abs(r) < 1e-6 * top) expect(Math.abs(ours.eigenvalues[i])).toBeLessThan(1e-6 * top);
      else expect(Math.abs(ours.eigenvalues[i] / r - 1)).toBeLessThan(5e-9);
    }
  });
});

describe.each([[2, 0.012, 13], [1, 0.008, 14]] as const)('jointed tetrahedral bracket, order %i', (order, cellM, seed) => {
  const jointed: JointedBracket = buildJointedTetBracket({ order, cellM, seed });
  const { model } = jointed;

  it('names each sub-part and its joint; the hinge nodes lie on the hinge line, the corner joint is one node', () => {
    const [flap, block] = jointed.joints;
    expect(flap.part).toBe('hingedFlap');
    expect(block.part).toBe('cornerBlock');
    expect(flap.nodeIds.length).toBeGreaterThan(50);
    expect(block.nodeIds.length).toBeGreaterThan(20);
    expect(block.jointNodeIds.length).toBe(1);
    const position = (id: number): [number, number, number] => {
      const i = model.nodes.ids.indexOf(id);
      return [model.nodes.x[i], model.nodes.y[i], model.nodes.z[i]];
    };
    for (const id of flap.jointNodeIds) {
      const [x, , z] = position(id);
      expect([x, z]).toEqual([flap.pointM[0], flap.pointM[2]]);
    }
    expect(position(block.jointNodeIds[0])).toEqual(block.pointM);
    const all = [...flap.nodeIds, ...flap.jointNodeIds, ...block.nodeIds, ...block.jointNodeIds, ...model.nodeSets.boltFace];
    expect(new Set(all).size).toBe(all.length);
  });

  it('has exactly the expected zero modes, and they are the sub-parts rotating about their joints', () => {
    // Rigid rotation u = ω × (x − p) of a sub-part stores no strain energy (common practice);
    // every zero-mode shape must lie in the span of those rotations and vice versa.
    const count = jointed.expectedZeroModes + 4;
    const modes = solveModes(model.stiffness, model.mass, { count, coordinates: model.coordinates });
    const first = modes.eigenvalues[jointed.expectedZeroModes];
    const zero = Array.from(modes.eigenvalues).filter((l) => Math.abs(l) < 1e-6 * first).length;
    expect(zero).toBe(jointed.expectedZeroModes);
    const n = model.stiffness.n;
    const rotations: Float64Array[] = [];
    for (const joint of jointed.joints) {
      const members = new Set(joint.nodeIds);
      const axes = joint.axis ? [joint.axis] : [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
      for (const w of axes) {
        const r = new Float64Array(n);
        for (let d = 0; d < n; d++) {
          if (!members.has(model.dofMap.node[d])) continue;
          const v = [model.dofMap.x[d] - joint.pointM[0], model.dofMap.y[d] - joint.pointM[1], model.dofMap.z[d] - joint.pointM[2]];
          const cross = [w[1] * v[2] - w[2] * v[1], w[2] * v[0] - w[0] * v[2], w[0] * v[1] - w[1] * v[0]];
          r[d] = cross[model.dofMap.component[d]];
        }
        rotations.push(r);
      }
    }
    expect(rotations.length).toBe(jointed.expectedZeroModes);
    // r − Φ₀Φ₀ᵀM r, in the M-norm, relative to ‖r‖_M (Φ₀: the solver's mass-normalized zero modes)
    const dot = (a: Float64Array, b: Float64Array): number => a.reduce((s, v, i) => s + v * b[i], 0);
    for (const r of rotations) {
      const mr = symMultiply(model.mass, r);
      const rest = r.slice();
      for (let k = 0; k < jointed.expectedZeroModes; k++) {
        const phi = modes.shapes.subarray(k * n, (k + 1) * n);
        const c = dot(phi, mr);
        for (let i = 0; i < n; i++) rest[i] -= c * phi[i];
      }
      expect(Math.sqrt(dot(rest, symMultiply(model.mass, rest)) / dot(r, mr))).toBeLessThan(1e-6);
    }
  });
});
