/**
 * Clean-up on SIGINT / SIGTERM while a multi-file write is under way: a CI job that is cancelled
 * in the middle of `check --save-baseline` must leave no temporary files and no lock behind.
 *
 * `withSignalCleanup(cleanup, work)` runs `work`; if one of the two signals arrives meanwhile,
 * `cleanup` runs (synchronously), the handlers are removed and the signal is raised again, so the
 * process ends the way it would have without us (exit status 128 + signal number). Nested or
 * concurrent uses each register their own clean-up; every one runs.
 */
const SIGNALS = ['SIGINT', 'SIGTERM'] as const;
const cleanups = new Set<() => void>();
let installed = false;

function onSignal(signal: NodeJS.Signals): void {
  for (const c of [...cleanups]) {
    try {
      c();
    } catch {
      // clean-up is best effort: the signal must still end the process
    }
  }
  cleanups.clear();
  uninstall();
  process.kill(process.pid, signal);
}

function install(): void {
  if (installed) return;
  for (const s of SIGNALS) process.on(s, onSignal);
  installed = true;
}

function uninstall(): void {
  if (!installed) return;
  for (const s of SIGNALS) process.off(s, onSignal);
  installed = false;
}

export async function withSignalCleanup<T>(cleanup: () => void, work: () => Promise<T>): Promise<T> {
  cleanups.add(cleanup);
  install();
  try {
    return await work();
  } finally {
    cleanups.delete(cleanup);
    if (cleanups.size === 0) uninstall();
  }
}
