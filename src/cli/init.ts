/**
 * `modalgate init`: write a starter modalgate.yaml and add the report folder to .gitignore;
 * with `--ci github|gitlab|jenkins` also a package.json pinning modalgate and the CI server's
 * job file from the templates in ci/. Never writes over an existing file without --force.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { Option, type Command } from 'commander';
import { writeFileAtomic } from '../io/atomic-write.js';
import { InputError } from '../io/errors.js';
import { runAction } from './run-action.js';
import { packageRoot, packageVersion } from '../io/package-root.js';

/** The folder the reports go to (CI templates, starter config and the .gitignore entry agree). */
const REPORT_DIR = 'modalgate-report';

/** Node version the generated package.json asks for and the templates run (20 is past its end of life). */
const NODE_RANGE = '>=22';

/** The starter config; `schemaPath` is the editor schema's path relative to the config's folder. */
function starterConfig(schemaPath: string): string {
  return `# yaml-language-server: $schema=${schemaPath}
# modalgate config — checked by \`npx modalgate check\`. Paths are relative to this file.
# Editors complete keys from the schema:
$schema: ${schemaPath}

reports:
  junit: ${REPORT_DIR}/junit.xml     # publish this file in your CI job
  json: ${REPORT_DIR}/report.json

defaults:
  count: 20                             # solve the lowest 20 modes (or maxHz: 200 for every mode below 200 Hz)

# units: { length: m, mass: t, massScale: 1000 }   # optional names for reports and mass targets
#                                       # (here a kg/m model reported in t; frequencies stay in Hz)

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
}

/** The CI servers `--ci` knows: the template in ci/ and where its job file goes in the repository. */
export const CI_TARGETS = {
  github: { template: 'github-actions.yml', target: '.github/workflows/modalgate.yml' },
  gitlab: { template: 'gitlab-ci.yml', target: '.gitlab-ci.yml' },
  jenkins: { template: 'Jenkinsfile', target: 'Jenkinsfile' },
} as const;
export type CiServer = keyof typeof CI_TARGETS;

/** Where each template keeps its shard count (ci/README.md "Shards and the merge"). */
const SHARD_COUNT_AT: Record<CiServer, string> = {
  github: 'the list `shard: [1, 2, 3]`',
  gitlab: '`parallel: 3`',
  jenkins: '`def SHARDS = 3`',
};

interface InitOptions {
  output: string;
  force?: boolean;
  ci?: CiServer;
}

export function registerInit(program: Command): void {
  program
    .command('init')
    .description('write a starter modalgate.yaml (and with --ci a package.json and CI job file) in the working directory')
    .option('-o, --output <file>', 'where to write the config', 'modalgate.yaml')
    .addOption(new Option('--ci <server>', 'also write a package.json pinning modalgate and the job file for this CI server').choices(Object.keys(CI_TARGETS)))
    .option('-f, --force', 'overwrite existing files')
    .action(
      runAction((opts: InitOptions) => {
        process.stdout.write(initRepository(process.cwd(), opts));
        return 0;
      }),
    );
}

/** Forward slashes: the path goes into YAML and CI scripts, read the same on every OS. */
function posix(p: string): string {
  return p.split(sep).join('/');
}

/** The `$schema` path from the config's folder to the schema installed under `<repo>/node_modules`. */
function schemaPathFrom(configDir: string, repoDir: string, packageName: string): string {
  const rel = posix(relative(configDir, join(repoDir, 'node_modules', packageName, 'rules', 'schema', 'config.schema.json')));
  return rel.startsWith('.') ? rel : `./${rel}`;
}

/** The minimal package.json of a model repository: private, pins modalgate, names the Node version. */
function repositoryPackageJson(name: string, version: string): string {
  const pkg = {
    private: true,
    description: `Pins ${name} for the modal gate of this repository's FE models (written by \`${name} init --ci\`).`,
    engines: { node: NODE_RANGE },
    scripts: { 'modal-check': `${name} check` },
    devDependencies: { [name]: `^${version}` },
  };
  return `${JSON.stringify(pkg, null, 2)}\n`;
}

/** The CI template for `server`, pointed at the config when it is not the default one. */
export function ciJobFile(server: CiServer, configArg: string | undefined, root = packageRoot()): string {
  const text = readFileSync(join(root, 'ci', CI_TARGETS[server].template), 'utf8');
  return configArg ? text.replaceAll('npx modalgate check', `npx modalgate check --config ${configArg}`) : text;
}

/**
 * `.gitignore` text with `entries` (folders, `name/`) added once each — an existing line `name`,
 * `name/`, `/name` or `/name/` counts — or undefined when every one is already listed.
 */
function withIgnored(existing: string | undefined, entries: string[]): string | undefined {
  const listed = new Set((existing ?? '').split(/\r?\n/).map((l) => l.trim().replace(/^\//, '').replace(/\/$/, '')));
  const missing = entries.filter((e) => !listed.has(e.replace(/\/$/, '')));
  if (missing.length === 0) return undefined;
  const base = existing === undefined || existing === '' ? '' : existing.endsWith('\n') ? existing : `${existing}\n`;
  return `${base}# added by modalgate init\n${missing.join('\n')}\n`;
}

/**
 * Write the starter config (and with `ci` the package.json and job file) into the repository at
 * `repoDir`, append the report folder to .gitignore; returns what to print. Every file is checked
 * before any is written, so a refusal leaves the folder as it was.
 */
function initRepository(repoDir: string, opts: InitOptions): string {
  const pkg = { root: packageRoot(), name: 'modalgate', version: packageVersion() };
  const configPath = resolve(repoDir, opts.output);
  const files: { path: string; text: string }[] = [
    { path: configPath, text: starterConfig(schemaPathFrom(dirname(configPath), repoDir, pkg.name)) },
  ];
  if (opts.ci) {
    const relConfig = posix(relative(repoDir, configPath));
    const configArg = relConfig === 'modalgate.yaml' ? undefined : relConfig;
    files.push({ path: join(repoDir, 'package.json'), text: repositoryPackageJson(pkg.name, pkg.version) });
    files.push({ path: join(repoDir, CI_TARGETS[opts.ci].target), text: ciJobFile(opts.ci, configArg, pkg.root) });
  }
  if (!opts.force) {
    for (const f of files) if (existsSync(f.path)) throw new InputError(f.path, 'already exists; not overwritten (use --force to replace it)');
  }
  for (const f of files) writeFileAtomic(f.path, f.text);

  const ignorePath = join(repoDir, '.gitignore');
  // the report folder always; node_modules too when init makes the repository a Node project
  const entries = opts.ci ? [`${REPORT_DIR}/`, 'node_modules/'] : [`${REPORT_DIR}/`];
  const ignored = withIgnored(existsSync(ignorePath) ? readFileSync(ignorePath, 'utf8') : undefined, entries);
  if (ignored !== undefined) writeFileAtomic(ignorePath, ignored);

  const out = files.map((f) => `wrote ${f.path}`);
  out.push(ignored === undefined ? `${ignorePath} already ignores ${entries.join(' and ')}` : `updated ${ignorePath} (ignores ${entries.join(' and ')})`);
  out.push('next:');
  const steps = [
    'set name, stiffness and mass (and dofs if you export a DOF map) for each model;',
    'pick the rule set: free-free for an unsupported model, supported for a constrained one\n     (then set rules.first-elastic-frequency.minHz from your stiffness requirement);',
  ];
  if (opts.ci) {
    steps.unshift('run `npm install` (it installs modalgate and writes package-lock.json), then commit\n     package.json and package-lock.json: the CI job runs `npm ci`, which needs the lockfile;');
    steps.push('run `npx modalgate check` until it passes, then `npx modalgate check --save-baseline baselines/`\n     and commit baselines/ (refresh them later on purpose: see node_modules/modalgate/ci/README.md);');
    steps.push(`set the shard count (parallel check jobs, ${SHARD_COUNT_AT[opts.ci]}) at the top of ${CI_TARGETS[opts.ci].target}\n     from your models' check time;`);
    steps.push(`commit ${CI_TARGETS[opts.ci].target} and the config; see \`npx modalgate rules\` for every rule and default.`);
  } else {
    steps.push('run `npx modalgate check` and see `npx modalgate rules` for every rule and default;');
    steps.push('add modalgate to CI with `npx modalgate init --ci github|gitlab|jenkins` (or copy a template from\n     node_modules/modalgate/ci/).');
  }
  steps.forEach((s, i) => out.push(`  ${i + 1}. ${s}`));
  out.push('');
  return out.join('\n');
}

/** The starter config as written at the top of a repository (`modalgate init` with no options). */
export const STARTER_CONFIG = starterConfig(schemaPathFrom('.', '.', 'modalgate'));

/** Write the starter config at `target`, its folder taken as the repository (refusing to overwrite unless `force`). */
export function writeStarterConfig(target: string, force: boolean): string {
  return initRepository(dirname(target), { output: target, force });
}
