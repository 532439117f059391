/**
 * N-thread LDLᵀ factorization, behind the same synchronous interface as the serial one, and
 * its jobs for the helper threads (helper-thread.ts).
 *
 * The supernodal tree is split (subtree-split.ts) into N sets of disjoint subtrees; helper i
 * factors set i + 1 while this thread factors set 0, then this thread factors the top (their
 * common ancestors), applying the updates the subtrees still owe through the shared `nextRow`
 * record, and hands every helper a share of the top's large supernodes (descendant updates by
 * target columns, panel updates by rows). All threads write disjoint blocks of the same
 * SharedArrayBuffer-backed arrays, so nothing is copied or merged but the pivot counts (merged
 * in part order). Which thread computes which entry, and in which order the updates of an
 * entry are added, is fixed by the split: the same split gives the same bits on every run.
 */
import {
  applyDescendant,
  factorSupernodes,
  factorValues,
  panelUpdateRows,
  rowsBefore,
  updateWorkspace,
  type RecycledValues,
  type SupernodalFactor,
  type SupernodeCooperation,
  type UpdateWorkspace,
} from './numeric-ldlt.js';
import { PivotMonitor, type MonitorState } from './pivot-monitor.js';
import type { SupernodalStructure } from './symbolic.js';
import type { SubtreeSplit } from './subtree-split.js';
import type { FactorStorage } from './simd-sweep-kernels.js';
import { alongsideAll, collectAll, sharedBlock, sharedCopy, sharedInt32, startHelpers, type Answer, type Helper } from './helper-thread.js';

/** The arrays every job on a factor brings (shared; `storage` when the values live in a WebAssembly memory), and the helper's scratch region. */
interface FactorParts {
  structure: SupernodalStructure;
  values: Float64Array;
  d: Float64Array;
  storage?: FactorStorage;
  region: number;
}

/** Factor the supernodes of `ranges` (the helper's part of the split). */
export interface FactorJob extends FactorParts {
  kind: 'factor';
  shift: number;
  tolerance: number;
  diagonalScale: number;
  nextRow: Int32Array;
  dirty: boolean;
  ranges: [number, number][];
}

/** A helper's share of a shared supernode's descendant updates. */
export interface DescendantsJob extends FactorParts {
  kind: 'descendants';
  sn: number;
  /** (dn, start, stop) triples. */
  list: Int32Array;
  /** The helper's share: target columns fromColumn … toColumn − 1. */
  fromColumn: number;
  toColumn: number;
}

/** A helper's share of a panel update: rows from … to−1 below the panel. */
export interface PanelJob extends FactorParts {
  kind: 'panel';
  sn: number;
  c0: number;
  c1: number;
  from: number;
  to: number;
}

/** Drop the workspace kept for the jobs of one factorization (it views that factor's memory). */
export interface DropWorkspaceJob {
  kind: 'dropWorkspace';
}

interface Factored extends Answer {
  kind: 'factored';
  monitor: MonitorState;
}

/** `a` itself when it is in shared memory, else a shared copy. */
function inShared<T extends Float64Array | Int32Array>(a: T): T {
  return a.buffer instanceof SharedArrayBuffer ? a : sharedCopy(a);
}

/** The structure with every array moved to shared memory (the helper reads it without a copy). */
export function shareStructure(s: SupernodalStructure): SupernodalStructure {
  const { pair } = s;
  return {
    ...s,
    perm: sharedCopy(s.perm),
    pair: {
      n: pair.n,
      colPtr: inShared(pair.colPtr),
      rowIdx: inShared(pair.rowIdx),
      stiffnessAt: inShared(pair.stiffnessAt),
      massAt: inShared(pair.massAt),
      // K's and M's values: copied only when the caller has no shared copy of them (shifted-solver.ts)
      stiffnessValues: inShared(pair.stiffnessValues),
      massValues: inShared(pair.massValues),
    },
    superStart: sharedCopy(s.superStart),
    superOf: sharedCopy(s.superOf),
    rowPtr: sharedCopy(s.rowPtr),
    rows: sharedCopy(s.rows),
    valuePtr: sharedCopy(s.valuePtr),
  };
}

/**
 * LDLᵀ on N threads along `split` (N = its parts); null when N − 1 helper threads are not
 * available, so the caller factors serially. `s` must come from shareStructure.
 */
export function parallelSupernodalLdlt(s: SupernodalStructure, shift: number, monitor: PivotMonitor, split: SubtreeSplit, recycled?: RecycledValues): SupernodalFactor | null {
  const threads = split.parts.length;
  const helpers = startHelpers(threads - 1);
  if (threads < 2 || helpers.length !== threads - 1) return null;
  // before the factor's large allocation: let every thread drop the shared arrays of earlier work
  collectAll(helpers);
  const { values, storage, dirty } = factorValues(s, recycled, sharedBlock, threads);
  const d = sharedBlock(s.n);
  const nextRow = sharedInt32(s.supernodes);
  const out = { values, d, nextRow, dirty, ...(storage ? { storage } : {}) };
  const common = { kind: 'factor', structure: s, shift, tolerance: monitor.tolerance, diagonalScale: monitor.diagonalScale, ...out } as const;
  const jobs: FactorJob[] = helpers.map((_, i) => ({ ...common, ranges: split.parts[i + 1], region: i + 1 }));
  const theirs = alongsideAll<Factored>(helpers, jobs, () => factorSupernodes(s, shift, monitor, out, split.parts[0]), 'factored');
  // pivot counts in part order
  for (const t of theirs) monitor.merge(t.monitor);
  factorSupernodes(s, shift, monitor, out, split.top, split.parts.flat(), cooperation(helpers, s, values, d, storage));
  // the helpers let go of this factor's memory, so a released factor is not kept alive by them
  alongsideAll(helpers, helpers.map((): DropWorkspaceJob => ({ kind: 'dropWorkspace' })), () => {});
  return { structure: s, values, d, ...(storage ? { storage } : {}) };
}

/** Supernodes of the top with at least this many rows and columns share their work (our choice). */
const SHARE_MIN_ROWS = 512;
const SHARE_MIN_COLUMNS = 128;
/** A share of a panel update has at least this many rows; panels of fewer than twice as many stay on this thread (our choice). */
const SHARE_MIN_PANEL_ROWS = 128;

/**
 * How the top's large supernodes are shared among the N threads: descendants' updates split at
 * the target columns where the estimated work (per target column: the updating rows at and below
 * it times the descendant's columns) reaches 1/N, 2/N, … of the whole; panel updates split by
 * rows into near-equal shares, this thread's holding the panel's diagonal block.
 */
function cooperation(helpers: Helper[], s: SupernodalStructure, values: Float64Array, d: Float64Array, storage: FactorStorage | undefined): SupernodeCooperation {
  const inMemory = storage ? { storage } : {};
  const threads = helpers.length + 1;
  const { superStart, rowPtr, valuePtr } = s;
  return {
    wants: (sn) => rowPtr[sn + 1] - rowPtr[sn] >= SHARE_MIN_ROWS && superStart[sn + 1] - superStart[sn] >= SHARE_MIN_COLUMNS,
    descendants(sn, list, count, map, work) {
      const f = superStart[sn];
      const l = superStart[sn + 1];
      const perColumn = new Float64Array(l - f);
      let total = 0;
      // a descendant's row at position p inside S costs (rows from p down) × (its columns) in that target column
      for (let t = 0; t < count; t++) {
        const dn = list[3 * t];
        const rd = rowPtr[dn];
        const nrd = rowPtr[dn + 1] - rd;
        const ncd = superStart[dn + 1] - superStart[dn];
        for (let p = list[3 * t + 1]; p < list[3 * t + 2]; p++) {
          const cost = (nrd - p) * ncd;
          perColumn[s.rows[rd + p] - f] += cost;
          total += cost;
        }
      }
      // share t: target columns bounds[t] … bounds[t + 1] − 1, cut where t/N of the work lies left
      const bounds = [f];
      let acc = 0;
      let c = 0;
      for (let t = 1; t < threads; t++) {
        for (; c < l - f && acc + perColumn[c] <= (t * total) / threads; c++) acc += perColumn[c];
        bounds.push(f + c);
      }
      bounds.push(l);
      const triples = list.slice(0, 3 * count);
      const jobs: DescendantsJob[] = helpers.map((_, i) => ({ kind: 'descendants', structure: s, values, d, ...inMemory, region: i + 1, sn, list: triples, fromColumn: bounds[i + 1], toColumn: bounds[i + 2] }));
      // this thread: target columns before bounds[1]
      alongsideAll(helpers, jobs, () => applyColumns(s, sn, triples, f, bounds[1], values, d, map, work));
    },
    panel(sn, c0, c1, work) {
      const f = superStart[sn];
      const nr = rowPtr[sn + 1] - rowPtr[sn];
      const v0 = valuePtr[sn];
      const rows = nr - c0;
      const shares = Math.min(threads, Math.floor(rows / SHARE_MIN_PANEL_ROWS));
      if (shares < 2) {
        panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, rows);
        return;
      }
      // share t: rows bounds[t] … bounds[t + 1] − 1 below c0; this thread's first share holds the diagonal block
      const bounds = [0];
      for (let t = 1; t < shares; t++) bounds.push(Math.max(c1 - c0, Math.round((t * rows) / shares)));
      bounds.push(rows);
      const jobs: PanelJob[] = [];
      for (let t = 1; t < shares; t++) {
        jobs.push({ kind: 'panel', structure: s, values, d, ...inMemory, region: t, sn, c0, c1, from: bounds[t], to: bounds[t + 1] });
      }
      alongsideAll(helpers.slice(0, shares - 1), jobs, () => panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, bounds[1]));
    },
  };
}

/**
 * S(·, fromColumn … toColumn − 1) −= the updates of every descendant of `triples` ((dn, start,
 * stop) flattened) in those target columns; `map` holds S's local row positions.
 */
function applyColumns(
  s: SupernodalStructure,
  sn: number,
  triples: Int32Array,
  fromColumn: number,
  toColumn: number,
  values: Float64Array,
  d: Float64Array,
  map: Int32Array,
  work: UpdateWorkspace,
): void {
  // each descendant's row positions whose target columns lie in the range
  for (let t = 0; 3 * t < triples.length; t++) {
    const dn = triples[3 * t];
    const start = triples[3 * t + 1];
    const stop = triples[3 * t + 2];
    const from = rowsBefore(s, dn, start, fromColumn);
    const to = Math.min(stop, rowsBefore(s, dn, from, toColumn));
    if (to > from) applyDescendant(s, dn, sn, start, stop, values, d, map, work, from - start, to - start);
  }
}

/** A helper's share of a shared supernode's descendant updates (called in the helper). */
function helperDescendants(job: DescendantsJob, map: Int32Array, work: UpdateWorkspace): void {
  const s = job.structure;
  const sn = job.sn;
  const r0 = s.rowPtr[sn];
  const nr = s.rowPtr[sn + 1] - r0;
  // local position of each row of S
  for (let i = 0; i < nr; i++) map[s.rows[r0 + i]] = i;
  applyColumns(s, sn, job.list, job.fromColumn, job.toColumn, job.values, job.d, map, work);
}

/** A helper's share of a panel update (called in the helper). */
function helperPanel(job: PanelJob, work: UpdateWorkspace): void {
  const s = job.structure;
  const nr = s.rowPtr[job.sn + 1] - s.rowPtr[job.sn];
  panelUpdateRows(job.values, s.valuePtr[job.sn], nr, job.c0, job.c1, s.superStart[job.sn], job.d, work, job.from, job.to);
}

/** Workspaces the helper keeps between jobs (a shared supernode sends one job per panel). */
let map = new Int32Array(0);
let work: UpdateWorkspace | null = null;
let workFor = -1;

/** The helper's workspaces for a job's factor (its scratch region of the factor's memory when it lives in one). */
function workspaces(job: FactorParts): { map: Int32Array; work: UpdateWorkspace } {
  const s = job.structure;
  if (map.length < s.n) map = new Int32Array(s.n);
  // a shared supernode sends one job per panel: the workspace is kept while the factor is the same
  const id = job.storage?.id ?? 0;
  if (work === null || id !== workFor || work.rel.length < s.maxRows) {
    work = updateWorkspace(s, job.storage, job.region);
    workFor = id;
  }
  return { map, work };
}

/** Lets go of the kept workspace, which may view an earlier factor's memory (so that memory can go). */
export function dropFactorWorkspace(): void {
  work = null;
  workFor = -1;
}

const DONE: Answer = { kind: 'done' };

/** The helper's handlers of these jobs (helper-worker.ts). */
export const factorJobHandlers = {
  factor(job: FactorJob): Factored {
    const monitor = new PivotMonitor(job.tolerance, job.diagonalScale);
    const out = { values: job.values, d: job.d, nextRow: job.nextRow, dirty: job.dirty, ...(job.storage ? { storage: job.storage } : {}) };
    factorSupernodes(job.structure, job.shift, monitor, out, job.ranges, [], undefined, job.region);
    return { kind: 'factored', monitor: monitor.state() };
  },
  descendants(job: DescendantsJob): Answer {
    const ws = workspaces(job);
    helperDescendants(job, ws.map, ws.work);
    return DONE;
  },
  panel(job: PanelJob): Answer {
    helperPanel(job, workspaces(job).work);
    return DONE;
  },
  dropWorkspace(_job: DropWorkspaceJob): Answer {
    dropFactorWorkspace();
    return DONE;
  },
};
