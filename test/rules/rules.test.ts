import { describe, expect, it } from 'vitest';
import { rigidBodyModes } from '../../src/rules/rigid-body-modes.js';
import { firstElasticFrequency } from '../../src/rules/first-elastic-frequency.js';
import { modeFrequencies } from '../../src/rules/mode-frequencies.js';
import { massNormalization } from '../../src/rules/mass-normalization.js';
import { massOrthogonality } from '../../src/rules/mass-orthogonality.js';
import { stiffnessOrthogonality } from '../../src/rules/stiffness-orthogonality.js';
import { eigenResidual } from '../../src/rules/eigen-residual.js';
import { modesComplete } from '../../src/rules/modes-complete.js';
import { matrixSymmetry } from '../../src/rules/matrix-symmetry.js';
import { matrixFinite } from '../../src/rules/matrix-finite.js';
import { diagonalSanity } from '../../src/rules/diagonal-sanity.js';
import { conditioning } from '../../src/rules/conditioning.js';
import { cutoffDefaults, splitRigidBodyModes } from '../../src/model/rigid-body-split.js';
import { chainContext, cleanSummary, exactModes, lineDofMap, modesWithFrequencies, sparseFromDense, springChain } from './fake-model.js';

const k = 1000;
const m = 2;
const n = 6;
/** Free–free chain of n equal masses: λ_j = (4k/m) sin²(jπ/(2n)), j = 0…n−1 — exact discrete result, CRITERIA.md §7 [V]. */
const chainLambda = (j: number) => ((4 * k) / m) * Math.sin((j * Math.PI) / (2 * n)) ** 2;
const hz = (lambda: number) => Math.sqrt(lambda) / (2 * Math.PI);

function freeChain() {
  const chain = springChain(n, k, new Array<number>(n).fill(m));
  return { chain, modes: exactModes(chain) };
}

describe('rigid-body-modes', () => {
  const six = [1e-7, -2e-7, 3e-7, 1e-6, 2e-6, 4e-6];
  it('passes with six near-zero modes below 1e-4 × the first elastic frequency (ECSS separation, [S])', () => {
    const ctx = { ...chainContext(freeChain().chain), modes: modesWithFrequencies([...six, 12.3, 15, 40]) };
    const o = rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, expected: 6 });
    expect(o.status).toBe('pass');
    expect(o.measured).toBe(6);
  });
  it('says plainly that an extra near-zero mode is a mechanism', () => {
    const ctx = { ...chainContext(freeChain().chain), modes: modesWithFrequencies([...six, 5e-6, 12.3, 15]) };
    const o = rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, expected: 6 });
    expect(o.status).toBe('fail');
    expect(o.message).toContain('7 modes below 0.0001 × the first elastic frequency (12.3 Hz), expected 6');
    expect(o.message).toContain('mechanism or an unintended free part');
  });
  it('uses the absolute 0.005 Hz cutoff when asked (ECSS d, [S])', () => {
    const ctx = { ...chainContext(freeChain().chain), modes: modesWithFrequencies([...six, 0.004, 12.3]) };
    const o = rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, cutoffBasis: 'hz', expected: 6 });
    expect(o.message).toMatch(/^7 modes below 0.005 Hz, expected 6: the model has a mechanism/);
  });
  it('reports grounding when there are too few, and accepts a range', () => {
    const ctx = { ...chainContext(freeChain().chain), modes: modesWithFrequencies([1e-7, 2e-7, 3.1, 12.3]) };
    expect(rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, expected: 6 }).message).toContain('grounded');
    expect(rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, min: 1, max: 3 }).status).toBe('pass');
  });
  it('is an error, not a pass, when every solved mode is rigid', () => {
    const ctx = { ...chainContext(freeChain().chain), modes: modesWithFrequencies([1e-7, 2e-7, 3e-7]) };
    expect(rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, expected: 6 }).status).toBe('fail');
    expect(rigidBodyModes.evaluate(ctx, { ...cutoffDefaults, expected: 3 }).status).toBe('error');
  });
  it('finds the single rigid-body mode of a free–free chain solved by a reference eigensolver', () => {
    const { chain, modes } = freeChain();
    const o = rigidBodyModes.evaluate(chainContext(chain, modes), { ...cutoffDefaults, expected: 1 });
    expect(o.status).toBe('pass');
  });
});

describe('rigid-body split', () => {
  it('falls back to the absolute cutoff when no separation gap exists (supported model)', () => {
    const s = splitRigidBodyModes(Float64Array.from([3.2, 7.7, 12]), cutoffDefaults);
    expect(s).toMatchObject({ count: 0, firstElasticIndex: 0, basis: 'hz', fellBack: true });
  });
  it('puts the split at the highest gap', () => {
    const s = splitRigidBodyModes(Float64Array.from([0, 1e-9, 2e-6, 10, 11]), cutoffDefaults);
    expect(s.count).toBe(3);
    expect(s.cutoffHz).toBeCloseTo(1e-3, 12);
  });
});

describe('first-elastic-frequency', () => {
  it('measures the first elastic mode of a free–free chain against the exact formula', () => {
    const { chain, modes } = freeChain();
    const exact = hz(chainLambda(1));
    const pass = firstElasticFrequency.evaluate(chainContext(chain, modes), { ...cutoffDefaults, minHz: exact * 0.99 });
    expect(pass.status).toBe('pass');
    // relative agreement of the reference eigensolver with the closed form (exact discrete result)
    expect(Math.abs((pass.measured as number) - exact) / exact).toBeLessThan(1e-12);
    const fail = firstElasticFrequency.evaluate(chainContext(chain, modes), { ...cutoffDefaults, minHz: exact * 1.01 });
    expect(fail.status).toBe('fail');
    expect(fail.message).toContain('below the required minimum');
    expect(firstElasticFrequency.evaluate(chainContext(chain, modes), { ...cutoffDefaults, minHz: 0, maxHz: exact * 0.5 }).status).toBe('fail');
  });
});

describe('mode-frequencies', () => {
  it('checks listed modes within ± tolerance % (default 5 %, [M] CRITERIA.md §1b)', () => {
    const { chain, modes } = freeChain();
    const f3 = hz(chainLambda(2));
    const ctx = chainContext(chain, modes);
    expect(modeFrequencies.evaluate(ctx, { tolerancePercent: 5, targets: [{ mode: 3, hz: f3 * 1.04 }] }).status).toBe('pass');
    const o = modeFrequencies.evaluate(ctx, { tolerancePercent: 5, targets: [{ mode: 3, hz: f3 * 1.1 }] });
    expect(o.status).toBe('fail');
    expect(o.message).toContain('mode 3');
    expect(modeFrequencies.evaluate(ctx, { tolerancePercent: 5, targets: [] }).status).toBe('skip');
    expect(modeFrequencies.evaluate(ctx, { tolerancePercent: 5, targets: [{ mode: 99, hz: 1 }] }).status).toBe('error');
  });
});

describe('verification rules on reference modes', () => {
  const chain = springChain(5, 300, [1, 2, 3, 1.5, 0.5], 50); // grounded chain, unequal masses
  const exact = exactModes(chain);
  const ctx = chainContext(chain, exact);

  it('pass on modes from a reference eigensolver (ml-matrix)', () => {
    for (const rule of [massNormalization, massOrthogonality, stiffnessOrthogonality, eigenResidual]) {
      const o = rule.evaluate(ctx, rule.defaults as never);
      expect(o.status, `${rule.id}: ${o.message}`).toBe('pass');
    }
  });
  it('mass-normalization fails on a shape scaled by 1.01 (φᵀMφ = 1.0201)', () => {
    const modes = exactModes(chain);
    for (let r = 0; r < 5; r++) modes.shapes[2 * 5 + r] *= 1.01;
    const o = massNormalization.evaluate(chainContext(chain, modes), { tolerance: 1e-6 });
    expect(o.status).toBe('fail');
    expect(o.measured as number).toBeCloseTo(0.0201, 10);
    expect(o.message).toContain('mode 3');
  });
  it('mass-orthogonality fails when a shape is mixed with another', () => {
    const modes = exactModes(chain);
    // φ₂ ← cos t φ₂ + sin t φ₁ keeps unit modal mass; φ₁ᵀMφ₂ = sin t
    const t = 1e-3;
    for (let r = 0; r < 5; r++) modes.shapes[5 + r] = Math.cos(t) * modes.shapes[5 + r] + Math.sin(t) * modes.shapes[r];
    const o = massOrthogonality.evaluate(chainContext(chain, modes), { tolerance: 1e-6 });
    expect(o.status).toBe('fail');
    expect(o.measured as number).toBeCloseTo(Math.sin(t), 9);
    expect(stiffnessOrthogonality.evaluate(chainContext(chain, modes), { tolerance: 1e-6 }).status).toBe('fail');
  });
  it('eigen-residual fails when an eigenvalue is off by 1e-4 relative', () => {
    const modes = exactModes(chain);
    modes.eigenvalues[1] *= 1 + 1e-4;
    const o = eigenResidual.evaluate(chainContext(chain, modes), { tolerance: 1e-8 });
    expect(o.status).toBe('fail');
    expect(o.message).toContain('mode 2');
  });
  it('modes-complete follows the Sturm count', () => {
    const modes = exactModes(chain);
    expect(modesComplete.evaluate(chainContext(chain, modes), {}).status).toBe('pass');
    modes.sturm = { ...modes.sturm, countBelow: modes.sturm.modesReturned + 1 };
    const o = modesComplete.evaluate(chainContext(chain, modes), {});
    expect(o.status).toBe('fail');
    expect(o.message).toContain('1 mode(s) below the last returned mode were missed');
  });
});

describe('matrix rules', () => {
  const chain = springChain(6, 10, new Array<number>(6).fill(1));
  it('matrix-symmetry fails above 1e-12 relative ([CP]) and names the place', () => {
    const ctx = chainContext(chain);
    ctx.stiffnessSummary = cleanSummary('K.mtx', 6, { symmetry: 'general', maxRelativeAsymmetry: 3e-9, asymmetryAt: { row: 4, col: 2 } });
    const o = matrixSymmetry.evaluate(ctx, { tolerance: 1e-12 });
    expect(o.status).toBe('fail');
    expect(o.message).toContain('row 4, column 2');
    expect(matrixSymmetry.evaluate(chainContext(chain), { tolerance: 1e-12 }).status).toBe('pass');
  });
  it('matrix-finite counts non-finite entries', () => {
    const ctx = chainContext(chain);
    ctx.massSummary = cleanSummary('M.mtx', 6, { nonFiniteCount: 2 });
    expect(matrixFinite.evaluate(ctx, {})).toMatchObject({ status: 'fail', measured: 2 });
  });
  it('diagonal-sanity names DOFs by node and component when a DOF map is given', () => {
    // DOF 6 has mass but no stiffness; DOFs 4 and 5 have stiffness but no mass
    const k6 = springChain(5, k, [1, 1, 1, 1, 1]).denseK.map((row) => [...row, 0]);
    k6.push([0, 0, 0, 0, 0, 0]);
    const masses = [1, 1, 1, 0, 0, 1];
    const ctx = chainContext({ stiffness: sparseFromDense(k6), mass: sparseFromDense(masses.map((v, i) => masses.map((_, j) => (i === j ? v : 0)))), denseK: k6, masses }, undefined, lineDofMap(6));
    const o = diagonalSanity.evaluate(ctx, diagonalSanity.defaults);
    expect(o.status).toBe('fail');
    expect(o.message).toContain('1 DOF(s) with zero stiffness diagonal: node 2 uz (dof 6)');
    expect(o.message).toContain('2 massless translational DOF(s): node 2 ux (dof 4) and node 2 uy (dof 5)');
    // no map, 6 DOFs: 6 per node assumed, so DOFs 4 and 5 are rx and ry (allowed by default)
    const noMap = diagonalSanity.evaluate({ ...ctx, dofMap: undefined }, diagonalSanity.defaults);
    expect(noMap.message).toBe('1 DOF(s) with zero stiffness diagonal: dof 6 (no DOF map: assumed 6 DOFs per node in the order ux uy uz rx ry rz).');
  });
  it('conditioning compares the pivot drop |diagonal / pivot| with 1e7 ([M])', () => {
    const modes = exactModes(chain);
    const ctx = chainContext(chain, modes, lineDofMap(6));
    expect(conditioning.evaluate(ctx, { maxPivotDrop: 1e7 }).status).toBe('pass');
    modes.factor = { ...modes.factor, maxDiagonalToPivotRatio: 3e9, maxRatioDof: 2 };
    const o = conditioning.evaluate(ctx, { maxPivotDrop: 1e7 });
    expect(o.status).toBe('fail');
    expect(o.message).toContain('node 1 uz (dof 3)');
    expect(o.message).toContain('about 9 digits');
  });
});
