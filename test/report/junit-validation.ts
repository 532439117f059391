/**
 * Validation of JUnit XML against the lenient JUnit schema junit-10.xsd (source: repository
 * jenkinsci/xunit-plugin, MIT; committed in test/reference/junit, see test/reference/README.md):
 * with libxml2's xmllint (as WebAssembly, npm xmllint-wasm), and with a structural check written
 * from that XSD (allowed elements and attributes, required attributes, the SUREFIRE_TIME decimal
 * pattern) plus our emission profile (properties first, timestamp without zone; docs/sources.md).
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { XMLParser } from 'fast-xml-parser';
import { validateXML } from 'xmllint-wasm';

export const repoRoot = resolve(import.meta.dirname, '../..');
export const junitXsd = join(repoRoot, 'test', 'reference', 'junit', 'junit-10.xsd');

/**
 * `xmllint --schema junit-10.xsd`, run by libxml2's own xmllint compiled to WebAssembly (npm
 * package xmllint-wasm, a devDependency), so the check runs the same on every machine.
 */
export async function xmllintValidate(xml: string): Promise<{ ok: boolean; output: string }> {
  const r = await validateXML({ xml: [{ fileName: 'junit.xml', contents: xml }], schema: [{ fileName: 'junit-10.xsd', contents: readFileSync(junitXsd, 'utf8') }] });
  return { ok: r.valid, output: r.rawOutput };
}

// junit-10.xsd: simpleType SUREFIRE_TIME
const SUREFIRE_TIME = /^(([0-9]{0,3},)*[0-9]{3}|[0-9]{0,3})*(\.[0-9]{0,3})?$/;

const ATTRS: Record<string, { allowed: string[]; required: string[]; children: string[] }> = {
  testsuites: { allowed: ['name', 'time', 'tests', 'failures', 'errors'], required: [], children: ['testsuite'] },
  testsuite: {
    allowed: ['name', 'tests', 'failures', 'errors', 'group', 'time', 'skipped', 'timestamp', 'hostname', 'id', 'package', 'file', 'log', 'url', 'version'],
    required: ['name', 'tests', 'failures', 'errors'],
    children: ['testsuite', 'properties', 'testcase', 'system-out', 'system-err'],
  },
  properties: { allowed: [], required: [], children: ['property'] },
  property: { allowed: ['name', 'value'], required: ['name', 'value'], children: [] },
  testcase: { allowed: ['name', 'time', 'classname', 'group'], required: ['name'], children: ['skipped', 'error', 'failure', 'rerunFailure', 'rerunError', 'flakyFailure', 'flakyError', 'system-out', 'system-err'] },
  failure: { allowed: ['type', 'message'], required: [], children: [] },
  error: { allowed: ['type', 'message'], required: [], children: [] },
  skipped: { allowed: ['type', 'message'], required: [], children: [] },
  'system-out': { allowed: [], required: [], children: [] },
  'system-err': { allowed: [], required: [], children: [] },
};

type Ordered = Record<string, unknown> & { ':@'?: Record<string, string> };

/** Problems found by the structural check (empty = valid). */
export function structuralProblems(xml: string): string[] {
  const problems: string[] = [];
  // characters outside XML 1.0 Char (W3C XML 1.0 §2.2) must not appear at all
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/.test(xml)) problems.push('illegal XML 1.0 character present');
  const doc = new XMLParser({ preserveOrder: true, ignoreAttributes: false, attributeNamePrefix: '', parseAttributeValue: false, parseTagValue: false }).parse(xml) as Ordered[];
  const roots = doc.filter((n) => !('?xml' in n));
  if (roots.length !== 1 || !('testsuites' in roots[0])) return [...problems, 'root element must be testsuites'];
  walk(roots[0], 'testsuites', problems);
  return problems;
}

function walk(node: Ordered, name: string, problems: string[]): void {
  const spec = ATTRS[name];
  if (!spec) return void problems.push(`element ${name} is not in junit-10.xsd`);
  const attrs = node[':@'] ?? {};
  for (const a of Object.keys(attrs)) if (!spec.allowed.includes(a)) problems.push(`${name}@${a} is not allowed`);
  for (const a of spec.required) if (!(a in attrs)) problems.push(`${name}@${a} is required`);
  if ('time' in attrs && (name === 'testsuite' || name === 'testsuites') && !SUREFIRE_TIME.test(attrs.time)) problems.push(`${name}@time "${attrs.time}" does not match SUREFIRE_TIME`);
  if (name === 'testsuite' && 'timestamp' in attrs && !/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d$/.test(attrs.timestamp)) problems.push(`testsuite@timestamp "${attrs.timestamp}" is not YYYY-MM-DDThh:mm:ss`);
  const children = (node[name] as Ordered[]) ?? [];
  const elements = children.filter((c) => !('#text' in c));
  if (name === 'testsuite') {
    const firstProps = elements.findIndex((c) => 'properties' in c);
    if (firstProps > 0) problems.push('testsuite: properties must come first');
  }
  for (const c of elements) {
    const childName = Object.keys(c).find((k) => k !== ':@')!;
    if (!spec.children.includes(childName)) problems.push(`${childName} is not allowed inside ${name}`);
    else walk(c, childName, problems);
  }
}
