/**
 * Worker-thread entry of `modalgate check`: checks the models it is sent, one at a time, and posts
 * each report. The main thread stays free while the (synchronous) solve runs here, so it can
 * answer SIGINT and SIGTERM at once and stop a model that exceeds its time limit
 * (model-runner.ts). The job comes resolved, as plain data (plain-job.ts): the config is not read
 * again here and no schema is compiled. The solver's thread count is this thread's
 * MODALGATE_THREADS, set by the runner when it starts the worker.
 */
import module from 'node:module';
import { parentPort } from 'node:worker_threads';
import type { analyzeModel, PhaseTimes, problemOf } from './analyze-model.js';
import type { PlainModelJob } from './plain-job.js';

// Node ≥ 22.1 can keep the compiled code of the modules on disk between runs (the solver's modules load after this)
(module as { enableCompileCache?: () => unknown }).enableCompileCache?.();
const { analyzeModel: analyze, problemOf: problem, stackOf } = await import('./analyze-model.js');
const { fromPlainJob } = await import('./plain-job.js');

/** `sendStacks`: post the stack trace of every exception the check catches (MODALGATE_DEBUG). */
export type ModelWorkerRequest = { kind: 'check'; id: number; job: PlainModelJob; sendStacks: boolean };

export type ModelWorkerMessage =
  | { kind: 'progress'; id: number; message: string }
  | { kind: 'caught'; id: number; stack: string }
  | { kind: 'phases'; id: number; times: PhaseTimes }
  | { kind: 'report'; id: number; report: Awaited<ReturnType<typeof analyzeModel>> }
  | { kind: 'failed'; id: number; problem: ReturnType<typeof problemOf> };

const port = parentPort!;

port.on('message', (request: ModelWorkerRequest) => void check(request));

async function check({ id, job, sendStacks }: ModelWorkerRequest): Promise<void> {
  const post = (m: ModelWorkerMessage): void => port.postMessage(m);
  const onCaughtError = sendStacks ? (e: unknown) => post({ kind: 'caught', id, stack: stackOf(e) }) : undefined;
  try {
    const report = await analyze(fromPlainJob(job), { onProgress: (message) => post({ kind: 'progress', id, message }), onPhases: (times) => post({ kind: 'phases', id, times }), onCaughtError });
    post({ kind: 'report', id, report });
  } catch (e) {
    onCaughtError?.(e);
    post({ kind: 'failed', id, problem: problem(e) });
  }
}
