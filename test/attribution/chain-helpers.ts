/**
 * A fixed–free spring–mass chain for the attribution tests: mass i (node i + 1, component ux,
 * at x = i) hangs on spring i from mass i − 1 (spring 0 from the ground). K is tridiagonal with
 * K_ii = k_i + k_{i+1}, K_{i,i+1} = −k_{i+1}; M = diag(m_i). Small and dense-solvable.
 */
import { assembleSymmetric, TripletList } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import type { DofMap } from '../../src/io/dof-map.js';

export interface Chain {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap: DofMap;
}

export function springChain(springs: readonly number[], masses: readonly number[]): Chain {
  const n = masses.length;
  const k = new TripletList();
  const m = new TripletList();
  // spring i joins DOF i − 1 (or the ground) and DOF i
  for (let i = 0; i < n; i++) {
    k.push(i, i, springs[i]);
    if (i > 0) {
      k.push(i - 1, i - 1, springs[i]);
      k.push(i, i - 1, -springs[i]);
    }
    m.push(i, i, masses[i]);
  }
  const dofMap: DofMap = {
    n,
    node: Int32Array.from({ length: n }, (_v, i) => i + 1),
    component: new Uint8Array(n),
    x: Float64Array.from({ length: n }, (_v, i) => i),
    y: new Float64Array(n),
    z: new Float64Array(n),
  };
  return { stiffness: assembleSymmetric(n, k).matrix, mass: assembleSymmetric(n, m).matrix, dofMap };
}

import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ModesResult } from '../../src/eigen/modes-types.js';
import { loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { compareWithBaseline } from '../../src/model/compare-baseline.js';
import { explainChanges } from '../../src/model/explain-changes.js';
import type { ExplainedChanges } from '../../src/model/change-facts.js';
import type { ComparisonFacts } from '../../src/model/comparison-facts.js';

export interface TestModel {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap?: DofMap;
}

/**
 * Save `before` with its modes as a baseline (a real unit on disk, every file the save writes),
 * load it, compare `after` and its modes with it, and explain the changes — the pipeline's path.
 * `store` drops parts of the saved baseline to act as an older one.
 */
export async function explainAgainst(before: TestModel, beforeModes: ModesResult, after: TestModel, afterModes: ModesResult | undefined, store: { massShapes?: boolean; fingerprints?: boolean } = {}): Promise<{ changes: ExplainedChanges; comparison?: ComparisonFacts }> {
  const dir = mkdtempSync(join(tmpdir(), 'modalgate-attrib-'));
  try {
    await saveBaseline(dir, { model: 'm', modes: beforeModes, mass: before.mass, stiffness: before.stiffness, dofMap: before.dofMap });
    const loaded = (await loadBaseline(dir, 'm'))!;
    if (store.massShapes === false) loaded.massShapes = null;
    if (store.fingerprints === false) loaded.fingerprints = null;
    const comparison = afterModes ? compareWithBaseline(loaded, { modes: afterModes, mass: after.mass, dofMap: after.dofMap }) : undefined;
    const changes = explainChanges({ baseline: loaded, stiffness: after.stiffness, mass: after.mass, dofMap: after.dofMap, modes: afterModes, comparison });
    return { changes, comparison };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
