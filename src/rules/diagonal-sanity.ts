/**
 * diagonal-sanity: no DOF has a zero or negative stiffness diagonal (an unconnected or wrongly
 * signed DOF makes K singular or indefinite), no negative mass diagonal, and — unless allowed —
 * no massless DOF (M only semi-definite; CRITERIA.md §6 "M SPD, or PSD with massless DOFs
 * flagged", [CP]). DOFs are named by node and component when a DOF map is given.
 */
import type { RuleDefinition } from './rule-types.js';
import { describeDof } from '../io/dof-map.js';
import { outcome } from './outcome.js';
import { formatList } from './message.js';

export interface DiagonalSanityOptions {
  allowMasslessDofs: boolean;
  /** How many DOFs to name in the message. */
  listLimit: number;
}

const messages = {
  pass: 'every stiffness diagonal is positive{{massPhrase}}.',
  fail: '{{problems}}.',
};

export const diagonalSanity: RuleDefinition<DiagonalSanityOptions> = {
  id: 'diagonal-sanity',
  description: 'No zero or negative stiffness diagonals, no negative mass diagonals, no massless DOFs (unless allowed).',
  optionsSchema: {
    type: 'object',
    properties: {
      allowMasslessDofs: { type: 'boolean' },
      listLimit: { type: 'integer', minimum: 1 },
    },
    additionalProperties: false,
  },
  defaults: { allowMasslessDofs: false, listLimit: 5 },
  messages,
  needs: [],
  evaluate(context, o) {
    const k = context.stiffnessSummary;
    const m = context.massSummary;
    const name = (dofs: number[]) => formatList(dofs.map((d) => describeDof(context.dofMap, d)), o.listLimit);
    const named = (dofs: number[]) => dofs.map((d) => describeDof(context.dofMap, d));
    const problems: string[] = [];
    if (k.zeroDiagonalCount > 0) problems.push(`${k.zeroDiagonalCount} DOF(s) with zero stiffness diagonal: ${name(k.zeroDiagonalDofs)}`);
    if (k.negativeDiagonalCount > 0) problems.push(`${k.negativeDiagonalCount} DOF(s) with negative stiffness diagonal: ${name(k.negativeDiagonalDofs)}`);
    if (m.negativeDiagonalCount > 0) problems.push(`${m.negativeDiagonalCount} DOF(s) with negative mass diagonal: ${name(m.negativeDiagonalDofs)}`);
    if (!o.allowMasslessDofs && m.zeroDiagonalCount > 0) problems.push(`${m.zeroDiagonalCount} massless DOF(s): ${name(m.zeroDiagonalDofs)}`);
    const details = {
      zeroStiffness: named(k.zeroDiagonalDofs),
      negativeStiffness: named(k.negativeDiagonalDofs),
      negativeMass: named(m.negativeDiagonalDofs),
      massless: named(m.zeroDiagonalDofs),
      counts: { zeroStiffness: k.zeroDiagonalCount, negativeStiffness: k.negativeDiagonalCount, negativeMass: m.negativeDiagonalCount, massless: m.zeroDiagonalCount },
    };
    const total = k.zeroDiagonalCount + k.negativeDiagonalCount + m.negativeDiagonalCount + (o.allowMasslessDofs ? 0 : m.zeroDiagonalCount);
    if (problems.length > 0) return outcome('fail', messages.fail, { problems: problems.join('; ') }, total, 0, details);
    const massPhrase = m.zeroDiagonalCount > 0 ? ` and no mass diagonal is negative (${m.zeroDiagonalCount} massless DOFs allowed)` : ' and every mass diagonal is positive';
    return outcome('pass', messages.pass, { massPhrase }, 0, 0, details);
  },
};
