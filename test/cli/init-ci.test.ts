/**
 * `modalgate init --ci github|gitlab|jenkins` in an empty folder (a model repository that is not
 * a Node project), run through the built CLI: the files it writes, refusal without --force, the
 * .gitignore entry written once, and a `$schema` path that resolves from the config's folder. The
 * templates themselves are checked in test/ci/templates.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { parse } from 'yaml';
import { ensureBuilt, repoRoot, runCli } from './built-cli.js';
import { CI_TARGETS, type CiServer } from '../../src/cli/init.js';

const ownPackage = JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8')) as { name: string; version: string };
let work: string;
let n = 0;
/** A fresh empty folder standing for a model repository. */
function freshRepo(): string {
  const dir = join(work, `repo-${n++}`);
  mkdirSync(dir);
  return dir;
}

beforeAll(() => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-init-ci-'));
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** The `$schema` value of a config written by init, and its editor modeline's. */
function schemaPaths(configFile: string): { key: string; modeline: string } {
  const text = readFileSync(configFile, 'utf8');
  const modeline = /^# yaml-language-server: \$schema=(\S+)$/m.exec(text)?.[1] ?? '';
  return { key: (parse(text) as { $schema: string }).$schema, modeline };
}

const servers = Object.keys(CI_TARGETS) as CiServer[];

describe('init --ci', () => {
  it.each(servers)('%s: writes package.json, the job file, the config and the .gitignore entry; refuses to overwrite without --force', async (server) => {
    const dir = freshRepo();
    const r = await runCli(['init', '--ci', server], dir);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('npm install');
    expect(r.stdout).toContain('package-lock.json');

    const pkg = JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8')) as Record<string, unknown>;
    expect(pkg.private).toBe(true);
    expect(pkg.devDependencies).toEqual({ [ownPackage.name]: `^${ownPackage.version}` });
    expect((pkg.engines as { node: string }).node).toBe('>=22');

    const job = join(dir, CI_TARGETS[server].target);
    expect(readFileSync(job, 'utf8')).toBe(readFileSync(join(repoRoot, 'ci', CI_TARGETS[server].template), 'utf8'));
    const config = join(dir, 'modalgate.yaml');
    const { key, modeline } = schemaPaths(config);
    expect(key).toBe(modeline);
    expect(resolve(dir, key)).toBe(join(dir, 'node_modules/modalgate/rules/schema/config.schema.json'));
    expect(readFileSync(join(dir, '.gitignore'), 'utf8')).toBe('# added by modalgate init\nmodalgate-report/\nnode_modules/\n');

    // a second run refuses: one line naming the first file found, exit 2, nothing changed
    writeFileSync(join(dir, 'package.json'), '{"private": true}\n');
    const again = await runCli(['init', '--ci', server], dir);
    expect(again.code).toBe(2);
    expect(again.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(again.stderr).toContain(`${config}: already exists; not overwritten (use --force`);
    expect(readFileSync(join(dir, 'package.json'), 'utf8')).toBe('{"private": true}\n');

    const forced = await runCli(['init', '--ci', server, '--force'], dir);
    expect(forced.code).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8'))).toEqual(pkg);
    // the .gitignore entries stay single
    const ignore = readFileSync(join(dir, '.gitignore'), 'utf8');
    expect(ignore.match(/^modalgate-report\/$/gm)).toHaveLength(1);
    expect(ignore.match(/^node_modules\/$/gm)).toHaveLength(1);
  });

  it('refuses when only the job file exists, naming it', async () => {
    const dir = freshRepo();
    writeFileSync(join(dir, '.gitlab-ci.yml'), 'build:\n  script: [make]\n');
    const r = await runCli(['init', '--ci', 'gitlab'], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`modalgate: ${join(dir, '.gitlab-ci.yml')}: already exists; not overwritten (use --force to replace it)\n`);
    expect(readdirSync(dir)).toEqual(['.gitlab-ci.yml']); // nothing else written
  });

  it('init --ci github -o configs/modalgate.yaml: $schema resolves from the subfolder and the workflow names the config', async () => {
    const dir = freshRepo();
    const r = await runCli(['init', '--ci', 'github', '-o', 'configs/modalgate.yaml'], dir);
    expect(r.code).toBe(0);
    const config = join(dir, 'configs/modalgate.yaml');
    const { key, modeline } = schemaPaths(config);
    expect(key).toBe('../node_modules/modalgate/rules/schema/config.schema.json');
    expect(modeline).toBe(key);
    expect(resolve(dirname(config), key)).toBe(join(dir, 'node_modules/modalgate/rules/schema/config.schema.json'));
    const workflow = readFileSync(join(dir, '.github/workflows/modalgate.yml'), 'utf8');
    const runs = JSON.stringify(parse(workflow));
    expect(runs).toContain('npx modalgate check --config configs/modalgate.yaml --baseline baselines/');
    expect(runs).not.toMatch(/modalgate check (?!--config)/);
  });

  it('plain init writes the config and the .gitignore entry only, appending to an existing .gitignore once', async () => {
    const dir = freshRepo();
    writeFileSync(join(dir, '.gitignore'), '*.tmp'); // no final newline
    const r = await runCli(['init'], dir);
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['.gitignore', 'modalgate.yaml']);
    expect(readFileSync(join(dir, '.gitignore'), 'utf8')).toBe('*.tmp\n# added by modalgate init\nmodalgate-report/\n');
    await runCli(['init', '--force'], dir);
    expect(readFileSync(join(dir, '.gitignore'), 'utf8').match(/modalgate-report\//g)).toHaveLength(1);
    expect(r.stdout).toContain('init --ci github|gitlab|jenkins');
  });

  it('an existing .gitignore that already lists the report folder is left as it is; --ci adds only node_modules/', async () => {
    const dir = freshRepo();
    writeFileSync(join(dir, '.gitignore'), 'build\n/modalgate-report\n');
    const r = await runCli(['init'], dir);
    expect(r.code).toBe(0);
    expect(readFileSync(join(dir, '.gitignore'), 'utf8')).toBe('build\n/modalgate-report\n');
    expect(r.stdout).toContain('already ignores modalgate-report/');
    const ci = await runCli(['init', '--ci', 'jenkins', '--force'], dir);
    expect(ci.code).toBe(0);
    expect(readFileSync(join(dir, '.gitignore'), 'utf8')).toBe('build\n/modalgate-report\n# added by modalgate init\nnode_modules/\n');
  });

  it('an unknown CI server is refused with exit 2', async () => {
    const dir = freshRepo();
    const r = await runCli(['init', '--ci', 'travis'], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--ci.*travis|travis.*--ci|Allowed choices are github, gitlab, jenkins/);
    expect(existsSync(join(dir, 'modalgate.yaml'))).toBe(false);
  });
});
