/**
 * src/eigen/verification.ts on its own:
 *  - checkShapes on exact mass-normalized modes (ml-matrix generalized eigenpairs) gives residuals
 *    and orthogonality at rounding, ΦᵀMΦ = I and ΦᵀKΦ = Λ; a shape scaled by (1 + ε) shows
 *    |ΦᵀMΦ − I| = (1 + ε)² − 1 exactly as defined in the header;
 *  - sameEigenvalue (1e-8 relative, or both zeros) and placeSturmShift (a quarter into the gap,
 *    past a whole cluster);
 *  - Sylvester's law of inertia: the negative pivots of LDLᵀ(K − σM) at the placed shift equal
 *    the number of eigenvalues below it (Bathe, Finite Element Procedures §11.6, as the header
 *    cites) — checked on the closed-form fixed–free chain, on a doubled chain (clusters) and on a
 *    chain with massless DOFs, whose infinite eigenvalues are not counted (reference: the
 *    reversed pencil through ml-matrix).
 */
import { describe, expect, it } from 'vitest';
import { checkShapes, CLUSTER_RELATIVE_TOLERANCE, placeSturmShift, sameEigenvalue } from '../../../src/eigen/verification.js';
import { createShiftedSolver } from '../../../src/sparse/shifted-solver.js';
import { symOneNorm } from '../../../src/sparse/csc.js';
import {
  blockOf,
  chain,
  denseFiniteEigenvaluesReversed,
  denseGeneralized,
  diagonalMatrix,
  fixedFreeEigenvalues,
  twoCopies,
  type Pencil,
} from './pencils.js';
import { hexGridPair } from '../../sparse/fe-like-matrices.js';

describe('checkShapes', () => {
  const p = hexGridPair(1, 1, 1, 4);
  const ref = denseGeneralized(p);
  const k = 5;
  const values = Float64Array.from(ref.values.slice(0, k));
  const shapes = blockOf(ref.vectors.slice(0, k));
  const kNorm = symOneNorm(p.stiffness);

  it('passes exact modes (ml-matrix): residuals and orthogonality at rounding, projections I and Λ', () => {
    const c = checkShapes(p.stiffness, p.mass, values, shapes, kNorm);
    expect(Math.max(...c.residuals)).toBeLessThan(1e-12);
    expect(c.orthogonality.massMaxDeviation).toBeLessThan(1e-12);
    expect(c.orthogonality.stiffnessMaxDeviation).toBeLessThan(1e-12);
    for (let i = 0; i < k; i++) {
      expect(c.projections.mass[i + i * k]).toBeCloseTo(1, 12);
      expect(c.projections.stiffness[i + i * k] / values[i]).toBeCloseTo(1, 11);
    }
  });

  it('reports a shape scaled by 1.01 as |ΦᵀMΦ − I| = 0.0201 and |ΦᵀKΦ − Λ|/λ_max = 0.0201 λ_i/λ_max', () => {
    const scaled = shapes.slice();
    const n = p.stiffness.n;
    for (let r = 2 * n; r < 3 * n; r++) scaled[r] *= 1.01;
    const c = checkShapes(p.stiffness, p.mass, values, scaled, kNorm);
    expect(c.orthogonality.massMaxDeviation).toBeCloseTo(0.0201, 10);
    expect(c.orthogonality.stiffnessMaxDeviation).toBeCloseTo((0.0201 * values[2]) / values[k - 1], 10);
    // an eigenvector times a constant is still an eigenvector: the residual stays at rounding
    expect(c.residuals[2]).toBeLessThan(1e-12);
  });

  it('gives a mixed shape x = cφ₁ + sφ₂ (with λ₁) the residual ‖s(λ₂ − λ₁)Mφ₂‖ / (‖Kx‖ + λ₁‖Mx‖)', () => {
    const n = p.stiffness.n;
    const [c0, s0] = [Math.cos(0.1), Math.sin(0.1)];
    const x = Float64Array.from({ length: n }, (_, r) => c0 * ref.vectors[0][r] + s0 * ref.vectors[1][r]);
    const check = checkShapes(p.stiffness, p.mass, values.slice(0, 1), x, kNorm);
    // by the definitions (residual-measure.ts), with the dense M of the reference
    const md = p.mass;
    const mv = (v: number[]) => {
      const out = new Array<number>(n).fill(0);
      for (let j = 0; j < n; j++)
        for (let q = md.colPtr[j]; q < md.colPtr[j + 1]; q++) {
          const i = md.rowIdx[q];
          out[i] += md.values[q] * v[j];
          if (i !== j) out[j] += md.values[q] * v[i];
        }
      return out;
    };
    const norm = (v: number[]) => Math.sqrt(v.reduce((a, b) => a + b * b, 0));
    const m1 = mv(ref.vectors[0]);
    const m2 = mv(ref.vectors[1]);
    const [l1, l2] = [ref.values[0], ref.values[1]];
    const kx = m1.map((v, r) => c0 * l1 * v + s0 * l2 * m2[r]);
    const mx = m1.map((v, r) => c0 * v + s0 * m2[r]);
    const expected = (Math.abs(s0) * (l2 - l1) * norm(m2)) / (norm(kx) + l1 * norm(mx));
    expect(check.residuals[0]).toBeCloseTo(expected, 8);
  });

  it('returns empty checks for no modes', () => {
    const c = checkShapes(p.stiffness, p.mass, new Float64Array(0), new Float64Array(0), kNorm);
    expect(c.residuals.length).toBe(0);
    expect(c.orthogonality).toEqual({ massMaxDeviation: 0, stiffnessMaxDeviation: 0 });
  });
});

describe('sameEigenvalue and placeSturmShift', () => {
  it('calls eigenvalues equal within 1e-8 relative, and any two zeros equal', () => {
    expect(CLUSTER_RELATIVE_TOLERANCE).toBe(1e-8);
    expect(sameEigenvalue(100, 100 * (1 + 0.9e-8), 0)).toBe(true);
    expect(sameEigenvalue(100, 100 * (1 + 1.1e-8), 0)).toBe(false);
    expect(sameEigenvalue(1e-12, -3e-12, 1e-10)).toBe(true);
    expect(sameEigenvalue(1e-12, 2e-10, 1e-10)).toBe(false);
  });

  it('places the shift a quarter into the gap after λ_N', () => {
    expect(placeSturmShift(Float64Array.from([1, 2, 3]), [7, 5], 0)).toEqual({ shift: 3.5, expectedBelow: 3, clusterRest: 0 });
    // estimates below λ_N (not equal to it) are ignored
    expect(placeSturmShift(Float64Array.from([1, 2, 3]), [2.5, 5], 0).shift).toBe(3.5);
  });

  it('goes past a cluster straddling N and says how many more values are below', () => {
    const top = 3 * (1 + 1e-10);
    const r = placeSturmShift(Float64Array.from([1, 2, 3]), [5, 3, top], 0);
    expect(r.clusterRest).toBe(2);
    expect(r.expectedBelow).toBe(5);
    expect(r.shift).toBeCloseTo(top + 0.25 * (5 - top), 14);
  });

  it('without estimates beyond, takes 1e-3 of the scale; for zeros, the zero threshold', () => {
    expect(placeSturmShift(Float64Array.from([1, 2, 4]), [], 0).shift).toBeCloseTo(4 + 0.25 * 4e-3, 14);
    const zeros = placeSturmShift(Float64Array.from([-2e-14, 1e-14]), [], 1e-8);
    expect(zeros.shift).toBeCloseTo(1e-14 + 0.25 * 1e-8, 20);
  });
});

describe('Sturm count at the placed shift (Sylvester\'s law of inertia)', () => {
  const countBelow = (p: Pencil, shift: number) => createShiftedSolver(p.stiffness, p.mass, { threads: 1 }).factor(shift).inertia.negative;

  it('equals N on the fixed–free chain for every N (closed-form eigenvalues)', () => {
    const n = 30;
    const exact = fixedFreeEigenvalues(n, 2, 0.5);
    for (const N of [1, 5, 17, 29]) {
      const placed = placeSturmShift(Float64Array.from(exact.slice(0, N)), exact.slice(N, N + 3), 0);
      expect(countBelow(chain(n, 2, 0.5, true), placed.shift)).toBe(N);
    }
  });

  it('counts a whole cluster: doubled chain, N = 3 ends inside the pair λ₂ = λ₂', () => {
    const p = twoCopies(chain(12, 1, 1, true));
    const single = fixedFreeEigenvalues(12, 1, 1);
    const doubled = single.flatMap((v) => [v, v]);
    const placed = placeSturmShift(Float64Array.from(doubled.slice(0, 3)), doubled.slice(3, 8), 0);
    expect(placed.clusterRest).toBe(1);
    expect(placed.expectedBelow).toBe(4);
    expect(countBelow(p, placed.shift)).toBe(4);
  });

  it('does not count the infinite eigenvalues of massless DOFs (reversed-pencil reference, ml-matrix)', () => {
    // fixed–free chain of 10 with every third mass zero: rank(M) = 7 finite eigenvalues
    const base = chain(10, 1, 1, true);
    const masses = Array.from({ length: 10 }, (_, i) => (i % 3 === 2 ? 0 : 1));
    const p: Pencil = { stiffness: base.stiffness, mass: diagonalMatrix(masses) };
    const finite = denseFiniteEigenvaluesReversed(p);
    expect(finite.length).toBe(7);
    for (const N of [1, 4, 7]) {
      const placed = placeSturmShift(Float64Array.from(finite.slice(0, N)), finite.slice(N), 0);
      expect(countBelow(p, placed.shift)).toBe(N);
    }
    // far above every finite eigenvalue the count stays at rank(M)
    expect(countBelow(p, 1e6 * finite[6])).toBe(7);
  });
});
