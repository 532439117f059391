/**
 * The Markdown summary renders user-derived text (model names, messages quoting a file's first
 * line, file names) as text: no raw HTML reaches GitHub/GitLab and Markdown punctuation is
 * escaped (CommonMark: a backslash before ASCII punctuation makes it literal; entities such as
 * &lt; render as the character — common practice).
 */
import { describe, expect, it } from 'vitest';
import { codeSpan, formatMarkdown, inline } from '../../src/report/markdown.js';
import type { CheckReport } from '../../src/pipeline/result-types.js';

function report(name: string, message: string): CheckReport {
  return {
    tool: { name: 'modalgate', version: '0' },
    timestamp: '2026-01-01T00:00:00',
    timeMs: 1,
    hostname: 'h',
    verdict: 'error',
    caution: 'results support, never replace, review by a qualified engineer',
    models: [{ name, verdict: 'error', timestamp: '2026-01-01T00:00:00', timeMs: 1, ruleSets: [], rules: [], problem: { kind: 'input', message } }],
  } as unknown as CheckReport;
}

describe('Markdown escaping', () => {
  it('no raw <script> or markup from names and messages', () => {
    const md = formatMarkdown(report('m<b>1</b>', "k.mtx:1: banner must start ...; found '<script>alert(1)</script> *x* [l](http://e)'"));
    expect(md).not.toMatch(/<script|<b>/i);
    expect(md).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(md).toContain('### m&lt;b&gt;1&lt;/b&gt;: ERROR');
    expect(md).toContain('\\*x\\* \\[l\\](http://e)');
  });

  it('inline keeps one line and escapes table pipes; code spans outgrow backtick runs', () => {
    expect(inline('a|b\nc & d')).toBe('a\\|b c &amp; d');
    expect(codeSpan('plain.json')).toBe('`plain.json`');
    expect(codeSpan('a``b')).toBe('```a``b```');
    expect(codeSpan('`x')).toBe('`` `x ``');
  });
});
