/**
 * `modalgate init`: write a starter modalgate.yaml (never over an existing file without --force)
 * and say what to edit.
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { writeFileAtomic } from '../io/atomic-write.js';
import { InputError } from '../io/errors.js';
import { runAction } from './run-action.js';

export const STARTER_CONFIG = `# modalgate config — checked by \`npx modalgate check\`. Paths are relative to this file.
# Editors complete keys from the schema:
$schema: ./node_modules/modalgate/rules/schema/config.schema.json

reports:
  junit: modalgate-report/junit.xml     # publish this file in your CI job
  json: modalgate-report/report.json

defaults:
  count: 20                             # solve the lowest 20 modes (or maxHz: 200 for every mode below 200 Hz)

models:
  - name: my-model                      # EDIT: a short unique name (JUnit classname modalgate.my-model)
    stiffness: model/my-model.stiffness.mtx.gz   # EDIT: K exported as Matrix Market (.mtx or .mtx.gz)
    mass: model/my-model.mass.mtx.gz             # EDIT: M exported as Matrix Market
    dofs: model/my-model.dofs.csv       # optional DOF map (dof,node,component,x,y,z); remove if you have none
    ruleSets: [free-free]               # EDIT: free-free (6 rigid-body modes) or supported (0), optionally + handoff-audit
    rules:
      conditioning: warning             # per-rule severity (error | warning | off) ...
      # first-elastic-frequency: { minHz: 35 }   # ... or options; required with the supported rule set
`;

export function registerInit(program: Command): void {
  program
    .command('init')
    .description('write a starter modalgate.yaml in the working directory')
    .option('-o, --output <file>', 'where to write it', 'modalgate.yaml')
    .option('-f, --force', 'overwrite an existing file')
    .action(
      runAction((opts: { output: string; force?: boolean }) => {
        process.stdout.write(writeStarterConfig(resolve(process.cwd(), opts.output), opts.force ?? false));
        return 0;
      }),
    );
}

/** Write the starter config at `target` (refusing to overwrite unless `force`); returns what to print. */
export function writeStarterConfig(target: string, force: boolean): string {
  if (existsSync(target) && !force) throw new InputError(target, 'already exists; not overwritten (use --force to replace it)');
  writeFileAtomic(target, STARTER_CONFIG);
  return [
    `wrote ${target}`,
    'next:',
    '  1. set name, stiffness and mass (and dofs if you export a DOF map) for each model;',
    '  2. pick the rule set: free-free for an unsupported model, supported for a constrained one',
    '     (then set rules.first-elastic-frequency.minHz from your stiffness requirement);',
    '  3. run `npx modalgate check` and see `npx modalgate rules` for every rule and default;',
    '  4. copy a CI template from node_modules/modalgate/ci/ into your pipeline.',
    '',
  ].join('\n');
}
