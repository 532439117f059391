/**
 * A resolved model job as plain data, to cross to a worker thread: its rules become
 * `{ ruleId, severity, options }` (a rule's module holds functions, which do not cross threads)
 * and are found again in the rule registry on the other side. The options were merged and
 * validated when the config was resolved; the worker neither reads the config again nor
 * compiles a schema.
 */
import { findRule } from '../rules/registry.js';
import type { ActiveSeverity, ResolvedRule } from '../rules/engine.js';
import type { ModelJob } from './job-types.js';

export interface PlainRule {
  ruleId: string;
  severity: ActiveSeverity;
  options: Record<string, unknown>;
}

export type PlainModelJob = Omit<ModelJob, 'rules'> & { rules: PlainRule[] };

export function toPlainJob(job: ModelJob): PlainModelJob {
  return { ...job, rules: job.rules.map((r) => ({ ruleId: r.rule.id, severity: r.severity, options: r.options })) };
}

/** The job with its rules from the registry; a rule id the registry does not know is an internal error. */
export function fromPlainJob(plain: PlainModelJob): ModelJob {
  const rules = plain.rules.map((r): ResolvedRule => {
    const rule = findRule(r.ruleId);
    if (!rule) throw new Error(`rule ${r.ruleId} of model ${plain.name} is not in the rule registry`);
    return { rule, severity: r.severity, options: r.options };
  });
  return { ...plain, rules };
}
