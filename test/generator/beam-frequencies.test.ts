/**
 * Beam and rod elements against handbook natural frequencies (dense reference: ml-matrix).
 */
import { describe, expect, it } from 'vitest';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { buildFrame, type FrameNode } from '../../fixtures/generator/frame-builder.js';
import { rectangularSection, roundBarSection, STEEL } from '../../fixtures/generator/sections.js';
import { beamElementMatrices } from '../../fixtures/generator/elements/beam3d.js';
import { rodElementMatrices } from '../../fixtures/generator/elements/rod.js';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { frequenciesHz, generalizedEigenvalues } from './dense-reference.js';

// Cantilever roots βL of cos βL cosh βL = −1: Blevins, Formulas for Natural Frequency and Mode
// Shape (1979), Table 8-1, values as listed in docs/sources.md §7 ([S] table, [V] roots).
const CANTILEVER_BETA_L = [1.87510407, 4.69409113, 7.85475744];

/** Euler–Bernoulli f = (βL)²/(2πL²)·√(EI/(ρA)) (Blevins Table 8-1, via docs/sources.md §7). */
function eulerBernoulliHz(betaL: number, lengthM: number, ei: number, rhoA: number): number {
  return ((betaL * betaL) / (2 * Math.PI * lengthM * lengthM)) * Math.sqrt(ei / rhoA);
}

describe('clamped-free beam, 40 elements', () => {
  it('square section: first three bending frequencies within 0.5 %, each appearing twice', () => {
    const lengthM = 2;
    const section = rectangularSection(0.05, 0.05);
    const model = buildCantilever({ lengthM, elements: 40, section });
    const f = frequenciesHz(generalizedEigenvalues(model.stiffness, model.mass));
    const rhoA = STEEL.densityKgM3 * section.areaM2;
    CANTILEVER_BETA_L.forEach((betaL, i) => {
      const expected = eulerBernoulliHz(betaL, lengthM, STEEL.youngPa * section.izM4, rhoA);
      // the two bending planes give the pair (2i, 2i+1): no torsion or axial mode is lower
      expect(Math.abs(f[2 * i] / expected - 1)).toBeLessThan(0.005);
      expect(Math.abs(f[2 * i + 1] / expected - 1)).toBeLessThan(0.005);
    });
  });

  it('rectangular section: the two bending planes follow their own second moments', () => {
    const lengthM = 3; // long enough that torsion and axial modes lie above the bending modes compared
    const section = rectangularSection(0.06, 0.03); // width along ŷ, depth along ẑ
    const model = buildCantilever({ lengthM, elements: 40, section });
    const f = frequenciesHz(generalizedEigenvalues(model.stiffness, model.mass));
    const rhoA = STEEL.densityKgM3 * section.areaM2;
    const expected = [section.iyM4, section.izM4]
      .flatMap((i) => [...CANTILEVER_BETA_L, 10.99554073].map((b) => eulerBernoulliHz(b, lengthM, STEEL.youngPa * i, rhoA)))
      .sort((a, b) => a - b);
    // the six lowest modes are bending modes of either plane: the soft plane's 4th (βL = 10.99554073,
    // same table) falls below the stiff plane's 3rd; torsion (≈ 198 Hz) and axial (≈ 431 Hz) are higher
    expected.slice(0, 6).forEach((e, i) => expect(Math.abs(f[i] / e - 1)).toBeLessThan(0.005));
  });
});

describe('axial rod chain', () => {
  it('fixed-free rod: f_i = (2i−1)c/(4L) within 0.5 %', () => {
    // Rod formula: Blevins table via docs/sources.md §7 ([M] table number, formula exact).
    const lengthM = 10;
    const n = 40;
    const nodes: FrameNode[] = Array.from({ length: n + 1 }, (_, i) => ({ id: i + 1, x: (lengthM * i) / n, y: 0, z: 0 }));
    const section = roundBarSection(0.02);
    const model = buildFrame({
      nodes,
      members: nodes.slice(1).map((nd, i) => ({ kind: 'rod' as const, nodes: [i + 1, nd.id] as const, section, material: STEEL })),
      supports: [
        { nodes: [1], kind: 'pin' },
        { nodes: nodes.slice(1).map((nd) => nd.id), kind: [1, 2] }, // transverse motion held: axial chain only
      ],
    });
    expect(model.stiffness.n).toBe(n);
    const f = frequenciesHz(generalizedEigenvalues(model.stiffness, model.mass));
    const c = Math.sqrt(STEEL.youngPa / STEEL.densityKgM3);
    for (let i = 1; i <= 3; i++) expect(Math.abs(f[i - 1] / (((2 * i - 1) * c) / (4 * lengthM)) - 1)).toBeLessThan(0.005);
  });
});

describe('single elements', () => {
  it('a skew beam element is symmetric with exactly 6 zero-energy modes (ml-matrix eigen)', () => {
    // An unsupported element has the 6 rigid-body motions of a free body in 3D (common practice).
    const { stiffness, mass } = beamElementMatrices([0.1, -0.2, 0.3], [1.1, 0.4, 1.0], [0, 0, 1], rectangularSection(0.04, 0.07), STEEL);
    const K = new Matrix(12, 12);
    const scale = Math.max(...stiffness.map(Math.abs));
    for (let i = 0; i < 12; i++) {
      for (let j = 0; j < 12; j++) {
        expect(Math.abs(stiffness[i * 12 + j] - stiffness[j * 12 + i])).toBeLessThan(1e-14 * scale);
        expect(Math.abs(mass[i * 12 + j] - mass[j * 12 + i])).toBeLessThan(1e-14 * mass[0]);
        K.set(i, j, stiffness[i * 12 + j]);
      }
    }
    const ev = new EigenvalueDecomposition(K, { assumeSymmetric: true }).realEigenvalues.map(Math.abs).sort((a, b) => a - b);
    expect(ev[5]).toBeLessThan(1e-9 * ev[11]);
    expect(ev[6]).toBeGreaterThan(1e-6 * ev[11]);
  });

  it('a rod element has zero energy in translation and transverse motion, EA/L along its axis', () => {
    const section = roundBarSection(0.01);
    const { stiffness } = rodElementMatrices([0, 0, 0], [3, 4, 0], section.areaM2, STEEL);
    const e = [0.6, 0.8, 0]; // unit axis of the 3-4-5 triangle
    const ea = (STEEL.youngPa * section.areaM2) / 5;
    const stretch = [-e[0], -e[1], -e[2], e[0], e[1], e[2]]; // unit elongation 2 along the axis
    const f = stretch.map((_, i) => stretch.reduce((s, v, j) => s + stiffness[i * 6 + j] * v, 0));
    // energy ½ uᵀKu = ½ (EA/L) δ², δ = 2 (Hooke's law, common practice)
    expect(stretch.reduce((s, v, i) => s + v * f[i], 0)).toBeCloseTo(ea * 4, 6);
  });
});
