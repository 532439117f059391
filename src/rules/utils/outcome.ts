/**
 * Outcomes built from a rule's own `messages`: every sentence a rule returns is one of its
 * templates, named by id, with `{{placeholders}}` filled. The outcome keeps the id
 * (`messageId`) beside the filled text, so tests assert which message a rule chose, not prose.
 */
import type { RuleOutcome, RuleStatus } from '../rule-types.js';
import { formatMessage } from './message.js';

export type MessageTemplates = Record<string, string>;

export interface RuleMessages<M extends MessageTemplates> {
  /** The outcome whose message is template `id` filled from `values`. */
  outcome(
    status: RuleStatus,
    id: keyof M & string,
    values?: Record<string, unknown>,
    measured?: number | string | null,
    limit?: number | string | null,
    details?: Record<string, unknown>,
  ): RuleOutcome;
  /** Template `id` filled from `values`: a part that becomes a placeholder value of another template. */
  text(id: keyof M & string, values?: Record<string, unknown>): string;
}

/** The two builders of one rule, bound to its `messages`. */
export function ruleMessages<M extends MessageTemplates>(messages: M): RuleMessages<M> {
  const text = (id: keyof M & string, values: Record<string, unknown> = {}): string => {
    const template = messages[id];
    if (template === undefined) throw new Error(`no message template "${id}"`);
    return formatMessage(template, values);
  };
  return {
    text,
    outcome(status, id, values = {}, measured, limit, details) {
      const o: RuleOutcome = { status, messageId: id, message: text(id, values) };
      if (measured !== undefined) o.measured = measured;
      if (limit !== undefined) o.limit = limit;
      if (details !== undefined) o.details = details;
      return o;
    },
  };
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
