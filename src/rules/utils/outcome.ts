/** Small constructors for RuleOutcome, so every rule reads the same way. */
import type { RuleOutcome, RuleStatus } from '../rule-types.js';
import { formatMessage } from './message.js';

export function outcome(
  status: RuleStatus,
  template: string,
  values: Record<string, unknown>,
  measured?: number | string | null,
  limit?: number | string | null,
  details?: Record<string, unknown>,
): RuleOutcome {
  const o: RuleOutcome = { status, message: formatMessage(template, values) };
  if (measured !== undefined) o.measured = measured;
  if (limit !== undefined) o.limit = limit;
  if (details !== undefined) o.details = details;
  return o;
}

/** Index and value of the largest entry of a list. */
export function argMax(values: ArrayLike<number>): { index: number; value: number } {
  let index = -1;
  let value = -Infinity;
  for (let i = 0; i < values.length; i++) {
    if (values[i] > value) {
      value = values[i];
      index = i;
    }
  }
  return { index, value };
}
