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
  /** Id of the save (also in the names of its data files). */
  runId: string;
  /** How the stored DOFs were chosen when the baseline was saved. */
  selection: 'all' | 'nodes' | 'auto';
  /** Smallest share of a baseline mode's kinetic energy on the stored DOFs (1: every DOF stored). */
  energyShareKept: number;
  /** DOFs the shapes are compared on (0 when they could not be matched). */
  dofsCompared: number;
  /**
   * How baseline DOFs were matched with the model's: by (node, component) when both sides carry
   * a DOF map (a renumbering is not a change), by (coordinates, component) when that matches
   * more DOFs (node ids changed too), by DOF index when the DOF counts agree and a map
   * is missing, 'none' when neither works (shapes are not compared).
   */
  numberingCheck: DofMatching;
  /** DOFs of the baseline model not found in the model now, and DOFs of the model now not in the baseline (by node and component). */
  dofsRemoved: number;
  dofsAdded: number;
  /** Some matched DOF has another row number now. */
  renumbered: boolean;
}

export type DofMatching = 'node and component' | 'position and component' | 'dof index' | 'none';

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
  /** MAC of the two shapes (plain or mass-weighted, see `weighting`); null when paired by frequency order. */
  mac: number | null;
  /**
   * The value mode-shape-match checks: the MAC, or for modes of a near-repeated group the
   * group's subspace MAC (`groupMatches[group]`); null when paired by frequency order.
   */
  correlation: number | null;
  /** Index into `groupMatches` when the pair belongs to a near-repeated group, else null. */
  group: number | null;
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
  /** Member of a near-repeated group that the other side's solve cut at its highest mode (its partner was not solved). */
  cutGroup: boolean;
}

/**
 * A group of near-repeated modes compared as a subspace: the principal angles θ between the
 * span of the baseline modes and the span of their current partners in the W inner product
 * (Björck & Golub 1973): cos θ_k are the singular values of L_B⁻¹ (Φ_BᵀWΨ_C) L_C⁻ᵀ with
 * Φ_BᵀWΦ_B = L_B L_Bᵀ and Ψ_CᵀWΨ_C = L_C L_Cᵀ. min(k_B, k_C) angles.
 */
export interface GroupMatch {
  baselineModes: number[];
  currentModes: number[];
  /** cos θ_k, descending. */
  cosines: number[];
  /** min_k cos² θ_k: the subspace MAC (1 when the spans agree). */
  subspaceMac: number;
  /** The two sides have different numbers of modes in the group (one solve cut the group). */
  cut: boolean;
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
  /** 'shapes': one-to-one assignment over the correlation matrix; 'frequency order' when the shapes could not be compared. */
  pairedBy: 'shapes' | 'frequency order';
  /** Why the shapes were not compared (null when they were). */
  shapesNotCompared: string | null;
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
  /** Near-repeated groups compared as subspaces. */
  groupMatches: GroupMatch[];
  /** Mass properties stored with the baseline (null when it had no DOF map). */
  baselineMassProperties: unknown;
}
