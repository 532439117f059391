/**
 * rigid-body-energy: a free-free model must not resist rigid motion (unintended grounding).
 * Measured: max over the six rigid-body vectors r of  rᵀKr / (λ_ref rᵀMr)  (= E / E_ref with
 * E = ½ rᵀKr, E_ref = ½ λ_ref rᵀMr; see src/model/rigid-body-energy.ts for λ_ref).
 * Default limit 1e-8 — our choice, derived from the ECSS-E-ST-32-03C separation criterion
 * f_rigid / f_first-elastic < 1e-4 ([S] docs/sources.md §1a): the ratio is (f_r / f_ref)², so 1e-8
 * asks the same of the geometric rigid vectors. The standard has its own energy check, whose
 * numbers were not recovered ([M] docs/sources.md §1a); none is claimed here.
 * On failure the message names the nodes with the largest residual forces K r (where the model
 * is grounded), down to 1 % of the largest residual (at most 10), each with its share of it.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { geometryMessages, geometryOrSkip, isOutcome } from './utils/geometry-common.js';
import { formatList } from './utils/message.js';

export interface RigidBodyEnergyOptions {
  maxRelativeEnergy: number;
  /** Skip supported models (constraint sets applied, or no near-zero mode): the check is for free-free models. */
  onlyFreeFree: boolean;
}

const messages = {
  ...geometryMessages,
  pass: 'rigid motions store at most {{measured}} of the reference energy (limit {{limit}}, reference: {{reference}}).',
  fail: 'rigid motion {{direction}} stores {{measured}} of the reference energy (limit {{limit}}): the model is grounded near {{where}}.',
  referenceFirstElastic: '½ λ rᵀMr with λ = {{lambda}} of the first elastic mode',
  referenceEstimate: '½ λ rᵀMr with λ = {{lambda}}, an upper estimate of the first elastic eigenvalue (no elastic mode solved)',
  referenceTraces: '½ λ rᵀMr with λ = tr K / tr M = {{lambda}} (no elastic mode solved: a loose check)',
  residual: 'node {{node}} {{component}} ({{percent}} %)',
  skipped: 'not evaluated: {{reason}}; rigid-body energy applies to free-free models (set onlyFreeFree: false to force it).',
};
const { outcome, text } = ruleMessages(messages);

export const rigidBodyEnergy: RuleDefinition<RigidBodyEnergyOptions> = {
  id: 'rigid-body-energy',
  description: 'Rigid-body motions of a free-free model store (almost) no strain energy: no unintended grounding.',
  optionsSchema: {
    type: 'object',
    properties: {
      maxRelativeEnergy: { type: 'number', exclusiveMinimum: 0 },
      onlyFreeFree: { type: 'boolean' },
    },
    additionalProperties: false,
  },
  defaults: { maxRelativeEnergy: 1e-8, onlyFreeFree: true },
  messages,
  needs: ['dofMap'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    if (o.onlyFreeFree && g.supported) return outcome('skip', 'skipped', { reason: g.supported.reason });
    const e = g.rigidBodyEnergy;
    const measured = Math.abs(e.maxRelativeEnergy);
    const lambda = e.referenceEigenvalue.toExponential(3);
    const referenceId = e.referenceSource === 'first-elastic-mode' ? 'referenceFirstElastic' : e.referenceSource === 'smooth-field-estimate' ? 'referenceEstimate' : 'referenceTraces';
    const reference = text(referenceId, { lambda });
    const details = {
      referenceEigenvalue: e.referenceEigenvalue,
      referenceSource: e.referenceSource,
      directions: e.directions,
      freeRigidBodyMotions: g.freeRigidBodyMotions,
      largestResiduals: e.largestResiduals,
    };
    const values = { measured, limit: o.maxRelativeEnergy, reference, direction: e.worstDirection ?? '-', where: suspects(e.largestResiduals) };
    const status = measured <= o.maxRelativeEnergy ? 'pass' : 'fail';
    return outcome(status, status, values, measured, o.maxRelativeEnergy, details);
  },
};

/** "node 18 uy (100 %) and node 5 ux (3 %)": residuals relative to the largest. */
function suspects(list: readonly { node: number; component: string; normalizedResidual: number }[]): string {
  const top = list[0]?.normalizedResidual ?? 0;
  return formatList(list.map((r) => text('residual', { node: String(r.node), component: r.component, percent: String(top > 0 ? Math.round((100 * r.normalizedResidual) / top) : 0) })), 10);
}
