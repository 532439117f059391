/**
 * What changed since the baseline and where each frequency change came from: the change map
 * (./change-map.ts, needs the stored node fingerprints, no modes) and the first-order
 * attribution of every paired elastic mode (./change-attribution.ts, needs the baseline's
 * shapes on every DOF and a DOF matching; M₀φ for the stiffness/mass split). Each part that
 * cannot be made says why in plain words instead.
 */
import type { DofMap } from '../io/dof-map.js';
import type { ModesResult } from '../eigen/modes-types.js';
import type { SymmetricCsc } from '../sparse/csc.js';
import type { LoadedBaseline } from './baseline-store.js';
import { matchDofs, type DofMatch } from './compare-baseline.js';
import type { ComparisonFacts } from './comparison-facts.js';
import { compareFingerprints, nodeFingerprints } from './change-map.js';
import { nodeIndexOf } from './node-index.js';
import { attributeChanges } from './change-attribution.js';
import type { AttributionRegion, ChangeMapFacts, ExplainedChanges } from './change-facts.js';

export interface ExplainInput {
  baseline: LoadedBaseline;
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  dofMap?: DofMap;
  /** Modes now and the comparison's pairs; without them only the change map is made. */
  modes?: ModesResult;
  comparison?: ComparisonFacts;
  /** Name of the model's length unit (`units.length`), shown after region coordinates. */
  lengthUnit?: string;
  /** The DOF matching the comparison used (matchDofs), when the caller has it. */
  match?: DofMatch;
}

export function explainChanges(input: ExplainInput): ExplainedChanges {
  const { baseline } = input;
  const out: ExplainedChanges = { changeMap: null, changeMapMissing: null, attribution: null, attributionMissing: null };
  if (baseline.fingerprints) {
    const now = nodeFingerprints(input.stiffness, input.mass, input.dofMap);
    out.changeMap = compareFingerprints({ fingerprints: baseline.fingerprints, dofMap: baseline.dofMap }, { fingerprints: now, dofMap: input.dofMap ?? null }, input.stiffness, input.mass, input.lengthUnit);
  } else out.changeMapMissing = 'the baseline holds no node fingerprints (saved by an older modalgate): save it again to get the change map';
  const why = attributionBlocker(input);
  if (why) {
    out.attributionMissing = why;
    return out;
  }
  const modes = input.modes!, comparison = input.comparison!;
  const match = input.match ?? matchDofs(baseline, { modes, dofMap: input.dofMap });
  const rowOf = new Int32Array(modes.n).fill(-1);
  // baseline shape row of each compared DOF now
  for (let s = 0; s < match.compared; s++) rowOf[match.currentDofs ? match.currentDofs[s] : s] = match.baselineRows ? match.baselineRows[s] : s;
  const missing: string[] = [];
  if (!baseline.massShapes) missing.push('the baseline holds no M₀φ (too large to store, or saved by an older modalgate): shares are not split into stiffness and mass');
  if (!out.changeMap) missing.push('no change map: regions are the nodes with a notable share');
  if (match.removed > 0) missing.push(`${match.removed} DOFs of the baseline are not in the model now: their part of the change is not counted, so the estimate is not the full first-order term`);
  const pairs = comparison.pairs
    .filter((p) => !p.rigidBody && p.changePercent !== null)
    .map((p) => ({ baselineMode: p.baselineMode - 1, currentMode: p.currentMode - 1, currentEigenvalue: modes.eigenvalues[p.currentMode - 1], repeated: p.repeated }));
  // near-repeated groups of elastic baseline modes
  const rigid = new Set(comparison.pairs.filter((p) => p.rigidBody).map((p) => p.baselineMode));
  const groups = comparison.baselineGroups.filter((g) => !g.some((i) => rigid.has(i))).map((g) => g.map((i) => i - 1));
  const regions = out.changeMap ? changeMapRegions(out.changeMap, modes.n, input.dofMap) : null;
  out.attribution = attributeChanges({
    stiffness: input.stiffness,
    mass: input.mass,
    dofMap: input.dofMap,
    baselineShapes: baseline.shapes,
    baselineMassShapes: baseline.massShapes ? baseline.massShapes.values : null,
    baselineEigenvalues: baseline.snapshot.eigenvalues,
    groups,
    pairs,
    rowOf,
    regionOfNode: regions ? regions.regionOfNode : null,
    regions: regions ? regions.regions : null,
    missing,
    lengthUnit: input.lengthUnit,
  });
  return out;
}

function attributionBlocker(input: ExplainInput): string | null {
  const { baseline } = input;
  if (!input.modes || !input.comparison) return 'no modes were solved now, so frequency changes cannot be attributed';
  if (input.comparison.shapesNotCompared !== null) return `the baseline's shapes cannot be put on the model's DOFs now (${input.comparison.shapesNotCompared})`;
  if (baseline.dofs !== null) return 'the baseline keeps shapes on a subset of the DOFs only; attribution needs them on every DOF (baseline shapes: all)';
  if (!Array.isArray(baseline.snapshot.eigenvalues) || baseline.snapshot.eigenvalues.length !== baseline.shapes.cols) return 'the baseline holds no eigenvalues';
  return null;
}

/** The change map's regions as node-index sets of the model now. */
function changeMapRegions(map: ChangeMapFacts, n: number, dofMap: DofMap | undefined): { regionOfNode: Int32Array; regions: AttributionRegion[] } {
  const index = nodeIndexOf(n, dofMap);
  const position = new Map<number, number>();
  index.ids.forEach((id, q) => position.set(id, q));
  const regionOfNode = new Int32Array(index.ids.length).fill(-1);
  for (const node of map.nodes) if (node.region !== null && position.has(node.node)) regionOfNode[position.get(node.node)!] = node.region;
  return { regionOfNode, regions: map.regions.map((r) => ({ region: r.region, nodeCount: r.nodeCount, nodeRanges: r.nodeRanges, centroid: r.centroid, label: r.label })) };
}
