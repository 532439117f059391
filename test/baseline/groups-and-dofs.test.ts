/**
 * Comparison when things change around the modes (src/model/compare-baseline.ts):
 *  - principal angles between two spans (Björck & Golub 1973) against ml-matrix: QR of each
 *    block, then the singular values of Q_BᵀQ_C (outside the project);
 *  - a degenerate pair (two identical uncoupled chains: every eigenvalue twice, ml-matrix modes)
 *    whose partners come back rotated by 45° inside the eigenspace: single MAC 1/2 (definition,
 *    cos² 45°), group subspace MAC 1; when one side's solve cut the pair at its highest mode the
 *    pair compared without its partner still matches as a subspace and the partner is neither
 *    new nor lost;
 *  - DOFs added without DOF maps: modes pair by frequency order, frequency-drift still runs and
 *    measures 100 (f₁ − f₀)/f₀ from the two exact solutions, the shape rules skip with the reason;
 *  - with DOF maps on both sides an added DOF (new node) only shrinks the compared set, and a
 *    model whose DOFs are permuted (K, M and DOF map consistently) compares as the same model:
 *    MAC 1 on the diagonal (definition), drift 0, matched by node and component.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Matrix, QrDecomposition, SingularValueDecomposition } from 'ml-matrix';
import { chainContext, exactModes, sparseFromDense, springChain, type Chain } from '../rules/fake-model.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';
import type { DofMap } from '../../src/io/dof-map.js';
import { loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { compareWithBaseline } from '../../src/model/compare-baseline.js';
import type { ComparisonFacts } from '../../src/model/comparison-facts.js';
import { principalAngleCosines, shapeProducts } from '../../src/model/mac.js';
import { permuteSymmetric } from '../../src/sparse/permute.js';
import { findRule } from '../../src/rules/registry.js';
import { runRules, type ResolvedRule } from '../../src/rules/engine.js';

const dir = mkdtempSync(join(tmpdir(), 'modalgate-groups-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function columns(values: Float64Array, rows: number, cols: number): Matrix {
  return new Matrix(Array.from({ length: rows }, (_r, i) => Array.from({ length: cols }, (_c, j) => values[j * rows + i])));
}

/** Two identical fixed–free chains side by side (no coupling): K and M block diagonal. */
function twinChains(masses: number[]): Chain {
  const one = springChain(masses.length, 1000, masses, 1000);
  const n = masses.length;
  const denseK = Array.from({ length: 2 * n }, (_r, i) => Array.from({ length: 2 * n }, (_c, j) => (Math.floor(i / n) === Math.floor(j / n) ? one.denseK[i % n][j % n] : 0)));
  const all = [...masses, ...masses];
  return { stiffness: sparseFromDense(denseK), mass: sparseFromDense(all.map((m, i) => all.map((_, j) => (i === j ? m : 0)))), denseK, masses: all };
}

/** The first `count` modes with each degenerate pair (2k, 2k+1) turned by 45° inside its eigenspace. */
function rotatedPairs(modes: ModesResult, count: number): ModesResult {
  const n = modes.n, s = Math.SQRT1_2;
  const shapes = new Float64Array(n * count);
  // ψ_2k = (φ_2k + φ_2k+1)/√2, ψ_2k+1 = (φ_2k − φ_2k+1)/√2
  for (let c = 0; c < count; c++) {
    const a = c - (c % 2), sign = c % 2 === 0 ? 1 : -1;
    for (let i = 0; i < n; i++) shapes[c * n + i] = s * (modes.shapes[a * n + i] + sign * modes.shapes[(a + 1) * n + i]);
  }
  return { ...modes, eigenvalues: modes.eigenvalues.slice(0, count), frequenciesHz: modes.frequenciesHz.slice(0, count), residuals: modes.residuals.slice(0, count), shapes };
}

function first(modes: ModesResult, count: number): ModesResult {
  return { ...modes, eigenvalues: modes.eigenvalues.slice(0, count), frequenciesHz: modes.frequenciesHz.slice(0, count), residuals: modes.residuals.slice(0, count), shapes: modes.shapes.slice(0, modes.n * count) };
}

async function compare(name: string, chain: Chain, before: ModesResult, after: ModesResult, options: { afterMass?: Chain['mass']; beforeMap?: DofMap; afterMap?: DofMap } = {}): Promise<ComparisonFacts> {
  await saveBaseline(dir, { model: name, modes: before, mass: chain.mass, dofMap: options.beforeMap });
  return compareWithBaseline((await loadBaseline(dir, name))!, { modes: after, mass: options.afterMass ?? chain.mass, dofMap: options.afterMap });
}

function run(chain: Chain, facts: ComparisonFacts, modes: ModesResult) {
  const rules: ResolvedRule[] = ['frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes'].map((id) => ({ rule: findRule(id)!, severity: 'error', options: { ...(findRule(id)!.defaults as object) } }));
  return Object.fromEntries(runRules({ ...chainContext(chain, modes), comparison: facts }, rules).map((r) => [r.ruleId, r]));
}

function chainMap(nodes: number[]): DofMap {
  const n = nodes.length;
  return { n, node: Int32Array.from(nodes), component: new Uint8Array(n), x: Float64Array.from(nodes), y: new Float64Array(n), z: new Float64Array(n) };
}

describe('principal angles between spans', () => {
  it('equal the singular values of Q_BᵀQ_C (ml-matrix QR and SVD), plain and mass-weighted', () => {
    const rows = 9, kb = 3, kc = 2;
    const b = Float64Array.from({ length: rows * kb }, (_v, k) => Math.sin(1.7 * k + 0.3) + 0.2 * Math.cos(5 * k));
    const c = Float64Array.from({ length: rows * kc }, (_v, k) => Math.cos(1.1 * k + 0.5) + (k % rows === 2 ? 0.8 : 0));
    const masses = Array.from({ length: rows }, (_v, i) => 1 + 0.25 * i);
    const weight = sparseFromDense(masses.map((m, i) => masses.map((_, j) => (i === j ? m : 0))));
    for (const w of [undefined, weight]) {
      const ours = principalAngleCosines(shapeProducts({ rows, cols: kb, values: b }, { rows, cols: kc, values: c }, w), [0, 1, 2], [0, 1]);
      // W = diag(m): the W-angles of X are the plain angles of diag(√m) X
      const scale = (x: Float64Array, k: number): Matrix => {
        const m = columns(x, rows, k);
        if (w) for (let i = 0; i < rows; i++) for (let j = 0; j < k; j++) m.set(i, j, m.get(i, j) * Math.sqrt(masses[i]));
        return m;
      };
      const qb = new QrDecomposition(scale(b, kb)).orthogonalMatrix.subMatrix(0, rows - 1, 0, kb - 1);
      const qc = new QrDecomposition(scale(c, kc)).orthogonalMatrix.subMatrix(0, rows - 1, 0, kc - 1);
      const reference = new SingularValueDecomposition(qb.transpose().mmul(qc)).diagonal.sort((x, y) => y - x);
      expect(ours).toHaveLength(2);
      ours.forEach((v, k) => expect(v).toBeCloseTo(reference[k], 12));
      expect(ours[1]).toBeLessThan(0.999); // a case with a real angle
    }
  });
});

describe('degenerate pairs', () => {
  const twins = twinChains([1, 1.3, 0.8]);
  const all = exactModes(twins); // ml-matrix: every frequency twice
  it('a pair returned rotated inside its eigenspace matches as a group (subspace MAC 1, single MAC 1/2)', async () => {
    const facts = await compare('rotated', twins, all, rotatedPairs(all, 6));
    expect(facts.baselineGroups).toEqual([[1, 2], [3, 4], [5, 6]]);
    expect(facts.groupMatches).toHaveLength(3);
    for (const g of facts.groupMatches) {
      expect(g.cut).toBe(false);
      g.cosines.forEach((c) => expect(c).toBeCloseTo(1, 10));
    }
    for (const p of facts.pairs) {
      expect(p.mac).toBeCloseTo(0.5, 10); // cos² 45°
      expect(p.correlation).toBeCloseTo(1, 10);
      expect(p.group).not.toBeNull();
    }
    const byId = run(twins, facts, rotatedPairs(all, 6));
    expect(byId['mode-shape-match'].status).toBe('pass');
    expect(byId['mode-swap'].status).toBe('pass');
  });
  it('a pair cut by the current solve is compared as a subspace and its partner is not lost', async () => {
    const current = rotatedPairs(all, 4).shapes; // modes 1–4 turned; keep modes 1–3
    const cut = first({ ...all, shapes: current }, 3);
    const facts = await compare('cut-current', twins, first(all, 4), cut);
    const g = facts.groupMatches.find((x) => x.baselineModes.includes(3))!;
    expect(g).toMatchObject({ baselineModes: [3, 4], currentModes: [3], cut: true });
    expect(g.cosines[0]).toBeCloseTo(1, 10);
    const p = facts.pairs.find((x) => x.currentMode === 3)!;
    expect(p.mac).toBeCloseTo(0.5, 10); // the pair compared without its partner
    expect(p.correlation).toBeCloseTo(1, 10);
    expect(facts.lostModes).toMatchObject([{ cutGroup: true, withinCompared: false }]);
    const byId = run(twins, facts, cut);
    expect(byId['new-or-lost-modes'].status).toBe('pass');
    expect(byId['mode-shape-match'].status).toBe('pass');
  });
  it('a pair cut by the baseline save is not new in the current solve', async () => {
    const current = rotatedPairs(all, 4);
    const facts = await compare('cut-baseline', twins, first(all, 3), current);
    expect(facts.groupMatches.find((x) => x.currentModes.includes(3))).toMatchObject({ baselineModes: [3], currentModes: [3, 4], cut: true });
    expect(facts.newModes).toMatchObject([{ cutGroup: true, withinCompared: false }]);
    expect(run(twins, facts, current)['new-or-lost-modes'].status).toBe('pass');
  });
});

describe('added or removed DOFs', () => {
  const before = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.2], 1000);
  const after = springChain(7, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.2, 0.5], 1000);
  const m0 = exactModes(before), m1 = exactModes(after, 6);
  it('without DOF maps: modes pair by frequency order, frequency-drift runs, shape rules skip with the reason', async () => {
    const facts = await compare('added', before, m0, m1, { afterMass: after.mass });
    expect(facts.pairedBy).toBe('frequency order');
    expect(facts.baseline).toMatchObject({ numberingCheck: 'none', dofsCompared: 0, dofsAdded: 1 });
    expect(facts.pairs.map((p) => [p.baselineMode, p.currentMode])).toEqual([[1, 1], [2, 2], [3, 3], [4, 4], [5, 5], [6, 6]]);
    for (const p of facts.pairs) {
      const f0 = m0.frequenciesHz[p.baselineMode - 1], f1 = m1.frequenciesHz[p.currentMode - 1];
      expect(p.changePercent!).toBeCloseTo((100 * (f1 - f0)) / f0, 10);
    }
    const byId = run(after, facts, m1);
    const reason = 'the baseline has 6 DOFs and the model now 7, and neither side has a DOF map, so DOFs cannot be matched and the shapes cannot be compared';
    // frequency-drift judges the frequency-order pairs against its default ±5 % (docs/sources.md §1b)
    expect(byId['frequency-drift'].status).toBe(facts.pairs.some((p) => Math.abs(p.changePercent!) > 5) ? 'fail' : 'pass');
    expect(byId['frequency-drift'].message).toContain(`Modes paired by frequency order: ${reason}.`);
    expect((byId['frequency-drift'].details as { pairedBy: string }).pairedBy).toBe('frequency order');
    for (const id of ['mode-shape-match', 'mode-swap', 'new-or-lost-modes']) {
      expect(byId[id].status).toBe('skip');
      expect(byId[id].message).toBe(`not evaluated: ${reason}.`);
    }
  });
  it('with DOF maps: shapes are compared on the DOFs both sides have, matched by node and component', async () => {
    // the new mass becomes node 99, placed first in the new numbering
    const facts = await compare('added-map', before, m0, m1, { afterMass: after.mass, beforeMap: chainMap([1, 2, 3, 4, 5, 6]), afterMap: chainMap([1, 2, 3, 4, 5, 6, 99]) });
    expect(facts.pairedBy).toBe('shapes');
    expect(facts.baseline).toMatchObject({ numberingCheck: 'node and component', dofsCompared: 6, dofsAdded: 1, dofsRemoved: 0 });
    expect(facts.mac.values).toHaveLength(36);
    expect(run(after, facts, m1)['frequency-drift'].status).not.toBe('skip');
  });
  it('with DOF maps: a permuted numbering is not a change (MAC 1 on the diagonal, drift 0)', async () => {
    const perm = Int32Array.from([3, 0, 5, 1, 4, 2]); // new DOF k = old DOF perm[k]
    const dense = before.denseK.map((_r, i) => before.denseK.map((_c, j) => before.denseK[perm[i]][perm[j]]));
    const masses = Array.from(perm, (p) => before.masses[p]);
    const permuted: Chain = { stiffness: permuteSymmetric(before.stiffness, perm), mass: permuteSymmetric(before.mass, perm), denseK: dense, masses };
    expect(Array.from(permuted.mass.values)).toEqual(masses); // the convention of permuteSymmetric, checked
    const m2 = exactModes(permuted);
    const facts = await compare('permuted', before, m0, m2, { afterMass: permuted.mass, beforeMap: chainMap([11, 12, 13, 14, 15, 16]), afterMap: chainMap(Array.from(perm, (p) => 11 + p)) });
    expect(facts.baseline).toMatchObject({ numberingCheck: 'node and component', dofsCompared: 6, dofsAdded: 0, dofsRemoved: 0, renumbered: true });
    for (const p of facts.pairs) {
      expect(p.baselineMode).toBe(p.currentMode);
      expect(p.mac!).toBeCloseTo(1, 12);
      expect(p.changePercent!).toBeCloseTo(0, 10);
    }
    const byId = run(permuted, facts, m2);
    for (const id of ['frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes']) expect(byId[id].status).toBe('pass');
  });
});
