/**
 * Pivot bookkeeping shared by the LDLᵀ factorizations (no pivoting is done, so every pivot d_j
 * is accepted in place and only judged here).
 *
 * - Inertia: d_j < 0 negative, d_j > 0 positive, |d_j| ≤ τ·|a_jj| zero (τ = zero tolerance,
 *   relative to A's own diagonal; a_jj = 0 falls back to the largest |a_jj| of A).
 * - Tiny pivots (|d_j| ≤ τ·|a_jj|) are recorded with their original DOF so the caller can move a
 *   shift that sits on an eigenvalue.
 * - A pivot that is exactly zero or not finite would turn the rest of the factor into NaN/∞, so it
 *   is replaced by τ·scale (scale = |a_jj|, or max |a_jj| when that is 0): positive, tiny, on
 *   the matrix's own scale. The factor stays finite and usable for inertia counts; solves
 *   through it are meaningless near that DOF, which the tiny-pivot record says.
 * - max |a_jj / d_j| (common-practice conditioning indicator) and its DOF.
 */
import type { Inertia, TinyPivot } from './factor-types.js';

/** A monitor's counts as plain data (to pass between threads). */
export interface MonitorState {
  negative: number;
  zero: number;
  positive: number;
  maxRatio: number;
  maxRatioIndex: number;
  tiny: { index: number; pivot: number; diagonal: number }[];
}

export class PivotMonitor {
  negative = 0;
  zero = 0;
  positive = 0;
  maxRatio = 0;
  maxRatioIndex = -1;
  readonly tiny: { index: number; pivot: number; diagonal: number }[] = [];

  constructor(
    readonly tolerance: number,
    readonly diagonalScale: number,
  ) {}

  /** Judge pivot `pivot` of permuted column j whose matrix diagonal is `diagonal`; returns the pivot to use. */
  accept(j: number, pivot: number, diagonal: number): number {
    const scale = diagonal !== 0 ? Math.abs(diagonal) : this.diagonalScale;
    let d = pivot;
    if (Math.abs(d) <= this.tolerance * scale || !Number.isFinite(d)) {
      this.zero++;
      if (this.tiny.length < 1000) this.tiny.push({ index: j, pivot: d, diagonal });
      if (d === 0 || !Number.isFinite(d)) d = this.tolerance * (scale > 0 ? scale : 1);
    } else if (d < 0) this.negative++;
    else this.positive++;
    const ratio = Math.abs(diagonal / d);
    if (ratio > this.maxRatio) {
      this.maxRatio = ratio;
      this.maxRatioIndex = j;
    }
    return d;
  }

  state(): MonitorState {
    const { negative, zero, positive, maxRatio, maxRatioIndex } = this;
    return { negative, zero, positive, maxRatio, maxRatioIndex, tiny: this.tiny.slice() };
  }

  /** Adds the counts of a monitor that judged other pivots of the same factorization. */
  merge(other: MonitorState): void {
    this.negative += other.negative;
    this.zero += other.zero;
    this.positive += other.positive;
    if (other.maxRatio > this.maxRatio || (other.maxRatio === this.maxRatio && other.maxRatioIndex < this.maxRatioIndex)) {
      this.maxRatio = other.maxRatio;
      this.maxRatioIndex = other.maxRatioIndex;
    }
    const all = this.tiny.concat(other.tiny).sort((a, b) => a.index - b.index).slice(0, 1000);
    this.tiny.length = 0;
    this.tiny.push(...all);
  }

  inertia(): Inertia {
    return { negative: this.negative, zero: this.zero, positive: this.positive, zeroTolerance: this.tolerance };
  }

  /** Tiny pivots in original DOF numbering (perm[k] = original index of pivot k). */
  tinyPivots(perm: Int32Array): TinyPivot[] {
    return this.tiny.map((t) => ({ dof: perm[t.index], pivot: t.pivot, diagonal: t.diagonal }));
  }
}
