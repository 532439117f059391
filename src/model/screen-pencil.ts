/**
 * Screening of the pencil (K, M) before a solve, shared by `modalgate check` and
 * `modalgate modes`: can K φ = λ M φ be solved as a vibration problem at all? The solver's
 * theory (Sturm count, M-inner products) needs finite entries and M positive semi-definite.
 *
 *  - non-finite entries in K or M;
 *  - a negative diagonal entry of M (eᵢᵀMeᵢ < 0);
 *  - M zero on every diagonal (no mass at all);
 *  - a 2×2 principal minor of M below zero, m_ij² > m_ii·m_jj: the vector
 *    x = √m_jj eᵢ − sign(m_ij)·√m_ii eⱼ has xᵀMx < 0, so M is indefinite even though its
 *    diagonal is positive (every principal submatrix of a positive semi-definite matrix is
 *    positive semi-definite, common practice). A relative margin of 1e-10 and an absolute one
 *    of 1e-12·max m_ii (ours) keep rounding of an exported consistent mass from tripping it.
 *    The test is sound, not complete: an indefinite M whose 2×2 minors are all non-negative is
 *    caught by the solver instead (a vector with xᵀMx < 0, src/eigen/m-orthonormalize.ts).
 *
 * Each reason names the file, so the CLI can print one line and exit 2.
 */
import { diagonalOf, type SymmetricCsc } from '../sparse/csc.js';
import type { MatrixSummary } from '../io/matrix-summary.js';

export interface PencilBlocker {
  /** The file at fault. */
  file: string;
  /** One plain sentence, without the file. */
  reason: string;
}

const MINOR_RELATIVE_MARGIN = 1e-10;
const MINOR_ABSOLUTE_MARGIN = 1e-12;

/** Why solving would be meaningless, or null. */
export function screenPencil(k: MatrixSummary, m: MatrixSummary, mass?: SymmetricCsc): PencilBlocker | null {
  if (k.nonFiniteCount > 0) return { file: k.file, reason: `K has ${k.nonFiniteCount} non-finite entr${k.nonFiniteCount === 1 ? 'y' : 'ies'}` };
  if (m.nonFiniteCount > 0) return { file: m.file, reason: `M has ${m.nonFiniteCount} non-finite entr${m.nonFiniteCount === 1 ? 'y' : 'ies'}` };
  if (m.negativeDiagonalCount > 0) return { file: m.file, reason: 'M has negative diagonal entries (it cannot be positive semi-definite)' };
  if (m.zeroDiagonalCount === m.n) return { file: m.file, reason: 'M is zero on every diagonal' };
  const minor = mass ? negativeMinor(mass) : null;
  if (minor) {
    return {
      file: m.file,
      reason: `M is indefinite: rows ${minor.j + 1} and ${minor.i + 1} have m_ij² > m_ii·m_jj (${minor.mij.toPrecision(4)}² > ${minor.mii.toPrecision(4)}·${minor.mjj.toPrecision(4)}), so some motion would have negative kinetic energy`,
    };
  }
  return null;
}

/** The first 2×2 principal minor of M that is negative beyond rounding, or null. */
export function negativeMinor(mass: SymmetricCsc): { i: number; j: number; mij: number; mii: number; mjj: number } | null {
  const n = mass.n;
  const d = diagonalOf(mass);
  let maxDiagonal = 0;
  for (let j = 0; j < n; j++) maxDiagonal = Math.max(maxDiagonal, Math.abs(d[j]));
  const floor = MINOR_ABSOLUTE_MARGIN * maxDiagonal;
  // every stored off-diagonal entry m_ij (i > j): m_ij² ≤ m_ii m_jj (1 + margin) + floor²
  for (let j = 0; j < n; j++) {
    for (let p = mass.colPtr[j]; p < mass.colPtr[j + 1]; p++) {
      const i = mass.rowIdx[p];
      if (i === j) continue;
      const v = mass.values[p];
      if (v * v > d[i] * d[j] * (1 + MINOR_RELATIVE_MARGIN) + floor * floor) return { i, j, mij: v, mii: d[i], mjj: d[j] };
    }
  }
  return null;
}
