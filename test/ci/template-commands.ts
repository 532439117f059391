/**
 * The `npx modalgate …` commands of the CI templates in ci/, as argument lists with the CI
 * server's variables filled in for shard k of n, so tests can parse them with our own option
 * parser and run them as the CI jobs would.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { parse } from 'yaml';
import type { CiServer } from '../../src/cli/init.js';

export interface TemplateCommand {
  /** Where it came from: `jobs.check.steps[4]`, `modalgate-shard.script[0]`, `sh (line 52)`. */
  where: string;
  /** The words after `npx modalgate`, variables filled in (the part before a `||` fallback). */
  argv: string[];
}

/** Each server's shard index and count, as the template writes them. */
const VARIABLES: Record<CiServer, [RegExp, 'k' | 'n'][]> = {
  github: [[/\$\{\{\s*matrix\.shard\s*\}\}/g, 'k'], [/\$\{\{\s*strategy\.job-total\s*\}\}/g, 'n']],
  gitlab: [[/\$CI_NODE_INDEX\b|\$\{CI_NODE_INDEX\}/g, 'k'], [/\$CI_NODE_TOTAL\b|\$\{CI_NODE_TOTAL\}/g, 'n']],
  jenkins: [[/\$\{k\}/g, 'k'], [/\$\{SHARDS\}/g, 'n']],
};

/** The modalgate command lines of a shell script (one per line; folded YAML is one line already). */
function commandsOf(script: string): string[] {
  return script
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l.startsWith('npx modalgate '))
    .map((l) => l.split(' || ')[0]);
}

/** The scripts of a template: `[where, script text]`. */
function scripts(server: CiServer, text: string): [string, string][] {
  if (server === 'github') {
    const doc = parse(text) as { jobs: Record<string, { steps: { run?: string }[] }> };
    return Object.entries(doc.jobs).flatMap(([id, job]) => job.steps.flatMap((s, i): [string, string][] => (s.run ? [[`jobs.${id}.steps[${i}]`, s.run]] : [])));
  }
  if (server === 'gitlab') {
    const doc = parse(text) as Record<string, { script?: string[] }>;
    return Object.entries(doc).flatMap(([id, job]) => (Array.isArray(job?.script) ? job.script.map((s, i): [string, string] => [`${id}.script[${i}]`, s]) : []));
  }
  // Jenkinsfile: sh '…' and sh "…" steps (single line each in our template)
  return [...text.matchAll(/\bsh\s+(['"])(.*?)\1/g)].map((m): [string, string] => [`sh (line ${text.slice(0, m.index).split('\n').length})`, m[2]]);
}

/** Every modalgate command of the template, with shard `k` of `n` filled in. */
export function templateCommands(server: CiServer, text: string, k = 1, n = 3): TemplateCommand[] {
  return scripts(server, text).flatMap(([where, script]) =>
    commandsOf(script).map((line) => {
      let filled = line;
      for (const [pattern, v] of VARIABLES[server]) filled = filled.replace(pattern, String(v === 'k' ? k : n));
      return { where, argv: filled.split(/\s+/).slice(2) };
    }),
  );
}

/** The first command whose argv satisfies `pick` (throws when there is none). */
export function findCommand(commands: TemplateCommand[], pick: (argv: string[]) => boolean): TemplateCommand {
  const c = commands.find((x) => pick(x.argv));
  if (!c) throw new Error(`no such command among ${commands.map((x) => x.argv.join(' ')).join(' | ')}`);
  return c;
}

/** A word with `*` in its file name expanded in `cwd` as a shell would (sorted; kept as is when nothing matches). */
export function expandGlob(word: string, cwd: string): string[] {
  if (!word.includes('*')) return [word];
  const dir = dirname(word);
  const re = new RegExp(`^${word.slice(dir.length + 1).split('*').map((p) => p.replace(/[.+?^${}()|[\]\\]/g, '\\$&')).join('.*')}$`);
  let names: string[];
  try {
    names = readdirSync(join(cwd, dir)).filter((f) => re.test(f)).sort();
  } catch {
    return [word];
  }
  return names.length > 0 ? names.map((f) => `${dir}/${f}`) : [word];
}

/** The value after `option` in argv (undefined when absent). */
export function optionValue(argv: string[], option: string): string | undefined {
  const i = argv.indexOf(option);
  return i >= 0 ? argv[i + 1] : undefined;
}
