/**
 * End to end, opt-in (MODALGATE_PACK_E2E=1; needs the npm registry for modalgate's dependencies and
 * takes ~30 s, so it stays out of `npm test`): `npm pack` this repository, `init --ci github` in an
 * empty git repository holding the demo bracket, point its package.json at the tarball, `npm install`
 * (writes the lockfile), then `npm ci` from that lockfile, and check with a saved baseline — the
 * steps README "Add modalgate to a model repository" tells a user to take.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parse } from 'yaml';
import { ensureBuilt, repoRoot, runCli } from './built-cli.js';

const enabled = process.env.MODALGATE_PACK_E2E === '1';
let work = '';

function sh(cmd: string, args: string[], cwd: string): { code: number | null; out: string } {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8', timeout: 300_000 });
  return { code: r.status, out: `${r.stdout}${r.stderr}` };
}

describe.runIf(enabled)('npm pack + init --ci github in an empty model repository', () => {
  beforeAll(() => {
    ensureBuilt();
    work = mkdtempSync(join(tmpdir(), 'modalgate-pack-'));
  });
  afterAll(() => rmSync(work, { recursive: true, force: true }));

  it('installs from the lockfile and checks against a saved baseline', async () => {
    expect(sh('npm', ['pack', '--ignore-scripts', '--pack-destination', work], repoRoot).code).toBe(0);
    const tarball = readdirSync(work).find((f) => f.endsWith('.tgz'));
    expect(tarball).toBeDefined();
    const repo = join(work, 'repo');
    mkdirSync(join(repo, 'model'), { recursive: true });
    for (const f of ['bracket.stiffness.mtx.gz', 'bracket.mass.mtx.gz', 'bracket.dofs.csv']) cpSync(join(repoRoot, 'fixtures/demo', f), join(repo, 'model', f));
    expect((await runCli(['init', '--ci', 'github'], repo)).code).toBe(0);

    const pkgFile = join(repo, 'package.json');
    const pkg = JSON.parse(readFileSync(pkgFile, 'utf8')) as { devDependencies: Record<string, string> };
    pkg.devDependencies.modalgate = `file:../${tarball}`;
    writeFileSync(pkgFile, JSON.stringify(pkg, null, 2));
    // the starter config, edited as its EDIT marks say: the demo bracket is a supported model
    const config = join(repo, 'modalgate.yaml');
    writeFileSync(
      config,
      readFileSync(config, 'utf8')
        .replaceAll('my-model', 'bracket')
        .replace('ruleSets: [free-free] ', 'ruleSets: [supported] ')
        .replace('# first-elastic-frequency: { minHz: 35 }', 'first-elastic-frequency: { minHz: 1 }'),
    );

    const install = sh('npm', ['install', '--no-audit', '--no-fund'], repo);
    expect(install.code, install.out).toBe(0);
    expect(existsSync(join(repo, 'package-lock.json'))).toBe(true);
    // the config's $schema names the installed schema
    const schema = (parse(readFileSync(config, 'utf8')) as { $schema: string }).$schema;
    expect(existsSync(resolve(repo, schema))).toBe(true);

    rmSync(join(repo, 'node_modules'), { recursive: true });
    const ci = sh('npm', ['ci', '--prefer-offline', '--no-audit', '--no-fund'], repo);
    expect(ci.code, ci.out).toBe(0);
    const save = sh('npx', ['modalgate', 'check', '--save-baseline', 'baselines/', '-q'], repo);
    expect(save.code, save.out).toBe(0);
    const compare = sh('npx', ['modalgate', 'check', '--baseline', 'baselines/', '--junit', 'modalgate-report/junit.xml'], repo);
    expect(compare.code, compare.out).toBe(0);
    expect(readFileSync(join(repo, 'modalgate-report/junit.xml'), 'utf8')).toContain('frequency-drift');
  });
});
