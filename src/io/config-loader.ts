/**
 * Config and rule-set files: find the config, parse YAML or JSON, validate against the JSON
 * Schemas of rules/schema/. Every defect is an InputError naming the file and the path inside it.
 * Turning a parsed config into model jobs (rule sets, rule options, paths) is the pipeline's
 * (src/pipeline/load-config.ts).
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { parseDocument } from 'yaml';
import { InputError } from './errors.js';
import { packageRoot } from './package-root.js';
import { describeSchemaError, pickError } from './config-errors.js';
import { CONFIG_FILE_NAMES, type RawConfig, type RawRuleSet } from './config-types.js';
import { schemaValidator } from './schema-validator.js';

export { FILE_SCHEMAS, fileSchema } from './schema-files.js';
import { FILE_SCHEMAS, fileSchema } from './schema-files.js';

/** The config path: `explicit` if given (must exist), else the first of modalgate.yaml/.yml/.json in `cwd`. */
export function findConfig(explicit: string | undefined, cwd: string = process.cwd()): string {
  if (explicit !== undefined) {
    const p = resolve(cwd, explicit);
    if (!existsSync(p)) throw new InputError(p, 'config file not found');
    if (statSync(p).isDirectory()) throw new InputError(p, 'is a directory, not a config file');
    return p;
  }
  for (const name of CONFIG_FILE_NAMES) {
    const p = join(cwd, name);
    if (existsSync(p)) return p;
  }
  throw new InputError(join(cwd, CONFIG_FILE_NAMES[0]), `no config found in ${cwd} (looked for ${CONFIG_FILE_NAMES.join(', ')}); run \`modalgate init\` to write one, or pass --config`);
}

/** Largest config or rule-set file read (a real one is a few kB). */
const CONFIG_MAX_BYTES = 16 * 2 ** 20;

/** Parse a YAML or JSON file into a plain value (JSON is YAML, but JSON files get JSON's errors). */
export function readStructuredFile(path: string): unknown {
  let text: string;
  try {
    // only regular files of bounded size: /dev/zero or a FIFO would never end
    const st = statSync(path);
    if (!st.isFile()) throw new InputError(path, 'is not a regular file (a config must be a YAML or JSON file)');
    if (st.size > CONFIG_MAX_BYTES) throw new InputError(path, `is ${st.size} bytes; a config file may hold at most ${CONFIG_MAX_BYTES / 2 ** 20} MiB`);
    text = readFileSync(path, 'utf8');
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(path, `cannot be read (${(e as NodeJS.ErrnoException).code ?? 'I/O error'})`);
  }
  if (path.endsWith('.json')) {
    try {
      return JSON.parse(text) as unknown;
    } catch (e) {
      throw new InputError(path, `is not valid JSON: ${(e as Error).message}`);
    }
  }
  const doc = parseDocument(text, { prettyErrors: true, uniqueKeys: true });
  if (doc.errors.length > 0) {
    const err = doc.errors[0];
    const line = err.linePos?.[0]?.line;
    const first = err.message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '');
    throw new InputError(path, `is not valid YAML: ${first}`, { line });
  }
  try {
    return doc.toJS() as unknown;
  } catch (e) {
    // e.g. "Excessive alias count": aliases expanding to a huge document
    throw new InputError(path, `is not a usable YAML document: ${(e as Error).message}`);
  }
}

/** The config at `path`, parsed and checked against rules/schema/config.schema.json. */
export function readConfigFile(path: string): RawConfig {
  return checkConfigObject(readStructuredFile(path), path);
}

/** A parsed config (from a file or built in code), checked against rules/schema/config.schema.json; `file` names it in errors. */
export function checkConfigObject(raw: unknown, file: string): RawConfig {
  validateAgainst('config.schema.json', raw, file, '');
  return raw as RawConfig;
}

/** A rule-set file, parsed and checked against rules/schema/rule-set.schema.json. */
export function readRuleSetFile(path: string): RawRuleSet {
  const raw = readStructuredFile(path);
  validateAgainst('rule-set.schema.json', raw, path, '');
  return raw as RawRuleSet;
}

function validateAgainst(schemaFile: (typeof FILE_SCHEMAS)[number], value: unknown, file: string, base: string): void {
  const validate = schemaValidator(schemaFile, fileSchema(schemaFile));
  if (value === null || value === undefined) throw new InputError(file, 'is empty: expected a mapping of keys to values');
  if (validate(value)) return;
  const errors = validate.errors ?? [];
  const e = pickError(errors);
  const { where, reason } = describeSchemaError(e, base, errors);
  throw new InputError(file, reason, { where });
}

/** A report target must not be a directory, and its nearest existing ancestor must be a directory. */
export function checkWritableTarget(p: string, file: string, where?: string): void {
  if (existsSync(p) && statSync(p).isDirectory()) throw new InputError(file, `report path ${p} is a directory; give a file name`, { where });
  let up = dirname(p);
  // climb to the first existing ancestor
  while (!existsSync(up) && dirname(up) !== up) up = dirname(up);
  if (!statSync(up).isDirectory()) throw new InputError(file, `report path ${p} is inside ${up}, which is a file, not a folder`, { where });
}

/** A built-in name (rules/<name>.yaml) or a path relative to the config. */
/** A rule-set name that is a file path (a folder separator or a YAML/JSON extension), not a built-in name. */
export function namesRuleSetFile(name: string): boolean {
  return /[\\/]/.test(name) || /\.(ya?ml|json)$/.test(name);
}

export function resolveRuleSetPath(name: string, dir: string): string | null {
  if (namesRuleSetFile(name)) {
    const p = resolve(dir, name);
    return existsSync(p) ? p : null;
  }
  const p = join(packageRoot(), 'rules', `${name}.yaml`);
  return existsSync(p) ? p : null;
}

export function builtInRuleSetNames(): string[] {
  return ['free-free', 'supported', 'handoff-audit'];
}
