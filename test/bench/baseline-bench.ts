/**
 * Baseline size and comparison time at scale: a steel hex box of 40×40×24 elements clamped on
 * one face (≈ 121 000 DOFs), 20 modes. Saves a baseline with shapes on every DOF (the default)
 * and prints the files' sizes, then
 * loads it and compares the model with itself (MAC matrix, pairing), printing the time and the
 * smallest paired MAC (1 expected).
 */
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { compareWithBaseline } from '../../src/model/compare-baseline.js';

export default async function baselineBench(): Promise<void> {
  const model = buildHexBox({ sizeM: [1, 1, 0.6], elements: [40, 40, 24], material: STEEL, clampFace: 'zMin' });
  console.log(`hex box 40×40×24, zMin clamped: ${model.stiffness.n} DOFs`);
  let t0 = performance.now();
  const modes = solveModes(model.stiffness, model.mass, { count: 20, coordinates: model.coordinates });
  console.log(`solveModes(20): ${((performance.now() - t0) / 1000).toFixed(1)} s, ${modes.frequenciesHz[0].toFixed(2)} … ${modes.frequenciesHz[19].toFixed(2)} Hz`);
  const dir = mkdtempSync(join(tmpdir(), 'modalgate-baseline-bench-'));
  try {
    t0 = performance.now();
    const files = await saveBaseline(dir, { model: 'box', modes, mass: model.mass, dofMap: model.dofMap });
    const saveMs = performance.now() - t0;
    const jsonBytes = statSync(files.json).size, shapeBytes = statSync(files.shapes).size;
    console.log(`saveBaseline (every DOF): ${saveMs.toFixed(0)} ms; ${files.json.split('/').pop()} ${(jsonBytes / 1024).toFixed(1)} KiB, ${files.shapes.split('/').pop()} ${(shapeBytes / 1024).toFixed(1)} KiB, total ${((jsonBytes + shapeBytes) / 1e6).toFixed(3)} MB (about 8 bytes per value expected)`);
    t0 = performance.now();
    const baseline = (await loadBaseline(dir, 'box'))!;
    const loadMs = performance.now() - t0;
    t0 = performance.now();
    const facts = compareWithBaseline(baseline, { modes, mass: model.mass, dofMap: model.dofMap });
    const compareMs = performance.now() - t0;
    const minMac = Math.min(...facts.pairs.map((p) => p.correlation ?? 0));
    console.log(`loadBaseline ${loadMs.toFixed(0)} ms; compareWithBaseline ${compareMs.toFixed(0)} ms on ${facts.baseline.dofsCompared} DOFs; ${facts.pairs.length} pairs, smallest MAC ${minMac.toFixed(12)}, swaps ${facts.swaps.length}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
