/**
 * JUnit XML for CI servers, following the emission profile of docs/sources.md §5 ([CP], built from
 * the Ant, Jenkins xunit junit-10.xsd, Jenkins junit-plugin, GitLab and Azure readers):
 *
 *   <testsuites name tests failures errors time>          totals (junit-10.xsd has no `skipped` here)
 *     <testsuite name tests failures errors skipped time timestamp hostname>   one per model
 *       <properties><property name value/>…</properties>   first: DOFs, nonzeros, solver, shift, modes, Sturm
 *       <testcase name=<rule id> classname=modalgate.<model> time>
 *         <failure message type=<rule id>>  measured vs limit, at severity error
 *         <error message type>              the rule could not be evaluated (bad input, solver trouble)
 *         <skipped message>                 the rule does not apply here, and why
 *       <system-out>  per-model summary, warnings and the caution sentence
 *       <system-err>  solver warnings
 *
 * Rules that fail at severity `warning` pass in JUnit (they must not fail the build) and say so in
 * their own <system-out>. Times are seconds with three decimals, never an exponent.
 */
import { createRequire } from 'node:module';
import type { XMLBuilder as XMLBuilderClass } from 'fast-xml-parser';
import type { RuleResult } from '../rules/engine.js';
import { formatNumber } from '../rules/utils/message.js';
import type { CheckReport, ModelReport, ProblemReport } from '../pipeline/result-types.js';
import { CAUTION, ruleCounts } from '../pipeline/result-types.js';
import { junitSeconds, xmlAttribute, xmlSafe } from './xml-text.js';

// the package's one-file CommonJS build: its ES-module entry loads some 30 files (about 70 ms of CPU per run)
const { XMLBuilder } = createRequire(import.meta.url)('fast-xml-parser') as { XMLBuilder: typeof XMLBuilderClass };

type XmlNode = Record<string, unknown>;

export function formatJunit(report: CheckReport): string {
  const suites = report.models.map((m) => modelSuite(m, report.hostname));
  if (report.problem) suites.unshift(problemSuite(report, report.problem));
  const totals = { tests: 0, failures: 0, errors: 0 };
  // totals over the suites
  for (const s of suites) {
    totals.tests += Number(s['@_tests']);
    totals.failures += Number(s['@_failures']);
    totals.errors += Number(s['@_errors']);
  }
  const doc = {
    '?xml': { '@_version': '1.0', '@_encoding': 'UTF-8' },
    testsuites: {
      '@_name': 'modalgate',
      '@_tests': totals.tests,
      '@_failures': totals.failures,
      '@_errors': totals.errors,
      '@_time': junitSeconds(report.timeMs),
      testsuite: suites,
    },
  };
  const builder = new XMLBuilder({ ignoreAttributes: false, attributeNamePrefix: '@_', textNodeName: '#text', format: true, indentBy: '  ', suppressEmptyNode: true });
  return `${(builder.build(doc) as string).trimEnd()}\n`;
}

function modelSuite(m: ModelReport, hostname: string): XmlNode {
  const classname = `modalgate.${m.name}`;
  const cases = m.rules.map((r) => ruleCase(r, classname));
  if (m.problem) cases.unshift(problemCase(m.problem.kind === 'input' ? 'model-input' : `model-${m.problem.kind}`, classname, m.problem));
  const failures = cases.filter((c) => 'failure' in c).length;
  const errors = cases.filter((c) => 'error' in c).length;
  const skipped = cases.filter((c) => 'skipped' in c).length;
  const suite: XmlNode = {
    '@_name': xmlAttribute(m.name),
    '@_tests': cases.length,
    '@_failures': failures,
    '@_errors': errors,
    '@_skipped': skipped,
    '@_time': junitSeconds(m.timeMs),
    '@_timestamp': m.timestamp,
    '@_hostname': xmlAttribute(hostname),
    properties: { property: modelProperties(m).map(([name, value]) => ({ '@_name': name, '@_value': xmlAttribute(value) })) },
    testcase: cases,
    'system-out': xmlSafe(modelSummary(m), 20_000),
  };
  if (m.solve && m.solve.warnings.length > 0) suite['system-err'] = xmlSafe(m.solve.warnings.join('\n'), 20_000);
  return suite;
}

function modelProperties(m: ModelReport): [string, string][] {
  const p: [string, string][] = [];
  if (m.ruleSets.length > 0) p.push(['ruleSets', m.ruleSets.join(', ')]);
  if (m.stats) {
    p.push(['dofs', String(m.stats.dofs)], ['stiffness.nonzeros', String(m.stats.stiffnessNonzeros)], ['mass.nonzeros', String(m.stats.massNonzeros)]);
    p.push(['stiffness.file', m.stats.stiffnessFile], ['mass.file', m.stats.massFile]);
    if (m.stats.dofsFile) p.push(['dofs.file', m.stats.dofsFile]);
  }
  if (m.solve) {
    const s = m.solve;
    p.push(['solver.method', s.method], ['solver.ordering', s.ordering], ['solver.shift', s.shifts.map((x) => formatNumber(x)).join(' ')]);
    if (s.requested.count !== undefined) p.push(['modes.requested', String(s.requested.count)]);
    if (s.requested.maxHz !== undefined) p.push(['modes.maxHz', String(s.requested.maxHz)]);
    p.push(['modes.returned', String(s.modesReturned)]);
    p.push(['sturm.shift', formatNumber(s.sturm.shift)], ['sturm.countBelow', String(s.sturm.countBelow)], ['sturm.result', s.sturm.ok ? 'complete' : 'NOT confirmed']);
  }
  if (m.modes && m.modes.length > 0) p.push(['modes.frequenciesHz', m.modes.map((r) => formatNumber(r.frequencyHz)).join(' ')]);
  return p;
}

function ruleCase(r: RuleResult, classname: string): XmlNode {
  const c: XmlNode = { '@_name': r.ruleId, '@_classname': classname, '@_time': junitSeconds(r.timeMs) };
  const body = xmlSafe(ruleBody(r));
  if (r.status === 'skip') c.skipped = { '@_message': xmlAttribute(r.message) };
  else if (r.severity === 'warning' && r.status !== 'pass') c['system-out'] = xmlSafe(`warning (does not fail the gate): ${r.message}\n${ruleBody(r)}`);
  else if (r.status === 'fail') c.failure = { '@_message': xmlAttribute(r.message), '@_type': r.ruleId, '#text': body };
  else if (r.status === 'error') c.error = { '@_message': xmlAttribute(r.message), '@_type': 'rule-error', '#text': body };
  return c;
}

function ruleBody(r: RuleResult): string {
  const lines = [r.message];
  if (r.measured !== undefined && r.measured !== null) lines.push(`measured: ${show(r.measured)}`);
  if (r.limit !== undefined && r.limit !== null) lines.push(`limit: ${show(r.limit)}`);
  lines.push(`rule: ${r.ruleId} — ${r.description}`);
  return lines.join('\n');
}

function show(v: number | string): string {
  return typeof v === 'number' ? formatNumber(v) : v;
}

function problemCase(name: string, classname: string, p: ProblemReport): XmlNode {
  const where = [p.file, p.line !== undefined ? `line ${p.line}` : undefined, p.where].filter(Boolean).join(', ');
  const text = where ? `${p.message}\nat: ${where}` : p.message;
  return { '@_name': name, '@_classname': classname, '@_time': '0.000', error: { '@_message': xmlAttribute(p.message), '@_type': `${p.kind}-error`, '#text': xmlSafe(text) } };
}

function problemSuite(report: CheckReport, p: ProblemReport): XmlNode {
  return {
    '@_name': 'modalgate',
    '@_tests': 1,
    '@_failures': 0,
    '@_errors': 1,
    '@_skipped': 0,
    '@_time': junitSeconds(report.timeMs),
    '@_timestamp': report.timestamp,
    '@_hostname': xmlAttribute(report.hostname),
    testcase: [p.kind === 'interrupted' || p.kind === 'write' ? problemCase(p.kind === 'write' ? 'reports' : 'run', 'modalgate.run', p) : problemCase('config', 'modalgate.config', p)],
    'system-out': CAUTION,
  };
}

function modelSummary(m: ModelReport): string {
  const c = ruleCounts(m.rules);
  const lines = [`model ${m.name}: ${m.verdict} — ${c.passed} passed, ${c.failed} failed, ${c.warnings} warnings, ${c.errors} errors, ${c.skipped} skipped`];
  for (const r of m.rules) if (r.status !== 'pass') lines.push(`  ${r.severity === 'warning' && r.status !== 'skip' ? 'warning' : r.status} ${r.ruleId}: ${r.message}`);
  lines.push(CAUTION);
  return lines.join('\n');
}
