/**
 * Contracts of the sparse LDLᵀ layer, shared by the factorization code (src/sparse) and its
 * users (src/eigen, src/rules). A = K − σM is factored as P A Pᵀ = L D Lᵀ with unit lower L
 * and diagonal D (no pivoting); the ordering P and the symbolic structure are computed once
 * and reused for every shift σ.
 */

export type OrderingName = 'natural' | 'amd' | 'nested-dissection' | 'coordinate-bisection';

/** One ordering tried by the automatic choice, with its exact predicted nnz(L). */
export interface OrderingCandidate {
  name: OrderingName;
  nnzL: number;
  /** Time to compute this ordering (graph and compression excluded; for nested dissection the
   * two variants and the prediction that picks one), ms. */
  ms: number;
}

/**
 * Counts of D's entries by sign. By Sylvester's law of inertia, with M positive
 * (semi)definite, `negative` equals the number of eigenvalues of (K, M) below σ.
 */
export interface Inertia {
  negative: number;
  zero: number;
  positive: number;
  /** |d_j| ≤ zeroTolerance · |a_jj| counted as zero (relative to A's own diagonal). */
  zeroTolerance: number;
}

/** A pivot tiny relative to A's diagonal: the shift may sit on an eigenvalue, or a mechanism. */
export interface TinyPivot {
  /** 0-based DOF in the original (unpermuted) numbering. */
  dof: number;
  pivot: number;
  diagonal: number;
}

export interface PhaseTimings {
  orderingMs: number;
  symbolicMs: number;
  numericMs: number;
}

export interface FactorDiagnostics {
  ordering: OrderingName;
  n: number;
  /** Nonzeros of L including its unit diagonal. */
  nnzL: number;
  /** Floating-point operations of the numeric factorization (multiply-adds counted as 2). */
  flops: number;
  supernodes: number;
  timings: PhaseTimings;
  /** Bytes held by the factor's arrays (L values, indices, D). */
  factorBytes: number;
  /** max_j |a_jj / d_j| — a conditioning indicator (common practice), and where it occurs. */
  maxDiagonalToPivotRatio: number;
  maxRatioDof: number;
  tinyPivots: TinyPivot[];
  /** Threads the numeric factorization ran on (1, or the N parts the elimination tree was split into). */
  threads?: number;
  /**
   * Which kernels this factor's products run in: the factorization's block updates and the
   * triangular sweeps of its solves, each WebAssembly SIMD or the plain TypeScript loops (the
   * same results; SIMD wherever the runtime has WebAssembly SIMD and shared memory).
   */
  kernels?: { factor: KernelKind; sweeps: KernelKind };
}

export type KernelKind = 'simd' | 'plain';

/** The numeric factor of one shifted matrix. Vectors are in the original DOF numbering. */
export interface ShiftedFactor {
  readonly n: number;
  readonly shift: number;
  readonly inertia: Inertia;
  readonly diagnostics: FactorDiagnostics;
  /** x = A⁻¹ b. `x` may be `b` (in place). */
  solve(b: Float64Array, x?: Float64Array): Float64Array;
  /** X = A⁻¹ B for a column-major n×k block. `x` may be `b`. */
  solveBlock(b: Float64Array, k: number, x?: Float64Array): Float64Array;
  /**
   * Hands the factor's memory back to its solver, which fills it with the next factorization
   * instead of allocating (and first touching) as much again. Shift, inertia and diagnostics
   * stay readable; solving afterwards throws. Calling it twice does nothing.
   */
  release(): void;
}

export interface ShiftedSolverOptions {
  ordering?: 'auto' | OrderingName;
  /** Node coordinates per DOF (x, y, z interleaved, length 3n) for coordinate bisection. */
  coordinates?: Float64Array;
  /** Relative zero-pivot tolerance for inertia, default 1e-13 (our choice). */
  zeroPivotTolerance?: number;
  /** Most threads the numeric factorization and block solves may use (default and cap: N of src/sparse/helper-thread.ts). */
  threads?: number;
  /**
   * Refuse (MemoryLimitError) before any numeric work when the factor, plus `extraBytes` the
   * caller keeps beside it, is predicted to need more than this many bytes.
   */
  memoryLimitBytes?: number;
  extraBytes?: number;
}

/**
 * Ordering + symbolic analysis of the pattern of K + M, done once; `factor(σ)` then computes
 * the numeric LDLᵀ of K − σM on that structure.
 */
export interface ShiftedSolver {
  readonly n: number;
  readonly ordering: OrderingName;
  readonly predictedNnzL: number;
  /** Every ordering the choice computed (one when the ordering was named), in trial order. */
  readonly orderingCandidates: readonly OrderingCandidate[];
  factor(shift: number): ShiftedFactor;
}
