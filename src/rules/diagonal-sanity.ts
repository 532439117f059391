/**
 * diagonal-sanity: the diagonals of the solved K and M (after constraint sets) are sane.
 *   - No zero or negative stiffness diagonal: an unconnected or wrongly signed DOF makes K
 *     singular or indefinite ([CP]).
 *   - No negative mass diagonal (M must be positive semi-definite).
 *   - No DOF with neither stiffness nor mass: it is connected to nothing; no option allows it.
 *   - Massless DOFs (M only semi-definite; "M SPD, or PSD with massless DOFs flagged", docs/sources.md
 *     §6, [CP]) are judged by component. A lumped (diagonal) mass matrix without rotary inertia
 *     leaves every rotation massless — the everyday export of many FE programs, and harmless: the
 *     shift-invert solve condenses those DOFs out ([CP]). So massless rotations pass unless
 *     `allowMasslessRotations` is false; a massless translation fails unless
 *     `allowMasslessTranslations` is true (a translation without mass is usually a node someone
 *     forgot to give mass). Every message names the option that would allow what it reports.
 * Components come from the DOF map. Without one, 6 DOFs per node in the order ux uy uz rx ry rz
 * are assumed when the DOF count is a multiple of 6 (the message says so); otherwise components
 * are unknown and massless DOFs are judged as translations.
 */
import type { RuleContext, RuleDefinition } from './rule-types.js';
import { dofMessages, dofName } from './utils/dof-name.js';
import { diagonalOf } from '../sparse/csc.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export interface DiagonalSanityOptions {
  /** Massless rx, ry, rz DOFs pass (a lumped mass matrix without rotary inertia). */
  allowMasslessRotations: boolean;
  /** Massless ux, uy, uz DOFs pass. */
  allowMasslessTranslations: boolean;
  /** How many DOFs to name in the message. */
  listLimit: number;
}

const messages = {
  pass: 'every stiffness diagonal is positive and no mass diagonal is negative{{allowed}}{{assumption}}.',
  fail: '{{problems}}{{assumption}}.',
  unconnected: '{{count}} DOF(s) with neither stiffness nor mass (connected to nothing; no option allows this): {{list}}',
  zeroStiffness: '{{count}} DOF(s) with zero stiffness diagonal: {{list}}',
  negativeStiffness: '{{count}} DOF(s) with negative stiffness diagonal: {{list}}',
  negativeMass: '{{count}} DOF(s) with negative mass diagonal: {{list}}',
  masslessTranslations: '{{count}} massless translational DOF(s): {{list}} (a translation needs mass; allowMasslessTranslations: true allows it)',
  masslessRotations: '{{count}} massless rotational DOF(s): {{list}} (usual for a lumped mass matrix without rotary inertia; allowMasslessRotations: true allows it)',
  masslessUnknown: '{{count}} massless DOF(s) of unknown component, judged as translations: {{list}} (give the model a DOF map, or set allowMasslessTranslations: true)',
  allowedRotations: '; {{count}} massless rotational DOF(s) allowed by allowMasslessRotations: true (a lumped mass matrix without rotary inertia)',
  allowedTranslations: '; {{count}} massless translational DOF(s) allowed by allowMasslessTranslations: true',
  allowedUnknown: '; {{count}} massless DOF(s) of unknown component allowed by allowMasslessTranslations: true',
  assumedSix: ' (no DOF map: assumed 6 DOFs per node in the order ux uy uz rx ry rz)',
  unknownComponents: ' (no DOF map, and {{n}} DOFs is not a multiple of 6: components unknown)',
  ...dofMessages,
};
const { outcome, text } = ruleMessages(messages);

/** How the component of a DOF is known: from the map, assumed 6 per node, or not at all. */
type ComponentSource = 'dof map' | 'assumed 6 per node' | 'unknown';

/** DOF lists by kind (0-based DOFs of the solved model). */
interface DiagonalFindings {
  unconnected: number[];
  zeroStiffness: number[];
  negativeStiffness: number[];
  negativeMass: number[];
  masslessTranslations: number[];
  masslessRotations: number[];
  masslessUnknown: number[];
}

type Kind = keyof DiagonalFindings;
const KINDS: Kind[] = ['unconnected', 'zeroStiffness', 'negativeStiffness', 'negativeMass', 'masslessTranslations', 'masslessRotations', 'masslessUnknown'];
/** JSON details keep at most this many named DOFs per kind (counts stay exact). */
const DETAIL_CAP = 100;

export const diagonalSanity: RuleDefinition<DiagonalSanityOptions> = {
  id: 'diagonal-sanity',
  description: 'No zero or negative stiffness diagonals, no negative mass diagonals, no DOF without stiffness and mass; massless rotations allowed, massless translations not (both configurable).',
  optionsSchema: {
    type: 'object',
    properties: {
      allowMasslessRotations: { type: 'boolean', description: 'massless rx, ry, rz DOFs pass (a lumped mass matrix without rotary inertia leaves them massless)' },
      allowMasslessTranslations: { type: 'boolean', description: 'massless ux, uy, uz DOFs pass' },
      listLimit: { type: 'integer', minimum: 1 },
    },
    additionalProperties: false,
  },
  defaults: { allowMasslessRotations: true, allowMasslessTranslations: false, listLimit: 5 },
  messages,
  needs: [],
  evaluate(context, o) {
    const source = componentSource(context);
    const found = scanDiagonals(context, source);
    const nameOf = (d: number) => dofName(context, d, messages);
    const allowed: Record<Kind, boolean> = {
      unconnected: false,
      zeroStiffness: false,
      negativeStiffness: false,
      negativeMass: false,
      masslessTranslations: o.allowMasslessTranslations,
      masslessRotations: o.allowMasslessRotations,
      masslessUnknown: o.allowMasslessTranslations,
    };
    const n = context.stiffness.n;
    const assumption = source === 'assumed 6 per node' ? text('assumedSix') : source === 'unknown' ? text('unknownComponents', { n }) : '';
    const problems = KINDS.filter((k) => !allowed[k] && found[k].length > 0).map((k) => text(k, { count: found[k].length, list: formatList(found[k].map(nameOf), o.listLimit) }));
    const counts = Object.fromEntries(KINDS.map((k) => [k, found[k].length])) as Record<Kind, number>;
    const details = {
      dofs: n,
      componentsFrom: source,
      counts,
      allowed: { masslessRotations: o.allowMasslessRotations, masslessTranslations: o.allowMasslessTranslations },
      ...Object.fromEntries(KINDS.map((k) => [k, found[k].slice(0, DETAIL_CAP).map(nameOf)])),
    };
    const total = KINDS.filter((k) => !allowed[k]).reduce((s, k) => s + found[k].length, 0);
    if (problems.length > 0) return outcome('fail', 'fail', { problems: problems.join('; '), assumption }, total, 0, details);
    const allowedPhrase = [
      found.masslessRotations.length > 0 ? text('allowedRotations', { count: found.masslessRotations.length }) : '',
      found.masslessTranslations.length > 0 ? text('allowedTranslations', { count: found.masslessTranslations.length }) : '',
      found.masslessUnknown.length > 0 ? text('allowedUnknown', { count: found.masslessUnknown.length }) : '',
    ].join('');
    const massless = found.masslessRotations.length + found.masslessTranslations.length + found.masslessUnknown.length;
    return outcome('pass', 'pass', { allowed: allowedPhrase, assumption: massless > 0 ? assumption : '' }, 0, 0, details);
  },
};

function componentSource(context: RuleContext): ComponentSource {
  if (context.dofMap) return 'dof map';
  // without constraint sets the solved DOFs are the exported ones; with them, keptDofs maps back
  const exported = context.keptDofs ? context.stiffnessSummary.n : context.stiffness.n;
  return exported % 6 === 0 ? 'assumed 6 per node' : 'unknown';
}

/** One pass over both diagonals: every DOF in at most one stiffness kind and one mass kind. */
function scanDiagonals(context: RuleContext, source: ComponentSource): DiagonalFindings {
  const k = diagonalOf(context.stiffness);
  const m = diagonalOf(context.mass);
  const found: DiagonalFindings = { unconnected: [], zeroStiffness: [], negativeStiffness: [], negativeMass: [], masslessTranslations: [], masslessRotations: [], masslessUnknown: [] };
  const map = context.dofMap;
  const kept = context.keptDofs;
  // component code 0..2 translation, 3..5 rotation, −1 unknown
  const code = (i: number) => (map ? map.component[i] : source === 'assumed 6 per node' ? (kept ? kept[i] : i) % 6 : -1);
  for (let i = 0; i < k.length; i++) {
    if (k[i] === 0 && m[i] === 0) found.unconnected.push(i);
    else if (k[i] === 0) found.zeroStiffness.push(i);
    else if (k[i] < 0) found.negativeStiffness.push(i);
    if (m[i] < 0) found.negativeMass.push(i);
    if (m[i] !== 0 || k[i] === 0) continue;
    const c = code(i);
    if (c < 0) found.masslessUnknown.push(i);
    else if (c < 3) found.masslessTranslations.push(i);
    else found.masslessRotations.push(i);
  }
  return found;
}
