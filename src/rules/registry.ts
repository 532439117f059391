/**
 * Every rule modalgate knows. Adding a rule = one file exporting its RuleDefinition + one line
 * below. The config loader validates options from each rule's own `optionsSchema`; `modalgate
 * rules` lists them in this order (input checks, then solution checks, then requirements).
 */
import type { RuleDefinition } from './rule-types.js';
import { matrixFinite } from './matrix-finite.js';
import { matrixSymmetry } from './matrix-symmetry.js';
import { diagonalSanity } from './diagonal-sanity.js';
import { conditioning } from './conditioning.js';
import { modesComplete } from './modes-complete.js';
import { eigenResidual } from './eigen-residual.js';
import { massNormalization } from './mass-normalization.js';
import { massOrthogonality } from './mass-orthogonality.js';
import { stiffnessOrthogonality } from './stiffness-orthogonality.js';
import { rigidBodyModes } from './rigid-body-modes.js';
import { firstElasticFrequency } from './first-elastic-frequency.js';
import { modeFrequencies } from './mode-frequencies.js';
import { frequencyDrift } from './frequency-drift.js';
import { modeShapeMatch } from './mode-shape-match.js';
import { modeSwap } from './mode-swap.js';
import { newOrLostModes } from './new-or-lost-modes.js';
import { massDrift } from './mass-drift.js';
import { changeOutsideRegion } from './change-outside-region.js';
import { rigidBodyEnergy } from './rigid-body-energy.js';
import { totalMass } from './total-mass.js';
import { centerOfMass } from './center-of-mass.js';
import { massConsistency } from './mass-consistency.js';
import { massParticipation } from './mass-participation.js';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyRule = RuleDefinition<any>;

export const builtInRules: readonly AnyRule[] = [
  matrixFinite,
  matrixSymmetry,
  diagonalSanity,
  conditioning,
  modesComplete,
  eigenResidual,
  massNormalization,
  massOrthogonality,
  stiffnessOrthogonality,
  rigidBodyModes,
  firstElasticFrequency,
  modeFrequencies,
  rigidBodyEnergy,
  totalMass,
  centerOfMass,
  massConsistency,
  massParticipation,
  frequencyDrift,
  modeShapeMatch,
  modeSwap,
  newOrLostModes,
  massDrift,
  changeOutsideRegion,
];

const byId = new Map(builtInRules.map((r) => [r.id, r]));

export function findRule(id: string): AnyRule | undefined {
  return byId.get(id);
}

export function ruleIds(): string[] {
  return builtInRules.map((r) => r.id);
}
