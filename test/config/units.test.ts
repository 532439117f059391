/** `units:` in the config: top level for every model, a model's own keys over it, none when absent. */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { loadConfig } from '../../src/pipeline/load-config.js';

const models = resolve(import.meta.dirname, 'models');
let work: string;
beforeAll(() => (work = mkdtempSync(join(tmpdir(), 'modalgate-units-config-'))));
afterAll(() => rmSync(work, { recursive: true, force: true }));

function load(text: string) {
  const file = join(work, 'modalgate.yaml');
  writeFileSync(file, text);
  return loadConfig(file);
}

const model = (name: string, extra = '') => `  - { name: ${name}, stiffness: ${models}/tiny.stiffness.mtx, mass: ${models}/tiny.mass.mtx, ruleSets: [free-free]${extra} }\n`;

it('top-level units reach every model; a model overrides key by key', () => {
  const c = load(`units: { length: m, mass: t, massScale: 1000 }\nmodels:\n${model('a')}${model('b', ', units: { length: mm }')}${model('c', ', units: { mass: kg, massScale: 1 }')}`);
  expect(c.models.map((m) => m.units)).toEqual([
    { length: 'm', mass: 't', massScale: 1000 },
    { length: 'mm', mass: 't', massScale: 1000 },
    { length: 'm', mass: 'kg', massScale: 1 },
  ]);
});

it('without units no model has any (the output stays in the model units, unnamed)', () => {
  const c = load(`models:\n${model('a')}${model('b', ', units: { mass: t, massScale: 1000 }')}`);
  expect(c.models[0]).not.toHaveProperty('units');
  expect(c.models[1].units).toEqual({ mass: 't', massScale: 1000 });
});
