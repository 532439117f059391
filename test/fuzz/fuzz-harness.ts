/**
 * Runs mutated Matrix Market files, DOF maps and configs (mutations.ts) through modalgate's
 * readers in this process, and a sample of them through the built CLI. The contract checked:
 * - a reader either succeeds or throws an InputError whose one-line message names the file
 *   (anything else is an uncaught exception: a defect);
 * - the CLI exits 0, 1 or 2; on exit 2 it prints exactly one stderr line naming the file, and
 *   never a stack trace;
 * - peak memory stays below 10× the input size plus a fixed 200 MB.
 */
import fc from 'fast-check';
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join, resolve } from 'node:path';
import { readMatrixMarket, readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { readDofMap } from '../../src/io/dof-map-reader.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { InputError, oneLineMessage } from '../../src/io/errors.js';
import { mutatedInputs, type InputKind, type MutatedInput } from './mutations.js';

/** The checkout's root, from the TypeScript source or from its compiled copy under dist/. */
const here = resolve(import.meta.dirname, '../..');
export const repoRoot = basename(here) === 'dist' ? resolve(here, '..') : here;
const MB = 1024 * 1024;

export interface FuzzFailure {
  kind: InputKind;
  seed: string;
  steps: string[];
  problem: string;
}

export interface FuzzSummary {
  runs: number;
  accepted: number;
  refused: number;
  failures: FuzzFailure[];
  largestInputBytes: number;
  /** Growth of this process's peak resident set over the run, in bytes. */
  peakGrowthBytes: number;
  slowestMs: number;
}

function seedFiles(): Record<InputKind, Record<string, string>> {
  const read = (p: string): string => readFileSync(join(repoRoot, p), 'utf8');
  return {
    matrix: {
      'k3.mtx': read('test/io/good-inputs/k3.mtx'),
      'm2.mtx': read('test/io/good-inputs/m2.mtx'),
      'tiny.stiffness.mtx': read('test/config/models/tiny.stiffness.mtx'),
      'tiny.mass.mtx': read('test/config/models/tiny.mass.mtx'),
    },
    dofmap: { 'dofs3.csv': read('test/io/good-inputs/dofs3.csv'), 'tiny.dofs.csv': read('test/config/models/tiny.dofs.csv') },
    config: { 'modalgate.yaml': read('test/config/good/modalgate.yaml') },
  };
}

/** A scratch copy of the config fixtures, so mutated configs resolve their model paths. */
function scratch(): string {
  const dir = mkdtempSync(join(tmpdir(), 'modalgate-fuzz-'));
  for (const d of ['good', 'models', 'rulesets']) cpSync(join(repoRoot, 'test/config', d), join(dir, d), { recursive: true });
  return dir;
}

function fileFor(dir: string, input: MutatedInput, k: number): string {
  if (input.kind === 'config') return join(dir, 'good', `fuzz-${k}.yaml`);
  if (input.kind === 'dofmap') return join(dir, `fuzz-${k}.csv`);
  return join(dir, `fuzz-${k}.mtx${input.gzipped ? '.gz' : ''}`);
}

/** Reads one mutated file the way the tool does; returns a problem, or null when the contract holds. */
async function readOne(dir: string, input: MutatedInput, file: string): Promise<{ problem: string | null; refused: boolean }> {
  const tiny = join(dir, 'models');
  try {
    if (input.kind === 'matrix') {
      await readMatrixMarket(file);
      // as the stiffness of a pair, and as its mass
      await readStiffnessAndMass(file, join(tiny, 'tiny.mass.mtx'));
      await readStiffnessAndMass(join(tiny, 'tiny.stiffness.mtx'), file);
    } else if (input.kind === 'dofmap') {
      await readDofMap(file, 3);
    } else {
      loadConfig(file);
    }
    return { problem: null, refused: false };
  } catch (e) {
    if (!(e instanceof InputError)) return { problem: `uncaught ${e instanceof Error ? e.name : typeof e}: ${oneLineMessage(e)}`, refused: true };
    const line = oneLineMessage(e);
    if (line.includes('\n')) return { problem: `message spans lines: ${line}`, refused: true };
    // the message must name the file it is about (the mutated one, or the good partner it was read with)
    if (!line.includes(basename(e.file)) || !existsSync(e.file)) return { problem: `message does not name an existing file: ${line}`, refused: true };
    return { problem: null, refused: true };
  }
}

/** `runs` mutated inputs of every kind in turn, reproducible from `seed`. */
export async function fuzzReaders(runs: number, seed: number): Promise<FuzzSummary> {
  const seeds = seedFiles();
  const dir = scratch();
  const kinds: InputKind[] = ['matrix', 'dofmap', 'config'];
  const samples = kinds.map((kind) => fc.sample(mutatedInputs(kind, seeds[kind]), { numRuns: Math.ceil(runs / kinds.length), seed: seed + kinds.indexOf(kind) }));
  const startPeak = process.resourceUsage().maxRSS * 1024;
  const summary: FuzzSummary = { runs: 0, accepted: 0, refused: 0, failures: [], largestInputBytes: 0, peakGrowthBytes: 0, slowestMs: 0 };
  try {
    for (let k = 0; summary.runs < runs; k++) {
      const input = samples[k % kinds.length][Math.floor(k / kinds.length)];
      if (!input) break;
      const file = fileFor(dir, input, k);
      writeFileSync(file, input.bytes);
      summary.largestInputBytes = Math.max(summary.largestInputBytes, input.bytes.length);
      const t0 = performance.now();
      const r = await readOne(dir, input, file);
      summary.slowestMs = Math.max(summary.slowestMs, performance.now() - t0);
      summary.runs++;
      if (r.refused) summary.refused++;
      else summary.accepted++;
      if (r.problem) summary.failures.push({ kind: input.kind, seed: input.seed, steps: input.steps, problem: r.problem });
      rmSync(file, { force: true });
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  summary.peakGrowthBytes = Math.max(0, process.resourceUsage().maxRSS * 1024 - startPeak);
  return summary;
}

export interface CliFuzzResult {
  runs: number;
  failures: FuzzFailure[];
  /** Largest peak RSS of a CLI run, bytes (0 when /usr/bin/time is missing). */
  largestPeakBytes: number;
  /** Runs that were refused (exit 2): the ones whose one-line error was checked. */
  refused: number;
}

/** A sample of mutated matrix files and configs through the built CLI (`inspect`, `check`). */
export function fuzzCli(runs: number, seed: number): CliFuzzResult {
  const cli = join(repoRoot, 'dist/src/cli/main.js');
  const seeds = seedFiles();
  const dir = scratch();
  const haveTime = existsSync('/usr/bin/time');
  const result: CliFuzzResult = { runs: 0, failures: [], largestPeakBytes: 0, refused: 0 };
  const inputs = [
    ...fc.sample(mutatedInputs('matrix', seeds.matrix), { numRuns: Math.ceil(runs / 2), seed }),
    ...fc.sample(mutatedInputs('config', seeds.config), { numRuns: Math.floor(runs / 2), seed: seed + 7 }),
  ];
  try {
    inputs.forEach((input, k) => {
      const file = fileFor(dir, input, k);
      writeFileSync(file, input.bytes);
      const args = input.kind === 'matrix' ? ['inspect', file] : ['check', '-c', file, '--junit', join(dir, `junit-${k}.xml`)];
      const timeFile = join(dir, `time-${k}.txt`);
      const r = haveTime
        ? spawnSync('/usr/bin/time', ['-f', '%M', '-o', timeFile, process.execPath, cli, ...args], { encoding: 'utf8', timeout: 120_000, env: { ...process.env, NO_COLOR: '1', MODALGATE_THREADS: '1' } })
        : spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', timeout: 120_000, env: { ...process.env, NO_COLOR: '1', MODALGATE_THREADS: '1' } });
      result.runs++;
      const fail = (problem: string): void => void result.failures.push({ kind: input.kind, seed: input.seed, steps: input.steps, problem });
      if (haveTime && existsSync(timeFile)) {
        const peak = Number(readFileSync(timeFile, 'utf8').trim().split('\n').pop()) * 1024;
        result.largestPeakBytes = Math.max(result.largestPeakBytes, peak);
        if (peak > 10 * statSync(file).size + 200 * MB) fail(`peak memory ${(peak / MB).toFixed(0)} MB for a ${statSync(file).size}-byte input`);
      }
      if (r.signal) return fail(`killed by ${r.signal} (timeout 120 s?)`);
      if (![0, 1, 2].includes(r.status ?? -1)) return fail(`exit code ${r.status}`);
      if (/\n\s+at .+:\d+:\d+/.test(r.stderr)) return fail(`stack trace on stderr: ${r.stderr.slice(0, 300)}`);
      if (r.status === 2) {
        result.refused++;
        const lines = r.stderr.trim().split('\n');
        if (lines.length !== 1) fail(`${lines.length} stderr lines: ${r.stderr.slice(0, 300)}`);
        else if (!lines[0].includes('fuzz-') && !lines[0].includes('tiny.')) fail(`stderr line names no file: ${lines[0]}`);
        else if (/internal error/.test(lines[0])) fail(`internal error: ${lines[0]}`);
      }
    });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  return result;
}

export function describeFailures(failures: FuzzFailure[], limit = 10): string {
  return failures
    .slice(0, limit)
    .map((f) => `${f.kind} from ${f.seed} [${f.steps.join('; ')}]: ${f.problem}`)
    .join('\n');
}
