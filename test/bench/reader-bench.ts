/**
 * Matrix Market reader throughput and memory (`npm run bench -- reader`).
 *
 * Writes a ≥ 200 MB `coordinate real symmetric` file of a banded SPD matrix (n = 200 000,
 * half-bandwidth 30, off-diagonal values random in (−1, −0.5] written as shortest round-trip
 * text, 16–17 significant digits; diagonal 61 + random, so the matrix is diagonally dominant)
 * with our writer into a temporary directory, then reads it back and reports:
 *   - throughput = file bytes / read time (MB = 10^6 bytes); target ≥ 100 MB/s
 *   - peak memory added by reading (rss and arrayBuffers sampled every 5 ms, minus the
 *     baseline taken after a forced GC just before the read); target ≤ 3 × the CSC arrays
 *     (colPtr 4(n+1) + rowIdx 4·nnz + values 8·nnz bytes)
 * The temporary file is deleted afterwards.
 */
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import { createGzip } from 'node:zlib';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cpus, loadavg } from 'node:os';
import { readMatrixMarket } from '../../src/io/matrix-market-reader.js';
import { writeSymmetricMatrixMarket } from '../../src/io/matrix-market-writer.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

const N = 200_000;
const HALF_BAND = 30;
const MB = 1e6;

function bandedMatrix(n: number, b: number): SymmetricCsc {
  let nnz = 0;
  for (let j = 0; j < n; j++) nnz += Math.min(b, n - 1 - j) + 1;
  const colPtr = new Int32Array(n + 1);
  const rowIdx = new Int32Array(nnz);
  const values = new Float64Array(nnz);
  let p = 0;
  let s = 12345;
  // column j: diagonal, then rows j+1 .. j+b
  for (let j = 0; j < n; j++) {
    colPtr[j] = p;
    rowIdx[p] = j;
    values[p++] = 2 * b + 1 + Math.random();
    for (let i = j + 1; i <= Math.min(n - 1, j + b); i++) {
      s = (s * 1103515245 + 12345) % 2147483648;
      rowIdx[p] = i;
      values[p++] = -(0.5 + 0.5 * (s / 2147483648) + Math.random() * 1e-9);
    }
  }
  colPtr[n] = p;
  return { n, colPtr, rowIdx, values };
}

/** Full collections, with a pause so freed ArrayBuffer memory is really released. */
async function settle(): Promise<void> {
  const g = (globalThis as { gc?: () => void }).gc;
  for (let k = 0; k < 3; k++) {
    g?.();
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Write the benchmark file; the matrix goes out of scope on return. */
async function writeBenchFile(path: string): Promise<{ nnz: number; writeS: number }> {
  const a = bandedMatrix(N, HALF_BAND);
  const tw = performance.now();
  await writeSymmetricMatrixMarket(path, a, { comment: 'reader benchmark: banded SPD matrix' });
  return { nnz: a.colPtr[N], writeS: (performance.now() - tw) / 1000 };
}

/** The same file gzip-compressed (level 1): read throughput in text MB/s, no target. */
async function gzipFigure(path: string, textBytes: number, plain: SymmetricCsc): Promise<void> {
  const gz = `${path}.gz`;
  await pipeline(createReadStream(path), createGzip({ level: 1 }), createWriteStream(gz));
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  const { matrix } = await readMatrixMarket(gz);
  const readS = (performance.now() - t0) / 1000;
  const cpu = process.cpuUsage(cpu0);
  const same = Buffer.from(matrix.values.buffer).equals(Buffer.from(plain.values.buffer));
  console.log(
    `gzip (${(statSync(gz).size / MB).toFixed(1)} MB compressed): ${(textBytes / MB / readS).toFixed(0)} MB/s of text wall, ` +
      `${(textBytes / MB / ((cpu.user + cpu.system) / 1e6)).toFixed(0)} MB/s of CPU time; values identical to .mtx: ${same}`,
  );
  rmSync(gz, { force: true });
}

export default async function readerBench(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'modalgate-reader-bench-'));
  const path = join(dir, 'banded.mtx');
  try {
    const { nnz, writeS } = await writeBenchFile(path);
    const bytes = statSync(path).size;
    console.log(`file: ${(bytes / MB).toFixed(1)} MB, n = ${N}, stored nonzeros = ${nnz}; written in ${writeS.toFixed(1)} s (${(bytes / MB / writeS).toFixed(0)} MB/s)`);
    if (!(globalThis as { gc?: unknown }).gc) console.log('note: run with --expose-gc for a clean memory baseline');

    await settle();
    const base = process.memoryUsage();
    let peakRss = base.rss;
    let peakBuffers = base.arrayBuffers;
    const sample = (): void => {
      const m = process.memoryUsage();
      if (m.rss > peakRss) peakRss = m.rss;
      if (m.arrayBuffers > peakBuffers) peakBuffers = m.arrayBuffers;
    };
    const timer = setInterval(sample, 5);
    const load = loadavg()[0];
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    const { matrix, summary } = await readMatrixMarket(path);
    const readS = (performance.now() - t0) / 1000;
    const cpu = process.cpuUsage(cpu0);
    const cpuS = (cpu.user + cpu.system) / 1e6;
    sample();
    clearInterval(timer);

    const cscBytes = matrix.colPtr.byteLength + matrix.rowIdx.byteLength + matrix.values.byteLength;
    const mbps = bytes / MB / readS;
    const addedRss = peakRss - base.rss;
    const addedBuffers = peakBuffers - base.arrayBuffers;
    const cpuMbps = bytes / MB / cpuS;
    console.log(`read: ${readS.toFixed(2)} s wall → ${mbps.toFixed(0)} MB/s; ${cpuS.toFixed(2)} s CPU → ${cpuMbps.toFixed(0)} MB per CPU-second (load average ${load.toFixed(1)} on ${cpus().length} cores)`);
    console.log(`read back: stored ${summary.storedNonzeros}, bandwidth ${summary.bandwidth}`);
    console.log(`CSC arrays: ${(cscBytes / MB).toFixed(1)} MB`);
    console.log(`peak added rss: ${(addedRss / MB).toFixed(1)} MB (${(addedRss / cscBytes).toFixed(2)} × CSC); peak added arrayBuffers: ${(addedBuffers / MB).toFixed(1)} MB (${(addedBuffers / cscBytes).toFixed(2)} × CSC)`);
    console.log(`target throughput ≥ 100 MB/s: ${mbps >= 100 ? 'met' : 'NOT met'} (${mbps.toFixed(0)} MB/s wall clock; ${cpuMbps.toFixed(0)} MB/s of CPU time)`);
    const worst = Math.max(addedRss, addedBuffers) / cscBytes;
    console.log(`target peak memory ≤ 3 × CSC: ${worst <= 3 ? 'met' : 'NOT met'} (${worst.toFixed(2)} ×)`);
    if (summary.storedNonzeros !== nnz) console.log(`ERROR: read ${summary.storedNonzeros} nonzeros, wrote ${nnz}`);
    await gzipFigure(path, bytes, matrix);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
