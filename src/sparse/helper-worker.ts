/**
 * A helper thread (helper-thread.ts starts N − 1 of them, each with its own port). It waits for
 * jobs on its message port, hands each to its kind's handler (the job modules' handler tables),
 * posts the answer (tagged with the job's id) on the same port and then writes the id into the
 * job's flag, so the main thread — blocked in Atomics.wait — can take the answer with
 * receiveMessageOnPort. Every job answers, an exception included, so the main thread never
 * waits forever on a job that started.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { workerData, type MessagePort } from 'node:worker_threads';
import type { Answer, Failed, Job, PostedJob } from './helper-thread.js';
import { dropFactorWorkspace, factorJobHandlers } from './split-factor.js';
import { solveJobHandlers } from './split-solve.js';
import { separatorJobHandlers } from './separator-jobs.js';
import { blockProductHandlers } from './block-product-jobs.js';

const port = (workerData as { port: MessagePort }).port;

/**
 * A collector this thread can run on request: the jobs hand it shared arrays (bases, factors),
 * and their memory is returned only when every thread has dropped them — this thread allocates
 * too little for its collector to run on its own. Measured effect of the collections on peak RSS
 * in helper-thread.ts (collectHere): 547 against 579 MB on a 26k-DOF solve with 3 factorizations.
 */
setFlagsFromString('--expose-gc');
const collect = runInNewContext('gc') as () => void;

/** The runtime's own jobs, then every job module's. */
const handlers: Record<string, (job: never) => Answer> = {
  ping: (): Answer => ({ kind: 'pong' }),
  collect(): Answer {
    // the kept workspace may view an earlier factor's memory: drop it so that memory can go
    dropFactorWorkspace();
    collect();
    return { kind: 'done' };
  },
  ...factorJobHandlers,
  ...solveJobHandlers,
  ...separatorJobHandlers,
  ...blockProductHandlers,
};

function run(job: Job): Answer {
  const handler = handlers[job.kind] as ((job: Job) => Answer) | undefined;
  if (handler === undefined) throw new Error(`no handler for job kind ${job.kind}`);
  return handler(job);
}

port.on('message', (job: PostedJob) => {
  let result: Answer;
  try {
    result = run(job);
  } catch (e) {
    const failed: Failed = { kind: 'failed', message: e instanceof Error ? e.message : String(e) };
    result = failed;
  }
  port.postMessage({ ...result, id: job.id });
  Atomics.store(job.flag, 0, job.id);
  Atomics.notify(job.flag, 0);
});
