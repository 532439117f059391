/**
 * What an eigen algorithm is asked and what it hands back. Algorithms (subspace iteration,
 * block Lanczos) find the `count` eigenpairs of (K, M) nearest the operator's shift σ; the
 * front door (solve-modes.ts) picks σ so those are the wanted ones.
 */
import type { ShiftInvertOperator } from './shift-invert-operator.js';
import type { MassBasis } from './m-orthonormalize.js';

export interface EigenSearch {
  operator: ShiftInvertOperator;
  /** Eigenpairs wanted, nearest σ. */
  count: number;
  /** Relative residual at which a pair counts as converged (see residual-measure.ts). */
  tolerance: number;
  /** Largest number of vectors any basis may hold (≤ n, ≤ rank(M)). */
  maxBasis: number;
  /** ‖K‖₁ (largest column sum), the scale of the rigid-body residual floor. */
  stiffnessNorm: number;
  /**
   * Eigenvectors found earlier (another slice of the spectrum), M-orthonormal with their
   * M-images: every basis stays M-orthogonal to them, so they are not found again.
   */
  deflation?: MassBasis;
  /** Optional start vectors (n×startCount), e.g. Ritz vectors of an earlier pass. */
  start?: Float64Array;
  startCount?: number;
  maxIterations?: number;
  /** Block size of block Lanczos (default 6: the largest multiplicity of a free-free model). */
  blockSize?: number;
  onProgress?: (message: string) => void;
  /**
   * Called with the current Ritz values (ascending) after each iteration or cycle; returning
   * false stops the search (the front door uses it to abandon a badly placed shift early).
   */
  checkpoint?: (estimates: Float64Array) => boolean;
  /** Set by the algorithm when `checkpoint` stopped it. */
}

export interface EigenSearchResult {
  /** Converged (or best) pairs, ascending λ, at most `count`. */
  count: number;
  values: Float64Array;
  /** n×count, M-orthonormal. */
  vectors: Float64Array;
  /** Relative residuals per pair (residual-measure.ts). */
  residuals: Float64Array;
  iterations: number;
  /** Every wanted pair met the tolerance (or stagnated at rounding level, see `warnings`). */
  converged: boolean;
  warnings: string[];
  /**
   * Best Ritz values at the end (converged and not), ascending, with their vectors — the
   * front door uses them to place shifts and to warm-start a second pass.
   */
  estimates: Float64Array;
  estimateVectors: Float64Array;
  estimateCount: number;
  /** The checkpoint asked to stop. */
  abandoned: boolean;
}
