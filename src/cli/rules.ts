/**
 * `modalgate rules`: every rule with its description, inputs, options and defaults, and the
 * built-in rule sets. `--json` prints the same as JSON (for editors and scripts).
 */
import { readFileSync } from 'node:fs';
import type { Command } from 'commander';
import { builtInRules, type AnyRule } from '../rules/registry.js';
import { builtInRuleSetNames, resolveRuleSetPath } from '../io/config-loader.js';
import { readStructuredFile } from '../io/config-loader.js';
import { packageRoot } from '../io/package-root.js';
import { runAction } from './run-action.js';

interface OptionRow {
  name: string;
  type: string;
  required: boolean;
  default?: unknown;
  description?: string;
}

export function registerRules(program: Command): void {
  program
    .command('rules')
    .description('list every rule with its options and defaults, and the built-in rule sets')
    .option('--json', 'print as JSON')
    .action(
      runAction((opts: { json?: boolean }) => {
        process.stdout.write(opts.json ? `${JSON.stringify(rulesAsJson(), null, 2)}\n` : formatRules());
        return 0;
      }),
    );
}

function optionRows(rule: AnyRule): OptionRow[] {
  const schema = rule.optionsSchema as { properties?: Record<string, Record<string, unknown>>; required?: string[]; anyOf?: { required: string[] }[] };
  const required = new Set(schema.required ?? []);
  const defaults = rule.defaults as Record<string, unknown>;
  return Object.entries(schema.properties ?? {}).map(([name, p]) => ({
    name,
    type: describeType(p),
    required: required.has(name),
    default: defaults[name],
    description: typeof p.description === 'string' ? p.description : undefined,
  }));
}

function describeType(p: Record<string, unknown>): string {
  if (Array.isArray(p.enum)) return (p.enum as unknown[]).join(' | ');
  const bounds: string[] = [];
  if (p.minimum !== undefined) bounds.push(`≥ ${String(p.minimum)}`);
  if (p.exclusiveMinimum !== undefined) bounds.push(`> ${String(p.exclusiveMinimum)}`);
  if (p.exclusiveMaximum !== undefined) bounds.push(`< ${String(p.exclusiveMaximum)}`);
  const t = p.type === 'array' ? 'list' : String(p.type ?? 'any');
  return bounds.length ? `${t} ${bounds.join(', ')}` : t;
}

/** 1e-6 rather than 0.000001: defaults read the way docs/sources.md and rules/README.md write them. */
function showDefault(v: unknown): string {
  if (typeof v === 'number' && v !== 0 && (Math.abs(v) < 1e-3 || Math.abs(v) >= 1e6)) return v.toExponential().replace('e+', 'e');
  return JSON.stringify(v);
}

export function formatRules(): string {
  const out: string[] = ['Rules (set per model or in a rule set: severity error | warning | off, plus options):', ''];
  for (const rule of builtInRules) {
    out.push(`${rule.id}`);
    out.push(`  ${rule.description}`);
    if (rule.needs.length) out.push(`  needs: ${rule.needs.join(', ')}`);
    const rows = optionRows(rule);
    const anyOf = (rule.optionsSchema as { anyOf?: { required: string[] }[] }).anyOf;
    if (anyOf) out.push(`  set one of: ${anyOf.map((a) => a.required.join(' + ')).join(', ')}`);
    const w = Math.max(0, ...rows.map((r) => r.name.length));
    const tw = Math.max(0, ...rows.map((r) => r.type.length));
    for (const r of rows) {
      const def = r.required ? 'required' : r.default === undefined ? 'no default' : `default ${showDefault(r.default)}`;
      out.push(`    ${r.name.padEnd(w)}  ${r.type.padEnd(tw)}  ${def}`);
    }
    out.push('');
  }
  out.push('Built-in rule sets (ruleSets: [name] in the config; see rules/README.md for every default and its source):');
  for (const name of builtInRuleSetNames()) out.push(`  ${name.padEnd(14)} ${ruleSetDescription(name)}`);
  out.push('');
  return `${out.join('\n')}\n`;
}

function ruleSetDescription(name: string): string {
  const p = resolveRuleSetPath(name, packageRoot());
  if (!p) return '';
  const raw = readStructuredFile(p) as { description?: string };
  return (raw.description ?? '').replace(/\s+/g, ' ').trim();
}

function rulesAsJson(): unknown {
  return {
    rules: builtInRules.map((r) => ({ id: r.id, description: r.description, needs: r.needs, optionsSchema: r.optionsSchema, defaults: r.defaults })),
    ruleSets: builtInRuleSetNames().map((name) => {
      const p = resolveRuleSetPath(name, packageRoot());
      return { name, file: p, content: p ? readFileSync(p, 'utf8') : null };
    }),
  };
}
