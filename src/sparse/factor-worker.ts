/**
 * Helper thread of the parallel LDLᵀ (src/sparse/parallel-factor.ts). It waits for jobs on its
 * message port, runs them on the shared arrays, posts the result (tagged with the job's id) on
 * the same port and then writes the id into the job's flag, so the main thread — blocked in
 * Atomics.wait — can take the result with receiveMessageOnPort. Every job answers, an exception
 * included, so the main thread never waits forever on a job that started.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { workerData, type MessagePort } from 'node:worker_threads';
import { addTimesSmall, timesSmallInPlace, transposeTimes } from '../dense/block-ops.js';
import { multilevelSeparator } from './ordering/multilevel-bisection.js';
import { symMultiplyColumns } from './csc.js';
import { factorSupernodes, updateWorkspace, type UpdateWorkspace } from './numeric-ldlt.js';
import { PivotMonitor } from './pivot-monitor.js';
import { backwardSweepRanges, forwardSweepRanges, sweepWorkspace } from './triangular-solve.js';
import { helperDescendants, helperPanel, type HelperJob, type HelperResult } from './parallel-factor.js';
import type { SupernodalStructure } from './symbolic.js';
import type { FactorStorage } from './simd-sweep-kernels.js';

const port = (workerData as { port: MessagePort }).port;

/**
 * A collector this thread can run on request: the jobs hand it shared arrays (bases, factors),
 * and their memory is returned only when every thread has dropped them — this thread allocates
 * too little for its collector to run on its own.
 */
setFlagsFromString('--expose-gc');
const collect = runInNewContext('gc') as () => void;

/** Workspaces kept between jobs (a shared supernode sends one job per panel). */
let map = new Int32Array(0);
let work: UpdateWorkspace | null = null;
let workFor = -1;

/** This thread's workspaces for a job's factor (scratch region 1 of its memory when it lives in one). */
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

function run(job: HelperJob): HelperResult {
  switch (job.kind) {
    case 'ping':
      return { kind: 'pong' };
    case 'separatorRuns':
      return { kind: 'separators', wheres: job.seeds.map((seed) => multilevelSeparator(job.graph, seed)) };
    case 'collect':
    case 'dropWorkspace':
      // the kept workspace may view an earlier factor's memory: drop it so that memory can go
      work = null;
      workFor = -1;
      if (job.kind === 'collect') collect();
      return { kind: 'done' };
    case 'factor': {
      const monitor = new PivotMonitor(job.tolerance, job.diagonalScale);
      const out = { values: job.values, d: job.d, nextRow: job.nextRow, dirty: job.dirty, ...(job.storage ? { storage: job.storage } : {}) };
      factorSupernodes(job.structure, job.shift, monitor, out, job.ranges, [], undefined, 1);
      return { kind: 'factored', monitor: monitor.state() };
    }
    case 'descendants': {
      const ws = workspaces(job);
      helperDescendants(job, ws.map, ws.work);
      return { kind: 'done' };
    }
    case 'panel':
      helperPanel(job, workspaces(job).work);
      return { kind: 'done' };
    case 'transposeTimes':
      transposeTimes(job.a, job.b, job.rows, job.p, job.q, job.out, job.rowFrom, job.rowTo);
      return { kind: 'done' };
    case 'addTimesSmall':
      addTimesSmall(job.c, job.a, job.rows, job.p, job.s, job.q, job.alpha, job.rowFrom, job.rowTo);
      return { kind: 'done' };
    case 'symMultiply':
      symMultiplyColumns(job.a, job.x, job.k, job.y, job.colFrom, job.colTo);
      return { kind: 'done' };
    case 'timesSmallInPlace':
      timesSmallInPlace(job.a, job.rows, job.p, job.s, job.q, job.rowFrom, job.rowTo);
      return { kind: 'done' };
    case 'forward': {
      const f = { structure: job.structure, values: job.values, d: job.d, storage: job.storage };
      forwardSweepRanges(f, job.x, job.columns, sweepWorkspace(f, job.columns, 1), job.ranges, { index: job.index, count: job.count, acc: job.acc });
      return { kind: 'done' };
    }
    case 'backward': {
      const f = { structure: job.structure, values: job.values, d: job.d, storage: job.storage };
      backwardSweepRanges(f, job.x, job.columns, sweepWorkspace(f, job.columns, 1), job.ranges);
      return { kind: 'done' };
    }
  }
}

port.on('message', (job: HelperJob) => {
  let result: HelperResult;
  try {
    result = run(job);
  } catch (e) {
    result = { kind: 'failed', message: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage({ ...result, id: job.id });
  Atomics.store(job.flag, 0, job.id);
  Atomics.notify(job.flag, 0);
});
