/**
 * Screening facts of one stiffness or mass matrix (the MatrixSummary), from its lower-triangle
 * CSC and what the reader learned. One pass over the stored entries:
 *
 *   diagonal d_j = a_jj (0 when not stored); min/max over j; spread = max|d| / min|d| over d ≠ 0;
 *   zero (d_j = 0) and negative (d_j < 0) diagonals, counted exactly, listed up to `listCap`;
 *   half-bandwidth b = max (i − j) over stored a_ij; max |a_ij|; non-finite entries.
 */
import type { SymmetricCsc } from '../sparse/csc.js';
import type { MatrixSummary } from './matrix-summary.js';

export interface MatrixFacts {
  file: string;
  format: string;
  field: string;
  symmetry: string;
  entriesInFile: number;
  duplicatesSummed: number;
  /** For `general` files: max |a_ij − a_ji| / max|a| and where (0-based, row ≥ col). */
  maxRelativeAsymmetry?: number;
  asymmetryRow?: number;
  asymmetryCol?: number;
  listCap?: number;
}

const DEFAULT_LIST_CAP = 20;

export function summarizeMatrix(a: SymmetricCsc, facts: MatrixFacts): MatrixSummary {
  const { n, colPtr, rowIdx, values } = a;
  const cap = facts.listCap ?? DEFAULT_LIST_CAP;
  let diagMin = Infinity, diagMax = -Infinity, absMin = Infinity, absMax = 0;
  let zeroCount = 0, negativeCount = 0, bandwidth = 0, maxAbs = 0, nonFinite = 0, diagonals = 0;
  const zeroDofs: number[] = [];
  const negativeDofs: number[] = [];
  // column j: its diagonal, then the reach and size of its entries
  for (let j = 0; j < n; j++) {
    const p0 = colPtr[j], p1 = colPtr[j + 1];
    const d = p0 < p1 && rowIdx[p0] === j ? values[p0] : 0;
    if (p0 < p1 && rowIdx[p0] === j) diagonals++;
    if (d < diagMin) diagMin = d;
    if (d > diagMax) diagMax = d;
    if (d === 0) {
      if (zeroCount++ < cap) zeroDofs.push(j);
    } else {
      const ad = Math.abs(d);
      if (ad < absMin) absMin = ad;
      if (ad > absMax) absMax = ad;
      if (d < 0 && negativeCount++ < cap) negativeDofs.push(j);
    }
    if (p1 > p0 && rowIdx[p1 - 1] - j > bandwidth) bandwidth = rowIdx[p1 - 1] - j;
    // largest magnitude in the column; NaN/∞ counted
    for (let p = p0; p < p1; p++) {
      const v = values[p];
      if (v - v !== 0) nonFinite++;
      else if (Math.abs(v) > maxAbs) maxAbs = Math.abs(v);
    }
  }
  const stored = colPtr[n];
  return {
    file: facts.file,
    format: facts.format,
    field: facts.field,
    symmetry: facts.symmetry,
    n,
    entriesInFile: facts.entriesInFile,
    storedNonzeros: stored,
    fullNonzeros: 2 * stored - diagonals,
    duplicatesSummed: facts.duplicatesSummed,
    maxRelativeAsymmetry: facts.maxRelativeAsymmetry ?? 0,
    asymmetryAt:
      facts.asymmetryRow !== undefined && facts.asymmetryRow >= 0
        ? { row: facts.asymmetryRow + 1, col: (facts.asymmetryCol ?? 0) + 1 }
        : null,
    nonFiniteCount: nonFinite,
    diagonalMin: n > 0 ? diagMin : 0,
    diagonalMax: n > 0 ? diagMax : 0,
    diagonalSpread: absMin === Infinity ? 0 : absMax / absMin,
    zeroDiagonalCount: zeroCount,
    zeroDiagonalDofs: zeroDofs,
    negativeDiagonalCount: negativeCount,
    negativeDiagonalDofs: negativeDofs,
    bandwidth,
    maxAbsEntry: maxAbs,
    listCap: cap,
  };
}
