/**
 * `npm run bench -- modes`: our lowest-20-mode solve beside SciPy's eigsh (ARPACK shift-invert)
 * on the same Matrix Market files, for a hexahedral solid (~120k DOF) and a space frame
 * (~60k DOF), each free-free and clamped. Prints time, peak memory (max RSS of each process,
 * file reading included on both sides), the ratios, and the largest relative eigenvalue
 * difference (elastic modes; rigid-body values are rounding noise and compared absolutely).
 * MODES_BENCH_SCALE=0.25 shrinks the models (DOF counts scale about linearly).
 * SciPy runs when python3 with scipy is present; otherwise that column is skipped.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { buildFrame, type FrameMember, type FrameNode } from '../../fixtures/generator/frame-builder.js';
import { circularHollowSection, STEEL } from '../../fixtures/generator/sections.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { writeSymmetricMatrixMarket } from '../../src/io/matrix-market-writer.js';
import { writeDofMap } from '../../src/io/dof-map-writer.js';

const here = path.dirname(fileURLToPath(import.meta.url));
const repoRoot = path.resolve(here, '../../..');
const cli = path.join(repoRoot, 'dist/src/cli/main.js');
const scipyScript = path.join(repoRoot, 'test/bench/scipy_eigsh_bench.py');

/** A hex box with about `dofs` DOFs, aspect 4:1:1. */
function hexSolid(dofs: number, clamped: boolean): GeneratedModel {
  const nodes = dofs / 3;
  const c = Math.max(2, Math.round(Math.cbrt(nodes / 4)) - 1);
  return buildHexBox({ sizeM: [2, 0.5, 0.5], elements: [4 * c + 3, c, c], material: STEEL, clampFace: clamped ? 'xMin' : undefined });
}

/** A rectangular space frame (columns, beams both ways) with about `dofs` DOFs. */
function spaceFrame(dofs: number, clamped: boolean): GeneratedModel {
  const nodesWanted = dofs / 6;
  const a = Math.max(2, Math.round(Math.cbrt(nodesWanted / 2)));
  const [nx, ny, nz] = [a, a, 2 * a];
  const id = (i: number, j: number, k: number) => 1 + i + nx * (j + ny * k);
  const nodes: FrameNode[] = [];
  const members: FrameMember[] = [];
  const section = circularHollowSection(0.2, 0.01);
  // grid nodes, 4 m bays, 3 m storeys
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) nodes.push({ id: id(i, j, k), x: 4 * i, y: 4 * j, z: 3 * k });
  const beam = (p: number, q: number, vertical: boolean): FrameMember => ({ kind: 'beam', nodes: [p, q], section, material: STEEL, orientation: vertical ? [1, 0, 0] : [0, 0, 1] });
  // members along x, y and z between neighbouring grid nodes
  for (let k = 0; k < nz; k++) {
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        if (i + 1 < nx) members.push(beam(id(i, j, k), id(i + 1, j, k), false));
        if (j + 1 < ny) members.push(beam(id(i, j, k), id(i, j + 1, k), false));
        if (k + 1 < nz) members.push(beam(id(i, j, k), id(i, j, k + 1), true));
      }
    }
  }
  const base: number[] = [];
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) base.push(id(i, j, 0));
  return buildFrame({ nodes, members, supports: clamped ? [{ nodes: base, kind: 'clamp' }] : [], description: `space frame ${nx}×${ny}×${nz}` });
}

interface Ours {
  eigenvalues: number[];
  seconds: number;
  solveSeconds: number;
  peakRssKb: number;
  shift: number;
  solves: number;
  sturmOk: boolean;
  maxResidual: number;
  /** Factorizations, iteration and verification times of the solve, s. */
  phases: string;
}

function runOurs(dir: string, name: string): Ours {
  const json = path.join(dir, `${name}.ours.json`);
  const args = ['-f', '%e %M', process.execPath, cli, 'modes', '--stiffness', path.join(dir, `${name}.K.mtx`), '--mass', path.join(dir, `${name}.M.mtx`), '--dofs', path.join(dir, `${name}.dofs.csv`), '--count', '20', '--json', json];
  const r = spawnSync('/usr/bin/time', args, { encoding: 'utf8' });
  const last = r.stderr.trim().split('\n').pop() ?? '';
  const [wall, rss] = last.split(' ').map(Number);
  const doc = JSON.parse(readFileSync(json, 'utf8'));
  return {
    eigenvalues: doc.eigenvalues,
    seconds: wall,
    solveSeconds: doc.timings.totalMs / 1000,
    peakRssKb: rss,
    shift: doc.shifts.length > 1 ? doc.shifts[doc.shifts.length - 2] : doc.shifts[0],
    solves: doc.solves,
    sturmOk: doc.sturm.ok,
    maxResidual: Math.max(...doc.residuals),
    phases: `factor ${(doc.timings.factorMs / 1000).toFixed(1)} s, iterate ${(doc.timings.iterateMs / 1000).toFixed(1)} s, verify ${(doc.timings.verifyMs / 1000).toFixed(1)} s`,
  };
}

function runScipy(dir: string, name: string, sigma: number): { eigenvalues: number[]; seconds: number; wall: number; peakRssKb: number; ordering: string } | string {
  const out = path.join(dir, `${name}.scipy.json`);
  const t0 = performance.now();
  const r = spawnSync('python3', [scipyScript, path.join(dir, `${name}.K.mtx`), path.join(dir, `${name}.M.mtx`), '20', String(sigma), out], { encoding: 'utf8', timeout: 900_000 });
  if (r.error || r.status !== 0) return `SciPy skipped (${r.error?.message ?? r.stderr.trim().split('\n').pop()})`;
  const doc = JSON.parse(readFileSync(out, 'utf8'));
  return { ...doc, wall: (performance.now() - t0) / 1000 };
}

function maxRelativeDifference(a: number[], b: number[]): number {
  const scale = Math.max(...a.map(Math.abs));
  let worst = 0;
  // elastic modes relative; rigid-body values (≤ 1e-10 of the largest) are noise
  for (let i = 0; i < Math.min(a.length, b.length); i++) {
    if (Math.max(Math.abs(a[i]), Math.abs(b[i])) <= 1e-10 * scale) continue;
    worst = Math.max(worst, Math.abs(a[i] - b[i]) / Math.abs(b[i]));
  }
  return worst;
}

export default async function modesBench(): Promise<void> {
  const scale = Number(process.env.MODES_BENCH_SCALE ?? '1');
  const dir = mkdtempSync(path.join(tmpdir(), 'modalgate-modes-bench-'));
  const cases: [string, () => GeneratedModel][] = [
    ['hex-free', () => hexSolid(120_000 * scale, false)],
    ['hex-clamped', () => hexSolid(120_000 * scale, true)],
    ['frame-free', () => spaceFrame(60_000 * scale, false)],
    ['frame-clamped', () => spaceFrame(60_000 * scale, true)],
  ];
  const only = process.env.MODES_BENCH_ONLY;
  console.log('case            n       ours s (solve)   SciPy s   time ratio   ours MB   SciPy MB   mem ratio   max rel diff   solves  Sturm');
  for (const [name, build] of cases) {
    if (only && !name.includes(only)) continue;
    const m = build();
    await writeSymmetricMatrixMarket(path.join(dir, `${name}.K.mtx`), m.stiffness);
    await writeSymmetricMatrixMarket(path.join(dir, `${name}.M.mtx`), m.mass);
    await writeDofMap(path.join(dir, `${name}.dofs.csv`), m.dofMap);
    const ours = runOurs(dir, name);
    const scipy = runScipy(dir, name, ours.shift);
    const cols = [name.padEnd(14), String(m.stiffness.n).padStart(7), `${ours.seconds.toFixed(1)} (${ours.solveSeconds.toFixed(1)})`.padStart(16)];
    if (typeof scipy === 'string') {
      console.log(`${cols.join(' ')}   ${scipy}; ours ${(ours.peakRssKb / 1024).toFixed(0)} MB, Sturm ${ours.sturmOk}`);
      continue;
    }
    cols.push(
      scipy.seconds.toFixed(1).padStart(9),
      (ours.solveSeconds / scipy.seconds).toFixed(2).padStart(12),
      (ours.peakRssKb / 1024).toFixed(0).padStart(9),
      (scipy.peakRssKb / 1024).toFixed(0).padStart(10),
      (ours.peakRssKb / scipy.peakRssKb).toFixed(2).padStart(11),
      maxRelativeDifference(ours.eigenvalues, scipy.eigenvalues).toExponential(2).padStart(14),
      String(ours.solves).padStart(8),
      ours.sturmOk ? '  ok' : '  FAILED',
    );
    console.log(cols.join(' '));
    console.log(`${''.padEnd(14)} ours: ${ours.phases}; SciPy: ${scipy.ordering}`);
  }
  console.log(`files in ${dir}; time ratio = our solve (read excluded) / SciPy factor+eigsh; memory = max RSS of each process`);
}
