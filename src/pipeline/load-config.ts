/**
 * A config turned into model jobs: paths resolved relative to the config file, rule sets loaded,
 * and each rule's options merged (rule defaults ← rule sets in order ← `defaults.rules` ← the
 * model's `rules`), every layer validated against the rule's own options schema (the rule
 * registry's). Reading and schema-checking the files is io's (src/io/config-loader.ts).
 * Every defect is an InputError naming the file and the path inside it.
 */
import { existsSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import { InputError } from '../io/errors.js';
import { schemaValidator } from '../io/schema-validator.js';
import { describeSchemaError, pickError } from '../io/config-errors.js';
import { builtInRuleSetNames, checkWritableTarget, namesRuleSetFile, readConfigFile, readRuleSetFile, resolveRuleSetPath } from '../io/config-loader.js';
import type { RawConfig, RawModelConfig, RawRuleEntry } from '../io/config-types.js';
import { builtInRules, findRule, ruleIds, type AnyRule } from '../rules/registry.js';
import type { ResolvedRule } from '../rules/engine.js';
import type { Severity } from '../rules/rule-types.js';
import { DEFAULT_MODE_COUNT, type BaselineJob, type LoadedConfig, type ModelJob } from './job-types.js';

const SEVERITIES: Severity[] = ['error', 'warning', 'off'];

/** Command-line settings that override the config: baseline directories (absolute). */
export interface ConfigOverrides {
  baselineDir?: string;
  saveBaselineDir?: string;
  /** --max-memory, bytes, handed to every model's solve. */
  memoryLimitBytes?: number;
}

/** Load, validate and resolve the config at `path`. */
export function loadConfig(path: string, overrides: ConfigOverrides = {}): LoadedConfig {
  return resolveConfig(readConfigFile(path), path, overrides);
}

/**
 * Resolve a config already read and schema-checked (checkConfigObject): relative paths from the
 * folder of `path`, which also names the config in errors.
 */
export function resolveConfig(config: RawConfig, path: string, overrides: ConfigOverrides = {}): LoadedConfig {
  const dir = dirname(path);
  const reports = {
    junit: reportPath(config.reports?.junit, dir, path, 'reports.junit'),
    json: reportPath(config.reports?.json, dir, path, 'reports.json'),
    html: reportPath(config.reports?.html, dir, path, 'reports.html'),
  };
  checkUniqueNames(config.models, path);
  const models = config.models.map((m, i) => resolveModel(config, m, i, path, dir, overrides));
  checkEveryModelHasRules(config, models, path);
  return { path, dir, reports, models };
}

function checkUniqueNames(models: RawModelConfig[], file: string): void {
  const seen = new Map<string, number>();
  models.forEach((m, i) => {
    const j = seen.get(m.name);
    if (j !== undefined) throw new InputError(file, `duplicate model name "${m.name}" (also models[${j}].name); names must be unique`, { where: `models[${i}].name` });
    seen.set(m.name, i);
  });
}

function reportPath(value: string | undefined, dir: string, file: string, where: string): string | undefined {
  if (value === undefined) return undefined;
  const p = resolve(dir, value);
  checkWritableTarget(p, file, where);
  return p;
}

function resolveModel(config: RawConfig, m: RawModelConfig, i: number, file: string, dir: string, overrides: ConfigOverrides = {}): ModelJob {
  const where = `models[${i}]`;
  const d = config.defaults ?? {};
  if (m.count !== undefined && m.maxHz !== undefined) throw new InputError(file, 'give either count or maxHz, not both', { where: `${where}.maxHz` });
  if (d.count !== undefined && d.maxHz !== undefined) throw new InputError(file, 'give either count or maxHz, not both', { where: 'defaults.maxHz' });
  const ownsForm = m.count !== undefined || m.maxHz !== undefined;
  const count = ownsForm ? m.count : d.count;
  const maxHz = ownsForm ? m.maxHz : d.maxHz;
  const ruleSets = m.ruleSets ?? d.ruleSets ?? [];
  const ruleSetWhere = m.ruleSets ? `${where}.ruleSets` : 'defaults.ruleSets';
  const baseline = resolveBaseline(config, m, where, file, dir, overrides);
  // a baseline to compare with turns on the regression rules (at their defaults) under every other layer
  const layers: RuleLayer[] = baseline?.compareDir !== undefined ? baselineRuleLayers(file) : [];
  ruleSets.forEach((name, k) => layers.push(...loadRuleSetLayers(name, dir, file, `${ruleSetWhere}[${k}]`)));
  if (d.rules) layers.push(...overrideLayers(d.rules, file, 'defaults.rules'));
  if (m.rules) layers.push(...overrideLayers(m.rules, file, `${where}.rules`));
  const job: ModelJob = {
    name: m.name,
    stiffnessPath: existingFile(m.stiffness, dir, file, `${where}.stiffness`),
    massPath: existingFile(m.mass, dir, file, `${where}.mass`),
    dofsPath: m.dofs !== undefined ? existingFile(m.dofs, dir, file, `${where}.dofs`) : undefined,
    solve: {
      count: count ?? (maxHz === undefined ? DEFAULT_MODE_COUNT : undefined),
      maxHz,
      method: m.method ?? d.method,
      tolerance: m.tolerance ?? d.tolerance,
      memoryLimitBytes: overrides.memoryLimitBytes,
    },
    rules: resolveRules(layers, file, `${where}.rules`),
    ruleSets,
    configPath: file,
    where,
    constraints: (m.constraints ?? []).map(({ dofsFile, ...set }, k) => {
      const dofsPath = dofsFile === undefined ? undefined : existingFile(dofsFile, dir, file, `${where}.constraints[${k}].dofsFile`);
      return { ...set, dofsPath };
    }),
    baseline,
  };
  const units = config.units || m.units ? { ...config.units, ...m.units } : undefined;
  if (units) job.units = units;
  return job;
}

/** A model that runs no rule would pass with "0/0 rules passed": refuse it instead. */
function checkEveryModelHasRules(config: RawConfig, models: ModelJob[], file: string): void {
  models.forEach((job, i) => {
    if (job.rules.length > 0) return;
    const listsSome = job.ruleSets.length > 0 || config.models[i].rules !== undefined || config.defaults?.rules !== undefined;
    throw new InputError(file, noRulesReason(job.name, listsSome), { where: job.where });
  });
}

function noRulesReason(model: string, listsSome: boolean): string {
  const why = listsSome ? 'its rule sets and rules leave every rule off' : 'it lists no rule sets and no rules (and defaults gives none)';
  return `model "${model}" has no rule to run: ${why}; a check without rules proves nothing, so add ruleSets (e.g. [supported] or [free-free]) or rules to it or to defaults`;
}

/** Top-level `baseline` merged with the model's own, paths resolved; command-line directories win. */
function resolveBaseline(config: RawConfig, m: RawModelConfig, where: string, file: string, dir: string, overrides: ConfigOverrides): BaselineJob | undefined {
  if (!config.baseline && !m.baseline && overrides.baselineDir === undefined && overrides.saveBaselineDir === undefined) return undefined;
  const { dir: rawDir, ...settings } = { ...config.baseline, ...m.baseline };
  const at = m.baseline?.dir !== undefined ? `${where}.baseline.dir` : 'baseline.dir';
  let compareDir = overrides.baselineDir;
  if (compareDir === undefined && rawDir !== undefined) {
    compareDir = resolve(dir, rawDir);
    // a missing directory is no error (the baseline rules skip with a warning); a file is
    if (existsSync(compareDir) && !statSync(compareDir).isDirectory()) throw new InputError(file, `baseline directory is a file: ${compareDir}`, { where: at });
  }
  return { ...settings, compareDir, saveDir: overrides.saveBaselineDir, where: m.baseline ? `${where}.baseline` : 'baseline' };
}

/** Every rule that needs a baseline, at severity error with its default options. */
function baselineRuleLayers(file: string): RuleLayer[] {
  return builtInRules.filter((r) => r.needs.includes('baseline')).map((r) => ({ ruleId: r.id, severity: 'error' as const, options: {}, file, where: 'baseline' }));
}

function existingFile(value: string, dir: string, file: string, where: string): string {
  const p = isAbsolute(value) ? value : resolve(dir, value);
  if (!existsSync(p)) throw new InputError(file, `file not found: ${p}`, { where });
  if (statSync(p).isDirectory()) throw new InputError(file, `${p} is a directory, not a file`, { where });
  return p;
}

/** One source of rule settings: where it was written and what it says. */
interface RuleLayer {
  ruleId: string;
  severity?: Severity;
  options: Record<string, unknown>;
  file: string;
  where: string;
}

function loadRuleSetLayers(name: string, dir: string, file: string, where: string): RuleLayer[] {
  const p = resolveRuleSetPath(name, dir);
  if (p === null) {
    const builtIn = namesRuleSetFile(name) ? `file not found: ${resolve(dir, name)}` : `unknown rule set "${name}" (built-in rule sets: ${builtInRuleSetNames().join(', ')}; or give a path to your own file)`;
    throw new InputError(file, builtIn, { where });
  }
  try {
    return overrideLayers(readRuleSetFile(p).rules, p, 'rules');
  } catch (e) {
    if (!(e instanceof InputError) || e.file === file) throw e;
    // name the config that pulled the rule set in, too
    throw new InputError(e.file, `${e.reason} (rule set listed at ${where} in ${file})`, { line: e.line, where: e.where });
  }
}

function overrideLayers(rules: Record<string, RawRuleEntry>, file: string, base: string): RuleLayer[] {
  return Object.entries(rules).map(([ruleId, entry]) => {
    const where = `${base}.${ruleId}`;
    const rule = findRule(ruleId);
    if (!rule) throw new InputError(file, `unknown rule "${ruleId}"${suggest(ruleId)} (run \`modalgate rules\` for the list)`, { where });
    if (typeof entry === 'string') {
      if (!SEVERITIES.includes(entry)) throw new InputError(file, `must be one of: ${SEVERITIES.join(', ')} (or a mapping of options)`, { where });
      return { ruleId, severity: entry, options: {}, file, where };
    }
    if (entry === null || typeof entry !== 'object' || Array.isArray(entry)) throw new InputError(file, `must be a severity (${SEVERITIES.join(', ')}) or a mapping of options`, { where });
    const { severity, ...options } = entry;
    if (severity !== undefined && !SEVERITIES.includes(severity)) throw new InputError(file, `must be one of: ${SEVERITIES.join(', ')}`, { where: `${where}.severity` });
    checkOptions(rule, options, false, file, where);
    return { ruleId, severity, options, file, where };
  });
}

/** Merge the layers of every mentioned rule, drop rules that end up `off`, validate the result. */
function resolveRules(layers: RuleLayer[], configFile: string, modelRulesWhere: string): ResolvedRule[] {
  const out: ResolvedRule[] = [];
  for (const rule of builtInRules) {
    const mine = layers.filter((l) => l.ruleId === rule.id);
    if (mine.length === 0) continue;
    let severity: Severity = 'error';
    let options: Record<string, unknown> = structuredClone(rule.defaults) as Record<string, unknown>;
    for (const l of mine) {
      if (l.severity !== undefined) severity = l.severity;
      options = mergeOptions(rule, options, l.options);
    }
    if (severity === 'off') continue;
    checkOptions(rule, options, true, configFile, `${modelRulesWhere}.${rule.id}`);
    out.push({ rule, severity, options });
  }
  return out;
}

/** upper wins; keys of an exclusive group that `upper` does not use are dropped when it uses another. */
function mergeOptions(rule: AnyRule, lower: Record<string, unknown>, upper: Record<string, unknown>): Record<string, unknown> {
  const merged = { ...lower };
  for (const group of rule.exclusiveOptions ?? []) {
    if (!group.some((k) => k in upper)) continue;
    for (const other of rule.exclusiveOptions ?? []) {
      if (other !== group) for (const k of other) delete merged[k];
    }
  }
  return { ...merged, ...upper };
}

/**
 * The schema a rule's options are checked against: its own (`complete`, the merged options), or,
 * for one layer of settings, the same without what only the merged options must meet (required
 * keys, anyOf/oneOf alternatives). `key` names its validator (io/schema-validator.ts).
 */
export function optionsSchemaFor(rule: AnyRule, complete: boolean): { key: string; schema: object } {
  const schema = { ...rule.optionsSchema };
  if (!complete) {
    delete schema.required;
    delete schema.anyOf;
    delete schema.oneOf;
  }
  return { key: `${complete ? 'options' : 'layer'}.${rule.id}`, schema };
}

/** Validate options with the rule's schema; `complete` false checks one layer (no required keys). */
function checkOptions(rule: AnyRule, options: Record<string, unknown>, complete: boolean, file: string, where: string): void {
  const { key, schema } = optionsSchemaFor(rule, complete);
  const validate = schemaValidator(key, schema);
  if (validate(options)) return;
  const errors = validate.errors ?? [];
  const { where: at, reason } = describeSchemaError(pickError(errors), where, errors);
  const hint = complete && errors.some((e) => e.keyword === 'required') ? ': set it in the config for this model (the rule set leaves it to you)' : '';
  throw new InputError(file, reason + hint, { where: at });
}

function suggest(id: string): string {
  let best = '';
  let bestDistance = Infinity;
  for (const known of ruleIds()) {
    const d = editDistance(id, known);
    if (d < bestDistance) {
      bestDistance = d;
      best = known;
    }
  }
  return bestDistance <= 3 ? ` (did you mean "${best}"?)` : '';
}

/** Levenshtein distance by the usual two-row dynamic programme. */
function editDistance(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  // row i holds distances from a[0..i) to every prefix of b
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) row[j] = Math.min(prev[j] + 1, row[j - 1] + 1, prev[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    prev = row;
  }
  return prev[b.length];
}

/** The jobs of the models named (all of them when none is named); an unknown name is an input error listing the known ones. */
export function selectModels(config: LoadedConfig, names: string[] | undefined): ModelJob[] {
  if (!names || names.length === 0) return config.models;
  const known = config.models.map((m) => m.name);
  for (const n of names) {
    if (!known.includes(n)) throw new InputError(config.path, `no model named ${n} (models: ${known.join(', ')})`);
  }
  return config.models.filter((m) => names.includes(m.name));
}
