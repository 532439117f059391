import type { SymmetricCsc } from '../sparse/csc.js';
import type { DofMap } from '../io/dof-map.js';
import type { ModesResult } from '../eigen/modes-types.js';
import type { MatrixSummary } from '../io/matrix-summary.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
import type { ComparisonFacts } from '../model/comparison-facts.js';
import type { ReportUnits } from './utils/units.js';
import type { ExplainedChanges } from '../model/change-facts.js';

/** `error` fails the gate, `warning` reports without failing, `off` does not run. */
export type Severity = 'error' | 'warning' | 'off';

/** pass / fail (rule evaluated and violated) / skip (cannot apply, say why) / error (could not evaluate). */
export type RuleStatus = 'pass' | 'fail' | 'skip' | 'error';

export interface RuleOutcome {
  status: RuleStatus;
  /**
   * Id of the rule's message template the outcome used (a key of its `messages`). Every outcome a
   * rule returns has one (src/rules/utils/outcome.ts); results the engine makes itself (a missing
   * input, a rule that threw) have none.
   */
  messageId?: string;
  /** One plain sentence, built from the rule's message template. */
  message: string;
  measured?: number | string | null;
  limit?: number | string | null;
  /** Structured extras for JSON/HTML (lists of DOFs, per-mode values...). */
  details?: Record<string, unknown>;
}

/** Everything known about one model when its rules run. Rules read it; they never print. */
export interface RuleContext {
  modelName: string;
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  stiffnessSummary: MatrixSummary;
  massSummary: MatrixSummary;
  dofMap?: DofMap;
  /** Solved DOF r is exported DOF keptDofs[r] (0-based), when constraint sets removed DOFs. */
  keptDofs?: Int32Array;
  modes?: ModesResult;
  geometry?: GeometryFacts;
  comparison?: ComparisonFacts;
  /** Units for messages and mass targets (`units:` of the config); none: the model's own, unnamed. */
  units?: ReportUnits;
  /** Change map and frequency-change attribution against the baseline (src/model/explain-changes.ts). */
  changes?: ExplainedChanges;
}

export type RuleNeed = 'modes' | 'dofMap' | 'baseline';

/**
 * One rule. `O` is its options object; `Required` names the options without a default (the
 * project must give them: listed in the schema's `required`, so the config loader refuses a
 * config without them), which `defaults` then cannot hold.
 */
export interface RuleDefinition<O extends object = Record<string, unknown>, Required extends keyof O = never> {
  id: string;
  /** One line, shown by `modalgate rules`. */
  description: string;
  /** JSON Schema (draft 2020-12 subset ajv understands) of the options object. */
  optionsSchema: Record<string, unknown>;
  /** Every option except the required ones. */
  defaults: Omit<O, Required>;
  /** Message templates with {{placeholders}}. */
  messages: Record<string, string>;
  /** Inputs the rule needs; when absent the engine records `skip` with the reason. */
  needs: RuleNeed[];
  /**
   * Groups of options that exclude each other (e.g. `[['expected'], ['min', 'max']]`). When a
   * config layer sets a key of one group, keys of the other groups from lower layers (defaults,
   * rule sets) are dropped before validation, so an override can switch forms.
   */
  exclusiveOptions?: string[][];
  evaluate(context: RuleContext, options: O): RuleOutcome;
}
