/**
 * 4- and 10-node tetrahedra: quadrature exactness, rigid-body modes, total mass, the 10-node
 * mass distribution and the patch test.
 */
import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { TET_RULE_DEGREE_2, TET_RULE_DEGREE_5, type TetRule } from '../../fixtures/generator/elements/tet-quadrature.js';
import { tetElementMatrices, TET10_EDGES } from '../../fixtures/generator/elements/tetrahedron.js';
import { STEEL } from '../../fixtures/generator/sections.js';

const factorial = (k: number): number => (k <= 1 ? 1 : k * factorial(k - 1));

/** An irregular tetrahedron (m), right-handed, and its volume by the triple product. */
const CORNERS = [0.01, 0.02, 0.0, 0.07, 0.0, 0.01, 0.03, 0.06, 0.005, 0.02, 0.025, 0.05];
function volumeOf(c: number[]): number {
  const u = [c[3] - c[0], c[4] - c[1], c[5] - c[2]];
  const v = [c[6] - c[0], c[7] - c[1], c[8] - c[2]];
  const w = [c[9] - c[0], c[10] - c[1], c[11] - c[2]];
  return (u[0] * (v[1] * w[2] - v[2] * w[1]) - u[1] * (v[0] * w[2] - v[2] * w[0]) + u[2] * (v[0] * w[1] - v[1] * w[0])) / 6;
}
/** Corners plus the six mid-edge nodes (straight edges). */
function tenNodes(c: number[]): number[] {
  const out = c.slice();
  for (const [i, j] of TET10_EDGES) for (let d = 0; d < 3; d++) out.push((c[3 * i + d] + c[3 * j + d]) / 2);
  return out;
}

function eigenvaluesOf(a: Float64Array, n: number): number[] {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, 0.5 * (a[i * n + j] + a[j * n + i]));
  return [...new EigenvalueDecomposition(m, { assumeSymmetric: true }).realEigenvalues].sort((x, y) => x - y);
}

describe('tetrahedron quadrature', () => {
  const check = (rule: TetRule): void => {
    // ∫ L0^a L1^b L2^c L3^d dV = 6V a! b! c! d! / (a+b+c+d+3)!, V = 1/6 (Zienkiewicz & Taylor vol. 1 ch. 9; Hughes §3.I)
    for (let a = 0; a <= rule.degree; a++) for (let b = 0; a + b <= rule.degree; b++)
      for (let c = 0; a + b + c <= rule.degree; c++) for (let d = 0; a + b + c + d <= rule.degree; d++) {
        const exact = (factorial(a) * factorial(b) * factorial(c) * factorial(d)) / factorial(a + b + c + d + 3);
        let q = 0;
        for (let g = 0; g < rule.weights.length; g++) {
          const L = rule.points.subarray(4 * g, 4 * g + 4);
          q += rule.weights[g] * L[0] ** a * L[1] ** b * L[2] ** c * L[3] ** d;
        }
        expect(Math.abs(q / exact - 1)).toBeLessThan(1e-13);
      }
  };
  it('the 4-point rule integrates every monomial of degree ≤ 2 exactly', () => check(TET_RULE_DEGREE_2));
  it('the 14-point rule integrates every monomial of degree ≤ 5 exactly', () => check(TET_RULE_DEGREE_5));
});

describe.each([4, 10] as const)('%i-node tetrahedron', (nodes) => {
  const xyz = nodes === 4 ? CORNERS : tenNodes(CORNERS);
  const nd = 3 * nodes;
  const V = volumeOf(CORNERS);
  const { stiffness, mass } = tetElementMatrices(xyz, STEEL);

  it('stiffness is symmetric with exactly six zero eigenvalues (free element)', () => {
    // A free solid has 6 rigid-body motions, which store no strain energy (common practice).
    const scale = Math.max(...stiffness.map(Math.abs));
    for (let i = 0; i < nd; i++) for (let j = 0; j < nd; j++) expect(Math.abs(stiffness[i * nd + j] - stiffness[j * nd + i])).toBeLessThan(1e-13 * scale);
    const ev = eigenvaluesOf(stiffness, nd);
    const top = ev[nd - 1];
    expect(ev.filter((l) => Math.abs(l) < 1e-11 * top).length).toBe(6);
    expect(ev[6]).toBeGreaterThan(1e-4 * top);
  });

  it('total mass rᵀMr equals ρV in each direction', () => {
    // Σ N_a = 1 (partition of unity) so rᵀMr = ∫ρ dV (common practice).
    for (let c = 0; c < 3; c++) {
      let s = 0;
      for (let a = 0; a < nodes; a++) for (let b = 0; b < nodes; b++) s += mass[(3 * a + c) * nd + 3 * b + c];
      expect(Math.abs(s / (STEEL.densityKgM3 * V) - 1)).toBeLessThan(1e-13);
    }
  });

  it('uniform strain: element strain energy uᵀKu/2 equals V·(λ (tr ε)² / 2 + μ ε:ε)', () => {
    // Hooke's law for isotropic solids, energy density λ(tr ε)²/2 + μ ε:ε (e.g. Timoshenko &
    // Goodier, Theory of Elasticity, §§ 6, 7); a linear displacement field gives uniform strain,
    // which both elements reproduce exactly (patch test, Zienkiewicz & Taylor vol. 1 ch. 10).
    const A = [[1e-4, 3e-5, -2e-5], [-1e-5, -4e-5, 6e-5], [2e-5, 5e-5, 2e-4]];
    const u = new Float64Array(nd);
    for (let a = 0; a < nodes; a++) for (let i = 0; i < 3; i++) u[3 * a + i] = 1e-6 * (i + 1) + A[i][0] * xyz[3 * a] + A[i][1] * xyz[3 * a + 1] + A[i][2] * xyz[3 * a + 2];
    let energy = 0;
    for (let r = 0; r < nd; r++) for (let s = 0; s < nd; s++) energy += 0.5 * u[r] * stiffness[r * nd + s] * u[s];
    const E = STEEL.youngPa, nu = STEEL.poissonRatio;
    const lame = (E * nu) / ((1 + nu) * (1 - 2 * nu)), mu = E / (2 * (1 + nu));
    let tr = 0, ee = 0;
    for (let i = 0; i < 3; i++) {
      tr += A[i][i];
      for (let j = 0; j < 3; j++) ee += (0.5 * (A[i][j] + A[j][i])) ** 2;
    }
    expect(Math.abs(energy / (V * (0.5 * lame * tr * tr + mu * ee)) - 1)).toBeLessThan(1e-12);
  });
});

describe('10-node tetrahedron consistent mass distribution', () => {
  it('row sums: −ρV/20 at each corner, ρV/5 at each mid-edge node', () => {
    // Row sum of node a = ρ∫N_a dV (Σ_b N_b = 1). With ∫L dV = V/4, ∫L² dV = V/10, ∫L_i L_j dV = V/20
    // (the integration formula quoted in the quadrature test): corners ∫L(2L − 1) = V/5 − V/4 = −V/20,
    // mid-edge ∫4 L_i L_j = V/5. Our derivation; the values match those recalled from memory.
    const xyz = tenNodes(CORNERS);
    const { mass } = tetElementMatrices(xyz, STEEL);
    const rhoV = STEEL.densityKgM3 * volumeOf(CORNERS);
    for (let a = 0; a < 10; a++) {
      let s = 0;
      for (let b = 0; b < 10; b++) s += mass[3 * a * 30 + 3 * b];
      expect(Math.abs(s / (a < 4 ? -rhoV / 20 : rhoV / 5) - 1)).toBeLessThan(1e-12);
    }
  });
});
