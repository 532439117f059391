/**
 * Facts about what changed since the baseline and where a frequency change came from: the
 * change map (./change-map.ts, fingerprints of each node's rows of K and M) and the
 * first-order attribution of each paired mode's eigenvalue change (./change-attribution.ts).
 * Read by frequency-drift and change-outside-region, carried as-is into the reports. Plain
 * numbers and arrays only; node ids as in the DOF map (DOF numbers without one), coordinates
 * in the DOF map's length unit.
 */

/** Ascending runs of consecutive node ids, [first, last]. */
export type NodeRanges = [number, number][];

export interface ChangedNode {
  node: number;
  change: 'stiffness' | 'mass' | 'stiffness and mass' | 'added' | 'removed';
  /** Region number (index into ChangeMapFacts.regions); null for removed nodes. */
  region: number | null;
  /** Node position (the model now; the baseline's for removed nodes), null without a DOF map. */
  at: [number, number, number] | null;
}

/** Changed and added nodes joined by entries of K or M of the model now. */
export interface ChangeRegion {
  region: number;
  nodeCount: number;
  nodeRanges: NodeRanges;
  centroid: [number, number, number] | null;
  /** "nodes 1201–1240 near (2.0, 0.4, 1.1)" (coordinates in the DOF map's unit). */
  label: string;
  /** Nodes whose stiffness rows changed, whose mass rows changed, that are new. */
  stiffnessChanged: number;
  massChanged: number;
  added: number;
}

export interface ChangeMapFacts {
  /** How baseline nodes met the model's now ('none': they could not be matched, every node counts as added). */
  matchedBy: 'node id' | 'position' | 'dof index' | 'none';
  nodesCompared: number;
  changedNodes: number;
  addedNodes: number;
  removedNodes: number;
  /** Largest first. */
  regions: ChangeRegion[];
  /** Every changed, added and removed node. */
  nodes: ChangedNode[];
  removed: { nodeCount: number; nodeRanges: NodeRanges; centroid: [number, number, number] | null; label: string } | null;
}

/** One group of nodes' part in a mode's first-order eigenvalue change. */
export interface ShareOfChange {
  /** δλ_part / δλ_estimate (signed; the shares of a mode sum to 1). */
  share: number;
  /** Its part of δλ_estimate, (rad/s)². */
  deltaEigenvalue: number;
  /** Stiffness and mass parts of deltaEigenvalue; null when the baseline did not store M₀φ. */
  stiffnessDelta: number | null;
  massDelta: number | null;
  /** stiffnessDelta / δλ_estimate and massDelta / δλ_estimate (they add up to `share`); null without M₀φ. */
  stiffnessShare: number | null;
  massShare: number | null;
}

export interface RegionShare extends ShareOfChange {
  /** Index into AttributionFacts.regions. */
  region: number;
}

export interface NodeShare extends ShareOfChange {
  node: number;
  at: [number, number, number] | null;
}

export interface ModeAttribution {
  baselineMode: number;
  currentMode: number;
  /** Baseline eigenvalue λ = (2πf)². */
  eigenvalue: number;
  /** λ_now − λ_baseline and the first-order estimate φᵀ(K₁ − λM₁)φ. */
  measuredDelta: number;
  estimatedDelta: number;
  /** Frequency change, %: measured, and implied by the estimate, 100(√(1 + δλ_est/λ) − 1). */
  measuredPercent: number;
  estimatedPercent: number;
  /** |δλ_est − δλ_measured| / |δλ_measured| (a large value: the change is not small, or modes mixed); null when δλ_measured is 0. */
  disagreement: number | null;
  /** Either side of the pair is in a group of near-repeated modes. */
  repeated: boolean;
  /** The baseline's near-repeated group the estimate was made for as a whole (1-based modes), or null. */
  group: number[] | null;
  /** The measured or the estimated frequency change is at least 0.01 % (our choice): reports show this mode. */
  notable: boolean;
  /** By |share|, largest first. */
  regions: RegionShare[];
  /** Share of the nodes outside every region (round-off and the baseline's residual when regions come from the change map). */
  elsewhere: ShareOfChange;
  /** The nodes with the largest |share|, at most 10. */
  topNodes: NodeShare[];
}

export interface AttributionRegion {
  region: number;
  nodeCount: number;
  nodeRanges: NodeRanges;
  centroid: [number, number, number] | null;
  /** "nodes 1201–1240 near (2.0, 0.4, 1.1)". */
  label: string;
}

export interface AttributionFacts {
  /** Where the regions come from: the change map, or nodes whose share is not negligible (no fingerprints stored). */
  regionsFrom: 'change map' | 'shares';
  /** Whether shares split into stiffness and mass (the baseline stored M₀φ). */
  split: boolean;
  /** What the baseline lacked, in plain words (empty when nothing). */
  missing: string[];
  regions: AttributionRegion[];
  /** Paired elastic modes, baseline order. */
  modes: ModeAttribution[];
}

/** The change map and the attribution of one model against its baseline; each missing part says why. */
export interface ExplainedChanges {
  changeMap: ChangeMapFacts | null;
  /** Why there is no change map. */
  changeMapMissing: string | null;
  attribution: AttributionFacts | null;
  /** Why there is no attribution. */
  attributionMissing: string | null;
}
