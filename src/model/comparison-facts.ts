/**
 * Facts from comparing a model's modes with a stored baseline: the MAC matrix, the one-to-one
 * pairing (mode tracking), frequency change per pair, swaps, and modes without a partner.
 * Built by ./compare-baseline.ts, read by the regression rules (frequency-drift,
 * mode-shape-match, mode-swap, new-or-lost-modes) and carried as-is into the JSON report.
 * Plain numbers and arrays only. Mode numbers are 1-based, counting rigid-body modes.
 */

export interface BaselineSource {
  /** The baseline's JSON metadata file. */
  file: string;
  createdAt: string;
  /** Modes stored in the baseline. */
  modes: number;
  dofCount: number;
  /** How the compared DOFs were chosen when the baseline was saved. */
  selection: 'all' | 'nodes' | 'auto';
  /** DOFs the shapes are compared on. */
  dofsCompared: number;
  /** 'dof-map hash' when both sides carry a DOF map, else 'dof count only'. */
  numberingCheck: 'dof-map hash' | 'dof count only';
}

/** A dense matrix as plain JSON: row-major, row = baseline mode, column = current mode. */
export interface ModeMatrix {
  rows: number;
  cols: number;
  values: number[];
}

export interface ModePair {
  baselineMode: number;
  currentMode: number;
  baselineHz: number;
  currentHz: number;
  /** 100·(f_current − f_baseline)/f_baseline; null for rigid-body modes (f ≈ 0). */
  changePercent: number | null;
  /** MAC of the two shapes (plain or mass-weighted, see `weighting`). */
  mac: number;
  /**
   * The value the pairing used and mode-shape-match checks: the MAC, or for near-repeated
   * modes the subspace share (a shape compared with the span of its partner's group).
   */
  correlation: number;
  /** Either mode belongs to a group of near-repeated modes (or the rigid-body modes). */
  repeated: boolean;
  rigidBody: boolean;
}

export interface UnpairedMode {
  mode: number;
  hz: number;
  /** The other side solved modes up to at least this frequency: the partner should have been found. */
  withinCompared: boolean;
  /** Best correlation with any mode of the other side, and that mode (null when it has none). */
  bestCorrelation: number;
  bestPartner: number | null;
}

export interface ModeSwap {
  /** Baseline modes a < b ... */
  baselineModes: [number, number];
  /** ... now found as current modes p(a) > p(b). */
  currentModes: [number, number];
  correlations: [number, number];
}

export interface ComparisonSettings {
  weighting: 'mass' | 'plain';
  minPairCorrelation: number;
  windowPercent: number | null;
  /** Consecutive modes closer than this (percent of the lower) form a near-repeated group. */
  repeatedTolerancePercent: number;
}

export interface ComparisonFacts {
  baseline: BaselineSource;
  settings: ComparisonSettings;
  baselineFrequenciesHz: number[];
  currentFrequenciesHz: number[];
  /** Highest frequency each side solved (the range the other side's modes can be looked up in). */
  baselineMaxHz: number;
  currentMaxHz: number;
  /** Near-repeated groups (size ≥ 2) on each side, 1-based modes. */
  baselineGroups: number[][];
  currentGroups: number[][];
  mac: ModeMatrix;
  /** The pairing's correlation matrix (MAC, or subspace share where groups are involved). */
  correlation: ModeMatrix;
  /** Paired modes in baseline order. */
  pairs: ModePair[];
  lostModes: UnpairedMode[];
  newModes: UnpairedMode[];
  swaps: ModeSwap[];
}
