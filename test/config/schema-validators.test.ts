/**
 * The ahead-of-time schema validators (src/io/schema-validators.generated.ts, written by
 * make-schema-validators.ts): the committed file is what the generator makes from today's schemas,
 * so no run compiles a schema; and a schema that changed after generation is compiled at run
 * time instead of being checked by stale code.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { isPrecompiled, schemaValidator } from '../../src/io/schema-validator.js';
import { GENERATED_PATH, schemaValidatorsSource, validatedSchemas } from './make-schema-validators.js';

const repoRoot = join(import.meta.dirname, '../..');

describe('ahead-of-time schema validators', () => {
  it('the committed module is current (else run `npm run validators`)', () => {
    const stale = validatedSchemas().filter(({ key, schema }) => !isPrecompiled(key, schema)).map((s) => s.key);
    expect(stale, 'schemas changed since src/io/schema-validators.generated.ts was written: run `npm run validators`').toEqual([]);
    expect(readFileSync(join(repoRoot, GENERATED_PATH), 'utf8') === schemaValidatorsSource(), 'run `npm run validators`').toBe(true);
  });

  it('a schema that no longer reads as generated is compiled now, and validates', () => {
    const [first] = validatedSchemas().filter((s) => s.key.startsWith('options.'));
    const changed = { ...first.schema, properties: { ...(first.schema as { properties?: object }).properties, extra: { type: 'number' } } };
    expect(isPrecompiled(first.key, first.schema)).toBe(true);
    expect(isPrecompiled(first.key, changed)).toBe(false);
    const validate = schemaValidator(`${first.key}.changed`, changed);
    expect(validate({ extra: 'no' })).toBe(false);
    expect(validate.errors?.[0]).toMatchObject({ keyword: 'type', instancePath: '/extra' });
  });
});
