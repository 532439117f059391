/**
 * MAC and pairing against their definitions and outside references:
 *  - MAC(φ, φ) = 1; mass-weighted MAC of two M-orthogonal modes = 0; MAC unchanged by scaling
 *    and sign (Allemang & Brown 1982, definition restated in Allemang 2003 eq. 4, docs/sources.md §2 [C]),
 *    on modes of a generated cantilever solved densely by ml-matrix (outside the project);
 *  - a hand value: MAC([1,0], [1,1]) = 1/2 (definition);
 *  - the assignment equals exhaustive search over every permutation (brute force, common practice).
 */
import { describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { denseModes, denseOf } from '../model/helpers.js';
import { macMatrix, modalAssuranceCriterion, restrictRows, shapeProducts, subspaceShare } from '../../src/model/mac.js';
import { principalSubmatrix } from '../../src/sparse/permute.js';
import { assignMinimumCost, pairModes } from '../../src/model/mode-pairing.js';

const beam = buildCantilever({ lengthM: 1, elements: 6, widthM: 0.02, depthM: 0.03 });
const modes = denseModes(beam.stiffness, beam.mass, 8); // ml-matrix reference modes, φᵀMφ = 1
const n = modes.n;
const column = (k: number): Float64Array => modes.shapes.slice(k * n, (k + 1) * n);

describe('Modal Assurance Criterion (Allemang & Brown 1982)', () => {
  it('is 1 for a mode with itself, plain and mass-weighted', () => {
    for (let k = 0; k < 8; k++) {
      expect(modalAssuranceCriterion(column(k), column(k))).toBeCloseTo(1, 14);
      expect(modalAssuranceCriterion(column(k), column(k), beam.mass)).toBeCloseTo(1, 14);
    }
  });
  it('is 0 (mass-weighted) for M-orthogonal modes', () => {
    const mac = macMatrix({ rows: n, cols: 8, values: modes.shapes }, { rows: n, cols: 8, values: modes.shapes }, beam.mass);
    for (let i = 0; i < 8; i++) for (let j = 0; j < 8; j++) if (i !== j) expect(mac[i * 8 + j]).toBeLessThan(1e-20);
  });
  it('does not change when a shape is scaled or flips sign', () => {
    const a = column(0);
    const b = column(0).map((x, i) => x + 0.3 * column(2)[i]);
    const ref = modalAssuranceCriterion(a, b);
    expect(ref).toBeGreaterThan(0.1);
    expect(ref).toBeLessThan(0.999);
    for (const s of [-1, 1e-6, -37.5]) {
      expect(modalAssuranceCriterion(a.map((x) => s * x), b)).toBeCloseTo(ref, 13);
      expect(modalAssuranceCriterion(a, b.map((x) => s * x), beam.mass)).toBeCloseTo(modalAssuranceCriterion(a, b, beam.mass), 13);
    }
  });
  it('matches the hand value MAC([1,0],[1,1]) = 1/2 (definition)', () => {
    expect(modalAssuranceCriterion(Float64Array.of(1, 0), Float64Array.of(1, 1))).toBeCloseTo(0.5, 15);
  });
  it('subspace share: a rotated member of a pair lies wholly in the span of the pair', () => {
    const c = Math.cos(0.7), s = Math.sin(0.7);
    const rotated = column(0).map((x, i) => c * x + s * column(1)[i]);
    const p = shapeProducts({ rows: n, cols: 1, values: rotated }, { rows: n, cols: 3, values: modes.shapes.slice(0, 3 * n) }, beam.mass);
    expect(subspaceShare(p, 'baseline', 0, [0, 1])).toBeCloseTo(1, 12);
    // share in span{φ_0} alone is cos² of the rotation angle when the pair is M-orthonormal (definition)
    expect(subspaceShare(p, 'baseline', 0, [0])).toBeCloseTo(c * c, 12);
  });
  it('restricting M to a DOF subset gives the dense sub-block', () => {
    const dofs = Int32Array.of(0, 3, 4, 9, 17, n - 1);
    const sub = denseOf(principalSubmatrix(beam.mass, dofs));
    const full = denseOf(beam.mass);
    for (let a = 0; a < dofs.length; a++) for (let b = 0; b < dofs.length; b++) expect(sub.get(a, b)).toBe(full.get(dofs[a], dofs[b]));
    const rows = restrictRows(modes.shapes, n, 2, dofs);
    expect(rows[dofs.length + 2]).toBe(modes.shapes[n + 4]);
  });
});

/** Largest Σ w(i, p(i)) over every permutation p (exhaustive search). */
function bruteForceBest(w: Float64Array, m: number): number {
  let best = -Infinity;
  const perm = Array.from({ length: m }, (_, i) => i);
  const visit = (k: number): void => {
    if (k === m) {
      best = Math.max(best, perm.reduce((s, j, i) => s + w[i * m + j], 0));
      return;
    }
    for (let t = k; t < m; t++) {
      [perm[k], perm[t]] = [perm[t], perm[k]];
      visit(k + 1);
      [perm[k], perm[t]] = [perm[t], perm[k]];
    }
  };
  visit(0);
  return best;
}

describe('mode pairing by assignment', () => {
  it('finds the optimum of exhaustive search on random 6 × 6 problems', () => {
    let seed = 12345;
    const rand = (): number => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    for (let trial = 0; trial < 30; trial++) {
      const m = 6;
      const w = Float64Array.from({ length: m * m }, rand);
      const cost = w.map((x) => -x);
      const col = assignMinimumCost(cost, m);
      expect(new Set(col).size).toBe(m);
      const total = Array.from(col).reduce((s, j, i) => s + w[i * m + j], 0);
      expect(total).toBeCloseTo(bruteForceBest(w, m), 12);
    }
  });
  it('prefers the one-to-one optimum over a greedy pick, and leaves weak pairs unpaired', () => {
    // greedy would take (0,0)=0.95 and then (1,1)=0.2; the assignment takes 0.9 + 0.9
    const e = Float64Array.of(0.95, 0.9, 0.9, 0.2);
    const p = pairModes(e, [1, 2], [1, 2]);
    expect(Array.from(p.partnerOfBaseline)).toEqual([1, 0]);
    const weak = pairModes(Float64Array.of(0.95, 0.1, 0.1, 0.3), [1, 2], [1, 2]);
    expect(Array.from(weak.partnerOfBaseline)).toEqual([0, -1]);
  });
  it('keeps order on ties and respects the frequency window', () => {
    const tie = pairModes(Float64Array.of(1, 1, 1, 1), [1, 1], [1, 1]);
    expect(Array.from(tie.partnerOfBaseline)).toEqual([0, 1]);
    const windowed = pairModes(Float64Array.of(0.99, 0.6, 0.6, 0.99), [10, 20], [15, 20], { windowPercent: 10 });
    expect(Array.from(windowed.partnerOfBaseline)).toEqual([-1, 1]);
  });
});
