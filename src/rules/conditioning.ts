/**
 * conditioning: how far elimination shrinks a diagonal. For each DOF j, the pivot drop is
 * |a_jj / d_j|, the stiffness diagonal (of K − σM) divided by the pivot d_j the LDLᵀ factor
 * leaves for it; the largest over all DOFs must stay at or below maxPivotDrop. A diagonal that
 * shrinks by 10^k loses about k digits there ([CP]): the DOF is weakly connected or badly scaled.
 * A limit of 1e7 is often quoted for this check (ECSS-E-ST-32-03C, value from memory — [M]
 * docs/sources.md §1a). The drop is measured on the solver's last factor of K − σM.
 */
import type { RuleDefinition } from './rule-types.js';
import { dofMessages, dofName } from './utils/dof-name.js';
import { ruleMessages } from './utils/outcome.js';

export interface ConditioningOptions {
  /** Largest allowed |a_jj / d_j|: diagonal before elimination over the pivot after it. */
  maxPivotDrop: number;
}

const messages = {
  ...dofMessages,
  pass: 'largest pivot drop (diagonal / pivot) {{measured}} at {{where}}, within maxPivotDrop {{maxPivotDrop}}.',
  fail: 'pivot drop (diagonal / pivot) {{measured}} at {{where}} exceeds maxPivotDrop {{maxPivotDrop}}: about {{digits}} digits are lost there (a weakly connected or badly scaled DOF).',
};
const { outcome } = ruleMessages(messages);

export const conditioning: RuleDefinition<ConditioningOptions> = {
  id: 'conditioning',
  description: 'No diagonal shrinks by more than maxPivotDrop during LDLᵀ elimination: max over DOFs of |diagonal / pivot|.',
  optionsSchema: {
    type: 'object',
    properties: {
      maxPivotDrop: {
        type: 'number',
        exclusiveMinimum: 1,
        description: 'largest allowed ratio of a DOF\'s diagonal before elimination to its pivot after it, |a_jj / d_j|; a drop of 10^k loses about k digits',
      },
    },
    additionalProperties: false,
  },
  defaults: { maxPivotDrop: 1e7 },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const f = context.modes!.factor;
    const drop = f.maxDiagonalToPivotRatio;
    const where = dofName(context, f.maxRatioDof, messages);
    const values = { measured: drop, where, maxPivotDrop: o.maxPivotDrop, digits: Math.round(Math.log10(Math.max(drop, 1))) };
    const details = { dof: (context.keptDofs ? context.keptDofs[f.maxRatioDof] : f.maxRatioDof) + 1, where, pivotDrop: drop };
    const ok = drop <= o.maxPivotDrop;
    return outcome(ok ? 'pass' : 'fail', ok ? 'pass' : 'fail', values, drop, o.maxPivotDrop, details);
  },
};
