/**
 * The shift-invert operator of the pencil (K, M):
 *
 *     C = (K − σM)⁻¹ M,        C φ = θ φ  with  θ = 1 / (λ − σ).
 *
 * C is self-adjoint in the M-inner product ⟨x, y⟩_M = xᵀMy (Ericsson & Ruhe 1980), so the
 * eigenvalues of (K, M) nearest σ are the θ of largest magnitude — what block Lanczos and
 * subspace iteration find first. Algorithms see only this interface: they apply C to blocks,
 * multiply by M and K, and never touch the factorization itself (the operator layer
 * of the Spectra library, yixuan/spectra: MatOp operators kept apart from the solvers).
 *
 * Blocks are column-major n×k Float64Arrays; one pass over the factor serves all k columns.
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import { sharedMatrix, splitSymMultiplyBlock } from '../sparse/block-product-jobs.js';
import type { ShiftedFactor } from '../sparse/factor-types.js';

/** How much work the operator did: the figures that decide the cost of a solve. */
export interface OperatorCounts {
  /** Right-hand sides solved with the factor (one per column of every block). */
  solves: number;
  /** Passes over the factor (one per solveBlock call). */
  factorPasses: number;
  /** Columns multiplied by M. */
  massProducts: number;
  /** Columns multiplied by K. */
  stiffnessProducts: number;
}

export interface ShiftInvertOperator {
  readonly n: number;
  readonly shift: number;
  readonly factor: ShiftedFactor;
  readonly stiffness: SymmetricCsc;
  readonly mass: SymmetricCsc;
  readonly counts: OperatorCounts;
  /** Y = (K − σM)⁻¹ M X for an n×k block X. */
  apply(x: Float64Array, k: number): Float64Array;
  /** Y = (K − σM)⁻¹ B for an n×k block B (B = M X already formed). */
  solve(b: Float64Array, k: number): Float64Array;
  /** Y = M X. */
  massTimes(x: Float64Array, k: number): Float64Array;
  /** Y = K X. */
  stiffnessTimes(x: Float64Array, k: number): Float64Array;
}

export function createShiftInvertOperator(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  factor: ShiftedFactor,
): ShiftInvertOperator {
  const n = stiffness.n;
  const counts: OperatorCounts = { solves: 0, factorPasses: 0, massProducts: 0, stiffnessProducts: 0 };
  // shared copies (made once per matrix) let the helper threads take shares of each product
  const sharedK = sharedMatrix(stiffness);
  const sharedM = sharedMatrix(mass);
  const times = (a: SymmetricCsc, s: SymmetricCsc | null, x: Float64Array, k: number): Float64Array => {
    const y = new Float64Array(n * k);
    if (s === null || !splitSymMultiplyBlock(s, x, k, y)) symMultiplyBlock(a, x, k, y);
    return y;
  };
  const massTimes = (x: Float64Array, k: number): Float64Array => {
    counts.massProducts += k;
    return times(mass, sharedM, x, k);
  };
  const stiffnessTimes = (x: Float64Array, k: number): Float64Array => {
    counts.stiffnessProducts += k;
    return times(stiffness, sharedK, x, k);
  };
  const solve = (b: Float64Array, k: number): Float64Array => {
    counts.solves += k;
    counts.factorPasses += 1;
    return factor.solveBlock(b, k, new Float64Array(n * k));
  };
  const apply = (x: Float64Array, k: number): Float64Array => {
    // (K − σM)⁻¹ (M X), solved in place over the product
    const b = massTimes(x, k);
    counts.solves += k;
    counts.factorPasses += 1;
    return factor.solveBlock(b, k, b);
  };
  return { n, shift: factor.shift, factor, stiffness, mass, counts, apply, solve, massTimes, stiffnessTimes };
}

/**
 * A rough upper bound of rank(M): n minus the DOFs whose whole row of M is zero (massless
 * DOFs). The M-inner-product Krylov space cannot be larger than rank(M), so every basis is
 * capped by this (BCSSTM01 has 24 zero rows of 48).
 */
export function massRankBound(mass: SymmetricCsc): number {
  const n = mass.n;
  const hasEntry = new Uint8Array(n);
  // mark every row and column holding a nonzero
  for (let j = 0; j < n; j++) {
    for (let p = mass.colPtr[j]; p < mass.colPtr[j + 1]; p++) {
      if (mass.values[p] !== 0) {
        hasEntry[j] = 1;
        hasEntry[mass.rowIdx[p]] = 1;
      }
    }
  }
  let rank = 0;
  for (let j = 0; j < n; j++) rank += hasEntry[j];
  return rank;
}
