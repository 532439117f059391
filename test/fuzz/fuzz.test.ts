/**
 * A short seeded fuzz run inside `npm test` (the 10,000-input run is `npm run bench -- fuzz`):
 * mutated Matrix Market files, DOF maps and configs from the committed fixtures, generated with
 * the property-testing library fast-check. Every input is read or refused with an InputError that
 * names the file; the CLI sample exits 0, 1 or 2, with one stderr line and no stack trace.
 */
import { existsSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ensureBuilt } from '../cli/built-cli.js';
import { describeFailures, fuzzCli, fuzzReaders } from './fuzz-harness.js';

const MB = 1024 * 1024;

describe('fuzzed inputs (seeded)', () => {
  it('300 mutated inputs: read or refused with an InputError naming the file, memory bounded', async () => {
    const s = await fuzzReaders(300, 20261205);
    expect(s.runs).toBe(300);
    expect(s.failures, describeFailures(s.failures)).toEqual([]);
    expect(s.refused).toBeGreaterThan(50); // the mutations do break files
    expect(s.peakGrowthBytes).toBeLessThan(10 * s.largestInputBytes + 200 * MB);
  }, 120_000);

  it('3 mutated inputs through the built CLI: exit 0/1/2, one stderr line naming the file, no stack trace', () => {
    ensureBuilt();
    const r = fuzzCli(3, 7);
    expect(r.failures, describeFailures(r.failures)).toEqual([]);
    // the sample holds refused inputs, so the one-line-error checks ran; and the memory was measured
    expect(r.refused).toBeGreaterThan(0);
    if (existsSync('/usr/bin/time')) expect(r.largestPeakBytes).toBeGreaterThan(0);
  }, 120_000);
});
