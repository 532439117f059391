/**
 * Baseline snapshots: what one model's modes looked like when the baseline was saved, kept in a
 * directory as two files per model:
 *
 *   <model>.baseline.json    metadata (schemaVersion, frequencies, verification figures, mass
 *                            properties when known, DOF count and DOF-map hash, compared DOFs)
 *   <model>.shapes.mtx.gz    mass-normalized mode shapes, Matrix Market `array real general`
 *                            (gzip), rows = compared DOFs, one column per mode
 *
 * Shapes are kept at every DOF, at the DOFs of listed nodes/components, or at an automatic,
 * deterministic subset of at most `maxDofs` DOFs (default 2000, our choice) with the largest
 * kinetic energy summed over the modes: for mass-normalized φ_k the share of DOF i in mode k's
 * kinetic energy is e_ki = φ_ki (Mφ_k)_i with Σ_i e_ki = 1 (the modal kinetic-energy
 * distribution, common practice), and DOFs are ranked by Σ_k e_ki (ties: lower DOF first).
 * The subset's original 0-based DOF indices are stored, ascending.
 *
 * The DOF-map hash is SHA-256 over the node id and component of every DOF in order (not the
 * coordinates, so a moved node still compares): a renumbered model is detected, never compared
 * blindly. The shapes file is written first and the JSON last, both atomically, so a JSON file
 * always points at complete shapes.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { ModesResult } from '../eigen/modes-types.js';
import { COMPONENTS, type DofMap } from '../io/dof-map.js';
import { InputError } from '../io/errors.js';
import { writeFileAtomic } from '../io/atomic-write.js';
import { writeDenseArray } from '../io/matrix-market-writer.js';
import { readDenseArray } from '../io/matrix-market-reader.js';
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import { restrictRows, type ShapeBlock } from './mac.js';

export const BASELINE_SCHEMA_VERSION = 1;
export const DEFAULT_BASELINE_MAX_DOFS = 2000;

/** Which DOFs keep their shape values: every DOF, the DOFs of listed nodes, or the automatic subset. */
export type ShapeDofSelection = 'all' | 'auto' | { nodes: number[]; components?: string[] };

export interface BaselineSnapshot {
  schemaVersion: number;
  kind: 'modalgate-baseline';
  model: string;
  createdAt: string;
  toolVersion?: string;
  dofCount: number;
  dofMapHash: string | null;
  eigenvalues: number[];
  frequenciesHz: number[];
  verification: {
    method: string;
    sturm: ModesResult['sturm'];
    residuals: number[];
    massOrthogonality: number;
    stiffnessOrthogonality: number;
  };
  massProperties?: unknown;
  shapes: {
    file: string;
    normalization: 'mass';
    selection: 'all' | 'nodes' | 'auto';
    rows: number;
    cols: number;
    /** Original 0-based DOF indices of the rows (absent when every DOF is kept). */
    dofs?: number[];
  };
}

export interface LoadedBaseline {
  file: string;
  snapshot: BaselineSnapshot;
  shapes: ShapeBlock;
  /** Original DOF of each shape row, or null for every DOF in order. */
  dofs: Int32Array | null;
}

export interface SaveBaselineInput {
  model: string;
  modes: ModesResult;
  mass: SymmetricCsc;
  dofMap?: DofMap;
  massProperties?: unknown;
  selection?: ShapeDofSelection;
  maxDofs?: number;
  toolVersion?: string;
  /** Config file and place, for errors in the selection. */
  configFile?: string;
  where?: string;
}

export function baselineFiles(dir: string, model: string): { json: string; shapes: string } {
  return { json: join(dir, `${model}.baseline.json`), shapes: join(dir, `${model}.shapes.mtx.gz`) };
}

/** SHA-256 (hex) of the DOF numbering: n, then node id and component code of every DOF. */
export function dofMapHash(map: DofMap): string {
  const h = createHash('sha256');
  h.update(`dofs ${map.n}\n`);
  h.update(new Uint8Array(map.node.buffer, map.node.byteOffset, map.node.byteLength));
  h.update(new Uint8Array(map.component.buffer, map.component.byteOffset, map.component.byteLength));
  return h.digest('hex');
}

/** Write the snapshot of one model; returns the files written. */
export async function saveBaseline(dir: string, input: SaveBaselineInput): Promise<{ json: string; shapes: string }> {
  const { modes } = input;
  const files = baselineFiles(dir, input.model);
  const m = modes.eigenvalues.length;
  const dofs = selectShapeDofs(input);
  const values = dofs ? restrictRows(modes.shapes, modes.n, m, dofs) : modes.shapes.subarray(0, modes.n * m);
  const rows = dofs ? dofs.length : modes.n;
  const selection = input.selection === undefined || input.selection === 'auto' ? (dofs ? 'auto' : 'all') : input.selection === 'all' ? 'all' : 'nodes';
  const comment = `mass-normalized mode shapes of model ${input.model}: ${rows} DOFs (${selection}) x ${m} modes; modalgate baseline`;
  await writeDenseArray(files.shapes, rows, m, values, { gzip: true, comment });
  const snapshot: BaselineSnapshot = {
    schemaVersion: BASELINE_SCHEMA_VERSION,
    kind: 'modalgate-baseline',
    model: input.model,
    createdAt: new Date().toISOString(),
    toolVersion: input.toolVersion,
    dofCount: modes.n,
    dofMapHash: input.dofMap ? dofMapHash(input.dofMap) : null,
    eigenvalues: Array.from(modes.eigenvalues),
    frequenciesHz: Array.from(modes.frequenciesHz),
    verification: {
      method: modes.method,
      sturm: modes.sturm,
      residuals: Array.from(modes.residuals),
      massOrthogonality: modes.orthogonality.massMaxDeviation,
      stiffnessOrthogonality: modes.orthogonality.stiffnessMaxDeviation,
    },
    massProperties: input.massProperties,
    shapes: { file: `${input.model}.shapes.mtx.gz`, normalization: 'mass', selection, rows, cols: m, dofs: dofs ? Array.from(dofs) : undefined },
  };
  writeFileAtomic(files.json, `${JSON.stringify(snapshot, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? String(v) : v), 2)}\n`);
  return files;
}

/** The DOFs to keep (ascending), or null for every DOF. */
export function selectShapeDofs(input: SaveBaselineInput): Int32Array | null {
  const selection = input.selection ?? 'auto';
  if (selection === 'all') return null;
  if (selection === 'auto') return highestEnergyDofs(input.modes, input.mass, input.maxDofs ?? DEFAULT_BASELINE_MAX_DOFS);
  return nodeDofs(selection, input);
}

/** At most `maxDofs` DOFs with the largest Σ_k φ_ki (Mφ_k)_i, ascending; null when n ≤ maxDofs. */
export function highestEnergyDofs(modes: ModesResult, mass: SymmetricCsc, maxDofs: number): Int32Array | null {
  const n = modes.n, m = modes.eigenvalues.length;
  if (n <= maxDofs) return null;
  const massShapes = symMultiplyBlock(mass, modes.shapes.subarray(0, n * m), m);
  const energy = new Float64Array(n);
  // energy_i = Σ_k φ_ki (Mφ_k)_i
  for (let k = 0; k < m; k++) {
    for (let i = 0, o = k * n; i < n; i++) energy[i] += modes.shapes[o + i] * massShapes[o + i];
  }
  const order = new Int32Array(n);
  // order = 0..n−1, then by energy descending, index ascending on ties
  for (let i = 0; i < n; i++) order[i] = i;
  order.sort((a, b) => energy[b] - energy[a] || a - b);
  return order.slice(0, maxDofs).sort();
}

function nodeDofs(selection: { nodes: number[]; components?: string[] }, input: SaveBaselineInput): Int32Array {
  const file = input.configFile ?? input.model;
  const where = input.where ? `${input.where}.shapes` : 'baseline.shapes';
  const map = input.dofMap;
  if (!map) throw new InputError(file, 'choosing baseline shapes by node needs the model\'s DOF map (add `dofs:` to the model)', { where });
  const wanted = new Set(selection.nodes);
  const components = new Set((selection.components ?? [...COMPONENTS]).map((c) => COMPONENTS.indexOf(c as (typeof COMPONENTS)[number])));
  const found = new Set<number>();
  const dofs: number[] = [];
  // DOFs of the listed nodes with a listed component
  for (let d = 0; d < map.n; d++) {
    if (!wanted.has(map.node[d])) continue;
    found.add(map.node[d]);
    if (components.has(map.component[d])) dofs.push(d);
  }
  const missing = selection.nodes.filter((n) => !found.has(n));
  if (missing.length > 0) throw new InputError(file, `baseline shapes: node ${missing.slice(0, 5).join(', ')} is not in the model's DOF map`, { where });
  if (dofs.length === 0) throw new InputError(file, 'baseline shapes: the listed nodes carry none of the listed components', { where });
  return Int32Array.from(dofs);
}

/** The baseline of `model` in `dir`, or null when that model has none there. */
export async function loadBaseline(dir: string, model: string): Promise<LoadedBaseline | null> {
  if (!existsSync(dir) || !statSync(dir).isDirectory()) throw new InputError(dir, 'baseline directory not found');
  const files = baselineFiles(dir, model);
  if (!existsSync(files.json)) return null;
  const snapshot = parseSnapshot(files.json);
  const shapesPath = join(dir, snapshot.shapes.file);
  if (!existsSync(shapesPath)) throw new InputError(files.json, `its shapes file ${shapesPath} is missing`);
  const block = await readDenseArray(shapesPath);
  if (block.rows !== snapshot.shapes.rows || block.cols !== snapshot.shapes.cols) {
    throw new InputError(shapesPath, `holds ${block.rows} x ${block.cols} values but ${files.json} says ${snapshot.shapes.rows} x ${snapshot.shapes.cols}`);
  }
  const dofs = snapshot.shapes.dofs ? Int32Array.from(snapshot.shapes.dofs) : null;
  return { file: files.json, snapshot, shapes: block, dofs };
}

function parseSnapshot(file: string): BaselineSnapshot {
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    throw new InputError(file, `is not valid JSON: ${(e as Error).message}`);
  }
  const s = raw as Partial<BaselineSnapshot> | null;
  if (!s || s.kind !== 'modalgate-baseline') throw new InputError(file, 'is not a modalgate baseline (kind is not "modalgate-baseline")');
  if (s.schemaVersion !== BASELINE_SCHEMA_VERSION) throw new InputError(file, `has baseline schemaVersion ${String(s.schemaVersion)}; this modalgate reads version ${BASELINE_SCHEMA_VERSION}: save the baseline again`);
  const ok =
    Number.isInteger(s.dofCount) &&
    Array.isArray(s.frequenciesHz) &&
    s.frequenciesHz.every((f) => typeof f === 'number') &&
    s.shapes !== undefined &&
    typeof s.shapes.file === 'string' &&
    !/[\\/]/.test(s.shapes.file) &&
    s.shapes.cols === s.frequenciesHz.length &&
    (s.shapes.dofs === undefined ? s.shapes.rows === s.dofCount : (s.shapes.dofs.length === s.shapes.rows && s.shapes.dofs.every((d) => Number.isInteger(d) && d >= 0 && d < s.dofCount!)));
  if (!ok) throw new InputError(file, 'is an incomplete or inconsistent baseline (frequencies, DOF count or shapes entry missing or out of range)');
  return s as BaselineSnapshot;
}
