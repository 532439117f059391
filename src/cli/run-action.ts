import { oneLineMessage } from '../io/errors.js';

/** Exit codes of every command: 0 pass, 1 a rule failed, 2 bad input or internal error. */
export const EXIT_PASS = 0;
export const EXIT_RULE_FAILED = 1;
export const EXIT_BAD_INPUT = 2;

/** MODALGATE_DEBUG is set (non-empty): show the stack trace of every error a command catches. */
export function debugging(): boolean {
  return Boolean(process.env.MODALGATE_DEBUG);
}

/** Under MODALGATE_DEBUG, a caught error's stack trace on stderr; otherwise nothing. */
export function printDebugStack(stack: string): void {
  if (debugging()) process.stderr.write(`${stack}\n`);
}

/**
 * Wrap a command's action: whatever it throws becomes one stderr line and exit code 2,
 * never a stack trace (set MODALGATE_DEBUG=1 to see the trace).
 */
export function runAction<A extends unknown[]>(
  action: (...args: A) => Promise<number> | number,
): (...args: A) => Promise<void> {
  return async (...args: A) => {
    let code: number;
    try {
      code = await action(...args);
    } catch (e) {
      if (e instanceof Error && e.stack) printDebugStack(e.stack);
      process.stderr.write(`modalgate: ${oneLineMessage(e)}\n`);
      code = EXIT_BAD_INPUT;
    }
    process.exitCode = code;
  };
}

/**
 * `modalgate check … | head` closes the pipe early: a write then fails with EPIPE, which Node
 * raises as an uncaught 'error' event (a stack trace and exit 1 on a passing run). Stop writing
 * to that stream instead and leave the exit code to the run.
 */
export function stopWritingOnBrokenPipe(stream: NodeJS.WriteStream): void {
  stream.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code !== 'EPIPE' && e.code !== 'ERR_STREAM_DESTROYED') {
      // another failure of the terminal stream: nothing left to tell it to; mark the run failed
      if (!process.exitCode) process.exitCode = EXIT_BAD_INPUT;
    }
    stream.write = (() => true) as typeof stream.write;
  });
}
