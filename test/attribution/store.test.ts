/**
 * What the baseline keeps for the attribution: M₀φ (equal to M times the stored shapes) and the
 * node fingerprints, checked by SHA-256 like the other data files; a baseline saved before they
 * existed (no entries in the JSON) still loads and the explanation says what is missing.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { baselineJsonFile, loadBaseline, saveBaseline } from '../../src/model/baseline-store.js';
import { explainChanges } from '../../src/model/explain-changes.js';
import { symMultiplyBlock } from '../../src/sparse/csc.js';
import { denseModes } from '../model/helpers.js';
import { springChain } from './chain-helpers.js';

const chain = springChain([900, 700, 1200, 500], [1.5, 1.0, 2.0, 1.2]);
const modes = denseModes(chain.stiffness, chain.mass);

async function saved(): Promise<string> {
  const dir = mkdtempSync(join(tmpdir(), 'modalgate-store-'));
  await saveBaseline(dir, { model: 'c', modes, mass: chain.mass, stiffness: chain.stiffness, dofMap: chain.dofMap });
  return dir;
}

describe('baseline: M₀φ and node fingerprints', () => {
  it('stores M₀φ equal to M times the shapes, and one fingerprint per node', async () => {
    const dir = await saved();
    try {
      const b = (await loadBaseline(dir, 'c'))!;
      const expected = symMultiplyBlock(chain.mass, modes.shapes, modes.eigenvalues.length);
      expect(Array.from(b.massShapes!.values)).toEqual(Array.from(expected)); // written with 17 digits: exact
      expect(Array.from(b.fingerprints!.nodes)).toEqual([1, 2, 3, 4]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('an older baseline without them loads; the explanation says what is missing', async () => {
    const dir = await saved();
    try {
      const json = baselineJsonFile(dir, 'c');
      const s = JSON.parse(readFileSync(json, 'utf8'));
      delete s.massShapes;
      delete s.nodeFingerprints;
      writeFileSync(json, JSON.stringify(s));
      const b = (await loadBaseline(dir, 'c'))!;
      expect([b.massShapes, b.fingerprints]).toEqual([null, null]);
      const e = explainChanges({ baseline: b, stiffness: chain.stiffness, mass: chain.mass, dofMap: chain.dofMap });
      expect(e.changeMapMissing).toMatch(/no node fingerprints/);
      expect(e.attributionMissing).toMatch(/no modes/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('without modes (a solve that failed) the change map is still made, the attribution says why not', async () => {
    const dir = await saved();
    try {
      const b = (await loadBaseline(dir, 'c'))!;
      const heavier = springChain([900, 700, 1200, 500], [1.5, 1.0, 2.5, 1.2]);
      const e = explainChanges({ baseline: b, stiffness: heavier.stiffness, mass: heavier.mass, dofMap: heavier.dofMap });
      expect(e.changeMap!.nodes.map((n) => [n.node, n.change])).toEqual([[3, 'mass']]);
      expect(e.attribution).toBeNull();
      expect(e.attributionMissing).toMatch(/no modes were solved/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('region labels name the length unit of the config after their point (units.length)', async () => {
    const dir = await saved();
    try {
      const b = (await loadBaseline(dir, 'c'))!;
      const heavier = springChain([900, 700, 1200, 500], [1.5, 1.0, 2.5, 1.2]);
      const plain = explainChanges({ baseline: b, stiffness: heavier.stiffness, mass: heavier.mass, dofMap: heavier.dofMap });
      const named = explainChanges({ baseline: b, stiffness: heavier.stiffness, mass: heavier.mass, dofMap: heavier.dofMap, lengthUnit: 'mm' });
      const label = plain.changeMap!.regions[0].label;
      expect(label).toMatch(/^node 3 near \([^)]*\)$/);
      expect(named.changeMap!.regions[0].label).toBe(`${label} mm`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('a fingerprint file from another save is refused by its SHA-256', async () => {
    const dir = await saved();
    try {
      const s = JSON.parse(readFileSync(baselineJsonFile(dir, 'c'), 'utf8'));
      writeFileSync(join(dir, s.nodeFingerprints.file), gzipSync('node,stiffness,mass\n1,0000000000000000,0000000000000000\n'));
      await expect(loadBaseline(dir, 'c')).rejects.toThrow(/node fingerprint file .* SHA-256/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
