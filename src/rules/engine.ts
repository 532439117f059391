/**
 * The rule engine: run each enabled rule on one model's RuleContext, in registry order, and
 * record its outcome, severity and time. Rules whose inputs are missing (no modes because the
 * solve failed, no DOF map, no baseline) are not run: they get `skip` or `error` with the
 * reason. A rule that throws is recorded as `error` (an InputError keeps its sentence).
 */
import type { RuleContext, RuleNeed, RuleOutcome, RuleStatus, Severity } from './rule-types.js';
import type { AnyRule } from './registry.js';
import { oneLineMessage } from '../io/errors.js';

export type ActiveSeverity = Exclude<Severity, 'off'>;

/** A rule with its severity and merged, validated options, ready to run. */
export interface ResolvedRule {
  rule: AnyRule;
  severity: ActiveSeverity;
  options: Record<string, unknown>;
}

export interface RuleResult extends RuleOutcome {
  ruleId: string;
  description: string;
  severity: ActiveSeverity;
  options: Record<string, unknown>;
  timeMs: number;
}

/** Why an input a rule needs is absent; `error` when it should have been there (a failed solve). */
export type UnavailableInputs = Partial<Record<RuleNeed, { status: 'skip' | 'error'; reason: string }>>;

export function runRules(context: RuleContext, rules: ResolvedRule[], unavailable: UnavailableInputs = {}): RuleResult[] {
  return rules.map((r) => runOne(context, r, unavailable));
}

function runOne(context: RuleContext, r: ResolvedRule, unavailable: UnavailableInputs): RuleResult {
  const base = { ruleId: r.rule.id, description: r.rule.description, severity: r.severity, options: r.options };
  const missing = missingInput(context, r.rule.needs, unavailable);
  if (missing) return { ...base, status: missing.status, message: missing.reason, timeMs: 0 };
  const t0 = performance.now();
  let o: RuleOutcome;
  try {
    o = r.rule.evaluate(context, r.options);
  } catch (e) {
    o = { status: 'error', message: `the rule could not be evaluated: ${oneLineMessage(e)}` };
  }
  return { ...base, ...o, timeMs: performance.now() - t0 };
}

function missingInput(context: RuleContext, needs: RuleNeed[], unavailable: UnavailableInputs): { status: RuleStatus; reason: string } | null {
  for (const need of needs) {
    if (present(context, need)) continue;
    return unavailable[need] ?? { status: 'skip', reason: defaultReason[need] };
  }
  return null;
}

function present(context: RuleContext, need: RuleNeed): boolean {
  if (need === 'modes') return context.modes !== undefined;
  if (need === 'dofMap') return context.dofMap !== undefined;
  return context.comparison !== undefined;
}

const defaultReason: Record<RuleNeed, string> = {
  modes: 'not evaluated: no modes were solved for this model.',
  dofMap: 'not evaluated: the model has no DOF map (add `dofs:` to the model in the config).',
  baseline: 'not evaluated: no baseline was given for this model.',
};

/** 'error' if a rule could not be evaluated, 'fail' if an error-severity rule failed, else 'pass'. */
export function verdictOf(results: RuleResult[]): 'pass' | 'fail' | 'error' {
  if (results.some((r) => r.status === 'error' && r.severity === 'error')) return 'error';
  if (results.some((r) => r.status === 'fail' && r.severity === 'error')) return 'fail';
  return 'pass';
}
