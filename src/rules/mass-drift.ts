/**
 * mass-drift: the model's mass properties stay close to those stored with its baseline, so a
 * model that grew 20 % heavier fails even when no frequency moved past its drift limit:
 *
 *   total mass         |m − m_b| / m_b                      ≤ maxMassChangePercent / 100
 *   centre of mass     ‖c − c_b‖ / r_b                      ≤ maxCenterShiftPercent / 100
 *   inertia tensor     ‖I − I_b‖_F / ‖I_b‖_F (about each    ≤ maxInertiaChangePercent / 100
 *                      side's own centre of mass)
 *
 * with r_b = √((I₁ + I₂ + I₃) / (2 m_b)) the baseline's radius of gyration about its centre of
 * mass (for a body, trace I = 2 Σ m r², so r_b is the root-mean-square distance of the mass from
 * the centre: a shift is measured against the model's own size, whatever the length unit). Mass
 * properties come from RᵀMR with the rigid-body vectors (src/model/mass-properties.ts), so both
 * sides need a DOF map. Masses and lengths in messages are in the config's `units` when it has
 * them (the limits are percentages, whatever the unit). Defaults 1 % each: ours (the same order as total-mass's default; set
 * them to what your mass control allows).
 */
import type { RuleDefinition } from './rule-types.js';
import type { MassProperties } from '../model/mass-properties.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';
import { geometryMessages, geometryOrSkip, isOutcome } from './utils/geometry-common.js';
import { massIn, withUnit } from './utils/units.js';

export interface MassDriftOptions {
  maxMassChangePercent: number;
  maxCenterShiftPercent: number;
  maxInertiaChangePercent: number;
}

const messages = {
  ...geometryMessages,
  pass: 'mass properties agree with the baseline: total mass {{mass}} ({{massChange}} %), centre of mass moved {{shift}} ({{shiftPercent}} % of the radius of gyration {{radius}}), inertia changed {{inertiaChange}} %.',
  fail: 'mass properties differ from the baseline: {{list}}.',
  massChanged: 'total mass {{before}} → {{now}} ({{change}} %, allowed ± {{allowed}} %)',
  centreMoved: 'centre of mass moved {{shift}} ({{shiftPercent}} % of the radius of gyration {{radius}}, allowed {{allowed}} %)',
  inertiaChanged: 'inertia tensor changed {{change}} % (allowed {{allowed}} %)',
  limit: 'mass ± {{mass}} %, centre {{centre}} %, inertia {{inertia}} %',
  signed: '{{sign}}{{value}}',
  noBaseline: 'not evaluated: the baseline holds no mass properties (it was saved without a DOF map); save it again with check --save-baseline.',
};
const { outcome, text } = ruleMessages(messages);

export const massDrift: RuleDefinition<MassDriftOptions> = {
  id: 'mass-drift',
  description: 'Total mass, centre of mass and inertia stay within tolerances of the baseline.',
  optionsSchema: {
    type: 'object',
    properties: {
      maxMassChangePercent: { type: 'number', minimum: 0 },
      maxCenterShiftPercent: { type: 'number', minimum: 0, description: 'percent of the baseline radius of gyration' },
      maxInertiaChangePercent: { type: 'number', minimum: 0 },
    },
    additionalProperties: false,
  },
  defaults: { maxMassChangePercent: 1, maxCenterShiftPercent: 1, maxInertiaChangePercent: 1 },
  messages,
  needs: ['dofMap', 'baseline'],
  evaluate(context, o) {
    const g = geometryOrSkip(context);
    if (isOutcome(g)) return g;
    const before = context.comparison!.baselineMassProperties as MassProperties | null;
    if (!before || typeof before.totalMass !== 'number') return outcome('skip', 'noBaseline', {});
    const now = g.massProperties;
    const massChange = (100 * (now.totalMass - before.totalMass)) / before.totalMass;
    const shift = Math.hypot(now.centerOfMass[0] - before.centerOfMass[0], now.centerOfMass[1] - before.centerOfMass[1], now.centerOfMass[2] - before.centerOfMass[2]);
    const radius = Math.sqrt((before.principalMoments[0] + before.principalMoments[1] + before.principalMoments[2]) / (2 * before.totalMass));
    const shiftPercent = radius > 0 ? (100 * shift) / radius : shift === 0 ? 0 : Infinity;
    const inertiaChange = (100 * frobenius(now.inertiaAboutCenterOfMass.map((v, k) => v - before.inertiaAboutCenterOfMass[k]))) / frobenius(before.inertiaAboutCenterOfMass);
    const u = context.units;
    const mass = (x: number) => withUnit(massIn(u, x), u?.mass);
    const length = (x: number) => withUnit(x, u?.length);
    const values = {
      mass: mass(now.totalMass),
      massChange: signed(massChange),
      shift: length(shift),
      shiftPercent,
      radius: length(radius),
      inertiaChange: Number.isFinite(inertiaChange) ? inertiaChange : 0,
    };
    const details = {
      baseline: { totalMass: before.totalMass, centerOfMass: before.centerOfMass, inertiaAboutCenterOfMass: before.inertiaAboutCenterOfMass },
      current: { totalMass: now.totalMass, centerOfMass: now.centerOfMass, inertiaAboutCenterOfMass: now.inertiaAboutCenterOfMass },
      massChangePercent: massChange,
      centerShift: shift,
      centerShiftPercent: shiftPercent,
      radiusOfGyration: radius,
      inertiaChangePercent: values.inertiaChange,
    };
    const bad: string[] = [];
    if (Math.abs(massChange) > o.maxMassChangePercent) bad.push(text('massChanged', { before: mass(before.totalMass), now: mass(now.totalMass), change: signed(massChange), allowed: String(o.maxMassChangePercent) }));
    if (shiftPercent > o.maxCenterShiftPercent) bad.push(text('centreMoved', { shift: length(shift), shiftPercent, radius: length(radius), allowed: String(o.maxCenterShiftPercent) }));
    if (values.inertiaChange > o.maxInertiaChangePercent) bad.push(text('inertiaChanged', { change: values.inertiaChange, allowed: String(o.maxInertiaChangePercent) }));
    const limit = text('limit', { mass: String(o.maxMassChangePercent), centre: String(o.maxCenterShiftPercent), inertia: String(o.maxInertiaChangePercent) });
    if (bad.length > 0) return outcome('fail', 'fail', { list: formatList(bad, 3) }, Math.abs(massChange), limit, details);
    return outcome('pass', 'pass', values, Math.abs(massChange), limit, details);
  },
};

function frobenius(values: readonly number[]): number {
  let s = 0;
  for (const v of values) s += v * v;
  return Math.sqrt(s);
}

function signed(x: number): string {
  return text('signed', { sign: x > 0 ? '+' : '', value: x });
}
