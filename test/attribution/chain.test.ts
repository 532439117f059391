/**
 * Attribution against closed forms on a spring–mass chain (dense reference modes from
 * ml-matrix, outside the project).
 *
 * Reference: the eigenvalue derivative of a symmetric pencil with mass-normalized φ,
 *     dλ/dp = φᵀ(∂K/∂p − λ ∂M/∂p)φ
 * (R. L. Fox and M. P. Kapoor, "Rates of change of eigenvectors and eigenvalues", AIAA Journal
 * 6(12), 1968; docs/sources.md §2b). K and M are linear in a spring's stiffness k_s and a mass
 * m_j, so the first-order estimate of a change δp is exactly δp · dλ/dp: for spring s between
 * masses s − 1 and s, dλ/dk_s = (φ_s − φ_{s−1})²; for mass j, dλ/dm_j = −λ φ_j².
 */
import { describe, expect, it } from 'vitest';
import { denseModes } from '../model/helpers.js';
import { explainAgainst, springChain } from './chain-helpers.js';

const springs = [900, 700, 1200, 500, 800, 1000];
const masses = [1.5, 1.0, 2.0, 1.2, 0.8, 1.1];
const base = springChain(springs, masses);
const baseModes = denseModes(base.stiffness, base.mass);

describe('attribution on a spring–mass chain (closed forms, Fox & Kapoor 1968)', () => {
  it('a stiffness change of one spring: estimate = δk (φ_s − φ_{s−1})², 100 % on its two nodes, all stiffness', async () => {
    const s = 3, dk = 0.02 * springs[s];
    const after = springChain(springs.map((k, i) => (i === s ? k + dk : k)), masses);
    const { changes } = await explainAgainst(base, baseModes, after, denseModes(after.stiffness, after.mass));
    const a = changes.attribution!;
    expect(a.split).toBe(true);
    expect(a.regionsFrom).toBe('change map');
    expect(changes.changeMap!.changedNodes).toBe(2);
    expect(a.regions).toHaveLength(1);
    expect(a.regions[0].nodeRanges).toEqual([[s, s + 1]]); // nodes s (mass s − 1) and s + 1 (mass s)
    expect(a.modes).toHaveLength(baseModes.eigenvalues.length);
    for (const m of a.modes) {
      const k = m.baselineMode - 1;
      const phi = (i: number): number => baseModes.shapes[k * base.stiffness.n + i];
      const analytic = dk * (phi(s) - phi(s - 1)) ** 2;
      expect(Math.abs(m.estimatedDelta - analytic)).toBeLessThanOrEqual(1e-12 * Math.abs(baseModes.eigenvalues[k]));
      // the parts of all nodes sum to the estimate
      const sum = m.regions.reduce((t, r) => t + r.deltaEigenvalue, 0) + m.elsewhere.deltaEigenvalue;
      expect(Math.abs(sum - m.estimatedDelta)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(m.estimatedDelta)));
      // 100 % up to the reference modes' own residual ((K₀ − λM₀)φ is not exactly 0 on the untouched rows)
      expect(m.regions[0].share).toBeCloseTo(1, 10);
      expect(Math.abs(m.elsewhere.share)).toBeLessThanOrEqual(1e-10);
      expect(m.regions[0].stiffnessDelta! / m.regions[0].deltaEigenvalue).toBeCloseTo(1, 10);
      expect(Math.abs(m.regions[0].massDelta!)).toBeLessThanOrEqual(1e-9 * Math.abs(m.estimatedDelta));
      expect(m.topNodes.slice(0, 2).map((t) => t.node).sort()).toEqual([s, s + 1]);
    }
  });

  it('a mass change is reported as mass: estimate = −λ δm φ_j², on node j alone', async () => {
    const j = 2, dm = 0.01 * masses[j];
    const after = springChain(springs, masses.map((m, i) => (i === j ? m + dm : m)));
    const { changes } = await explainAgainst(base, baseModes, after, denseModes(after.stiffness, after.mass));
    const a = changes.attribution!;
    expect(changes.changeMap!.nodes.map((n) => [n.node, n.change])).toEqual([[j + 1, 'mass']]);
    expect(a.modes).toHaveLength(baseModes.eigenvalues.length);
    for (const m of a.modes) {
      const k = m.baselineMode - 1;
      const lambda = baseModes.eigenvalues[k];
      const analytic = -lambda * dm * baseModes.shapes[k * base.stiffness.n + j] ** 2;
      expect(Math.abs(m.estimatedDelta - analytic)).toBeLessThanOrEqual(1e-12 * lambda);
      expect(m.regions[0].share).toBeCloseTo(1, 10);
      expect(m.regions[0].massDelta! / m.estimatedDelta).toBeCloseTo(1, 10);
      expect(Math.abs(m.regions[0].stiffnessDelta!)).toBeLessThanOrEqual(1e-9 * Math.abs(m.estimatedDelta));
    }
  });

  it('shares sum to the estimate to 1e-12 when both a spring and a mass change; the split adds up', async () => {
    const after = springChain(springs.map((k, i) => (i === 1 ? k * 1.01 : k)), masses.map((m, i) => (i === 4 ? m * 1.02 : m)));
    const { changes } = await explainAgainst(base, baseModes, after, denseModes(after.stiffness, after.mass));
    for (const m of changes.attribution!.modes) {
      const all = [...m.regions, m.elsewhere];
      const total = all.reduce((t, r) => t + r.share, 0);
      expect(Math.abs(total - 1)).toBeLessThanOrEqual(1e-12);
      for (const r of all) expect(Math.abs(r.stiffnessDelta! + r.massDelta! - r.deltaEigenvalue)).toBeLessThanOrEqual(1e-12 * Math.abs(m.eigenvalue));
    }
  });

  it('an older baseline without M₀φ still attributes, without the split, and says what is missing', async () => {
    const after = springChain(springs.map((k, i) => (i === 3 ? k * 1.02 : k)), masses);
    const { changes } = await explainAgainst(base, baseModes, after, denseModes(after.stiffness, after.mass), { massShapes: false, fingerprints: false });
    const a = changes.attribution!;
    expect(a.split).toBe(false);
    expect(a.regionsFrom).toBe('shares');
    expect(a.missing.join(' ')).toMatch(/no M₀φ/);
    expect(changes.changeMap).toBeNull();
    expect(changes.changeMapMissing).toMatch(/fingerprints/);
    expect(a.modes[0].regions[0].stiffnessDelta).toBeNull();
    expect(a.regions[0].nodeRanges).toEqual([[3, 4]]);
  });
});
