/**
 * Turn JSON Schema validation errors (ajv) into one plain sentence and a path inside the file
 * written the way a user reads it: `models[1].rules.first-elastic-frequency.minHz: must be a number`.
 */
import type { ErrorObject } from 'ajv';

const typeWords: Record<string, string> = {
  number: 'a number',
  integer: 'a whole number',
  string: 'a string',
  boolean: 'true or false',
  array: 'a list',
  object: 'a mapping of keys to values',
  null: 'null',
};

/** `/models/1/rules/x` → `models[1].rules.x`, prefixed by `base` when given. */
function readablePath(pointer: string, base = ''): string {
  let out = base;
  for (const raw of pointer.split('/').slice(1)) {
    const seg = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (/^\d+$/.test(seg)) out += `[${seg}]`;
    else out += out === '' ? seg : `.${seg}`;
  }
  return out;
}

/** The most useful single error of an ajv run: the deepest one that is not a combinator summary. */
export function pickError(errors: ErrorObject[]): ErrorObject {
  const concrete = errors.filter((e) => e.keyword !== 'anyOf' && e.keyword !== 'oneOf' && e.keyword !== 'if');
  const pool = concrete.length > 0 ? concrete : errors;
  return pool.reduce((a, b) => (b.instancePath.length > a.instancePath.length ? b : a));
}

/** Sentence and location of one ajv error. `base` prefixes the location (e.g. `models[0].rules.x`). */
export function describeSchemaError(e: ErrorObject, base = '', allErrors: ErrorObject[] = [e]): { where: string; reason: string } {
  const where = readablePath(e.instancePath, base);
  const p = e.params as Record<string, unknown>;
  const join = (w: string, k: string) => (w === '' ? k : `${w}.${k}`);
  switch (e.keyword) {
    case 'type': {
      const types = String(p.type).split(',');
      return { where, reason: `must be ${types.map((t) => typeWords[t] ?? t).join(' or ')}` };
    }
    case 'required': {
      const alternatives = allErrors.filter((x) => x.keyword === 'required' && x.instancePath === e.instancePath).map((x) => String((x.params as { missingProperty: string }).missingProperty));
      if (alternatives.length > 1) return { where, reason: `must set one of ${alternatives.join(', ')}` };
      return { where: join(where, String(p.missingProperty)), reason: 'is required' };
    }
    case 'additionalProperties':
      return { where: join(where, String(p.additionalProperty)), reason: 'is not a known key here' + allowedKeys(e) };
    case 'enum':
      return { where, reason: `must be one of: ${(p.allowedValues as unknown[]).map((v) => String(v)).join(', ')}` };
    case 'const':
      return { where, reason: `must be ${String(p.allowedValue)}` };
    case 'minimum':
      return { where, reason: `must be at least ${String(p.limit)}` };
    case 'maximum':
      return { where, reason: `must be at most ${String(p.limit)}` };
    case 'exclusiveMinimum':
      return { where, reason: `must be greater than ${String(p.limit)}` };
    case 'exclusiveMaximum':
      return { where, reason: `must be less than ${String(p.limit)}` };
    case 'minItems':
      return { where, reason: `must list at least ${String(p.limit)} item(s)` };
    case 'minLength':
      return { where, reason: 'must not be empty' };
    case 'pattern':
      return { where, reason: `must match the pattern ${String(p.pattern)} (letters, digits, '.', '_' and '-', starting with a letter or digit)` };
    case 'uniqueItems':
      return { where, reason: 'must not list the same item twice' };
    default:
      return { where, reason: e.message ?? 'is not valid' };
  }
}

function allowedKeys(e: ErrorObject): string {
  const props = (e.parentSchema as { properties?: Record<string, unknown> } | undefined)?.properties;
  if (!props) return '';
  const keys = Object.keys(props).filter((k) => k !== '$schema');
  return keys.length > 0 ? ` (known keys: ${keys.join(', ')})` : '';
}
