/**
 * The spring–mass chains the rule tests share, with their exact modes.
 * Free–free chain of n equal masses m joined by springs k: λ_j = (4k/m) sin²(jπ/(2n)),
 * j = 0…n−1 — the exact discrete result (docs/sources.md §7, standard result of the discrete wave equation).
 */
import { chainContext, exactModes, springChain } from './fake-model.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';

export const k = 1000;
export const m = 2;
export const n = 6;

export const chainLambda = (j: number): number => ((4 * k) / m) * Math.sin((j * Math.PI) / (2 * n)) ** 2;
export const hz = (lambda: number): number => Math.sqrt(lambda) / (2 * Math.PI);

/** The free–free chain and its modes from a general-purpose dense eigensolver (ml-matrix). */
export function freeChain() {
  const chain = springChain(n, k, new Array<number>(n).fill(m));
  return { chain, modes: exactModes(chain) };
}

/** Free–free chain context with its exact modes. */
export function freeChainContext(): RuleContext {
  const { chain, modes } = freeChain();
  return chainContext(chain, modes);
}

/** The free–free chain's matrices with made-up frequencies (for rules that read frequencies only). */
export function frequenciesContext(modes: ModesResult): RuleContext {
  return { ...chainContext(freeChain().chain), modes };
}

/** A grounded chain with unequal masses and its exact modes (ml-matrix). */
export const groundedChain = () => springChain(5, 300, [1, 2, 3, 1.5, 0.5], 50);
