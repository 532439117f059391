/**
 * Test-only patterns: nx×ny×nz node grids with `dofsPerNode` DOFs per node and node coupling
 * to the 26 (3D) / 8 (2D, nz = 1) surrounding nodes — the pattern of trilinear hexahedra
 * (bilinear quads) — or to the 6 / 4 face neighbours only (7-/5-point Laplacian).
 * Returned as SymmetricCsc (lower storage, unit values) plus interleaved node coordinates per DOF.
 */
import type { SymmetricCsc } from '../../../src/sparse/csc.js';

export interface GridPattern {
  matrix: SymmetricCsc;
  coordinates: Float64Array; // x, y, z of each DOF's node
}

export function gridPattern(
  nx: number,
  ny: number,
  nz: number,
  dofsPerNode: number,
  coupling: 'box' | 'faces' = 'box',
): GridPattern {
  const nodes = nx * ny * nz;
  const n = nodes * dofsPerNode;
  const id = (x: number, y: number, z: number) => x + nx * (y + ny * z);
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const coordinates = new Float64Array(3 * n);
  // column by column: DOF d of node (x,y,z) couples to all DOFs of neighbouring nodes with larger index
  for (let z = 0; z < nz; z++)
    for (let y = 0; y < ny; y++)
      for (let x = 0; x < nx; x++) {
        const a = id(x, y, z);
        const neighbours: number[] = [];
        for (let dz = -1; dz <= 1; dz++)
          for (let dy = -1; dy <= 1; dy++)
            for (let dx = -1; dx <= 1; dx++) {
              const X = x + dx, Y = y + dy, Z = z + dz;
              if (X < 0 || Y < 0 || Z < 0 || X >= nx || Y >= ny || Z >= nz) continue;
              if (coupling === 'faces' && Math.abs(dx) + Math.abs(dy) + Math.abs(dz) > 1) continue;
              const b = id(X, Y, Z);
              if (b > a) neighbours.push(b);
            }
        neighbours.sort((p, q) => p - q);
        for (let d = 0; d < dofsPerNode; d++) {
          const col = a * dofsPerNode + d;
          coordinates.set([x, y, z], 3 * col);
          for (let e = d; e < dofsPerNode; e++) rows.push(a * dofsPerNode + e);
          for (const b of neighbours) for (let e = 0; e < dofsPerNode; e++) rows.push(b * dofsPerNode + e);
          colPtr[col + 1] = rows.length;
        }
      }
  const rowIdx = Int32Array.from(rows);
  return { matrix: { n, colPtr, rowIdx, values: new Float64Array(rowIdx.length).fill(1) }, coordinates };
}
