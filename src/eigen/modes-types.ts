import type { FactorDiagnostics } from '../sparse/factor-types.js';

/** What to solve for: the lowest `count` modes, or every mode below `maxHz`. */
export interface ModesRequest {
  /**
   * Refuse the solve (MemoryLimitError from src/sparse/memory-limit.ts) before any numeric work
   * when the factor and the iteration's blocks are predicted to need more bytes than this.
   */
  memoryLimitBytes?: number;
  count?: number;
  maxHz?: number;
  method?: 'lanczos' | 'subspace';
  /** Relative tolerance on residuals at convergence (default 1e-12, our choice). */
  tolerance?: number;
  /** Node coordinates per DOF, interleaved x,y,z (3n), used by the ordering. */
  coordinates?: Float64Array;
  /** Called now and then during long solves (the CLI prints it on a TTY). */
  onProgress?: (message: string) => void;
}

/** Sturm-sequence proof that no mode was missed. */
export interface SturmCheck {
  /** The shift σ at which K − σM was factored for the count. */
  shift: number;
  /** Negative pivots of LDLᵀ(K − σM) = eigenvalues below σ. */
  countBelow: number;
  modesReturned: number;
  ok: boolean;
  /** Added by the eigen layer: e.g. that the count was taken past a cluster of equal eigenvalues. */
  note?: string;
}

/**
 * The requested count ended inside a cluster of equal eigenvalues (verification.ts,
 * sameEigenvalue): the rest of the cluster was returned too, so the Sturm count past the cluster
 * equals the modes returned.
 */
export interface ClusterExtension {
  /** Modes asked for. */
  requested: number;
  /** Modes returned: requested + the rest of the cluster. */
  returned: number;
  /** The repeated eigenvalue (λ of the last requested mode), (rad/s)². */
  eigenvalue: number;
  /** Relative tolerance within which eigenvalues count as equal. */
  relativeTolerance: number;
  /** The cluster is the rigid-body (zero) eigenvalues: equal as zeros, not by the relative test. */
  rigidBody: boolean;
}

/** ΦᵀMΦ and ΦᵀKΦ (column-major modes × modes), formed once by the verification. */
export interface ModalProjections {
  mass: Float64Array;
  stiffness: Float64Array;
}

export interface OrthogonalityCheck {
  /** max |ΦᵀMΦ − I| over all entries. */
  massMaxDeviation: number;
  /** max |ΦᵀKΦ − Λ| over all entries, divided by max(|λ_max|, tiny). */
  stiffnessMaxDeviation: number;
}

export interface ModesResult {
  n: number;
  /** λ = ω² in (rad/s)², ascending. */
  eigenvalues: Float64Array;
  /** f = √λ / 2π; negative λ reported honestly as −√|λ| / 2π. */
  frequenciesHz: Float64Array;
  /** Mass-normalized mode shapes, column-major n × modes (φᵢᵀMφᵢ = 1). */
  shapes: Float64Array;
  /** Eigenpair residual ‖Kφ − λMφ‖ / (‖Kφ‖ + |λ|‖Mφ‖) per mode, with the rigid-body floor (residual-measure.ts). */
  residuals: Float64Array;
  /** Added by the verification: ΦᵀMΦ and ΦᵀKΦ, which the rules read (absent in hand-made results). */
  projections?: ModalProjections;
  /** Present when the count was extended to return a whole cluster of equal eigenvalues. */
  clusterExtension?: ClusterExtension;
  sturm: SturmCheck;
  orthogonality: OrthogonalityCheck;
  method: 'lanczos' | 'subspace';
  /** Every shift factored during the solve. */
  shifts: number[];
  iterations: number;
  timings: { totalMs: number; factorMs: number; iterateMs: number; verifyMs: number };
  factor: FactorDiagnostics;
  /** Problems the solver noticed but could work past (a shift moved, a slow convergence). */
  warnings: string[];
  /**
   * The solve's own course, for whoever wants the detail (e.g. a first shift abandoned and the
   * solve started again): not problems, kept out of the warnings and the verdict.
   */
  diagnostics?: string[];
  /** Added by the eigen layer: right-hand sides solved with a factor over the whole solve. */
  solves?: number;
  /** Added by the eigen layer: n minus the massless DOFs (an upper bound of rank(M)). */
  rankMassBound?: number;
}

export function frequencyHzFromEigenvalue(lambda: number): number {
  const w = Math.sqrt(Math.abs(lambda)) / (2 * Math.PI);
  return lambda < 0 ? -w : w;
}

export function eigenvalueFromFrequencyHz(hz: number): number {
  const w = 2 * Math.PI * hz;
  return w * w;
}

/**
 * The solve met a vector x with xᵀMx < 0 beyond rounding: M is not positive semi-definite, so
 * K φ = λ M φ is not a vibration problem and no Sturm count means anything. Thrown by the
 * eigen layer; the CLI turns it into bad input naming the mass file (exit 2).
 */
export class IndefiniteMassError extends Error {
  /** xᵀMx / (‖x‖ ‖Mx‖) of the vector found, a negative cosine. */
  readonly cosine: number;

  constructor(cosine: number) {
    super(`M is not positive semi-definite: the solve met a motion with negative kinetic energy (xᵀMx = ${cosine.toPrecision(3)}·‖x‖‖Mx‖)`);
    this.name = 'IndefiniteMassError';
    this.cosine = cosine;
  }
}
