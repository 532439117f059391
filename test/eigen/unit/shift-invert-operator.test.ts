/**
 * src/eigen/shift-invert-operator.ts on its own:
 *  - Y = (K − σM)⁻¹ M X against ml-matrix's dense solve (general-purpose library);
 *  - C φ = θ φ with θ = 1/(λ − σ) for the eigenvectors of (K, M) (ml-matrix reference pairs);
 *  - C is self-adjoint in ⟨x, y⟩_M: ⟨Cx, y⟩_M = ⟨x, Cy⟩_M (Ericsson & Ruhe 1980, as the header states);
 *  - the work counters; massRankBound = n minus the massless DOFs.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { massRankBound } from '../../../src/eigen/shift-invert-operator.js';
import { chain, denseGeneralized, denseOf, diagonalMatrix, operatorAt, pseudoRandomBlock, sparseOf, type Pencil } from './pencils.js';
import { hexGridPair } from '../../sparse/fe-like-matrices.js';

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

describe('shift-invert operator C = (K − σM)⁻¹M', () => {
  const pencil: Pencil = hexGridPair(2, 1, 1, 7);
  const n = pencil.stiffness.n;
  const sigma = -0.37;
  const op = operatorAt(pencil, sigma);

  it('applies (K − σM)⁻¹ M X like a dense solve (ml-matrix)', () => {
    const x = pseudoRandomBlock(n, 3, 5);
    const y = op.apply(x, 3);
    const a = new Matrix(denseOf(pencil.stiffness)).sub(new Matrix(denseOf(pencil.mass)).mul(sigma));
    const mx = new Matrix(denseOf(pencil.mass)).mmul(new Matrix(Array.from({ length: n }, (_, r) => [x[r], x[n + r], x[2 * n + r]])));
    const ref = solve(a, mx);
    let worst = 0;
    let scale = 0;
    for (let j = 0; j < 3; j++) {
      for (let r = 0; r < n; r++) {
        worst = Math.max(worst, Math.abs(y[j * n + r] - ref.get(r, j)));
        scale = Math.max(scale, Math.abs(ref.get(r, j)));
      }
    }
    expect(worst / scale).toBeLessThan(1e-11);
  });

  it('solve(B) is (K − σM)⁻¹B, so solve(M X) = apply(X)', () => {
    const x = pseudoRandomBlock(n, 2, 6);
    const a = op.apply(x, 2);
    const b = op.solve(op.massTimes(x, 2), 2);
    let d = 0;
    for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
    expect(d).toBeLessThan(1e-12 * Math.max(...Array.from(a, Math.abs)));
  });

  it('maps the eigenvectors of (K, M) to θ = 1/(λ − σ) times themselves (ml-matrix eigenpairs)', () => {
    const ref = denseGeneralized(pencil);
    for (const i of [0, 1, 5, n - 1]) {
      const phi = Float64Array.from(ref.vectors[i]);
      const y = op.apply(phi, 1);
      const theta = 1 / (ref.values[i] - sigma);
      let worst = 0;
      for (let r = 0; r < n; r++) worst = Math.max(worst, Math.abs(y[r] - theta * phi[r]));
      expect(worst / (Math.abs(theta) * Math.max(...Array.from(phi, Math.abs)))).toBeLessThan(1e-9);
    }
  });

  it('is self-adjoint in the M-inner product: ⟨Cx, y⟩_M = ⟨x, Cy⟩_M', () => {
    const x = pseudoRandomBlock(n, 1, 8);
    const y = pseudoRandomBlock(n, 1, 9);
    const left = dot(op.massTimes(op.apply(x, 1), 1), y);
    const right = dot(op.massTimes(x, 1), op.apply(y, 1));
    expect(Math.abs(left - right)).toBeLessThan(1e-12 * Math.abs(left));
  });

  it('counts solves, passes over the factor and products per column', () => {
    const fresh = operatorAt(pencil, sigma);
    fresh.apply(pseudoRandomBlock(n, 4, 1), 4);
    fresh.solve(pseudoRandomBlock(n, 2, 2), 2);
    fresh.stiffnessTimes(pseudoRandomBlock(n, 3, 3), 3);
    expect(fresh.counts).toEqual({ solves: 6, factorPasses: 2, massProducts: 4, stiffnessProducts: 3 });
    expect(fresh.shift).toBe(sigma);
  });
});

describe('shift-invert operator with massless DOFs', () => {
  it('maps null(M) to zero: C e_j = (K − σM)⁻¹ M e_j = 0 for a massless DOF j', () => {
    const p: Pencil = { stiffness: chain(8, 1, 1, true).stiffness, mass: diagonalMatrix([1, 0, 1, 0, 1, 0, 1, 0]) };
    const op = operatorAt(p, -1e-3);
    const e3 = new Float64Array(8);
    e3[3] = 1;
    expect(Array.from(op.apply(e3, 1))).toEqual(new Array(8).fill(0));
    // and a massive DOF is not mapped to zero
    const e2 = new Float64Array(8);
    e2[2] = 1;
    expect(Math.max(...Array.from(op.apply(e2, 1), Math.abs))).toBeGreaterThan(0);
  });
});

describe('massRankBound: n minus the massless DOFs', () => {
  it('is n for a positive lumped mass', () => {
    expect(massRankBound(chain(9, 1, 2, true).mass)).toBe(9);
  });

  it('drops zero rows, and explicit zeros count as no entry', () => {
    expect(massRankBound(diagonalMatrix([1, 0, 2, 0, 0, 3]))).toBe(3);
  });

  it('counts a DOF whose only mass entries are off the diagonal (bound, not the exact rank)', () => {
    // rows 0 and 2 coupled by m₂₀ only, row 1 empty: rank([[0,0,1],[0,0,0],[1,0,0]]) = 2 = bound
    expect(massRankBound(sparseOf(3, [[2, 0, 1]]))).toBe(2);
    // rank([[1,1],[1,1]]) = 1, but no row is zero: the bound stays 2 (it is an upper bound only)
    expect(massRankBound(sparseOf(2, [[0, 0, 1], [1, 0, 1], [1, 1, 1]]))).toBe(2);
  });
});
