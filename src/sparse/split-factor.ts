/**
 * Two-thread LDLᵀ factorization, behind the same synchronous interface as the serial one, and
 * its jobs for the helper thread (helper-thread.ts).
 *
 * The supernodal tree is split (subtree-split.ts) into two sets of disjoint subtrees; the helper
 * factors one set while this thread factors the other, then this thread factors the top (their
 * common ancestors), applying the updates the subtrees still owe through the shared `nextRow`
 * record, and hands the helper a share of the top's large supernodes (descendant updates and
 * panel updates). Both threads write disjoint blocks of the same SharedArrayBuffer-backed
 * arrays, so nothing is copied or merged but the pivot counts.
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
import { alongside, collectBoth, sharedBlock, sharedCopy, sharedInt32, startHelper, type Answer, type Helper } from './helper-thread.js';

/** The arrays every job on a factor brings (shared; `storage` when the values live in a WebAssembly memory). */
interface FactorParts {
  structure: SupernodalStructure;
  values: Float64Array;
  d: Float64Array;
  storage?: FactorStorage;
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

/** The helper's share of a shared supernode's descendant updates. */
export interface DescendantsJob extends FactorParts {
  kind: 'descendants';
  sn: number;
  /** (dn, start, stop) triples. */
  list: Int32Array;
  /** The helper's share: target columns ≥ fromColumn. */
  fromColumn: number;
}

/** The helper's share of a panel update: rows from … to−1 below the panel. */
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

/** The structure with every array moved to shared memory (the helper reads it without a copy). */
export function shareStructure(s: SupernodalStructure): SupernodalStructure {
  const { pair } = s;
  return {
    ...s,
    perm: sharedCopy(s.perm),
    pair: { n: pair.n, colPtr: sharedCopy(pair.colPtr), rowIdx: sharedCopy(pair.rowIdx), stiffness: sharedCopy(pair.stiffness), mass: sharedCopy(pair.mass) },
    superStart: sharedCopy(s.superStart),
    superOf: sharedCopy(s.superOf),
    rowPtr: sharedCopy(s.rowPtr),
    rows: sharedCopy(s.rows),
    valuePtr: sharedCopy(s.valuePtr),
  };
}

/**
 * LDLᵀ on two threads along `split` (two parts); null when no helper thread is available, so the
 * caller factors serially. `s` must come from shareStructure.
 */
export function parallelSupernodalLdlt(s: SupernodalStructure, shift: number, monitor: PivotMonitor, split: SubtreeSplit, recycled?: RecycledValues): SupernodalFactor | null {
  const h = startHelper();
  if (h === null || split.parts.length !== 2) return null;
  // before the factor's large allocation: let both threads drop the shared arrays of earlier work
  collectBoth(h);
  const { values, storage, dirty } = factorValues(s, recycled, sharedBlock);
  const d = sharedBlock(s.n);
  const nextRow = sharedInt32(s.supernodes);
  const out = { values, d, nextRow, dirty, ...(storage ? { storage } : {}) };
  const job: FactorJob = { kind: 'factor', structure: s, shift, tolerance: monitor.tolerance, diagonalScale: monitor.diagonalScale, ...out, ranges: split.parts[1] };
  const theirs = alongside<Factored>(h, job, () => factorSupernodes(s, shift, monitor, out, split.parts[0]), 'factored');
  monitor.merge(theirs.monitor);
  factorSupernodes(s, shift, monitor, out, split.top, [...split.parts[0], ...split.parts[1]], cooperation(h, s, values, d, storage));
  // the helper lets go of this factor's memory, so a released factor is not kept alive by it
  alongside(h, { kind: 'dropWorkspace' }, () => {});
  return { structure: s, values, d, ...(storage ? { storage } : {}) };
}

/** Supernodes of the top with at least this many rows and columns share their work (our choice). */
const SHARE_MIN_ROWS = 512;
const SHARE_MIN_COLUMNS = 128;
/** Panel updates of fewer rows stay on this thread. */
const SHARE_MIN_PANEL_ROWS = 256;

/**
 * How the top's large supernodes are shared: descendants' updates split at the target column
 * where the estimated work (per target column: the updating rows at and below it times the
 * descendant's columns) is halved, panel updates split by rows.
 */
function cooperation(h: Helper, s: SupernodalStructure, values: Float64Array, d: Float64Array, storage: FactorStorage | undefined): SupernodeCooperation {
  const inMemory = storage ? { storage } : {};
  const { superStart, rowPtr, valuePtr } = s;
  return {
    wants: (sn) => rowPtr[sn + 1] - rowPtr[sn] >= SHARE_MIN_ROWS && superStart[sn + 1] - superStart[sn] >= SHARE_MIN_COLUMNS,
    descendants(sn, list, count, map, work) {
      const f = superStart[sn];
      const nc = superStart[sn + 1] - f;
      const perColumn = new Float64Array(nc);
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
      // split where half of the work lies left
      let mid = 0;
      for (let acc = 0; mid < nc && acc + perColumn[mid] <= total / 2; mid++) acc += perColumn[mid];
      const fromColumn = f + mid;
      const triples = list.slice(0, 3 * count);
      const job: DescendantsJob = { kind: 'descendants', structure: s, values, d, ...inMemory, sn, list: triples, fromColumn };
      alongside(h, job, () => {
        // this thread: target columns before fromColumn
        for (let t = 0; t < count; t++) {
          const dn = triples[3 * t];
          const start = triples[3 * t + 1];
          const split = rowsBefore(s, dn, start, fromColumn);
          if (split > start) applyDescendant(s, dn, sn, start, triples[3 * t + 2], values, d, map, work, 0, split - start);
        }
      });
    },
    panel(sn, c0, c1, work) {
      const f = superStart[sn];
      const nr = rowPtr[sn + 1] - rowPtr[sn];
      const v0 = valuePtr[sn];
      const rows = nr - c0;
      if (rows < SHARE_MIN_PANEL_ROWS) {
        panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, rows);
        return;
      }
      // this thread: the top half with the panel's diagonal block; the helper: the rows below
      const split = Math.max(c1 - c0, rows >> 1);
      const job: PanelJob = { kind: 'panel', structure: s, values, d, ...inMemory, sn, c0, c1, from: split, to: rows };
      alongside(h, job, () => panelUpdateRows(values, v0, nr, c0, c1, f, d, work, 0, split));
    },
  };
}

/** The helper's share of a shared supernode's descendant updates (called in the helper). */
function helperDescendants(job: DescendantsJob, map: Int32Array, work: UpdateWorkspace): void {
  const s = job.structure;
  const sn = job.sn;
  const r0 = s.rowPtr[sn];
  const nr = s.rowPtr[sn + 1] - r0;
  // local position of each row of S
  for (let i = 0; i < nr; i++) map[s.rows[r0 + i]] = i;
  for (let t = 0; 3 * t < job.list.length; t++) {
    const dn = job.list[3 * t];
    const start = job.list[3 * t + 1];
    const stop = job.list[3 * t + 2];
    const split = rowsBefore(s, dn, start, job.fromColumn);
    if (stop > split) applyDescendant(s, dn, sn, start, stop, job.values, job.d, map, work, split - start, stop - start);
  }
}

/** The helper's share of a panel update (called in the helper). */
function helperPanel(job: PanelJob, work: UpdateWorkspace): void {
  const s = job.structure;
  const nr = s.rowPtr[job.sn + 1] - s.rowPtr[job.sn];
  panelUpdateRows(job.values, s.valuePtr[job.sn], nr, job.c0, job.c1, s.superStart[job.sn], job.d, work, job.from, job.to);
}

/** Workspaces the helper keeps between jobs (a shared supernode sends one job per panel). */
let map = new Int32Array(0);
let work: UpdateWorkspace | null = null;
let workFor = -1;

/** The helper's workspaces for a job's factor (scratch region 1 of its memory when it lives in one). */
function workspaces(job: { structure: SupernodalStructure; storage?: FactorStorage }): { map: Int32Array; work: UpdateWorkspace } {
  const s = job.structure;
  if (map.length < s.n) map = new Int32Array(s.n);
  // a shared supernode sends one job per panel: the workspace is kept while the factor is the same
  const id = job.storage?.id ?? 0;
  if (work === null || id !== workFor || work.rel.length < s.maxRows) {
    work = updateWorkspace(s, job.storage, 1);
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
    factorSupernodes(job.structure, job.shift, monitor, out, job.ranges, [], undefined, 1);
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
