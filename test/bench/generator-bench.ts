/**
 * Synthetic model generator at scale: a free-free steel hex box of 46×46×46 elements
 * (47³ nodes, 311 469 DOFs). Prints generation time, nonzeros and memory (RSS and array
 * buffers before/after, the process's peak RSS, and the size of the resulting CSC arrays).
 */
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

const mb = (bytes: number): string => `${(bytes / 2 ** 20).toFixed(1)} MB`;
const cscBytes = (a: SymmetricCsc): number => a.colPtr.byteLength + a.rowIdx.byteLength + a.values.byteLength;

export default async function generatorBench(): Promise<void> {
  const gc = (globalThis as { gc?: () => void }).gc;
  gc?.();
  const before = process.memoryUsage();
  const t0 = performance.now();
  const model = buildHexBox({ sizeM: [1, 1, 1], elements: [46, 46, 46], material: STEEL });
  const seconds = (performance.now() - t0) / 1000;
  const after = process.memoryUsage();
  const peakRss = process.resourceUsage().maxRSS * 1024; // kB → bytes, whole process so far
  const k = model.stiffness;
  const m = model.mass;
  console.log(`hex box 46×46×46: ${k.n} DOFs, stored nonzeros K ${k.colPtr[k.n]}, M ${m.colPtr[m.n]}`);
  console.log(`generation time ${seconds.toFixed(2)} s`);
  console.log(`CSC arrays K ${mb(cscBytes(k))}, M ${mb(cscBytes(m))}`);
  console.log(`RSS before ${mb(before.rss)}, after ${mb(after.rss)}, peak (maxRSS) ${mb(peakRss)}`);
  console.log(`array buffers after ${mb(after.arrayBuffers)}`);
}
