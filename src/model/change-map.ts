/**
 * Change map: which nodes' rows of K and M changed since the baseline, without any solve.
 *
 * Fingerprint of a node p in a matrix A (K or M): an order-free 64-bit sum, over every entry
 * a_ij of the full symmetric matrix with row i a DOF of p, of a hash of
 *     (key(i), key(j), q(a_ij)),
 * where key(d) names DOF d by where it is and what it is — the bit patterns of its node's
 * coordinates and its component (or its index, without a DOF map) — and q quantizes a value to
 * 28 bits of mantissa (relative rounding).
 *
 * Two grids, one per 32-bit lane. Any fixed grid has boundaries: two exports of the same model
 * whose values differ by round-off (another assembly order after renumbering) quantize apart
 * whenever a value sits within that round-off of a boundary — with ~1e-16 relative round-off and
 * 28 bits, about one entry in 10⁷, so somewhere in a 100k-DOF model. Lane A rounds to nearest
 * (boundaries at half steps; an exponent step at a power of two is folded, so 2^e(1−ε) and
 * 2^e(1+ε) round alike); lane B truncates (boundaries at whole steps, half a step from A's). A
 * value within round-off of an A boundary is half a step from every B boundary, so a node whose
 * rows only carry round-off keeps at least one lane equal unless two of its entries sit at
 * boundaries of both grids (probability about the square of the one-grid figure per node). A
 * node counts as changed only when both lanes differ; a real change alters both lanes' hashes,
 * and goes unseen only when one lane's 32-bit sum collides (about 2·2⁻³² per changed node).
 *
 * Entries below 1e-13 of the matrix's largest |entry| count as zero (assembly round-off), so they
 * change neither pattern nor values. Both quantizations read the IEEE 754 bits (no log, no
 * power). Summing hashes (mod 2³² per lane) makes the fingerprint independent of the order of
 * rows, columns and entries: a renumbered model (node ids or DOF order) with the same physics
 * gives the same fingerprints; a changed value, an added or removed entry, or a moved node
 * changes them. A relative change below about 4e-9 (28 bits) can go unseen.
 *
 * Comparison: baseline nodes meet current nodes by node id, or by position when that matches
 * more nodes (node ids renumbered too; coincident nodes match nothing); without DOF maps,
 * DOF d is node d+1 and nodes meet by index when the DOF counts agree. Matched nodes whose
 * fingerprints differ are changed (in stiffness, mass or both); unmatched current nodes are
 * added, unmatched baseline nodes removed. Changed and added nodes are grouped into connected
 * regions: two nodes are linked when K or M of the model now has an entry between their DOFs
 * (union–find over the stored entries, O(nnz)).
 */
import type { DofMap } from '../io/dof-map.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import { nodeIndexOf, type NodeIndex } from './node-index.js';
import { centroid, connectedRegions, nodeCoordinates, nodeRanges, regionLabel } from './node-regions.js';
import type { ChangeMapFacts, ChangeRegion, ChangedNode } from './change-facts.js';
import { matchUniqueKeys } from './unique-key-match.js';

/** Entries below this share of the matrix's largest |entry| count as zero (our choice). */
const ZERO_SHARE = 1e-13;
/** Mantissa bits kept by the relative rounding (our choice: about 8.4 significant digits). */
const MANTISSA_BITS = 28;

/** Per node (in NodeIndex order): stiffness and mass fingerprints, two 32-bit lanes each. */
export interface NodeFingerprints {
  /** Node ids, ascending (DOF number for a model without a DOF map). */
  nodes: Int32Array;
  /** Lanes [a0, b0, a1, b1, …] per node. */
  stiffness: Uint32Array;
  mass: Uint32Array;
}

export function nodeFingerprints(stiffness: SymmetricCsc, mass: SymmetricCsc, dofMap?: DofMap): NodeFingerprints {
  const index = nodeIndexOf(stiffness.n, dofMap);
  const keys = dofKeys(stiffness.n, dofMap);
  return { nodes: index.ids, stiffness: matrixFingerprints(stiffness, index, keys), mass: matrixFingerprints(mass, index, keys) };
}

/** Two 32-bit keys per DOF: hash of (x, y, z bit patterns, component), or of the index. */
function dofKeys(n: number, map?: DofMap): Uint32Array {
  const keys = new Uint32Array(2 * n);
  const bits = new Uint32Array(new Float64Array(3).buffer);
  const f = new Float64Array(bits.buffer);
  // key(d) from the coordinates' bits and the component (or d itself)
  for (let d = 0; d < n; d++) {
    if (map) {
      f[0] = map.x[d] + 0; // +0 folds −0 into 0
      f[1] = map.y[d] + 0;
      f[2] = map.z[d] + 0;
      keys[2 * d] = mixWords(0x9e3779b9, [bits[0], bits[1], bits[2], bits[3], bits[4], bits[5], map.component[d]]);
      keys[2 * d + 1] = mixWords(0x85ebca6b, [bits[0], bits[1], bits[2], bits[3], bits[4], bits[5], map.component[d]]);
    } else {
      keys[2 * d] = mixWords(0x9e3779b9, [d]);
      keys[2 * d + 1] = mixWords(0x85ebca6b, [d]);
    }
  }
  return keys;
}

function matrixFingerprints(a: SymmetricCsc, index: NodeIndex, keys: Uint32Array): Uint32Array {
  const out = new Uint32Array(2 * index.ids.length);
  let largest = 0;
  for (let p = 0; p < a.colPtr[a.n]; p++) largest = Math.max(largest, Math.abs(a.values[p]));
  const floor = ZERO_SHARE * largest;
  const add = (row: number, col: number, e: number, q: number, eB: number, qB: number): void => {
    const node = index.nodeOf[row];
    // lane sums of hash(key(row), key(col), q(a)): lane A rounded, lane B truncated
    out[2 * node] = (out[2 * node] + mix3(keys[2 * row], keys[2 * col], e, q)) >>> 0;
    out[2 * node + 1] = (out[2 * node + 1] + mix3(keys[2 * row + 1], keys[2 * col + 1], eB, qB)) >>> 0;
  };
  // every stored a_ij (i ≥ j) is row i's entry in column j and, off the diagonal, row j's in column i
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const v = a.values[p];
      if (!(Math.abs(v) > floor)) continue;
      const q = roundedMantissa(v);
      const e = roundedExponent;
      const qB = truncatedMantissa(v);
      const eB = roundedExponent;
      const i = a.rowIdx[p];
      add(i, j, e, q, eB, qB);
      if (i !== j) add(j, i, e, q, eB, qB);
    }
  }
  return out;
}

/** Exponent word (sign and biased exponent) of the last roundedMantissa call: a module scratch, so the hot loop allocates nothing. */
let roundedExponent = 0;
const bitsF64 = new Float64Array(1);
const bitsU32 = new Uint32Array(bitsF64.buffer);
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0; // index of the high word

/**
 * v's 52-bit mantissa rounded to MANTISSA_BITS bits (read from the IEEE 754 bits: no log, no
 * power); sets roundedExponent to the sign and exponent bits. A mantissa that rounds up to
 * 2^MANTISSA_BITS carries into the exponent, so 2^e(1 − ε) and 2^e(1 + ε) round alike.
 */
function roundedMantissa(v: number): number {
  bitsF64[0] = v;
  const hi = bitsU32[HIGH], lo = bitsU32[1 - HIGH];
  const mantissa = (hi & 0xfffff) * 4294967296 + lo;
  let q = Math.round(mantissa / 2 ** (52 - MANTISSA_BITS));
  let exponentWord = hi >>> 20; // sign and biased exponent
  if (q === 2 ** MANTISSA_BITS) {
    q = 0;
    exponentWord++;
  }
  roundedExponent = exponentWord;
  return q;
}

/** v's mantissa truncated to MANTISSA_BITS bits (grid B); sets roundedExponent to the sign and exponent bits. */
function truncatedMantissa(v: number): number {
  bitsF64[0] = v;
  const hi = bitsU32[HIGH], lo = bitsU32[1 - HIGH];
  roundedExponent = hi >>> 20;
  return Math.floor(((hi & 0xfffff) * 4294967296 + lo) / 2 ** (52 - MANTISSA_BITS));
}

/** mixWords(seed, [a, b, c]) without the array. */
function mix3(seed: number, a: number, b: number, c: number): number {
  let h = round32(seed >>> 0, a);
  h = round32(h, b);
  h = round32(h, c);
  return finish32(h, 3);
}

function round32(h: number, w: number): number {
  let k = Math.imul(w | 0, 0xcc9e2d51);
  k = (k << 15) | (k >>> 17);
  k = Math.imul(k, 0x1b873593);
  h ^= k;
  h = (h << 13) | (h >>> 19);
  return (Math.imul(h, 5) + 0xe6546b64) | 0;
}

function finish32(h: number, words: number): number {
  h ^= words * 4;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/** 32-bit hash of a word list from a seed (murmur3's mixing steps and finalizer). */
function mixWords(seed: number, words: readonly number[]): number {
  let h = seed >>> 0;
  for (const w of words) h = round32(h, w);
  return finish32(h, words.length);
}

/** What the change map needs of one side: fingerprints and (optionally) the DOF map for coordinates. */
export interface ChangeMapSide {
  fingerprints: NodeFingerprints;
  dofMap: DofMap | null;
}

/** Compare baseline fingerprints with the model's now; regions by connectivity of the model now. */
export function compareFingerprints(baseline: ChangeMapSide, now: ChangeMapSide, stiffness: SymmetricCsc, mass: SymmetricCsc, lengthUnit?: string): ChangeMapFacts {
  const b = baseline.fingerprints, c = now.fingerprints;
  const match = matchNodes(baseline, now);
  const coordsNow = nodeCoordinates(c.nodes, now.dofMap);
  const coordsBase = nodeCoordinates(b.nodes, baseline.dofMap);
  const kind = new Int8Array(c.nodes.length); // 0 same, 1 stiffness, 2 mass, 3 both, 4 added
  const matchedBase = new Uint8Array(b.nodes.length);
  // compare fingerprints of matched nodes; unmatched current nodes are added
  for (let q = 0; q < c.nodes.length; q++) {
    const p = match[q];
    if (p < 0) {
      kind[q] = 4;
      continue;
    }
    matchedBase[p] = 1;
    // changed only when both lanes (both grids) differ, see the module comment
    const k = b.stiffness[2 * p] !== c.stiffness[2 * q] && b.stiffness[2 * p + 1] !== c.stiffness[2 * q + 1];
    const m = b.mass[2 * p] !== c.mass[2 * q] && b.mass[2 * p + 1] !== c.mass[2 * q + 1];
    kind[q] = (k ? 1 : 0) + (m ? 2 : 0);
  }
  const index = nodeIndexOf(stiffness.n, now.dofMap ?? undefined);
  const regionOf = connectedRegions(kind, index, [stiffness, mass]);
  const kinds = ['same', 'stiffness', 'mass', 'stiffness and mass', 'added'] as const;
  const touched: ChangedNode[] = [];
  for (let q = 0; q < c.nodes.length; q++) {
    if (kind[q] === 0) continue;
    touched.push({ node: c.nodes[q], change: kinds[kind[q]] as ChangedNode['change'], region: regionOf[q], at: coordsNow ? coordsNow[q] : null });
  }
  const removed: ChangedNode[] = [];
  for (let p = 0; p < b.nodes.length; p++) if (!matchedBase[p]) removed.push({ node: b.nodes[p], change: 'removed', region: null, at: coordsBase ? coordsBase[p] : null });
  const regions = regionSummaries(touched, lengthUnit);
  return {
    matchedBy: match.by,
    nodesCompared: match.count,
    changedNodes: touched.filter((t) => t.change !== 'added').length,
    addedNodes: touched.length - touched.filter((t) => t.change !== 'added').length,
    removedNodes: removed.length,
    regions,
    nodes: [...touched, ...removed],
    removed: removed.length > 0 ? labelled({ nodeCount: removed.length, nodeRanges: nodeRanges(removed.map((r) => r.node)), centroid: centroid(removed) }, lengthUnit) : null,
  };
}

/** match[q] = baseline node of current node q, or −1; by id, by position (when it matches more), or by index. */
function matchNodes(baseline: ChangeMapSide, now: ChangeMapSide): Int32Array & { by: ChangeMapFacts['matchedBy']; count: number } {
  const b = baseline.fingerprints.nodes, c = now.fingerprints.nodes;
  const tag = (m: Int32Array, by: ChangeMapFacts['matchedBy']): Int32Array & { by: ChangeMapFacts['matchedBy']; count: number } => {
    let count = 0;
    for (const p of m) if (p >= 0) count++;
    return Object.assign(m, { by, count });
  };
  if (!baseline.dofMap || !now.dofMap) {
    const m = new Int32Array(c.length).fill(-1);
    if (b.length === c.length) for (let q = 0; q < c.length; q++) m[q] = q;
    return tag(m, b.length === c.length ? 'dof index' : 'none');
  }
  const byId = matchUniqueKeys(c.length, (q) => c[q], b.length, (p) => b[p]);
  const coordsB = nodeCoordinates(b, baseline.dofMap)!, coordsC = nodeCoordinates(c, now.dofMap)!;
  const byPlace = matchUniqueKeys(c.length, (q) => coordsC[q].join(' '), b.length, (p) => coordsB[p].join(' '));
  return byPlace.matched > byId.matched ? tag(byPlace.match, 'position') : tag(byId.match, 'node id');
}

function regionSummaries(touched: ChangedNode[], lengthUnit: string | undefined): ChangeRegion[] {
  const byRegion: ChangedNode[][] = [];
  for (const t of touched) (byRegion[t.region!] ??= []).push(t);
  return byRegion.map((list, r) => ({
    region: r,
    ...labelled({ nodeCount: list.length, nodeRanges: nodeRanges(list.map((t) => t.node)), centroid: centroid(list) }, lengthUnit),
    stiffnessChanged: list.filter((t) => t.change === 'stiffness' || t.change === 'stiffness and mass').length,
    massChanged: list.filter((t) => t.change === 'mass' || t.change === 'stiffness and mass').length,
    added: list.filter((t) => t.change === 'added').length,
  }));
}


function labelled<T extends { nodeRanges: [number, number][]; centroid: [number, number, number] | null }>(g: T, lengthUnit: string | undefined): T & { label: string } {
  return { ...g, label: regionLabel(g.nodeRanges, g.centroid, lengthUnit) };
}
