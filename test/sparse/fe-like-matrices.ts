/**
 * Small FE-like symmetric matrices for the sparse tests: nodes on an nx×ny×nz grid with 3 DOFs
 * each, one 24×24 symmetric positive definite "element stiffness" GᵀG + I per hexahedral cell
 * (random G, fixed seed), lumped diagonal mass. The pattern is the one of trilinear hexahedra;
 * the values are not physical but exercise the factorization the same way.
 */
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import { seededUniform } from '../../src/dense/seeded-random.js';

/** Deterministic uniform [0, 1) generator. */
export const seededRandom = seededUniform;

export interface SmallPair {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
}

export function hexGridPair(nx: number, ny: number, nz: number, seed = 1): SmallPair {
  const rnd = seededRandom(seed);
  const node = (i: number, j: number, k: number) => i + (nx + 1) * (j + (ny + 1) * k);
  const nNodes = (nx + 1) * (ny + 1) * (nz + 1);
  const n = 3 * nNodes;
  const kt = new TripletList(nx * ny * nz * 300);
  const g = new Float64Array(24 * 24);
  const dofs = new Int32Array(24);
  // each cell adds GᵀG + I on its 24 DOFs (lower triangle only)
  for (let k = 0; k < nz; k++)
    for (let j = 0; j < ny; j++)
      for (let i = 0; i < nx; i++) {
        let c = 0;
        for (let dz = 0; dz < 2; dz++)
          for (let dy = 0; dy < 2; dy++)
            for (let dx = 0; dx < 2; dx++) {
              const nd = node(i + dx, j + dy, k + dz);
              for (let comp = 0; comp < 3; comp++) dofs[c++] = 3 * nd + comp;
            }
        for (let q = 0; q < g.length; q++) g[q] = rnd() - 0.5;
        for (let a = 0; a < 24; a++)
          for (let b = 0; b <= a; b++) {
            let s = a === b ? 1 : 0;
            for (let r = 0; r < 24; r++) s += g[r * 24 + a] * g[r * 24 + b];
            kt.push(dofs[a], dofs[b], s);
          }
      }
  const mt = new TripletList(n);
  // lumped mass: positive diagonal
  for (let d = 0; d < n; d++) mt.push(d, d, 0.5 + rnd());
  return { stiffness: assembleSymmetric(n, kt).matrix, mass: assembleSymmetric(n, mt).matrix };
}

/** Dense copy of a small symmetric matrix (tests only). */
export function denseOf(a: SymmetricCsc): number[][] {
  const d: number[][] = Array.from({ length: a.n }, () => new Array<number>(a.n).fill(0));
  for (let j = 0; j < a.n; j++)
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      d[i][j] = a.values[p];
      d[j][i] = a.values[p];
    }
  return d;
}

/** A − σB entrywise on dense copies. */
export function denseShifted(k: SymmetricCsc, m: SymmetricCsc, shift: number): number[][] {
  const a = denseOf(k);
  const b = denseOf(m);
  return a.map((row, i) => row.map((v, j) => v - shift * b[i][j]));
}
