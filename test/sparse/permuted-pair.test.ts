/**
 * The permuted pair (src/sparse/permute.ts, permutedPair) against the assembly it replaced:
 * K and M merged on their union pattern with both value arrays copied (unionPair), then that
 * union permuted with its values carried along (permuteUnion). The old code is kept here,
 * verbatim in substance, as the reference: the new pair must have the same pattern and give
 * the same entries of K, of M and of K − σM, bit for bit, on patterns where K and M agree and
 * where they differ (M outside K, K outside M, empty columns, explicit zeros).
 */
import { describe, expect, it } from 'vitest';
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import { inversePermutation, permutedPair, permutedUpper, shiftedEntry, transposePattern, unionPattern } from '../../src/sparse/permute.js';
import { analyzeShiftedPair } from '../../src/sparse/symbolic.js';
import { chooseOrdering } from '../../src/sparse/ordering/choose-ordering.js';
import { hexGridPair, seededRandom } from './fe-like-matrices.js';

interface OldPair {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
  stiffness: Float64Array;
  mass: Float64Array;
}

/** The former unionPair: sorted row lists of each column merged, both values copied. */
function oldUnionPair(stiffness: SymmetricCsc, mass: SymmetricCsc): OldPair {
  const n = stiffness.n;
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const kv: number[] = [];
  const mv: number[] = [];
  for (let j = 0; j < n; j++) {
    let p = stiffness.colPtr[j];
    let q = mass.colPtr[j];
    const pe = stiffness.colPtr[j + 1];
    const qe = mass.colPtr[j + 1];
    while (p < pe || q < qe) {
      const rk = p < pe ? stiffness.rowIdx[p] : n;
      const rm = q < qe ? mass.rowIdx[q] : n;
      kv.push(rk <= rm ? stiffness.values[p++] : 0);
      mv.push(rm <= rk ? mass.values[q++] : 0);
      rows.push(rk < rm ? rk : rm);
    }
    colPtr[j + 1] = rows.length;
  }
  return { n, colPtr, rowIdx: Int32Array.from(rows), stiffness: Float64Array.from(kv), mass: Float64Array.from(mv) };
}

/** The former permuteUnion: permuted upper part, transposed, values carried through both passes. */
function oldPermuteUnion(u: OldPair, perm: Int32Array): OldPair {
  const { upper, src } = permutedUpper(u, inversePermutation(perm));
  const { lower, map } = transposePattern(upper);
  const kv = new Float64Array(map.length);
  const mv = new Float64Array(map.length);
  for (let q = 0; q < map.length; q++) {
    kv[q] = u.stiffness[src[map[q]]];
    mv[q] = u.mass[src[map[q]]];
  }
  return { n: u.n, colPtr: lower.colPtr, rowIdx: lower.rowIdx, stiffness: kv, mass: mv };
}

/** A random symmetric matrix (lower storage) with about `perColumn` entries below each diagonal. */
function randomSymmetric(n: number, perColumn: number, seed: number, options: { diagonal?: boolean; zeros?: boolean; emptyEvery?: number } = {}): SymmetricCsc {
  const rnd = seededRandom(seed);
  const t = new TripletList(n * (perColumn + 1));
  for (let j = 0; j < n; j++) {
    if (options.emptyEvery && j % options.emptyEvery === 0) continue;
    if (options.diagonal !== false) t.push(j, j, 1 + rnd());
    for (let c = 0; c < perColumn; c++) {
      const i = j + 1 + Math.floor(rnd() * (n - j - 1));
      if (i < n) t.push(i, j, options.zeros && c === 0 ? 0 : rnd() - 0.5);
    }
  }
  return assembleSymmetric(n, t).matrix;
}

function shuffled(n: number, seed: number): Int32Array {
  const rnd = seededRandom(seed);
  const perm = Int32Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const k = Math.floor(rnd() * (i + 1));
    [perm[i], perm[k]] = [perm[k], perm[i]];
  }
  return perm;
}

function expectSamePair(k: SymmetricCsc, m: SymmetricCsc, perm: Int32Array): void {
  const old = oldPermuteUnion(oldUnionPair(k, m), perm);
  const pair = permutedPair(k, m, perm);
  expect(Array.from(pair.colPtr)).toEqual(Array.from(old.colPtr));
  expect(Array.from(pair.rowIdx)).toEqual(Array.from(old.rowIdx));
  const entries = old.rowIdx.length;
  const of = (f: (p: number) => number): number[] => Array.from({ length: entries }, (_, p) => f(p));
  expect(of((p) => (pair.stiffnessAt[p] >= 0 ? k.values[pair.stiffnessAt[p]] : 0))).toEqual(Array.from(old.stiffness));
  expect(of((p) => (pair.massAt[p] >= 0 ? m.values[pair.massAt[p]] : 0))).toEqual(Array.from(old.mass));
  // toEqual tells −0 from +0 (Object.is), so the sums agree bit for bit
  for (const shift of [0, 1.7, -3.25e4]) expect(of((p) => shiftedEntry(pair, p, shift))).toEqual(of((p) => old.stiffness[p] - shift * old.mass[p]));
}

describe('permutedPair (pattern once, values by reference) equals the former copied assembly', () => {
  it('on a hex-grid pair (lumped mass: M inside K)', () => {
    const { stiffness, mass } = hexGridPair(3, 2, 2, 5);
    expectSamePair(stiffness, mass, shuffled(stiffness.n, 11));
    expectSamePair(stiffness, mass, Int32Array.from({ length: stiffness.n }, (_, i) => i));
  });

  it('on patterns where K and M differ both ways, with empty columns and explicit zeros', () => {
    const n = 40;
    const k = randomSymmetric(n, 3, 1, { emptyEvery: 7, zeros: true });
    const m = randomSymmetric(n, 2, 2, { diagonal: false, emptyEvery: 5 });
    // both have entries the other lacks
    const u = unionPattern(k, m);
    expect(u.colPtr[n]).toBeGreaterThan(k.colPtr[n]);
    expect(u.colPtr[n]).toBeGreaterThan(m.colPtr[n]);
    for (const seed of [3, 4, 5]) expectSamePair(k, m, shuffled(n, seed));
    expectSamePair(m, k, shuffled(n, 6));
  });

  it('on an empty mass', () => {
    const k = randomSymmetric(12, 2, 9);
    const m: SymmetricCsc = { n: 12, colPtr: new Int32Array(13), rowIdx: new Int32Array(0), values: new Float64Array(0) };
    expectSamePair(k, m, shuffled(12, 1));
  });

  it('the supernodal analysis takes the tree from the ordering or counts it itself, with the same result', () => {
    const { stiffness, mass } = hexGridPair(4, 3, 3, 8);
    const order = chooseOrdering(stiffness, mass, { ordering: 'amd' });
    expect(order.tree).toBeDefined();
    const given = analyzeShiftedPair(stiffness, mass, order.perm, order.tree);
    const counted = analyzeShiftedPair(stiffness, mass, order.perm);
    expect(Array.from(given.perm)).toEqual(Array.from(counted.perm));
    expect(Array.from(given.superStart)).toEqual(Array.from(counted.superStart));
    expect(Array.from(given.rows)).toEqual(Array.from(counted.rows));
    expect(given.nnzL).toBe(counted.nnzL);
    expect(given.nnzL).toBe(order.predictedNnzL);
  });

  it('the same when K and M each have entries the other lacks (the ordering\'s graph is their union)', () => {
    const stiffness = randomSymmetric(40, 3, 11);
    const mass = randomSymmetric(40, 2, 12);
    const order = chooseOrdering(stiffness, mass, { ordering: 'amd' });
    expect(order.tree).toBeDefined();
    const given = analyzeShiftedPair(stiffness, mass, order.perm, order.tree);
    const counted = analyzeShiftedPair(stiffness, mass, order.perm);
    expect(Array.from(given.superStart)).toEqual(Array.from(counted.superStart));
    expect(Array.from(given.rows)).toEqual(Array.from(counted.rows));
    expect(given.nnzL).toBe(counted.nnzL);
    expect(given.nnzL).toBe(order.predictedNnzL);
  });
});
