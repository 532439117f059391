/**
 * JSON Schema validators for the config, rule-set files and rule options, without compiling a
 * schema on every run: `schema-validators.generated.ts` holds validators that ajv generated ahead
 * of time (its standalone code, `npm run validators`), each with the text of the schema it was
 * made from. A key whose schema still reads the same uses that code; one whose schema changed
 * since (or a key never generated) is compiled with ajv here, loaded only then. Either way the
 * validation is ajv's, with the same options; the ahead-of-time code only saves the compile
 * (about 0.2 s of CPU per run, ajv's own loading included).
 */
import { createRequire } from 'node:module';
import type { ValidateFunction } from 'ajv';
import { precompiledValidators } from './schema-validators.generated.js';

/** ajv's options for every schema of modalgate (the generator uses them too). */
export const AJV_OPTIONS = { allErrors: true, strict: false, verbose: true } as const;

interface Precompiled {
  /** JSON.stringify of the schema the code was generated from. */
  schema: string;
  validate: ValidateFunction;
}

const table = precompiledValidators as unknown as Record<string, Precompiled | undefined>;
const ready = new Map<string, ValidateFunction>();

/** The validator of `schema`, named `key` (`config`, `rule-set`, `options.<rule>`, `layer.<rule>`). */
export function schemaValidator(key: string, schema: object): ValidateFunction {
  let v = ready.get(key);
  if (!v) {
    const pre = table[key];
    v = pre && pre.schema === JSON.stringify(schema) ? pre.validate : compileNow(schema);
    ready.set(key, v);
  }
  return v;
}

/** Whether `key` would use ahead-of-time code for `schema` (for the test that keeps the file current). */
export function isPrecompiled(key: string, schema: object): boolean {
  return table[key]?.schema === JSON.stringify(schema);
}

type AjvLike = { compile(schema: object): ValidateFunction };
let ajv: AjvLike | undefined;

function compileNow(schema: object): ValidateFunction {
  if (!ajv) {
    // ajv is CommonJS: required on first need, so a run with current code never loads it
    const { Ajv2020 } = createRequire(import.meta.url)('ajv/dist/2020.js') as { Ajv2020: new (o: typeof AJV_OPTIONS) => AjvLike };
    ajv = new Ajv2020(AJV_OPTIONS);
  }
  return ajv.compile(schema);
}
