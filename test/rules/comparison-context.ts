/**
 * Hand-made baseline comparison facts for the regression rules: the rules read the pairs, swaps
 * and unpaired modes; how those are found is tested in test/baseline.
 */
import type { ComparisonFacts, ModePair, UnpairedMode } from '../../src/model/comparison-facts.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import { modesWithFrequencies } from './fake-model.js';
import { frequenciesContext } from './reference-chains.js';

/** A pair with its change 100·(f_current − f_baseline)/f_baseline and MAC. */
export function pair(baselineMode: number, currentMode: number, baselineHz: number, currentHz: number, mac = 0.99): ModePair {
  return {
    baselineMode,
    currentMode,
    baselineHz,
    currentHz,
    changePercent: (100 * (currentHz - baselineHz)) / baselineHz,
    mac,
    correlation: mac,
    group: null,
    repeated: false,
    rigidBody: false,
  };
}

export function unpaired(mode: number, hz: number, bestPartner: number | null = null, bestCorrelation = 0): UnpairedMode {
  return { mode, hz, withinCompared: true, bestCorrelation, bestPartner, cutGroup: false };
}

/** Comparison facts from the given parts; the rest empty, shapes compared. */
export function comparison(parts: Partial<ComparisonFacts>): ComparisonFacts {
  const pairs = parts.pairs ?? [];
  return {
    pairedBy: 'shapes',
    shapesNotCompared: null,
    baselineFrequenciesHz: pairs.map((p) => p.baselineHz),
    currentFrequenciesHz: pairs.map((p) => p.currentHz),
    baselineMaxHz: 100,
    currentMaxHz: 100,
    baselineGroups: [],
    currentGroups: [],
    pairs,
    lostModes: [],
    newModes: [],
    swaps: [],
    groupMatches: [],
    baselineMassProperties: null,
    ...parts,
  } as ComparisonFacts;
}

/** A context whose modes are the current frequencies of the pairs, compared as given. */
export function comparisonContext(parts: Partial<ComparisonFacts>): RuleContext {
  const facts = comparison(parts);
  return { ...frequenciesContext(modesWithFrequencies(facts.currentFrequenciesHz.length > 0 ? facts.currentFrequenciesHz : [1])), comparison: facts };
}
