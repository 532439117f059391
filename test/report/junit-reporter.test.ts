import { describe, expect, it } from 'vitest';
import { XMLParser } from 'fast-xml-parser';
import { formatJunit } from '../../src/report/junit-reporter.js';
import { xmlSafe, junitSeconds } from '../../src/report/xml-text.js';
import { sampleReport } from './sample-report.js';
import { structuralProblems, xmllintValidate } from './junit-validation.js';

const xml = formatJunit(sampleReport());
const parsed = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', isArray: (n) => ['testsuite', 'testcase', 'property'].includes(n) }).parse(xml);

describe('JUnit reporter', () => {
  it('has totals on testsuites and counts per model suite', () => {
    const root = parsed.testsuites;
    expect(root).toMatchObject({ name: 'modalgate', tests: '8', failures: '1', errors: '2', time: '1.765' });
    const [mast, loose, bracket] = root.testsuite;
    expect(mast).toMatchObject({ name: 'mast', tests: '3', failures: '0', errors: '0', skipped: '1', time: '0.813', timestamp: '2026-12-02T06:00:00', hostname: 'ci-runner-1' });
    expect(loose).toMatchObject({ tests: '3', failures: '1', errors: '1', skipped: '0' });
    expect(bracket).toMatchObject({ tests: '2', failures: '0', errors: '1', skipped: '1' });
  });
  it('writes one testcase per rule with classname modalgate.<model> and the rule id as name', () => {
    const cases = parsed.testsuites.testsuite[1].testcase;
    expect(cases.map((c: { name: string }) => c.name)).toEqual(['rigid-body-modes', 'eigen-residual', 'matrix-finite']);
    expect(cases[0].classname).toBe('modalgate.mast-guyed-loose-anchor');
    expect(cases[0].time).toBe('0.001');
    expect(cases[0].failure.type).toBe('rigid-body-modes');
    expect(cases[0].failure.message).toContain('expected 0: the model has a mechanism');
    expect(cases[0].failure['#text']).toContain('measured: 1');
    expect(cases[0].failure['#text']).toContain('limit: 0');
    expect(cases[1].error.message).toContain('eigensolver stopped');
  });
  it('puts model facts in properties, warnings in system-out and skips with the reason', () => {
    const mast = parsed.testsuites.testsuite[0];
    const props = Object.fromEntries(mast.properties.property.map((p: { name: string; value: string }) => [p.name, p.value]));
    expect(props).toMatchObject({ dofs: '1200', 'stiffness.nonzeros': '30000', 'solver.method': 'lanczos', 'solver.shift': '-39.47', 'modes.returned': '12', 'sturm.countBelow': '12', 'sturm.result': 'complete' });
    expect(mast.testcase[1]['system-out']).toContain('warning (does not fail the gate)');
    expect(mast.testcase[1].failure).toBeUndefined();
    expect(mast.testcase[2].skipped.message).toContain('no target frequencies');
    expect(mast['system-out']).toContain('qualified engineer');
    expect(mast['system-err']).toContain('shift moved once');
  });
  it('reports an unreadable model as an <error> testcase naming the file and line', () => {
    const c = parsed.testsuites.testsuite[2].testcase[0];
    expect(c.name).toBe('model-input');
    expect(c.error.type).toBe('input-error');
    expect(c.error['#text']).toContain('line 7');
  });
  it('escapes markup and removes characters illegal in XML 1.0 (W3C XML 1.0 §2.2)', () => {
    expect(xml).toContain('&lt;&amp;&gt; &quot;quoted&quot; ]]&gt;');
    expect(xml).not.toMatch(/[\u0000\u0001\u0007]/);
    expect(xmlSafe('a\u0000b\uFFFEc\u{1F600}d\tx')).toBe('abc\u{1F600}d\tx');
    expect(junitSeconds(1.2e-5)).toBe('0.000');
    expect(junitSeconds(123456.7)).toBe('123.457');
  });
  it('passes the structural check written from junit-10.xsd', () => {
    expect(structuralProblems(xml)).toEqual([]);
    expect(structuralProblems(xml.replace('<testsuites ', '<testsuites skipped="1" '))).toContain('testsuites@skipped is not allowed');
  });
  it('validates against junit-10.xsd with xmllint', async () => {
    const r = await xmllintValidate(xml);
    expect(r.output).toContain('validates');
    expect(r.ok).toBe(true);
    // the validator is live: an element the schema does not have is refused
    expect((await xmllintValidate(xml.replace('<testsuites ', '<testsuites><bogus/></testsuites><testsuites '))).ok).toBe(false);
    expect((await xmllintValidate('<testsuites><bogus/></testsuites>')).ok).toBe(false);
  });
});

describe('JUnit reporter for a run that could not start', () => {
  it('writes a config testcase with <error>', async () => {
    const report = { ...sampleReport(), models: [], problem: { kind: 'input' as const, message: '/x/modalgate.yaml: models[0].count: must be a whole number', file: '/x/modalgate.yaml', where: 'models[0].count' } };
    const out = formatJunit(report);
    expect(structuralProblems(out)).toEqual([]);
    expect(out).toContain('<testcase name="config" classname="modalgate.config"');
    expect(out).toContain('models[0].count: must be a whole number');
    const r = await xmllintValidate(out);
    expect(r.ok, r.output).toBe(true);
  });
});
