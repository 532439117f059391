/**
 * `npm run bench -- fuzz`: 10,000 mutated inputs (Matrix Market, DOF map, config) through the
 * readers, and 200 through the built CLI, with the contract of test/fuzz/fuzz-harness.ts.
 * FUZZ_RUNS / FUZZ_CLI_RUNS / FUZZ_SEED change the sizes and the seed.
 */
import { describeFailures, fuzzCli, fuzzReaders } from '../fuzz/fuzz-harness.js';

export default async function fuzzBench(): Promise<void> {
  const runs = Number(process.env.FUZZ_RUNS ?? 10_000);
  const cliRuns = Number(process.env.FUZZ_CLI_RUNS ?? 200);
  const seed = Number(process.env.FUZZ_SEED ?? 1);
  const t0 = performance.now();
  const s = await fuzzReaders(runs, seed);
  const mb = (b: number): string => (b / 1024 / 1024).toFixed(1);
  console.log(`readers: ${s.runs} inputs, ${s.accepted} read, ${s.refused} refused, ${s.failures.length} contract failures; ` +
    `largest input ${s.largestInputBytes} B, peak RSS growth ${mb(s.peakGrowthBytes)} MB, slowest ${s.slowestMs.toFixed(0)} ms, ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  if (s.failures.length) console.log(describeFailures(s.failures, 20));
  const t1 = performance.now();
  const c = fuzzCli(cliRuns, seed);
  console.log(`CLI: ${c.runs} runs, ${c.failures.length} contract failures, largest peak RSS ${mb(c.largestPeakBytes)} MB, ${((performance.now() - t1) / 1000).toFixed(1)} s`);
  if (c.failures.length) console.log(describeFailures(c.failures, 20));
}
