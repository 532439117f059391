/**
 * Where each paired mode's eigenvalue change came from, with no extra solve: first-order
 * perturbation of the symmetric pencil (Fox & Kapoor 1968, docs/sources.md §2b).
 *
 * The baseline stores mode i as λ_i and φ_i with φ_iᵀM₀φ_i = 1, so (K₀ − λ_iM₀)φ_i = 0 row by
 * row. For the model now (K₁, M₁), to first order in the change,
 *     δλ_i ≈ φ_iᵀ(K₁ − λ_iM₁)φ_i            (dλ/dp = φᵀ(∂K/∂p − λ ∂M/∂p)φ),
 * and the vector r_i = φ_i ∘ ((K₁ − λ_iM₁)φ_i) splits that number over the DOFs: on a row whose
 * K and M entries did not change, (K₁ − λM₁)φ = (K₀ − λM₀)φ = 0 up to round-off and the
 * baseline solve's residual. Summing r_i over a node's DOFs gives the node's part.
 * When the baseline also stored M₀φ_i, r_i splits exactly into
 *     stiffness  φ_i ∘ (K₁φ_i − λ_i M₀φ_i)   (= φ ∘ (K₁ − K₀)φ, because K₀φ = λM₀φ)
 *     mass      −λ_i φ_i ∘ ((M₁ − M₀)φ_i).
 *
 * φ_i is put on the model's DOFs now by the baseline comparison's DOF matching (node and
 * component, or position, or index); DOFs new in the model get φ = 0, and baseline DOFs that are
 * gone drop out (then the estimate is not the full first-order term: the facts say so).
 *
 * A mode of a near-repeated baseline group (equal or nearly equal eigenvalues, a symmetric
 * structure's bending pair) has no meaningful φ of its own: any combination of the group's
 * shapes is an eigenvector. There the degenerate form of the same first-order theory applies
 * (see groupVector): the change picks the combinations ψ_k, and r = ψ ∘ ((K₁ − λ̄M₁)ψ) splits
 * each one's estimate; the group's spread λ̄ − λ_i is counted with the unchanged nodes.
 *
 * Reported per mode: δλ measured (λ_now − λ_i) and estimated, the frequency changes they mean
 * (f ∝ √λ, so the estimate's frequency change is 100(√(1 + δλ_est/λ) − 1) %: a δλ estimate equal
 * to the measured δλ gives exactly the measured frequency change), their disagreement
 * |δλ_est − δλ|/|δλ| (second order in the change when the change is small and the mode did not
 * mix with another), and the parts of regions and of the top nodes, each split into stiffness
 * and mass when M₀φ is known. Regions are the change map's (./change-map.ts) when fingerprints
 * were stored; otherwise nodes whose |part| is at least 1e-6 of Σ|parts| of some mode (our
 * choice) grouped by K's connectivity.
 */
import type { DofMap } from '../io/dof-map.js';
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import { symmetricEigen } from '../dense/symmetric-eigen.js';
import { nodeIndexOf } from './node-index.js';
import { connectedRegions } from './node-regions.js';
import { centroid, nodeCoordinates, nodeRanges, regionLabel } from './node-regions.js';
import type { AttributionFacts, AttributionRegion, ModeAttribution, NodeShare, RegionShare, ShareOfChange } from './change-facts.js';

/** Nodes with at least this share of Σ|parts| of a mode form regions when no change map is known (our choice). */
const NOTABLE_SHARE = 1e-6;
const TOP_NODES = 10;
/** A mode whose measured or estimated frequency change reaches this (percent) is shown in reports (our choice). */
const NOTABLE_PERCENT = 0.01;

export interface AttributionInput {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap?: DofMap;
  /** Baseline shapes on all its DOFs, column-major rows × modes, mass-normalized. */
  baselineShapes: { rows: number; cols: number; values: Float64Array };
  /** M₀φ in the same layout, when stored. */
  baselineMassShapes: Float64Array | null;
  baselineEigenvalues: ArrayLike<number>;
  /** Near-repeated groups of the baseline (0-based elastic modes, size ≥ 2). */
  groups: number[][];
  /** Pairs (0-based baseline mode, 0-based current mode) with the current eigenvalue. */
  pairs: { baselineMode: number; currentMode: number; currentEigenvalue: number; repeated: boolean }[];
  /** Baseline row of each compared current DOF: rowOf[c] = stored row, or −1 for a DOF new in the model. */
  rowOf: Int32Array;
  /** Change-map region of each node of the model now (nodeIndexOf order), −1 outside; null when no change map. */
  regionOfNode: Int32Array | null;
  regions: AttributionRegion[] | null;
  /** What the baseline lacked (shown with the facts). */
  missing: string[];
  /** Name of the model's length unit, after region coordinates in labels (`units.length`). */
  lengthUnit?: string;
}

export function attributeChanges(input: AttributionInput): AttributionFacts {
  const { stiffness, mass, pairs, rowOf } = input;
  const n = stiffness.n;
  const m = pairs.length;
  const index = nodeIndexOf(n, input.dofMap);
  const nNodes = index.ids.length;
  const split = input.baselineMassShapes !== null;
  const rows = input.baselineShapes.rows;
  const lambdaOf = (i: number): number => input.baselineEigenvalues[i];
  // baseline modes needed: the paired ones and every member of a near-repeated group holding one
  const paired = new Set(pairs.map((p) => p.baselineMode));
  const groupOf = new Map<number, number[]>();
  for (const g of input.groups) if (g.some((i) => paired.has(i))) for (const i of g) groupOf.set(i, [...g].sort((x, y) => x - y));
  const columns = [...new Set([...paired, ...groupOf.keys()])].sort((x, y) => x - y);
  const colOf = new Map(columns.map((i, k) => [i, k]));
  const nc = columns.length;
  // Φ̃ (and M₀Φ̃): those baseline shapes on the DOFs now, 0 on new DOFs
  const phi = new Float64Array(n * nc);
  const massPhi0 = split ? new Float64Array(n * nc) : null;
  columns.forEach((i, k) => {
    for (let c = 0; c < n; c++) {
      const r = rowOf[c];
      if (r < 0) continue;
      phi[k * n + c] = input.baselineShapes.values[i * rows + r];
      if (massPhi0) massPhi0[k * n + c] = input.baselineMassShapes![i * rows + r];
    }
  });
  const kPhi = symMultiplyBlock(stiffness, phi, nc);
  const mPhi = symMultiplyBlock(mass, phi, nc);
  const blocks: Blocks = { n, phi, kPhi, mPhi };
  // one k × k eigenproblem per near-repeated group, shared by its members
  const solvedGroups = new Map<number[], GroupBasis>();
  const combos = pairs.map((p) => {
    const g = groupOf.get(p.baselineMode);
    if (!g) return { columns: [colOf.get(p.baselineMode)!], coefficients: [1], lambdaRef: lambdaOf(p.baselineMode), group: null };
    let basis = solvedGroups.get(g);
    if (!basis) solvedGroups.set(g, (basis = groupBasis(g, colOf, blocks, lambdaOf)));
    const k = g.length, rank = g.indexOf(p.baselineMode);
    return { columns: g.map((i) => colOf.get(i)!), coefficients: Array.from(basis.vectors.subarray(rank * k, (rank + 1) * k)), lambdaRef: basis.lambdaBar, group: g };
  });
  // per mode and node: total part Σ ψ(K₁ψ − λ_ref M₁ψ), stiffness part Σ ψ(K₁ψ − λ_ref M₀ψ)
  const total = new Float64Array(m * nNodes);
  const stiff = new Float64Array(m * nNodes);
  combos.forEach((v, k) => {
    const psi = combine(v, phi, n), kPsi = combine(v, kPhi, n), mPsi = combine(v, mPhi, n);
    const m0Psi = massPhi0 ? combine(v, massPhi0, n) : null;
    for (let c = 0; c < n; c++) {
      const f = psi[c];
      if (f === 0) continue;
      const node = k * nNodes + index.nodeOf[c];
      total[node] += f * (kPsi[c] - v.lambdaRef * mPsi[c]);
      if (m0Psi) stiff[node] += f * (kPsi[c] - v.lambdaRef * m0Psi[c]);
    }
  });
  const { regionOfNode, regions, regionsFrom } = input.regionOfNode && input.regions
    ? { regionOfNode: input.regionOfNode, regions: input.regions, regionsFrom: 'change map' as const }
    : { ...regionsFromShares(total, m, nNodes, index, stiffness, input.dofMap, input.lengthUnit), regionsFrom: 'shares' as const };
  const coords = nodeCoordinates(index.ids, input.dofMap);
  const modes = pairs.map((p, k) => {
    const lambda = lambdaOf(p.baselineMode);
    const parts = { total: total.subarray(k * nNodes, (k + 1) * nNodes), stiffness: split ? stiff.subarray(k * nNodes, (k + 1) * nNodes) : null, offset: combos[k].lambdaRef - lambda };
    const facts = modeFacts(p, lambda, parts, regionOfNode, regions.length, index.ids, coords);
    return { ...facts, group: combos[k].group ? combos[k].group!.map((i) => i + 1) : null };
  });
  return { regionsFrom, split, missing: input.missing, regions, modes };
}

interface Blocks {
  n: number;
  phi: Float64Array;
  kPhi: Float64Array;
  mPhi: Float64Array;
}

interface Combination {
  columns: number[];
  coefficients: number[];
  lambdaRef: number;
}

/** Σ_a coefficient_a · column_a of a column-major block. */
function combine(v: Combination, block: Float64Array, n: number): Float64Array {
  if (v.columns.length === 1 && v.coefficients[0] === 1) return block.subarray(v.columns[0] * n, (v.columns[0] + 1) * n);
  const out = new Float64Array(n);
  v.columns.forEach((k, a) => {
    const w = v.coefficients[a];
    for (let c = 0; c < n; c++) out[c] += w * block[k * n + c];
  });
  return out;
}

/**
 * The rank-th vector of a near-repeated baseline group (first-order perturbation of a repeated
 * eigenvalue): with λ̄ the group's mean eigenvalue and Φ_g its shapes, the new eigenvalues are to
 * first order λ̄ + g_k with g_k, q_k the eigenpairs of G = Φ_gᵀ(K₁ − λ̄M₁)Φ_g (symmetric, k × k),
 * because Φ_gᵀK₀Φ_g = diag(λ_a) ≈ λ̄I and Φ_gᵀM₀Φ_g = I. The baseline's own basis inside the group
 * is arbitrary; ψ_k = Φ_g q_k is the combination the change picks. ψ_k is given to the group's
 * members in ascending order of g_k, as mode tracking pairs them in frequency order.
 */
interface GroupBasis {
  /** q_k, column k (ascending g_k), k × k column-major. */
  vectors: Float64Array;
  lambdaBar: number;
}

function groupBasis(group: number[], colOf: Map<number, number>, b: Blocks, lambdaOf: (i: number) => number): GroupBasis {
  const k = group.length, n = b.n;
  const lambdaBar = group.reduce((s, i) => s + lambdaOf(i), 0) / k;
  const g = new Float64Array(k * k);
  // G_ab = φ_aᵀK₁φ_b − λ̄ φ_aᵀM₁φ_b, symmetrized
  for (let a = 0; a < k; a++) {
    for (let c = 0; c <= a; c++) {
      const pa = colOf.get(group[a])!, pc = colOf.get(group[c])!;
      let v = 0;
      for (let d = 0; d < n; d++) v += 0.5 * (b.phi[pa * n + d] * (b.kPhi[pc * n + d] - lambdaBar * b.mPhi[pc * n + d]) + b.phi[pc * n + d] * (b.kPhi[pa * n + d] - lambdaBar * b.mPhi[pa * n + d]));
      g[a * k + c] = g[c * k + a] = v;
    }
  }
  return { vectors: symmetricEigen(g, k).vectors, lambdaBar };
}

function modeFacts(
  p: AttributionInput['pairs'][number],
  lambda: number,
  split: { total: Float64Array; stiffness: Float64Array | null; offset: number },
  regionOfNode: Int32Array,
  regionCount: number,
  ids: Int32Array,
  coords: [number, number, number][] | null,
): Omit<ModeAttribution, 'group'> {
  const parts = split.total, stiffParts = split.stiffness;
  // δλ_est = Σ node parts + (λ_ref − λ_i) (the spread inside a near-repeated group, 0 for a single mode)
  let estimate = split.offset;
  for (let q = 0; q < parts.length; q++) estimate += parts[q];
  const of = (d: number): number => (estimate !== 0 ? d / estimate : 0);
  const share = (delta: number, stiffDelta: number | null): ShareOfChange => ({
    share: of(delta),
    deltaEigenvalue: delta,
    stiffnessDelta: stiffDelta,
    massDelta: stiffDelta === null ? null : delta - stiffDelta,
    stiffnessShare: stiffDelta === null ? null : of(stiffDelta),
    massShare: stiffDelta === null ? null : of(delta - stiffDelta),
  });
  const regionTotal = new Float64Array(regionCount + 1), regionStiff = new Float64Array(regionCount + 1);
  // Σ over each region's nodes (last slot: nodes outside every region)
  for (let q = 0; q < parts.length; q++) {
    const r = regionOfNode[q] >= 0 ? regionOfNode[q] : regionCount;
    regionTotal[r] += parts[q];
    if (stiffParts) regionStiff[r] += stiffParts[q];
  }
  const regions: RegionShare[] = [];
  for (let r = 0; r < regionCount; r++) regions.push({ region: r, ...share(regionTotal[r], stiffParts ? regionStiff[r] : null) });
  regions.sort((a, b) => Math.abs(b.deltaEigenvalue) - Math.abs(a.deltaEigenvalue) || a.region - b.region);
  const order = Array.from(parts.keys()).sort((a, b) => Math.abs(parts[b]) - Math.abs(parts[a]) || a - b).slice(0, TOP_NODES);
  const topNodes: NodeShare[] = order.filter((q) => parts[q] !== 0).map((q) => ({ node: ids[q], at: coords ? coords[q] : null, ...share(parts[q], stiffParts ? stiffParts[q] : null) }));
  const measured = p.currentEigenvalue - lambda;
  const implied = (d: number): number => 100 * (Math.sqrt(Math.max(0, 1 + d / lambda)) - 1);
  const measuredPercent = implied(measured), estimatedPercent = implied(estimate);
  return {
    baselineMode: p.baselineMode + 1,
    currentMode: p.currentMode + 1,
    eigenvalue: lambda,
    measuredDelta: measured,
    estimatedDelta: estimate,
    measuredPercent,
    estimatedPercent,
    notable: Math.max(Math.abs(measuredPercent), Math.abs(estimatedPercent)) >= NOTABLE_PERCENT,
    disagreement: measured === 0 ? null : Math.abs(estimate - measured) / Math.abs(measured),
    repeated: p.repeated,
    regions,
    elsewhere: share(regionTotal[regionCount] + split.offset, stiffParts ? regionStiff[regionCount] + split.offset : null),
    topNodes,
  };
}

/** Without a change map: nodes with a notable part in some mode, joined by K's connectivity. */
function regionsFromShares(total: Float64Array, m: number, nNodes: number, index: ReturnType<typeof nodeIndexOf>, stiffness: SymmetricCsc, map: DofMap | undefined, lengthUnit: string | undefined): { regionOfNode: Int32Array; regions: AttributionRegion[] } {
  const flagged = new Int8Array(nNodes);
  for (let k = 0; k < m; k++) {
    const parts = total.subarray(k * nNodes, (k + 1) * nNodes);
    let sum = 0;
    for (const v of parts) sum += Math.abs(v);
    // |part| ≥ NOTABLE_SHARE · Σ|parts|
    for (let q = 0; q < nNodes; q++) if (sum > 0 && Math.abs(parts[q]) >= NOTABLE_SHARE * sum) flagged[q] = 1;
  }
  const regionOfNode = connectedRegions(flagged, index, [stiffness]);
  const coords = nodeCoordinates(index.ids, map);
  const members: number[][] = [];
  for (let q = 0; q < nNodes; q++) if (regionOfNode[q] >= 0) (members[regionOfNode[q]] ??= []).push(q);
  const regions = members.map((list, r) => {
    const ranges = nodeRanges(list.map((q) => index.ids[q]));
    const at = centroid(list.map((q) => ({ at: coords ? coords[q] : null })));
    return { region: r, nodeCount: list.length, nodeRanges: ranges, centroid: at, label: regionLabel(ranges, at, lengthUnit) };
  });
  return { regionOfNode, regions };
}
