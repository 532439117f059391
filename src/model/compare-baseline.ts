/**
 * Compare a model's solved modes with its stored baseline (CRITERIA.md §2, mode-tracking
 * practice, [CP]):
 *
 *   1. same DOF numbering, or stop: DOF count and DOF-map hash must match (else InputError
 *      naming the baseline file — a renumbered model gives a meaningless MAC);
 *   2. current shapes at the baseline's compared DOFs; weight W = M on those DOFs (mass-weighted
 *      MAC, current M: the baseline's M is not stored) or I (plain MAC), see ./mac.ts;
 *   3. near-repeated groups on each side: the rigid-body modes (split as in rigid-body-modes,
 *      ECSS separation ratio, CRITERIA.md §1a [S]) and chains of consecutive elastic modes with
 *      (f_{k+1} − f_k)/f_k ≤ repeatedTolerancePercent (default 0.1 %, from CRITERIA.md §2
 *      practice 4: |Δf|/f < 1e-3, [CP]);
 *   4. correlation E(i, j) = MAC(i, j) between single modes; where a group is involved, the
 *      larger of the subspace shares P(φ_i, group of ψ_j) and P(ψ_j, group of φ_i);
 *   5. one-to-one pairing by assignment over E (./mode-pairing.ts); inside a pair of groups the
 *      partners are put back in frequency order (their order has no meaning); crossings left
 *      over are swaps; unpaired modes inside the range the other side solved are new or lost.
 */
import type { ModesResult } from '../eigen/modes-types.js';
import type { DofMap } from '../io/dof-map.js';
import { InputError } from '../io/errors.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import { cutoffDefaults, splitRigidBodyModes } from '../rules/rigid-body-split.js';
import { dofMapHash, type LoadedBaseline } from './baseline-store.js';
import { principalSubmatrix } from '../sparse/permute.js';
import { macFromProducts, restrictRows, shapeProducts, subspaceShare, type ShapeProducts } from './mac.js';
import { crossingPairs, DEFAULT_MIN_PAIR_CORRELATION, pairModes, type ModePairing } from './mode-pairing.js';
import type { ComparisonFacts, ComparisonSettings, ModePair, ModeSwap, UnpairedMode } from './comparison-facts.js';

export const DEFAULT_REPEATED_TOLERANCE_PERCENT = 0.1;

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

export function compareWithBaseline(baseline: LoadedBaseline, current: CurrentModel, settings: ComparisonSettings = defaultComparisonSettings()): ComparisonFacts {
  const numberingCheck = checkNumbering(baseline, current);
  const { modes } = current;
  const fb = baseline.snapshot.frequenciesHz;
  const fc = Array.from(modes.frequenciesHz);
  const mc = fc.length;
  const rows = baseline.shapes.rows;
  const currentValues = baseline.dofs ? restrictRows(modes.shapes, modes.n, mc, baseline.dofs) : modes.shapes.subarray(0, modes.n * mc);
  const weight = settings.weighting === 'mass' ? (baseline.dofs ? principalSubmatrix(current.mass, baseline.dofs) : current.mass) : undefined;
  const products = shapeProducts(baseline.shapes, { rows, cols: mc, values: currentValues }, weight);
  const mac = macFromProducts(products);
  const groupOfBaseline = groupIndex(fb, settings.repeatedTolerancePercent);
  const groupOfCurrent = groupIndex(fc, settings.repeatedTolerancePercent);
  const correlation = correlationMatrix(products, mac, groupOfBaseline, groupOfCurrent);
  const pairing = pairModes(correlation, fb, fc, { minCorrelation: settings.minPairCorrelation, windowPercent: settings.windowPercent ?? undefined });
  orderInsideGroups(pairing, groupOfBaseline, groupOfCurrent);
  const rigidBaseline = rigidCount(fb);
  const rigidCurrent = rigidCount(fc);
  const pairs: ModePair[] = [];
  // one row per paired baseline mode, in baseline order
  for (let i = 0; i < fb.length; i++) {
    const j = pairing.partnerOfBaseline[i];
    if (j < 0) continue;
    const rigidBody = i < rigidBaseline || j < rigidCurrent;
    pairs.push({
      baselineMode: i + 1,
      currentMode: j + 1,
      baselineHz: fb[i],
      currentHz: fc[j],
      changePercent: rigidBody ? null : (100 * (fc[j] - fb[i])) / fb[i],
      mac: mac[i * mc + j],
      correlation: correlation[i * mc + j],
      repeated: groupSize(groupOfBaseline, groupOfBaseline[i]) > 1 || groupSize(groupOfCurrent, groupOfCurrent[j]) > 1,
      rigidBody,
    });
  }
  const sameGroup = (a: number, b: number, pa: number, pb: number): boolean => groupOfBaseline[a] === groupOfBaseline[b] || groupOfCurrent[pa] === groupOfCurrent[pb];
  const swaps: ModeSwap[] = crossingPairs(pairing, sameGroup).map(([a, b]) => {
    const pa = pairing.partnerOfBaseline[a], pb = pairing.partnerOfBaseline[b];
    return { baselineModes: [a + 1, b + 1], currentModes: [pa + 1, pb + 1], correlations: [correlation[a * mc + pa], correlation[b * mc + pb]] };
  });
  const baselineMaxHz = fb.length > 0 ? Math.max(...fb) : 0;
  const currentMaxHz = mc > 0 ? Math.max(...fc) : 0;
  return {
    baseline: {
      file: baseline.file,
      createdAt: baseline.snapshot.createdAt,
      modes: fb.length,
      dofCount: baseline.snapshot.dofCount,
      selection: baseline.snapshot.shapes.selection,
      dofsCompared: rows,
      numberingCheck,
    },
    settings,
    baselineFrequenciesHz: fb.slice(),
    currentFrequenciesHz: fc,
    baselineMaxHz,
    currentMaxHz,
    baselineGroups: groupsOf(groupOfBaseline),
    currentGroups: groupsOf(groupOfCurrent),
    mac: { rows: fb.length, cols: mc, values: Array.from(mac) },
    correlation: { rows: fb.length, cols: mc, values: Array.from(correlation) },
    pairs,
    lostModes: unpaired(pairing.partnerOfBaseline, fb, currentMaxHz, (i) => rowBest(correlation, mc, i)),
    newModes: unpaired(pairing.partnerOfCurrent, fc, baselineMaxHz, (j) => columnBest(correlation, fb.length, mc, j)),
    swaps,
  };
}

/** Same DOF count, and same DOF-map hash when the baseline has one; else an InputError. */
function checkNumbering(baseline: LoadedBaseline, current: CurrentModel): 'dof-map hash' | 'dof count only' {
  const s = baseline.snapshot;
  const n = current.modes.n;
  if (s.dofCount !== n) {
    throw new InputError(baseline.file, `was saved for ${s.dofCount} DOFs but the model now has ${n} DOFs: the DOF numbering changed, so shapes cannot be compared; save a new baseline (check --save-baseline)`);
  }
  if (s.dofMapHash === null) return 'dof count only';
  if (!current.dofMap) throw new InputError(baseline.file, 'records a DOF map but the model now has none, so its DOF numbering cannot be checked; add `dofs:` to the model');
  if (dofMapHash(current.dofMap) !== s.dofMapHash) {
    throw new InputError(baseline.file, 'was saved with a different DOF numbering (the node/component of some DOFs changed), so shapes cannot be compared; save a new baseline (check --save-baseline)');
  }
  return 'dof-map hash';
}

function rigidCount(frequenciesHz: ArrayLike<number>): number {
  return frequenciesHz.length === 0 ? 0 : splitRigidBodyModes(frequenciesHz, cutoffDefaults).count;
}

/** Group id of each mode: rigid-body modes share group 0; close elastic neighbours share a group. */
export function groupIndex(frequenciesHz: ArrayLike<number>, tolerancePercent: number): Int32Array {
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

function unpaired(partner: Int32Array, hz: ArrayLike<number>, otherMaxHz: number, best: (k: number) => { value: number; index: number }): UnpairedMode[] {
  const out: UnpairedMode[] = [];
  for (let k = 0; k < partner.length; k++) {
    if (partner[k] >= 0) continue;
    const b = best(k);
    out.push({ mode: k + 1, hz: hz[k], withinCompared: hz[k] <= otherMaxHz, bestCorrelation: b.value, bestPartner: b.index >= 0 ? b.index + 1 : null });
  }
  return out;
}
