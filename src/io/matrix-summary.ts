/**
 * Facts about one stiffness or mass matrix gathered while reading and screening it
 * (computed in src/io/matrix-checks.ts, reported by `inspect` and used by the matrix rules).
 * DOF lists are 0-based and capped (see `listCap`); counts are exact.
 */
export interface MatrixSummary {
  file: string;
  /** 'coordinate' | 'array' and 'real' | 'integer', 'general' | 'symmetric' from the banner. */
  format: string;
  field: string;
  symmetry: string;
  n: number;
  /** Entries in the file (data lines). */
  entriesInFile: number;
  /** Stored lower-triangle entries after summing duplicates. */
  storedNonzeros: number;
  /** Entries of the full symmetric matrix. */
  fullNonzeros: number;
  duplicatesSummed: number;
  /** For `general` files: max |a_ij − a_ji| / max|a|, with where (1-based row/col); 0 for `symmetric`. */
  maxRelativeAsymmetry: number;
  asymmetryAt: { row: number; col: number } | null;
  nonFiniteCount: number;
  /** First non-finite entries (1-based row, column, file line; line 0 when unknown), when the reader recorded them. */
  nonFiniteAt?: { row: number; col: number; line: number }[];
  diagonalMin: number;
  diagonalMax: number;
  /** Largest |diagonal| ratio max/min over nonzero diagonals. */
  diagonalSpread: number;
  zeroDiagonalCount: number;
  zeroDiagonalDofs: number[];
  negativeDiagonalCount: number;
  negativeDiagonalDofs: number[];
  /** Half-bandwidth max |i − j| over stored entries. */
  bandwidth: number;
  maxAbsEntry: number;
  listCap: number;
}
