import { describe, expect, it } from 'vitest';
import { formatConsole, colorLevelFromEnv } from '../../src/report/console-reporter.js';
import { formatJson } from '../../src/report/json-reporter.js';
import { sampleReport } from './sample-report.js';

// eslint-disable-next-line no-control-regex
const ANSI = /\u001b\[/;

describe('console reporter', () => {
  it('prints one line per model, a table of failures and warnings, the verdict and the caution', () => {
    const out = formatConsole(sampleReport(), { colorLevel: 0 });
    expect(out).not.toMatch(ANSI);
    const lines = out.split('\n');
    expect(lines.filter((l) => /^(✔|✖)/.test(l))).toHaveLength(3);
    expect(out).toMatch(/mast-guyed-loose-anchor\s+rigid-body-modes\s+FAIL\s+1 mode below 0.005 Hz, expected 0/);
    expect(out).toMatch(/mast\s+conditioning\s+warning/);
    expect(out).toMatch(/bracket\s+model-input\s+error/);
    expect(out).toContain('modalgate: ERROR');
    expect(out).toContain('qualified engineer');
  });
  it('--quiet keeps only the table and the verdict', () => {
    const out = formatConsole(sampleReport(), { colorLevel: 0, quiet: true });
    expect(out).not.toContain('✔');
    expect(out).not.toContain('qualified engineer');
    expect(out).toContain('rigid-body-modes');
  });
  it('honours NO_COLOR and leaves FORCE_COLOR to chalk (https://no-color.org)', () => {
    expect(colorLevelFromEnv({ NO_COLOR: '1' })).toBe(0);
    expect(colorLevelFromEnv({ NO_COLOR: '' })).toBeUndefined();
    expect(colorLevelFromEnv({ NO_COLOR: '1', FORCE_COLOR: '1' })).toBeUndefined();
    expect(formatConsole(sampleReport(), { colorLevel: 1 })).toMatch(ANSI);
  });
});

describe('JSON reporter', () => {
  it('keeps every rule outcome with measured value and limit, and non-finite numbers as strings', () => {
    const doc = JSON.parse(formatJson(sampleReport()));
    expect(doc.reportVersion).toBe(1);
    expect(doc.caution).toContain('qualified engineer');
    expect(doc.models[1].rules[0]).toMatchObject({ ruleId: 'rigid-body-modes', status: 'fail', measured: 1, limit: 0 });
    expect(doc.models[1].rules[2].details.weird).toBe('Infinity');
    expect(doc.models[0].solve.sturm.countBelow).toBe(12);
    expect(doc.models[0].modes[1].frequencyHz).toBe(11.25);
  });
});
