/**
 * The CI templates in ci/ (what `init --ci` writes): each parses as YAML (the Jenkinsfile is
 * Groovy: a structural check instead, see ci/README.md), the GitHub workflow passes GitHub's own
 * workflow parser and schema (npm `@actions/workflow-parser`, maintained by GitHub in
 * actions/languageservices), each uses its server's parallel feature for `check --shard` with
 * `merge` as the last stage, and every `npx modalgate …` command in them parses with modalgate's
 * own option parser, the same words on all three servers. The run of those commands on the demo
 * config is in test/cli/shard.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Command, CommanderError } from 'commander';
import { parse } from 'yaml';
import { convertWorkflowTemplate, NoOperationTraceWriter, parseWorkflow } from '@actions/workflow-parser';
import { CI_TARGETS, ciJobFile, type CiServer } from '../../src/cli/init.js';
import { registerCheck } from '../../src/cli/check.js';
import { registerMerge } from '../../src/cli/merge.js';
import { parseShardSpec } from '../../src/pipeline/shard.js';
import { repoRoot } from '../cli/built-cli.js';
import { findCommand, optionValue, templateCommands } from './template-commands.js';

const servers = Object.keys(CI_TARGETS) as CiServer[];
const read = (server: CiServer): string => readFileSync(join(repoRoot, 'ci', CI_TARGETS[server].template), 'utf8');

/** Errors GitHub's workflow parser reports for a workflow file: parsing, schema, then job graph. */
async function workflowErrors(content: string): Promise<string[]> {
  const parsed = parseWorkflow({ name: 'modalgate.yml', content }, new NoOperationTraceWriter());
  const errors = parsed.context.errors.getErrors().map((e) => e.message);
  if (errors.length > 0 || !parsed.value) return errors;
  const template = await convertWorkflowTemplate(parsed.context, parsed.value);
  return (template.errors ?? []).map((e) => e.Message);
}

/**
 * Parse argv with modalgate's own `check` and `merge` commands (their actions replaced, nothing
 * runs): the command and its options, or the parser's error.
 */
function parseCli(argv: string[]): { command: string; opts: Record<string, unknown>; args: string[] } | { error: string } {
  const program = new Command().exitOverride().configureOutput({ writeErr: () => {}, writeOut: () => {} });
  registerCheck(program);
  registerMerge(program);
  let seen: { command: string; opts: Record<string, unknown>; args: string[] } | undefined;
  for (const c of program.commands) {
    c.action((...a: unknown[]) => {
      const cmd = a[a.length - 1] as Command;
      seen = { command: cmd.name(), opts: cmd.opts(), args: cmd.args };
    });
  }
  try {
    program.parse(argv, { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) return { error: e.message };
    throw e;
  }
  return seen ?? { error: 'no command' };
}

describe('every template', () => {
  it.each(['github', 'gitlab'] as CiServer[])('%s: parses as YAML without warnings', (server) => {
    expect(() => parse(read(server), { strict: true, prettyErrors: true })).not.toThrow();
  });

  it.each(servers)('%s: every modalgate command parses with our own CLI option parser, --shard k/n valid for every k', (server) => {
    const text = read(server);
    const n = shardCount(server, text);
    expect(n).toBeGreaterThanOrEqual(2);
    for (let k = 1; k <= n; k++) {
      const commands = templateCommands(server, text, k, n);
      expect(commands.length).toBeGreaterThanOrEqual(3);
      for (const c of commands) {
        const r = parseCli(c.argv);
        expect(r, `${server} ${c.where}: ${c.argv.join(' ')}`).not.toHaveProperty('error');
        if ('opts' in r && r.opts.shard !== undefined) expect(parseShardSpec(String(r.opts.shard))).toEqual({ index: k, count: n });
      }
    }
  });

  it('the option parser does refuse a misspelt option (the check above can fail)', () => {
    expect(parseCli(['check', '--shards', '1/3'])).toEqual({ error: "error: unknown option '--shards'\n(Did you mean --shard?)" });
    expect(parseCli(['merge'])).toHaveProperty('error');
  });

  it('the three servers run the same modalgate commands: shard k/n with --baseline and a JSON report, merge of all shard reports, a refresh that saves baselines', () => {
    const shapes = servers.map((server) => {
      const commands = templateCommands(server, read(server), 2, 3);
      const shard = findCommand(commands, (a) => a[0] === 'check' && a.includes('--shard')).argv;
      const merge = findCommand(commands, (a) => a[0] === 'merge').argv;
      const save = findCommand(commands, (a) => a[0] === 'check' && a.includes('--save-baseline')).argv;
      return { shard, merge, save };
    });
    for (const s of shapes) expect(s).toEqual(shapes[0]);
    const { shard, merge, save } = shapes[0];
    expect(shard).toEqual(['check', '--baseline', 'baselines/', '--shard', '2/3', '--json', 'modalgate-report/shard-2.json']);
    expect(merge.slice(0, 2)).toEqual(['merge', 'modalgate-report/shard-*.json']);
    for (const o of ['--junit', '--json', '--html', '--markdown']) expect(optionValue(merge, o)).toMatch(/^modalgate-report\//);
    expect(optionValue(save, '--save-baseline')).toBe('baselines/');
  });

  it.each(servers)('%s: init -o configs/modalgate.yaml passes --config to every check and to none of the merges', (server) => {
    const commands = templateCommands(server, ciJobFile(server, 'configs/modalgate.yaml'));
    expect(commands.some((c) => c.argv[0] === 'check')).toBe(true);
    expect(commands.some((c) => c.argv[0] === 'merge')).toBe(true);
    for (const c of commands) {
      if (c.argv[0] === 'check') expect(optionValue(c.argv, '--config'), c.where).toBe('configs/modalgate.yaml');
      else expect(c.argv).not.toContain('--config');
    }
  });
});

/** The template's shard count: GitHub's matrix list, GitLab's `parallel:`, the Jenkinsfile's SHARDS. */
function shardCount(server: CiServer, text: string): number {
  if (server === 'github') return ((parse(text) as GithubDoc).jobs.check.strategy!.matrix.shard as number[]).length;
  if (server === 'gitlab') return (parse(text) as Record<string, { parallel?: number }>)['modalgate-shard'].parallel!;
  return Number(/^def SHARDS = (\d+)/m.exec(text)?.[1]);
}

interface GithubStep {
  name?: string;
  uses?: string;
  run?: string;
  if?: string;
  with?: Record<string, unknown>;
}
interface GithubJob {
  if?: string;
  needs?: string | string[];
  strategy?: { 'fail-fast'?: boolean; matrix: Record<string, unknown> };
  steps: GithubStep[];
}
interface GithubDoc {
  on: Record<string, unknown>;
  jobs: Record<string, GithubJob>;
}

describe('GitHub Actions', () => {
  const text = read('github');

  it("passes GitHub's workflow parser and schema (@actions/workflow-parser), also as init -o writes it", async () => {
    expect(await workflowErrors(text)).toEqual([]);
    expect(await workflowErrors(ciJobFile('github', 'configs/modalgate.yaml'))).toEqual([]);
  });

  it('the parser catches a broken workflow: an unknown key, a missing runs-on, an unknown context, a needs of no job', async () => {
    expect(await workflowErrors(text.replace('runs-on: ubuntu-latest', 'runs-onn: ubuntu-latest'))).toEqual([
      expect.stringMatching(/Unexpected value 'runs-onn'/),
      expect.stringMatching(/Required property is missing: runs-on/),
    ]);
    expect(await workflowErrors(text.replace('${{ strategy.job-total }}', '${{ strateg.job-total }}'))).toEqual([expect.stringMatching(/Unrecognized named-value: 'strateg'/)]);
    expect(await workflowErrors(text.replace('needs: check', 'needs: chek'))).toEqual([expect.stringMatching(/Job 'merge' depends on unknown job 'chek'/)]);
  });

  it('a matrix of shards uploads JSON reports; the merge job needs them, runs even after a failed shard, merges, publishes and keeps the reports', () => {
    const doc = parse(text) as GithubDoc;
    expect(Object.keys(doc.on)).toEqual(['push', 'pull_request', 'workflow_dispatch']);
    const { check, merge, refresh_baselines: refresh } = doc.jobs;
    expect(check.strategy).toEqual({ 'fail-fast': false, matrix: { shard: [1, 2, 3] } });
    expect(check.steps.map((s) => s.run ?? '').join('\n')).toContain('--shard ${{ matrix.shard }}/${{ strategy.job-total }}');
    const upload = check.steps.find((s) => s.uses?.startsWith('actions/upload-artifact@'));
    expect(upload?.with).toMatchObject({ name: 'modalgate-shard-${{ matrix.shard }}', path: 'modalgate-report/shard-${{ matrix.shard }}.json' });
    expect(upload?.if).toContain('!cancelled()');

    expect(merge.needs).toBe('check');
    expect(merge.if).toContain('!cancelled()');
    const download = merge.steps.find((s) => s.uses?.startsWith('actions/download-artifact@'));
    expect(download?.with).toEqual({ pattern: 'modalgate-shard-*', path: 'modalgate-report', 'merge-multiple': true });
    const steps = merge.steps.map((s) => s.uses ?? s.run ?? '');
    const at = (pred: (s: string) => boolean) => steps.findIndex(pred);
    expect(at((s) => s.startsWith('actions/download-artifact@'))).toBeLessThan(at((s) => s.includes('modalgate merge')));
    expect(at((s) => s.includes('modalgate merge'))).toBeLessThan(at((s) => s.startsWith('mikepenz/action-junit-report@')));
    expect(merge.steps.find((s) => s.with?.report_paths === 'modalgate-report/junit.xml')?.if).toBe('always()');
    expect(merge.steps.find((s) => s.with?.name === 'modalgate-report')?.if).toBe('always()');

    for (const job of [check, merge, refresh]) {
      expect(job.steps.find((s) => s.uses?.startsWith('actions/setup-node@'))?.with).toEqual({ 'node-version': 22, cache: 'npm' });
      expect(job.steps.some((s) => s.run === 'npm ci')).toBe(true);
    }
    expect(refresh.if).toContain('inputs.refresh_baselines');
    expect(refresh.steps.some((s) => s.run?.includes('modalgate check --save-baseline baselines/'))).toBe(true);
    expect(refresh.steps.some((s) => s.run?.includes('gh pr create'))).toBe(true);
  });
});

describe('GitLab CI', () => {
  const doc = parse(read('gitlab')) as Record<string, Record<string, unknown>>;

  it('parallel shard jobs keep their reports; the merge job in a later stage needs their artifacts, runs always and keeps the JUnit report', () => {
    expect(doc.stages).toEqual(['test', 'report']);
    const shard = doc['modalgate-shard'];
    expect(shard.parallel).toBe(3);
    expect(shard.stage).toBe('test');
    expect((shard.script as string[])[0]).toContain('--shard $CI_NODE_INDEX/$CI_NODE_TOTAL --json modalgate-report/shard-$CI_NODE_INDEX.json');
    expect(shard.artifacts).toMatchObject({ when: 'always', paths: ['modalgate-report/'] });
    const merge = doc.modalgate;
    expect(merge.stage).toBe('report');
    expect(merge.needs).toEqual([{ job: 'modalgate-shard', artifacts: true }]);
    expect(merge.when).toBe('always');
    expect((merge.script as string[])[0]).toMatch(/^npx modalgate merge modalgate-report\/shard-\*\.json /);
    expect(merge.artifacts).toEqual({ when: 'always', paths: ['modalgate-report/'], reports: { junit: 'modalgate-report/junit.xml' } });
  });

  it('Node 22, npm cache keyed on the lockfile, a manual refresh job on the default branch', () => {
    const base = doc['.modalgate'];
    expect(base.image).toBe('node:22');
    expect(base.cache).toEqual({ key: { files: ['package-lock.json'] }, paths: ['.npm/'] });
    expect(base.before_script).toEqual(['npm ci --cache .npm --prefer-offline']);
    for (const id of ['modalgate-shard', 'modalgate', 'modalgate-refresh-baselines']) expect(doc[id].extends).toBe('.modalgate');
    const refresh = doc['modalgate-refresh-baselines'];
    expect(refresh.rules).toEqual([{ if: '$CI_COMMIT_BRANCH == $CI_DEFAULT_BRANCH', when: 'manual', allow_failure: true }]);
    expect((refresh.script as string[])[0]).toContain('modalgate check --save-baseline baselines/');
    expect((refresh.artifacts as { paths: string[] }).paths).toContain('baselines/');
  });
});

describe('Jenkinsfile', () => {
  // No maintained offline checker of Jenkinsfile syntax exists on npm: Jenkins validates a
  // declarative pipeline with its own server (the pipeline-model-definition plugin's
  // `declarative-linter` CLI command or /pipeline-model-converter/validate endpoint). This checks
  // the structure the template promises. `code` is the text with comments blanked and brackets
  // inside strings turned into `_`, at the same positions.
  const text = read('jenkins');
  const code = text
    .replace(/'[^'\n]*'|"[^"\n]*"|\/\/.*$/gm, (m) => (m.startsWith('//') ? ' '.repeat(m.length) : m.replace(/[{}()[\]]/g, '_')));

  /** The body of the first `name {` block at or after `from` (balanced braces). */
  function block(name: string, from = 0): { body: string; at: number } {
    const m = new RegExp(`${name}\\s*\\{`, 'g');
    m.lastIndex = from;
    const hit = m.exec(code);
    if (!hit) return { body: '', at: -1 };
    let depth = 0;
    for (let i = hit.index + hit[0].length - 1; i < code.length; i++) {
      if (code[i] === '{') depth++;
      else if (code[i] === '}' && --depth === 0) return { body: code.slice(hit.index + hit[0].length, i), at: hit.index };
    }
    return { body: '', at: -1 };
  }

  /** Where brackets first go wrong in `groovy` (comments and strings already blanked), or undefined. */
  function unbalanced(groovy: string): string | undefined {
    for (const [open, close] of [['{', '}'], ['(', ')'], ['[', ']']]) {
      let depth = 0;
      for (const [i, ch] of [...groovy].entries()) {
        if (ch === open) depth++;
        else if (ch === close && --depth < 0) return `${close} without ${open} at line ${groovy.slice(0, i).split('\n').length}`;
      }
      if (depth !== 0) return `${depth} ${open} not closed`;
    }
    return undefined;
  }

  it('braces, brackets and parentheses balance, never closing before they open (and a broken file is caught)', () => {
    expect(unbalanced(code)).toBeUndefined();
    expect(unbalanced(code.replace('parallel branches\n        }', 'parallel branches\n'))).toBe('1 { not closed');
    expect(unbalanced(code.replace("when { expression { params.REFRESH_BASELINES } }", "when { expression { params.REFRESH_BASELINES } } }"))).toMatch(/^} without \{ at line \d+/);
    // a misspelt option in an sh step is refused by the option parser
    const broken = templateCommands('jenkins', text.replace('--shard ${k}/${SHARDS}', '--shards ${k}/${SHARDS}'));
    expect(broken.map((c) => parseCli(c.argv)).filter((r) => 'error' in r)).toHaveLength(1);
  });

  it('pipeline with agent, parameters, environment and stages; the shard count at the top; parallel shard branches stash, merge unstashes', () => {
    expect(text).toMatch(/^def SHARDS = 3 /m);
    expect(text.indexOf('def SHARDS')).toBeLessThan(text.indexOf('pipeline {'));
    const pipeline = block('pipeline');
    expect(pipeline.at).toBeGreaterThan(0);
    expect(pipeline.body).toMatch(/^\s*agent none/);
    expect(text).toMatch(/booleanParam\(name: 'REFRESH_BASELINES'/);
    expect(block('environment').body).toContain('npm_config_cache');
    const stages = block('stages').body;
    const names = [...text.matchAll(/stage\('([^']+)'\)/g)].map((m) => m[1]);
    expect(names).toEqual(['check', 'merge', 'refresh baselines']);
    expect(stages).toContain('parallel branches');
    expect(text).toContain('for (int i = 1; i <= SHARDS; i++)');
    expect(text).toContain('stash name: "modalgate-shard-${k}", includes: "modalgate-report/shard-${k}.json"');
    expect(text).toContain('unstash "modalgate-shard-${k}"');
    expect(text).toContain('catchError(buildResult: \'FAILURE\', stageResult: \'FAILURE\')');
    expect(text).toContain("docker.image('node:22').inside");
    expect(text.match(/image 'node:22'/g)).toHaveLength(2);
    expect(text.match(/sh 'rm -rf modalgate-report && npm ci --prefer-offline'/g)).toHaveLength(3); // shard, merge, refresh: no report of an earlier build
    expect(text).not.toContain('returnStatus'); // the sh step's exit code fails the stage
  });

  it('the merge and refresh stages have an agent and post { always { archive first, junit second } }', () => {
    for (const name of ['merge', 'refresh baselines']) {
      const stage = block(`stage\\('${name}'\\)`, text.indexOf(`stage('${name}')`)).body;
      expect(stage).toMatch(/agent \{\s*docker \{ image 'node:22' \}\s*\}/);
      const always = /post \{\s*always \{([^}]*)\}\s*\}/.exec(stage)?.[1] ?? '';
      expect(always.indexOf('archiveArtifacts')).toBeGreaterThanOrEqual(0);
      expect(always.indexOf('junit ')).toBeGreaterThan(always.indexOf('archiveArtifacts'));
    }
  });
});
