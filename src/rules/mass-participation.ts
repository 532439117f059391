/**
 * mass-participation: the solved modes (or those up to maxHz) carry at least minFraction of the
 * mass in each listed direction: Σ_j Γ_jk² / rₖᵀMrₖ ≥ minFraction with Γ = ΦᵀMR (mass-normalized
 * Φ). Default 0.9 in the horizontal directions ux, uy: ASCE 7-16 §12.9.1.1 permits a modal
 * response spectrum analysis to use the modes reaching 90 % of the actual mass in each
 * orthogonal horizontal direction ([S]: quoted in a software vendor's help page on ASCE 7-16
 * §12.9.1, not read in the standard itself). Directions are global axes; list the ones that are
 * horizontal in your model.
 * The fraction is relative to the mass on the solved (kept) DOFs: with constraint sets that is
 * less than the export's total mass, and the message says both. On a free-free model the
 * rigid-body modes carry all of it, so the rule skips models with free rigid motions.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';
import { geometryMessages, geometryOrSkip, isOutcome } from './utils/geometry-common.js';
import { massIn, withUnit } from './utils/units.js';
import { RIGID_BODY_DIRECTIONS, type RigidBodyDirection } from '../model/rigid-body-vectors.js';

export interface MassParticipationOptions {
  directions: RigidBodyDirection[];
  minFraction: number;
  maxHz?: number;
}

const messages = {
  ...geometryMessages,
  pass: 'effective mass reaches {{reached}} within {{span}} (required {{minFraction}}){{basis}}.',
  fail: 'effective mass within {{span}} is short of {{minFraction}}: {{short}}; solve more modes or check where the mass is{{basis}}.',
  basis: ' (fractions of the mass on the {{keptDofs}} solved DOFs, {{keptMass}}; the whole export of {{exportedDofs}} DOFs has {{exportMass}})',
  spanUpTo: 'the {{count}} modes up to {{maxHz}} Hz',
  spanSolved: 'the {{count}} solved modes',
  fraction: '{{direction}} {{fraction}}',
  free: 'not evaluated: the model has {{free}} free rigid-body motion(s), whose modes carry all the mass; participation is for supported models.',
  noModes: 'not evaluated: no modes were solved for this model.',
  noMass: 'not evaluated: the listed directions carry no mass in this model ({{directions}}).',
};
const { outcome, text } = ruleMessages(messages);

export const massParticipation: RuleDefinition<MassParticipationOptions> = {
  id: 'mass-participation',
  description: 'The solved modes (or those up to maxHz) carry at least minFraction of the mass in each listed direction.',
  optionsSchema: {
    type: 'object',
    properties: {
      directions: { type: 'array', items: { enum: [...RIGID_BODY_DIRECTIONS] }, minItems: 1, uniqueItems: true },
      minFraction: { type: 'number', exclusiveMinimum: 0, maximum: 1 },
      maxHz: { type: 'number', exclusiveMinimum: 0 },
    },
    additionalProperties: false,
  },
  defaults: { directions: ['ux', 'uy'], minFraction: 0.9 },
  messages,
  needs: ['modes', 'dofMap'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    const p = g.participation;
    if (!p) return outcome('skip', 'noModes');
    if (g.freeRigidBodyMotions > 0 && !g.supported) return outcome('skip', 'free', { free: g.freeRigidBodyMotions });
    const f = context.modes!.frequenciesHz;
    let last = p.modes - 1;
    if (o.maxHz !== undefined) while (last >= 0 && f[last] > o.maxHz) last--;
    const span = o.maxHz !== undefined ? text('spanUpTo', { count: String(last + 1), maxHz: String(o.maxHz) }) : text('spanSolved', { count: String(p.modes) });
    const rows = o.directions
      .map((d) => {
        const k = RIGID_BODY_DIRECTIONS.indexOf(d);
        const fraction = last >= 0 ? p.cumulativeFraction[last][k] : 0;
        const reachedAt = p.cumulativeFraction.findIndex((row, j) => j <= last && row[k] !== null && row[k]! >= o.minFraction);
        return { direction: d, fraction, modesNeeded: reachedAt >= 0 ? reachedAt + 1 : null };
      })
      .filter((r) => r.fraction !== null) as { direction: RigidBodyDirection; fraction: number; modesNeeded: number | null }[];
    if (rows.length === 0) return outcome('skip', 'noMass', { directions: o.directions.join(', ') });
    const short = rows.filter((r) => r.fraction < o.minFraction);
    const worst = rows.reduce((a, b) => (b.fraction < a.fraction ? b : a));
    const exportMass = g.massProperties.totalMass;
    const keptMass = g.keptMass?.totalMass ?? exportMass;
    const keptDofs = g.constraints?.keptDofs ?? context.stiffness.n;
    const mass = (x: number) => withUnit(massIn(context.units, x), context.units?.mass);
    const basis = g.keptMass ? text('basis', { keptMass: mass(keptMass), keptDofs, exportedDofs: context.stiffnessSummary.n, exportMass: mass(exportMass) }) : '';
    const details = { modesConsidered: last + 1, directions: rows, rigidBodyMass: p.rigidBodyMass, keptMass, keptDofs, exportMass, exportedDofs: context.stiffnessSummary.n };
    const values = {
      basis,
      span,
      minFraction: o.minFraction,
      reached: formatList(rows.map((r) => text('fraction', { direction: r.direction, fraction: r.fraction.toFixed(3) }))),
      short: formatList(short.map((r) => text('fraction', { direction: r.direction, fraction: r.fraction.toFixed(3) }))),
    };
    const status = short.length === 0 ? 'pass' : 'fail';
    return outcome(status, status, values, worst.fraction, o.minFraction, details);
  },
};
