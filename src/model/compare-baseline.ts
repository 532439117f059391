/**
 * Compare a model's solved modes with its stored baseline (docs/sources.md §2, mode-tracking
 * practice, [CP]):
 *
 *   1. match DOFs: by (node, component) when both sides carry a DOF map, or by (coordinates,
 *      component) when that matches more DOFs (node ids renumbered too; coordinates compared
 *      exactly, coincident nodes left out) — a renumbered model compares as the same model, and
 *      added or removed DOFs only shrink the compared set —
 *      else by DOF index when the DOF counts agree; when neither works the shapes are not
 *      compared and modes are paired by frequency order (rigid-body with rigid-body, elastic
 *      with elastic), so frequency-drift still runs and the shape rules skip with the reason;
 *   2. current shapes at the matched DOFs; weight W = M on those DOFs (mass-weighted MAC,
 *      current M: the baseline's M is not stored) or I (plain MAC), see ./mac.ts;
 *   3. near-repeated groups on each side: the rigid-body modes (split as in rigid-body-modes,
 *      ECSS separation ratio, docs/sources.md §1a [S]) and chains of consecutive elastic modes with
 *      (f_{k+1} − f_k)/f_k ≤ repeatedTolerancePercent (default 0.1 %, from docs/sources.md §2
 *      practice 4: |Δf|/f < 1e-3, [CP]);
 *   4. correlation E(i, j) = MAC(i, j) between single modes; where a group is involved, the
 *      larger of the subspace shares P(φ_i, group of ψ_j) and P(ψ_j, group of φ_i);
 *   5. one-to-one pairing by assignment over E (./mode-pairing.ts); inside a pair of groups the
 *      partners are put back in frequency order (their order has no meaning); crossings left
 *      over are swaps; unpaired modes inside the range the other side solved are new or lost;
 *   6. groups linked by pairs are compared as subspaces (principal angles, Björck & Golub 1973):
 *      their pairs carry the group's subspace MAC; when one side's solve cut the group at its
 *      highest mode, the other side's extra members are not counted as new or lost.
 */
import type { ModesResult } from '../eigen/modes-types.js';
import type { DofMap } from '../io/dof-map.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import { cutoffDefaults, splitRigidBodyModes } from './rigid-body-split.js';
import type { LoadedBaseline } from './baseline-store.js';
import { principalSubmatrix } from '../sparse/permute.js';
import { macFromProducts, principalAngleCosines, restrictRows, shapeProducts, subspaceShare, type ShapeProducts } from './mac.js';
import { crossingPairs, DEFAULT_MIN_PAIR_CORRELATION, pairModes, type ModePairing } from './mode-pairing.js';
import type { ComparisonFacts, ComparisonSettings, DofMatching, GroupMatch, ModePair, ModeSwap, UnpairedMode } from './comparison-facts.js';
import { disjointSets } from './disjoint-sets.js';
import { matchUniqueKeys } from './unique-key-match.js';

const DEFAULT_REPEATED_TOLERANCE_PERCENT = 0.1;

export interface CurrentModel {
  modes: ModesResult;
  mass: SymmetricCsc;
  dofMap?: DofMap;
}

export function defaultComparisonSettings(partial: Partial<ComparisonSettings> = {}): ComparisonSettings {
  return {
    weighting: partial.weighting ?? 'mass',
    minPairCorrelation: partial.minPairCorrelation ?? DEFAULT_MIN_PAIR_CORRELATION,
    windowPercent: partial.windowPercent ?? null,
    repeatedTolerancePercent: partial.repeatedTolerancePercent ?? DEFAULT_REPEATED_TOLERANCE_PERCENT,
  };
}

/** Which stored shape rows meet which current DOFs. null arrays: every row / DOF in order. */
export interface DofMatch {
  matchedBy: DofMatching;
  /** Stored baseline shape rows compared, in the order of `currentDofs`. */
  baselineRows: Int32Array | null;
  /** Current 0-based DOF of each compared row, ascending. */
  currentDofs: Int32Array | null;
  compared: number;
  added: number;
  removed: number;
  renumbered: boolean;
  /** Why nothing could be compared (matchedBy 'none'). */
  reason: string | null;
}

/** `match`: the DOF matching when the caller already made it (it also feeds explainChanges). */
export function compareWithBaseline(baseline: LoadedBaseline, current: CurrentModel, settings: ComparisonSettings = defaultComparisonSettings(), match: DofMatch = matchDofs(baseline, current)): ComparisonFacts {
  const { modes } = current;
  const fb = baseline.snapshot.frequenciesHz;
  const fc = Array.from(modes.frequenciesHz);
  const mb = fb.length, mc = fc.length;
  const groupOfBaseline = groupIndex(fb, settings.repeatedTolerancePercent);
  const groupOfCurrent = groupIndex(fc, settings.repeatedTolerancePercent);
  const rigidBaseline = rigidCount(fb);
  const rigidCurrent = rigidCount(fc);
  const baselineMaxHz = mb > 0 ? Math.max(...fb) : 0;
  const currentMaxHz = mc > 0 ? Math.max(...fc) : 0;
  const s = baseline.snapshot;
  const facts: ComparisonFacts = {
    baseline: {
      file: baseline.file,
      createdAt: s.createdAt,
      runId: s.runId,
      modes: mb,
      dofCount: s.dofCount,
      selection: s.shapes.selection,
      energyShareKept: s.shapes.energyShareKept,
      dofsCompared: match.compared,
      numberingCheck: match.matchedBy,
      dofsRemoved: match.removed,
      dofsAdded: match.added,
      renumbered: match.renumbered,
    },
    settings,
    pairedBy: match.reason === null ? 'shapes' : 'frequency order',
    shapesNotCompared: match.reason,
    baselineFrequenciesHz: fb.slice(),
    currentFrequenciesHz: fc,
    baselineMaxHz,
    currentMaxHz,
    baselineGroups: groupsOf(groupOfBaseline),
    currentGroups: groupsOf(groupOfCurrent),
    mac: { rows: 0, cols: 0, values: [] },
    correlation: { rows: 0, cols: 0, values: [] },
    pairs: [],
    lostModes: [],
    newModes: [],
    swaps: [],
    groupMatches: [],
    baselineMassProperties: s.massProperties ?? null,
  };
  const pair = (i: number, j: number, mac: number | null, correlation: number | null): ModePair => {
    const rigidBody = i < rigidBaseline || j < rigidCurrent;
    return {
      baselineMode: i + 1,
      currentMode: j + 1,
      baselineHz: fb[i],
      currentHz: fc[j],
      changePercent: rigidBody ? null : (100 * (fc[j] - fb[i])) / fb[i],
      mac,
      correlation,
      group: null,
      repeated: groupSize(groupOfBaseline, groupOfBaseline[i]) > 1 || groupSize(groupOfCurrent, groupOfCurrent[j]) > 1,
      rigidBody,
    };
  };
  if (match.reason !== null) {
    const pairing = pairByOrder(mb, mc, rigidBaseline, rigidCurrent);
    for (let i = 0; i < mb; i++) if (pairing.partnerOfBaseline[i] >= 0) facts.pairs.push(pair(i, pairing.partnerOfBaseline[i], null, null));
    const none = (): { value: number; index: number } => ({ value: 0, index: -1 });
    facts.lostModes = unpaired(pairing.partnerOfBaseline, fb, currentMaxHz, none, () => false);
    facts.newModes = unpaired(pairing.partnerOfCurrent, fc, baselineMaxHz, none, () => false);
    return facts;
  }
  const baselineValues = match.baselineRows ? restrictRows(baseline.shapes.values, baseline.shapes.rows, mb, match.baselineRows) : baseline.shapes.values;
  const currentValues = match.currentDofs ? restrictRows(modes.shapes, modes.n, mc, match.currentDofs) : modes.shapes.subarray(0, modes.n * mc);
  const weight = settings.weighting === 'mass' ? (match.currentDofs ? principalSubmatrix(current.mass, match.currentDofs) : current.mass) : undefined;
  const rows = match.compared;
  const products = shapeProducts({ rows, cols: mb, values: baselineValues }, { rows, cols: mc, values: currentValues }, weight);
  const mac = macFromProducts(products);
  const correlation = correlationMatrix(products, mac, groupOfBaseline, groupOfCurrent);
  const pairing = pairModes(correlation, fb, fc, { minCorrelation: settings.minPairCorrelation, windowPercent: settings.windowPercent ?? undefined });
  orderInsideGroups(pairing, groupOfBaseline, groupOfCurrent);
  const groups = linkedGroups(pairing, groupOfBaseline, groupOfCurrent);
  facts.groupMatches = groups.map((g) => groupMatch(products, g.baseline, g.current));
  const groupOfPair = new Map<number, number>();
  groups.forEach((g, k) => g.baseline.forEach((i) => groupOfPair.set(i, k)));
  // one row per paired baseline mode, in baseline order; grouped pairs carry the group's subspace MAC
  for (let i = 0; i < mb; i++) {
    const j = pairing.partnerOfBaseline[i];
    if (j < 0) continue;
    const p = pair(i, j, mac[i * mc + j], correlation[i * mc + j]);
    const k = groupOfPair.get(i);
    if (k !== undefined) {
      p.group = k;
      p.correlation = facts.groupMatches[k].subspaceMac;
    }
    facts.pairs.push(p);
  }
  const sameGroup = (a: number, b: number, pa: number, pb: number): boolean => groupOfBaseline[a] === groupOfBaseline[b] || groupOfCurrent[pa] === groupOfCurrent[pb];
  facts.swaps = crossingPairs(pairing, sameGroup).map(([a, b]): ModeSwap => {
    const pa = pairing.partnerOfBaseline[a], pb = pairing.partnerOfBaseline[b];
    return { baselineModes: [a + 1, b + 1], currentModes: [pa + 1, pb + 1], correlations: [correlation[a * mc + pa], correlation[b * mc + pb]] };
  });
  const cut = cutMembers(groups, mb, mc);
  facts.mac = { rows: mb, cols: mc, values: Array.from(mac) };
  facts.correlation = { rows: mb, cols: mc, values: Array.from(correlation) };
  facts.lostModes = unpaired(pairing.partnerOfBaseline, fb, currentMaxHz, (i) => rowBest(correlation, mc, i), (i) => cut.baseline.has(i));
  facts.newModes = unpaired(pairing.partnerOfCurrent, fc, baselineMaxHz, (j) => columnBest(correlation, mb, mc, j), (j) => cut.current.has(j));
  return facts;
}

/** Match the stored shape rows with the model's DOFs (see step 1 above). */
export function matchDofs(baseline: LoadedBaseline, current: Pick<CurrentModel, 'modes' | 'dofMap'>): DofMatch {
  const s = baseline.snapshot;
  const n = current.modes.n;
  const stored = baseline.shapes.rows;
  const dofOfRow = (r: number): number => (baseline.dofs ? baseline.dofs[r] : r);
  const map = baseline.dofMap, now = current.dofMap;
  if (map && now) {
    // by node id, and by position where node ids changed too; the one that matches more DOFs wins
    const nodeKey = (m: DofMap) => (d: number) => m.node[d] * 8 + m.component[d];
    const placeKey = (m: DofMap) => (d: number) => `${m.x[d]} ${m.y[d]} ${m.z[d]} ${m.component[d]}`;
    const byNode = matchUniqueKeys(map.n, nodeKey(map), now.n, nodeKey(now));
    const byPlace = matchUniqueKeys(map.n, placeKey(map), now.n, placeKey(now));
    const [toCurrent, matched, matchedBy] = byPlace.matched > byNode.matched ? [byPlace.match, byPlace.matched, 'position and component' as const] : [byNode.match, byNode.matched, 'node and component' as const];
    let renumbered = map.n !== now.n;
    for (let d = 0; d < map.n && !renumbered; d++) if (toCurrent[d] >= 0 && toCurrent[d] !== d) renumbered = true;
    const rowsAndDofs: [number, number][] = [];
    for (let r = 0; r < stored; r++) if (toCurrent[dofOfRow(r)] >= 0) rowsAndDofs.push([r, toCurrent[dofOfRow(r)]]);
    rowsAndDofs.sort((a, b) => a[1] - b[1]);
    const base = { matchedBy, added: now.n - matched, removed: map.n - matched, renumbered };
    if (rowsAndDofs.length === 0) {
      return { ...base, matchedBy: 'none', baselineRows: null, currentDofs: null, compared: 0, reason: 'none of the DOFs stored with the baseline is in the model now (matched by node and component, or by position and component), so the shapes cannot be compared' };
    }
    const identity = rowsAndDofs.length === n && stored === n && rowsAndDofs.every(([r, c]) => r === c);
    return {
      ...base,
      baselineRows: identity ? null : Int32Array.from(rowsAndDofs, (x) => x[0]),
      currentDofs: identity ? null : Int32Array.from(rowsAndDofs, (x) => x[1]),
      compared: rowsAndDofs.length,
      reason: null,
    };
  }
  if (s.dofCount === n) return { matchedBy: 'dof index', baselineRows: null, currentDofs: baseline.dofs, compared: stored, added: 0, removed: 0, renumbered: false, reason: null };
  const why = map ? 'the model has no DOF map now' : now ? 'the baseline was saved without a DOF map' : 'neither side has a DOF map';
  return {
    matchedBy: 'none',
    baselineRows: null,
    currentDofs: null,
    compared: 0,
    added: Math.max(0, n - s.dofCount),
    removed: Math.max(0, s.dofCount - n),
    renumbered: false,
    reason: `the baseline has ${s.dofCount} DOFs and the model now ${n}, and ${why}, so DOFs cannot be matched and the shapes cannot be compared`,
  };
}

/** Rigid-body modes with rigid-body modes and elastic with elastic, each in frequency order. */
function pairByOrder(mb: number, mc: number, rb: number, rc: number): ModePairing {
  const partnerOfBaseline = new Int32Array(mb).fill(-1);
  const partnerOfCurrent = new Int32Array(mc).fill(-1);
  const link = (i: number, j: number): void => {
    partnerOfBaseline[i] = j;
    partnerOfCurrent[j] = i;
  };
  for (let k = 0; k < Math.min(rb, rc); k++) link(k, k);
  for (let k = 0; k < Math.min(mb - rb, mc - rc); k++) link(rb + k, rc + k);
  return { partnerOfBaseline, partnerOfCurrent };
}

function rigidCount(frequenciesHz: ArrayLike<number>): number {
  return frequenciesHz.length === 0 ? 0 : splitRigidBodyModes(frequenciesHz, cutoffDefaults).count;
}

/** Group id of each mode: rigid-body modes share group 0; close elastic neighbours share a group. */
function groupIndex(frequenciesHz: ArrayLike<number>, tolerancePercent: number): Int32Array {
  const m = frequenciesHz.length;
  const group = new Int32Array(m);
  const rigid = rigidCount(frequenciesHz);
  let next = rigid > 0 ? 1 : 0;
  // rigid-body modes share group 0; chain consecutive elastic modes whose relative gap is within the tolerance
  for (let k = 0; k < m; k++) {
    const close = k > rigid && (100 * Math.abs(frequenciesHz[k] - frequenciesHz[k - 1])) / Math.abs(frequenciesHz[k - 1]) <= tolerancePercent;
    group[k] = k < rigid ? 0 : close ? group[k - 1] : next++;
  }
  return group;
}

function groupSize(group: Int32Array, id: number): number {
  let c = 0;
  for (let k = 0; k < group.length; k++) if (group[k] === id) c++;
  return c;
}

function groupMembers(group: Int32Array, id: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < group.length; k++) if (group[k] === id) out.push(k);
  return out;
}

function groupsOf(group: Int32Array): number[][] {
  const out: number[][] = [];
  for (const id of new Set(group)) {
    const members = groupMembers(group, id);
    if (members.length > 1) out.push(members.map((k) => k + 1));
  }
  return out;
}

/** E(i, j): MAC between single modes; the larger subspace share where a group is involved. */
function correlationMatrix(p: ShapeProducts, mac: Float64Array, gb: Int32Array, gc: Int32Array): Float64Array {
  const mb = gb.length, mc = gc.length;
  const e = Float64Array.from(mac);
  const membersB = new Map<number, number[]>(), membersC = new Map<number, number[]>();
  for (const id of new Set(gb)) membersB.set(id, groupMembers(gb, id));
  for (const id of new Set(gc)) membersC.set(id, groupMembers(gc, id));
  // replace entries that touch a group by max(P(φ_i, C(j)), P(ψ_j, B(i)))
  for (let i = 0; i < mb; i++) {
    const B = membersB.get(gb[i])!;
    for (let j = 0; j < mc; j++) {
      const C = membersC.get(gc[j])!;
      if (B.length === 1 && C.length === 1) continue;
      e[i * mc + j] = Math.max(subspaceShare(p, 'baseline', i, C), subspaceShare(p, 'current', j, B));
    }
  }
  return e;
}

/** Inside each (baseline group, current group) block, give partners in ascending order. */
function orderInsideGroups(pairing: ModePairing, gb: Int32Array, gc: Int32Array): void {
  const blocks = new Map<string, number[]>();
  // collect the paired baseline modes of each block
  for (let i = 0; i < gb.length; i++) {
    const j = pairing.partnerOfBaseline[i];
    if (j < 0) continue;
    const key = `${gb[i]}:${gc[j]}`;
    const list = blocks.get(key) ?? [];
    list.push(i);
    blocks.set(key, list);
  }
  for (const rows of blocks.values()) {
    if (rows.length < 2) continue;
    const partners = rows.map((i) => pairing.partnerOfBaseline[i]).sort((a, b) => a - b);
    rows.forEach((i, k) => {
      pairing.partnerOfBaseline[i] = partners[k];
      pairing.partnerOfCurrent[partners[k]] = i;
    });
  }
}

function rowBest(e: Float64Array, mc: number, i: number): { value: number; index: number } {
  let value = 0, index = -1;
  for (let j = 0; j < mc; j++) if (e[i * mc + j] > value) [value, index] = [e[i * mc + j], j];
  return { value, index };
}

function columnBest(e: Float64Array, mb: number, mc: number, j: number): { value: number; index: number } {
  let value = 0, index = -1;
  for (let i = 0; i < mb; i++) if (e[i * mc + j] > value) [value, index] = [e[i * mc + j], i];
  return { value, index };
}

function unpaired(partner: Int32Array, hz: ArrayLike<number>, otherMaxHz: number, best: (k: number) => { value: number; index: number }, inCutGroup: (k: number) => boolean): UnpairedMode[] {
  const out: UnpairedMode[] = [];
  for (let k = 0; k < partner.length; k++) {
    if (partner[k] >= 0) continue;
    const b = best(k);
    const cutGroup = inCutGroup(k);
    out.push({ mode: k + 1, hz: hz[k], withinCompared: hz[k] <= otherMaxHz && !cutGroup, bestCorrelation: b.value, bestPartner: b.index >= 0 ? b.index + 1 : null, cutGroup });
  }
  return out;
}

interface LinkedGroup {
  baseline: number[];
  current: number[];
}

/**
 * Baseline and current modes joined by near-repeated groups on either side and by the pairs:
 * the connected parts with more than one mode on some side and at least one on each.
 */
function linkedGroups(pairing: ModePairing, gb: Int32Array, gc: Int32Array): LinkedGroup[] {
  const mb = gb.length, mc = gc.length;
  const { find, join } = disjointSets(mb + mc);
  // modes of one group; pairs across the sides
  for (let i = 1; i < mb; i++) if (gb[i] === gb[i - 1]) join(i, i - 1);
  for (let j = 1; j < mc; j++) if (gc[j] === gc[j - 1]) join(mb + j, mb + j - 1);
  for (let i = 0; i < mb; i++) if (pairing.partnerOfBaseline[i] >= 0) join(i, mb + pairing.partnerOfBaseline[i]);
  const parts = new Map<number, LinkedGroup>();
  for (let k = 0; k < mb + mc; k++) {
    const root = find(k);
    const g = parts.get(root) ?? { baseline: [], current: [] };
    if (k < mb) g.baseline.push(k);
    else g.current.push(k - mb);
    parts.set(root, g);
  }
  return [...parts.values()].filter((g) => g.baseline.length > 0 && g.current.length > 0 && (g.baseline.length > 1 || g.current.length > 1));
}

function groupMatch(p: ShapeProducts, baseline: number[], current: number[]): GroupMatch {
  const cosines = principalAngleCosines(p, baseline, current);
  const smallest = cosines.length > 0 ? cosines[cosines.length - 1] : 0;
  return { baselineModes: baseline.map((i) => i + 1), currentModes: current.map((j) => j + 1), cosines, subspaceMac: smallest * smallest, cut: baseline.length !== current.length };
}

/** Members of linked groups that the other side cut: its part of the group ends at its highest solved mode. */
function cutMembers(groups: LinkedGroup[], mb: number, mc: number): { baseline: Set<number>; current: Set<number> } {
  const out = { baseline: new Set<number>(), current: new Set<number>() };
  for (const g of groups) {
    if (g.baseline.length < g.current.length && g.baseline.includes(mb - 1)) g.current.forEach((j) => out.current.add(j));
    if (g.current.length < g.baseline.length && g.current.includes(mc - 1)) g.baseline.forEach((i) => out.baseline.add(i));
  }
  return out;
}
