/**
 * The tetrahedral models whose eigenvalues test/reference/make_tet_reference.py computes with
 * SciPy (outside the project). The generator is deterministic, so the test rebuilds each model
 * from these options and checks it is the same matrix (size, stored entries, traces) before
 * comparing eigenvalues.
 */
import { buildJointedTetBracket, buildTetBracket } from '../../fixtures/generator/tet-bracket.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';

export interface TetReferenceModel {
  name: string;
  /** Eigenvalues the reference holds (the lowest ones). */
  count: number;
  build: () => GeneratedModel;
}

export const TET_REFERENCE_MODELS: readonly TetReferenceModel[] = [
  { name: 'tet4-bracket-clamped', count: 20, build: () => buildTetBracket({ order: 1, cellM: 0.006, seed: 11 }) },
  { name: 'tet10-bracket-clamped', count: 20, build: () => buildTetBracket({ order: 2, cellM: 0.012, seed: 12 }) },
  { name: 'tet10-jointed-bracket', count: 24, build: () => buildJointedTetBracket({ order: 2, cellM: 0.012, seed: 13 }).model },
];
