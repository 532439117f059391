import { describe, expect, it } from 'vitest';
import { ruleMessages } from '../../../src/rules/utils/outcome.js';

describe('ruleMessages', () => {
  const messages = { missed: '{{count}} mode(s) missed below {{hz}} Hz.', item: 'mode {{mode}}' };
  const { outcome, text } = ruleMessages(messages);
  it('builds an outcome with the template id beside the filled sentence', () => {
    expect(outcome('fail', 'missed', { count: 2, hz: 12.345678 }, 2, 0, { a: 1 })).toEqual({
      status: 'fail',
      messageId: 'missed',
      message: '2 mode(s) missed below 12.35 Hz.',
      measured: 2,
      limit: 0,
      details: { a: 1 },
    });
  });
  it('leaves measured, limit and details out when not given', () => {
    expect(outcome('skip', 'item', { mode: 3 })).toEqual({ status: 'skip', messageId: 'item', message: 'mode 3' });
  });
  it('fills parts with text(), and refuses an unknown id', () => {
    expect(text('item', { mode: '7' })).toBe('mode 7');
    expect(() => text('nothing' as never)).toThrow(/no message template "nothing"/);
  });
});
