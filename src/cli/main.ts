#!/usr/bin/env node
import module from 'node:module';
import { readFileSync } from 'node:fs';

// Node ≥ 22.1 can keep the compiled code of the modules on disk between runs; Node 20 has no such call
(module as { enableCompileCache?: () => unknown }).enableCompileCache?.();
const { Command, CommanderError } = await import('commander');
const { EXIT_BAD_INPUT, stopWritingOnBrokenPipe } = await import('./run-action.js');

stopWritingOnBrokenPipe(process.stdout);
stopWritingOnBrokenPipe(process.stderr);

function packageVersion(): string {
  const url = new URL('../../../package.json', import.meta.url);
  return (JSON.parse(readFileSync(url, 'utf8')) as { version: string }).version;
}

const program = new Command();
program
  .name('modalgate')
  .description(
    'Gate finite-element model changes in CI: read K and M (Matrix Market), solve the lowest modes\n' +
      'with a verified sparse eigensolver, apply pass/fail rules, write JUnit XML and reports.\n' +
      'Exit codes: 0 pass, 1 a rule failed, 2 bad input or internal error.\n' +
      'Results support, never replace, review by a qualified engineer under the applicable codes.',
  )
  .version(packageVersion(), '-V, --version')
  .showHelpAfterError()
  .exitOverride();

// each command's module is loaded only when it may run: `check` never loads the solver on this thread
const commands: Record<string, () => Promise<(p: InstanceType<typeof Command>) => void>> = {
  inspect: async () => (await import('./inspect.js')).registerInspect,
  modes: async () => (await import('./modes.js')).registerModes,
  check: async () => (await import('./check.js')).registerCheck,
  rules: async () => (await import('./rules.js')).registerRules,
  init: async () => (await import('./init.js')).registerInit,
  demo: async () => (await import('./demo.js')).registerDemo,
  merge: async () => (await import('./merge.js')).registerMerge,
};
const named = process.argv[2];
// `--version` needs no command; a command name loads its own; help and anything else list them all
const toLoad = named === '-V' || named === '--version' ? [] : named !== undefined && Object.hasOwn(commands, named) ? [named] : Object.keys(commands);
for (const name of toLoad) (await commands[name]())(program);

try {
  await program.parseAsync(process.argv);
} catch (e) {
  if (e instanceof CommanderError) {
    // commander already printed its message; help and version exit 0
    process.exitCode = e.exitCode === 0 ? 0 : EXIT_BAD_INPUT;
  } else {
    process.stderr.write(`modalgate: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = EXIT_BAD_INPUT;
  }
}
