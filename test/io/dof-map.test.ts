/** DOF map CSV: write → read round trip, validation and naming (describeDof). */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readDofMap } from '../../src/io/dof-map-reader.js';
import { writeDofMap } from '../../src/io/dof-map-writer.js';
import { describeDof, type DofMap } from '../../src/io/dof-map.js';

const dir = mkdtempSync(join(tmpdir(), 'modalgate-dof-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function beamMap(nodes: number): DofMap {
  const n = nodes * 6;
  const map = {
    n, node: new Int32Array(n), component: new Uint8Array(n),
    x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n),
  };
  // six DOFs per node, nodes along x with awkward coordinates
  for (let d = 0; d < n; d++) {
    const k = Math.floor(d / 6);
    map.node[d] = 100 + 7 * k;
    map.component[d] = d % 6;
    map.x[d] = k * 0.1;
    map.y[d] = k === 1 ? -0 : 1 / 3;
    map.z[d] = k * 1e-300;
  }
  return map;
}

describe('DOF map', () => {
  it('round trip write → read is exact (plain and gzip)', async () => {
    const map = beamMap(50);
    for (const name of ['dofs.csv', 'dofs.csv.gz']) {
      const p = join(dir, name);
      await writeDofMap(p, map);
      const back = await readDofMap(p, map.n);
      expect(back.n).toBe(map.n);
      expect(Array.from(back.node)).toEqual(Array.from(map.node));
      expect(Array.from(back.component)).toEqual(Array.from(map.component));
      for (const c of ['x', 'y', 'z'] as const) {
        expect(Buffer.from(back[c].buffer).equals(Buffer.from(map[c].buffer)), c).toBe(true);
      }
    }
  });

  it('rows in any order, upper-case components, BOM, blank lines; n from the file when not given', async () => {
    const p = join(dir, 'any-order.csv');
    writeFileSync(p, '\ufeffdof, node, component, x, y, z\r\n3,11,RZ,1,0,0\r\n\r\n1,10,ux,0,0,0\r\n2,10,uy,0,0,0\r\n');
    const map = await readDofMap(p);
    expect(map.n).toBe(3);
    expect(describeDof(map, 2)).toBe('node 11 rz (dof 3)');
    expect(describeDof(undefined, 2)).toBe('dof 3');
  });

  it('a map shorter than K is refused, naming the first missing DOF', async () => {
    const p = join(dir, 'short.csv');
    writeFileSync(p, 'dof,node,component,x,y,z\n1,10,ux,0,0,0\n2,10,uy,0,0,0\n');
    await expect(readDofMap(p, 3)).rejects.toThrow(/short\.csv:3: dof 3 is missing/);
  });
});

describe('inspect report', () => {
  it('names zero and negative diagonals by node and component when a DOF map is given', async () => {
    const { formatInspection } = await import('../../src/cli/inspect.js');
    const { readMatrixMarket } = await import('../../src/io/matrix-market-reader.js');
    const k = join(dir, 'k.mtx');
    writeFileSync(k, '%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 4\n3 3 -1\n');
    const d = join(dir, 'd.csv');
    writeFileSync(d, 'dof,node,component,x,y,z\n1,10,ux,0,0,0\n2,10,uy,0,0,0\n3,11,rz,1,0,0\n');
    const { summary } = await readMatrixMarket(k);
    const text = formatInspection(summary, await readDofMap(d, 3));
    expect(text).toMatch(/zero diagonals\s+1: node 10 uy \(dof 2\)/);
    expect(text).toMatch(/negative diagonals\s+1: node 11 rz \(dof 3\)/);
    expect(formatInspection(summary)).toMatch(/zero diagonals\s+1: dof 2/);
  });
});

describe('DOF map components by number', () => {
  it('1 to 6 stand for ux uy uz rx ry rz; 0 and 7 are refused naming the line', async () => {
    const p = join(dir, 'numeric.csv');
    writeFileSync(p, 'dof,node,component,x,y,z\n1,5,1,0,0,0\n2,5,3,0,0,0\n3,5,6,0,0,0\n');
    const map = await readDofMap(p, 3);
    expect(Array.from(map.component)).toEqual([0, 2, 5]);
    const bad = join(dir, 'numeric-bad.csv');
    writeFileSync(bad, 'dof,node,component,x,y,z\n1,5,1,0,0,0\n2,5,7,0,0,0\n');
    await expect(readDofMap(bad, 2)).rejects.toThrow(/numeric-bad\.csv:3: unknown component '7' \(expected one of ux uy uz rx ry rz, or 1 to 6\)/);
  });
});
