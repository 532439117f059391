/**
 * Worker-thread entry of `modalgate check`: checks the models it is sent, one at a time, and posts
 * each report. The main thread stays free while the (synchronous) solve runs here, so it can
 * answer SIGINT and SIGTERM at once and stop a model that exceeds its time limit
 * (model-runner.ts). A job is found again by name from the config, because a resolved job holds
 * the rule modules (functions), which do not cross threads; the config is loaded once.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { loadConfig, type ConfigOverrides } from './load-config.js';
import type { LoadedConfig } from './job-types.js';
import { analyzeModel, problemOf, stackOf, type PhaseTimes } from './analyze-model.js';

export interface ModelWorkerInput {
  configPath: string;
  overrides: ConfigOverrides;
}

/** `sendStacks`: post the stack trace of every exception the check catches (MODALGATE_DEBUG). */
export type ModelWorkerRequest = { kind: 'check'; id: number; modelName: string; sendStacks: boolean };

export type ModelWorkerMessage =
  | { kind: 'progress'; id: number; message: string }
  | { kind: 'caught'; id: number; stack: string }
  | { kind: 'phases'; id: number; times: PhaseTimes }
  | { kind: 'report'; id: number; report: Awaited<ReturnType<typeof analyzeModel>> }
  | { kind: 'failed'; id: number; problem: ReturnType<typeof problemOf> };

const input = workerData as ModelWorkerInput;
const port = parentPort!;
let config: LoadedConfig | undefined;

port.on('message', (request: ModelWorkerRequest) => void check(request));

async function check({ id, modelName, sendStacks }: ModelWorkerRequest): Promise<void> {
  const post = (m: ModelWorkerMessage): void => port.postMessage(m);
  const onCaughtError = sendStacks ? (e: unknown) => post({ kind: 'caught', id, stack: stackOf(e) }) : undefined;
  try {
    config ??= loadConfig(input.configPath, input.overrides);
    const job = config.models.find((m) => m.name === modelName);
    if (!job) throw new Error(`model ${modelName} is not in ${input.configPath}`);
    const report = await analyzeModel(job, { onProgress: (message) => post({ kind: 'progress', id, message }), onPhases: (times) => post({ kind: 'phases', id, times }), onCaughtError });
    post({ kind: 'report', id, report });
  } catch (e) {
    onCaughtError?.(e);
    post({ kind: 'failed', id, problem: problemOf(e) });
  }
}
