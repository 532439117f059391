/**
 * How a rule names one solved DOF in its messages: "node 12 uz (dof 36)" with a DOF map, "dof 36"
 * without. The number is the DOF of the exported matrices (1-based): when constraint sets removed
 * DOFs before the solve, solved DOF d is exported DOF keptDofs[d].
 */
import { COMPONENTS } from '../../io/dof-map.js';
import type { RuleContext } from '../rule-types.js';
import { formatMessage } from './message.js';

/** The two templates; rules spread them into their `messages`. */
export const dofMessages = {
  dof: 'dof {{dof}}',
  nodeDof: 'node {{node}} {{component}} (dof {{dof}})',
};

/** Solved DOF d (0-based) named through the rule's templates (which hold `dofMessages`). */
export function dofName(context: RuleContext, d: number, messages: typeof dofMessages): string {
  const dof = String((context.keptDofs ? context.keptDofs[d] : d) + 1);
  const map = context.dofMap;
  return map ? formatMessage(messages.nodeDof, { node: String(map.node[d]), component: COMPONENTS[map.component[d]], dof }) : formatMessage(messages.dof, { dof });
}
