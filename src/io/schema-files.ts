/**
 * The JSON Schemas of rules/schema/ that files are checked against, each read and parsed once per
 * process. Kept apart from config-loader.ts (which loads the YAML parser) so a rule may take a
 * shared definition from them cheaply.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { packageRoot } from './package-root.js';

export const FILE_SCHEMAS = ['config.schema.json', 'rule-set.schema.json'] as const;

const schemaFiles = new Map<string, object>();

/** A schema of rules/schema/, parsed (read once; a rule set is checked once per model that names it). */
export function fileSchema(file: (typeof FILE_SCHEMAS)[number]): object {
  let schema = schemaFiles.get(file);
  if (!schema) schemaFiles.set(file, (schema = JSON.parse(readFileSync(join(packageRoot(), 'rules', 'schema', file), 'utf8')) as object));
  return schema;
}

/** A definition of the config schema's `$defs` (e.g. `nodeRegion`, the place selectors). */
export function configSchemaDefinition(name: string): object {
  const defs = (fileSchema('config.schema.json') as { $defs?: Record<string, object> }).$defs;
  const d = defs?.[name];
  if (!d) throw new Error(`config.schema.json has no $defs.${name}`);
  return d;
}
