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
/**
 * Baseline snapshots: what one model's modes looked like when the baseline was saved, kept in a
 * directory as one unit of files per model:
 *
 *   <model>.baseline.json              metadata: schemaVersion, run id, frequencies, verification
 *                                      figures, mass properties when known, DOF count, and the
 *                                      name and SHA-256 of each data file below
 *   <model>.<run>.shapes.mtx.gz        mass-normalized mode shapes, Matrix Market `array real
 *                                      general` (gzip), rows = stored DOFs, one column per mode
 *   <model>.<run>.dofs.csv.gz          the model's DOF map (node, component, coordinates per
 *                                      1-based DOF), when the model has one
 *   <model>.<run>.mass-shapes.mtx.gz   M₀φ of every mode, same layout as the shapes, when every
 *                                      DOF is kept and DOFs × modes ≤ 4 000 000 (our choice): it
 *                                      splits a frequency change into stiffness and mass
 *                                      (./change-attribution.ts)
 *   <model>.<run>.nodes.csv.gz         a fingerprint of each node's rows of K and of M
 *                                      (./change-map.ts), when K was given to the save
 *
 * One unit: the data files carry the save's run id in their names and are written (atomically)
 * first; the JSON, renamed into place last, is the single commit point. A reader therefore sees
 * the old unit or the new one, never a mix, and the loader checks each data file's SHA-256
 * against the JSON, so a mix made by hand (or by a copy) is refused with a sentence naming both
 * files. Saves of one model hold `<model>.baseline.lock` (./../io/file-lock.ts), so two
 * concurrent `--save-baseline` runs never interleave; after the commit the older unit's data
 * files are removed. On SIGINT/SIGTERM during a save the temporary files, the uncommitted data
 * files and the lock are removed before the process ends (../io/signal-cleanup.ts).
 *
 * Shapes are kept at every DOF by default (8 bytes a value in memory; on disk about 10 bytes a
 * value after gzip of the 17-digit text). A subset can be asked for: the DOFs of listed
 * nodes/components, or an automatic, deterministic subset of at most `maxDofs` DOFs with the
 * largest kinetic energy summed over the modes: for mass-normalized φ_k the share of DOF i in
 * mode k's kinetic energy is e_ki = φ_ki (Mφ_k)_i with Σ_i e_ki = 1 (the modal kinetic-energy
 * distribution, common practice), DOFs ranked by Σ_k e_ki (ties: lower DOF first); the smallest
 * share of any mode's kinetic energy the subset keeps is stored and reported. Stored DOF numbers
 * are 1-based, as in every file modalgate writes. Baselines saved before M₀φ and the
 * fingerprints were stored still load (both entries are optional); the attribution then says
 * what is missing.
 */
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { ModesResult } from '../eigen/modes-types.js';
import { COMPONENTS, type DofMap } from '../io/dof-map.js';
import { InputError } from '../io/errors.js';
import { writeFileAtomic, removeTempFiles } from '../io/atomic-write.js';
import { writeDenseArray } from '../io/matrix-market-writer.js';
import { readDenseArray } from '../io/matrix-market-reader.js';
import { writeDofMap } from '../io/dof-map-writer.js';
import { readDofMap } from '../io/dof-map-reader.js';
import { acquireFileLock, releaseIfOurs } from '../io/file-lock.js';
import { withSignalCleanup } from '../io/signal-cleanup.js';
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import { restrictRows, type ShapeBlock } from './mac.js';
import { readNodeFingerprints, writeNodeFingerprints, type FingerprintTable } from '../io/node-fingerprint-file.js';
import { nodeFingerprints } from './change-map.js';

const BASELINE_SCHEMA_VERSION = 2;
const DEFAULT_BASELINE_MAX_DOFS = 2000;
/** Largest DOFs × modes for which M₀φ is stored beside the shapes (32 MB in memory; our choice). */
export const MAX_MASS_SHAPE_VALUES = 4_000_000;

/** Which DOFs keep their shape values: every DOF (default), the DOFs of listed nodes, or the automatic subset. */
export type ShapeDofSelection = 'all' | 'auto' | { nodes: number[]; components?: string[] };

export interface BaselineDataFile {
  /** File name inside the baseline directory. */
  file: string;
  /** SHA-256 (hex) of the file's bytes as written. */
  sha256: string;
}

export interface BaselineSnapshot {
  schemaVersion: number;
  kind: 'modalgate-baseline';
  model: string;
  /** Random id of the save; also in the data files' names. */
  runId: string;
  createdAt: string;
  toolVersion?: string;
  dofCount: number;
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
  shapes: BaselineDataFile & {
    normalization: 'mass';
    selection: 'all' | 'nodes' | 'auto';
    rows: number;
    cols: number;
    /** 1-based DOFs of the rows (absent when every DOF is kept). */
    dofs?: number[];
    /** Smallest share of a mode's kinetic energy on the stored DOFs (1 when every DOF is kept). */
    energyShareKept: number;
  };
  /** The model's DOF map, or null when it had none. */
  dofMap: BaselineDataFile | null;
  /** M₀φ of every mode on every DOF (absent: not stored, or saved by an older modalgate). */
  massShapes?: BaselineDataFile & { rows: number; cols: number };
  /** Fingerprints of each node's K and M rows (absent: saved by an older modalgate). */
  nodeFingerprints?: BaselineDataFile & { nodes: number };
}

export interface LoadedBaseline {
  file: string;
  snapshot: BaselineSnapshot;
  shapes: ShapeBlock;
  /** Original 0-based DOF of each shape row, or null for every DOF in order. */
  dofs: Int32Array | null;
  /** The DOF map stored with the baseline, or null. */
  dofMap: DofMap | null;
  /** M₀φ on every DOF, column-major like `shapes`, or null when not stored. */
  massShapes: ShapeBlock | null;
  /** Node fingerprints of K and M, or null when not stored. */
  fingerprints: FingerprintTable | null;
}

export interface SaveBaselineInput {
  model: string;
  modes: ModesResult;
  mass: SymmetricCsc;
  /** The stiffness the modes were solved with: when given, the node fingerprints are stored. */
  stiffness?: SymmetricCsc;
  dofMap?: DofMap;
  massProperties?: unknown;
  selection?: ShapeDofSelection;
  maxDofs?: number;
  toolVersion?: string;
  /** Config file and place, for errors in the selection. */
  configFile?: string;
  where?: string;
  /** Fixed run id (16 hex digits) and save time, for fixtures that must come out byte-identical; default random and now. */
  runId?: string;
  createdAt?: string;
}

export interface SavedBaselineFiles {
  json: string;
  shapes: string;
  dofs?: string;
  massShapes?: string;
  nodes?: string;
}

export function baselineJsonFile(dir: string, model: string): string {
  return join(dir, `${model}.baseline.json`);
}

export function baselineLockFile(dir: string, model: string): string {
  return join(dir, `${model}.baseline.lock`);
}

function dataFileNames(model: string, runId: string): { shapes: string; dofs: string; massShapes: string; nodes: string } {
  return { shapes: `${model}.${runId}.shapes.mtx.gz`, dofs: `${model}.${runId}.dofs.csv.gz`, massShapes: `${model}.${runId}.mass-shapes.mtx.gz`, nodes: `${model}.${runId}.nodes.csv.gz` };
}

function sha256OfFile(path: string): string {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

/** Write the snapshot of one model as one unit; returns the files written. */
export async function saveBaseline(dir: string, input: SaveBaselineInput): Promise<SavedBaselineFiles> {
  const { modes } = input;
  const m = modes.eigenvalues.length;
  // M Φ: made at most once, for the DOF selection, the kept-energy share and M₀φ, whichever need it
  let mPhi: Float64Array | undefined;
  const massShapes = (): Float64Array => (mPhi ??= symMultiplyBlock(input.mass, modes.shapes.subarray(0, modes.n * m), m));
  const dofs = selectShapeDofs(input, massShapes);
  const runId = input.runId ?? randomBytes(8).toString('hex');
  const names = dataFileNames(input.model, runId);
  const paths = { json: baselineJsonFile(dir, input.model), shapes: join(dir, names.shapes), dofs: join(dir, names.dofs), massShapes: join(dir, names.massShapes), nodes: join(dir, names.nodes) };
  const dataPaths = [paths.shapes, paths.dofs, paths.massShapes, paths.nodes];
  const lock = await acquireFileLock(baselineLockFile(dir, input.model), `the baseline of model "${input.model}"`);
  let committed = false;
  // on a signal before the commit: our temporary files, our data files and the lock go
  const cleanup = (): void => {
    removeTempFiles([dir], process.pid);
    if (!committed) for (const p of dataPaths) rmSync(p, { force: true });
    lock.release();
  };
  try {
    return await withSignalCleanup(cleanup, async () => {
      const values = dofs ? restrictRows(modes.shapes, modes.n, m, dofs) : modes.shapes.subarray(0, modes.n * m);
      const rows = dofs ? dofs.length : modes.n;
      const selection = input.selection === 'auto' ? (dofs ? 'auto' : 'all') : input.selection === undefined || input.selection === 'all' ? 'all' : 'nodes';
      const comment = `mass-normalized mode shapes of model ${input.model}: ${rows} DOFs (${selection}) x ${m} modes; modalgate baseline run ${runId}`;
      await writeDenseArray(paths.shapes, rows, m, values, { gzip: true, comment });
      if (input.dofMap) await writeDofMap(paths.dofs, input.dofMap, { gzip: true });
      // M₀φ beside every-DOF shapes when the size allows; the fingerprints when K is known
      const keepMassShapes = !dofs && m > 0 && modes.n * m <= MAX_MASS_SHAPE_VALUES;
      if (keepMassShapes) {
        await writeDenseArray(paths.massShapes, modes.n, m, massShapes(), { gzip: true, comment: `M times the mass-normalized mode shapes of model ${input.model}; modalgate baseline run ${runId}` });
      }
      const fingerprints = input.stiffness ? nodeFingerprints(input.stiffness, input.mass, input.dofMap) : null;
      if (fingerprints) await writeNodeFingerprints(paths.nodes, fingerprints);
      const snapshot: BaselineSnapshot = {
        schemaVersion: BASELINE_SCHEMA_VERSION,
        kind: 'modalgate-baseline',
        model: input.model,
        runId,
        createdAt: input.createdAt ?? new Date().toISOString(),
        toolVersion: input.toolVersion,
        dofCount: modes.n,
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
        shapes: {
          file: names.shapes,
          sha256: sha256OfFile(paths.shapes),
          normalization: 'mass',
          selection,
          rows,
          cols: m,
          dofs: dofs ? Array.from(dofs, (d) => d + 1) : undefined,
          energyShareKept: dofs ? keptEnergyShare(modes, massShapes(), dofs) : 1,
        },
        dofMap: input.dofMap ? { file: names.dofs, sha256: sha256OfFile(paths.dofs) } : null,
        massShapes: keepMassShapes ? { file: names.massShapes, sha256: sha256OfFile(paths.massShapes), rows: modes.n, cols: m } : undefined,
        nodeFingerprints: fingerprints ? { file: names.nodes, sha256: sha256OfFile(paths.nodes), nodes: fingerprints.nodes.length } : undefined,
      };
      // the commit point: one rename
      writeFileAtomic(paths.json, `${JSON.stringify(snapshot, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? String(v) : v), 2)}\n`);
      committed = true;
      removeOlderUnits(dir, input.model, runId);
      return {
        json: paths.json,
        shapes: paths.shapes,
        ...(input.dofMap ? { dofs: paths.dofs } : {}),
        ...(keepMassShapes ? { massShapes: paths.massShapes } : {}),
        ...(fingerprints ? { nodes: paths.nodes } : {}),
      };
    });
  } catch (e) {
    if (!committed) for (const p of dataPaths) rmSync(p, { force: true });
    throw e;
  } finally {
    lock.release();
  }
}

/**
 * After a save of `model` was cut short on a worker thread that was then stopped (a time limit, a
 * signal): its temporary files, the data files the committed snapshot does not name, and this
 * process's lock go; the committed snapshot, if any, stays as it was.
 */
export function clearStoppedSave(dir: string, model: string): void {
  removeTempFiles([dir], process.pid);
  let committedRun = '';
  try {
    committedRun = String((JSON.parse(readFileSync(baselineJsonFile(dir, model), 'utf8')) as { runId?: unknown }).runId ?? '');
  } catch {
    // no committed snapshot: every data file of the model is uncommitted
  }
  removeOlderUnits(dir, model, committedRun);
  releaseIfOurs(baselineLockFile(dir, model));
}

/** Data files of this model from other runs (and the version-1 shapes file), after a commit. */
function removeOlderUnits(dir: string, model: string, runId: string): void {
  const escaped = model.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const unit = new RegExp(`^${escaped}\\.([0-9a-f]{16})\\.(shapes\\.mtx|dofs\\.csv|mass-shapes\\.mtx|nodes\\.csv)\\.gz$`);
  for (const name of safeList(dir)) {
    const hit = unit.exec(name);
    if ((hit && hit[1] !== runId) || name === `${model}.shapes.mtx.gz`) rmSync(join(dir, name), { force: true });
  }
}

function safeList(dir: string): string[] {
  try {
    return readdirSync(dir);
  } catch {
    return [];
  }
}

/** min over modes k of Σ_{i∈S} φ_ki (Mφ_k)_i: the smallest share of a mode's kinetic energy on the subset S. */
function keptEnergyShare(modes: ModesResult, massShapes: Float64Array, dofs: Int32Array): number {
  const n = modes.n, m = modes.eigenvalues.length;
  if (m === 0) return 1;
  let smallest = Infinity;
  // share_k = Σ_{i∈S} φ_ki (Mφ_k)_i / Σ_i φ_ki (Mφ_k)_i
  for (let k = 0, o = 0; k < m; k++, o += n) {
    let kept = 0, total = 0;
    for (let i = 0; i < n; i++) total += modes.shapes[o + i] * massShapes[o + i];
    for (let s = 0; s < dofs.length; s++) kept += modes.shapes[o + dofs[s]] * massShapes[o + dofs[s]];
    smallest = Math.min(smallest, total > 0 ? kept / total : 1);
  }
  return smallest;
}

/** The DOFs to keep (ascending), or null for every DOF. */
function selectShapeDofs(input: SaveBaselineInput, massShapes: () => Float64Array): Int32Array | null {
  const selection = input.selection ?? 'all';
  if (selection === 'all') return null;
  if (selection === 'auto') return highestEnergyDofs(input.modes, massShapes, input.maxDofs ?? DEFAULT_BASELINE_MAX_DOFS);
  return nodeDofs(selection, input);
}

/** At most `maxDofs` DOFs with the largest Σ_k φ_ki (Mφ_k)_i, ascending; null when n ≤ maxDofs. */
function highestEnergyDofs(modes: ModesResult, massShapesOf: () => Float64Array, maxDofs: number): Int32Array | null {
  const n = modes.n, m = modes.eigenvalues.length;
  if (n <= maxDofs) return null;
  const massShapes = massShapesOf();
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

/**
 * The baseline of `model` in `dir`, or null when that model has none there (the caller knows
 * whether the directory exists). A unit whose data files do not match the JSON's checksums is
 * refused: it is a mix of two saves.
 */
export async function loadBaseline(dir: string, model: string): Promise<LoadedBaseline | null> {
  if (!existsSync(dir) || !statSync(dir).isDirectory()) throw new InputError(dir, 'baseline directory not found');
  const json = baselineJsonFile(dir, model);
  if (!existsSync(json)) return null;
  const snapshot = parseSnapshot(json);
  const shapesPath = checkedDataFile(dir, json, snapshot, snapshot.shapes, 'shapes');
  const block = await readDenseArray(shapesPath);
  if (block.rows !== snapshot.shapes.rows || block.cols !== snapshot.shapes.cols) {
    throw new InputError(shapesPath, `holds ${block.rows} x ${block.cols} values but ${json} says ${snapshot.shapes.rows} x ${snapshot.shapes.cols}`);
  }
  const dofs = snapshot.shapes.dofs ? Int32Array.from(snapshot.shapes.dofs, (d) => d - 1) : null;
  const dofMap = snapshot.dofMap ? await readDofMap(checkedDataFile(dir, json, snapshot, snapshot.dofMap, 'DOF map'), snapshot.dofCount) : null;
  let massShapes: ShapeBlock | null = null;
  if (snapshot.massShapes) {
    const path = checkedDataFile(dir, json, snapshot, snapshot.massShapes, 'M·shapes');
    massShapes = await readDenseArray(path);
    if (massShapes.rows !== snapshot.dofCount || massShapes.cols !== snapshot.shapes.cols) throw new InputError(path, `holds ${massShapes.rows} x ${massShapes.cols} values but ${json} says ${snapshot.dofCount} x ${snapshot.shapes.cols}`);
  }
  let fingerprints: FingerprintTable | null = null;
  if (snapshot.nodeFingerprints) {
    const path = checkedDataFile(dir, json, snapshot, snapshot.nodeFingerprints, 'node fingerprint');
    fingerprints = readNodeFingerprints(path);
    if (fingerprints.nodes.length !== snapshot.nodeFingerprints.nodes) throw new InputError(path, `holds ${fingerprints.nodes.length} nodes but ${json} says ${snapshot.nodeFingerprints.nodes}`);
  }
  return { file: json, snapshot, shapes: block, dofs, dofMap, massShapes, fingerprints };
}

function checkedDataFile(dir: string, json: string, snapshot: BaselineSnapshot, entry: BaselineDataFile, what: string): string {
  const path = join(dir, entry.file);
  if (!existsSync(path)) throw new InputError(json, `its ${what} file ${path} is missing (run ${snapshot.runId}); save the baseline again with check --save-baseline`);
  const actual = sha256OfFile(path);
  if (actual !== entry.sha256) {
    throw new InputError(json, `does not belong with its ${what} file ${path}: the file's SHA-256 ${actual.slice(0, 12)}… differs from the ${entry.sha256.slice(0, 12)}… recorded by run ${snapshot.runId}, so the baseline mixes two saves; save it again with check --save-baseline`);
  }
  return path;
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
  const dataFile = (d: Partial<BaselineDataFile> | undefined | null): boolean => !!d && typeof d.file === 'string' && !/[\\/]/.test(d.file) && typeof d.sha256 === 'string';
  const ok =
    Number.isInteger(s.dofCount) &&
    typeof s.runId === 'string' &&
    Array.isArray(s.frequenciesHz) &&
    s.frequenciesHz.every((f) => typeof f === 'number') &&
    dataFile(s.shapes) &&
    (s.dofMap === null || dataFile(s.dofMap)) &&
    (s.massShapes === undefined || (dataFile(s.massShapes) && s.massShapes.rows === s.dofCount && s.massShapes.cols === s.frequenciesHz.length)) &&
    (s.nodeFingerprints === undefined || (dataFile(s.nodeFingerprints) && Number.isInteger(s.nodeFingerprints.nodes))) &&
    s.shapes!.cols === s.frequenciesHz.length &&
    (s.shapes!.dofs === undefined ? s.shapes!.rows === s.dofCount : (s.shapes!.dofs.length === s.shapes!.rows && s.shapes!.dofs.every((d) => Number.isInteger(d) && d >= 1 && d <= s.dofCount!)));
  if (!ok) throw new InputError(file, 'is an incomplete or inconsistent baseline (frequencies, DOF count, shapes or DOF-map entry missing or out of range)');
  return s as BaselineSnapshot;
}
