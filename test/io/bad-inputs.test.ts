/**
 * Bad-input corpus (test/io/bad-inputs, made by make_bad_inputs.py): every defective matrix
 * file and DOF map must raise an InputError whose one-line message names the file and the
 * line of the defect. The defects follow the NIST Matrix Market rules (Boisvert, Pozo &
 * Remington, NISTIR 5935; docs/sources.md §4 [C]) plus our K/M policy (§4 [CP]).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readMatrixMarket, readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { readDofMap } from '../../src/io/dof-map-reader.js';
import { oneLineMessage } from '../../src/io/errors.js';
import { caught } from './caught-input-error.js';

const here = dirname(fileURLToPath(import.meta.url));
const corpus = join(here, 'bad-inputs');
const good = join(here, 'good-inputs');
interface Case { file: string; kind: 'matrix' | 'dofmap'; line: number; says: string }
const cases = JSON.parse(readFileSync(join(corpus, 'manifest.json'), 'utf8')) as Case[];


describe('bad-input corpus', () => {
  it('holds at least 25 distinct defective matrix files and lists every file', () => {
    const files = readdirSync(corpus).filter((f) => !f.endsWith('.py') && f !== 'manifest.json');
    expect(new Set(files)).toEqual(new Set(cases.map((c) => c.file)));
    expect(cases.filter((c) => c.kind === 'matrix').length).toBeGreaterThanOrEqual(25);
  });

  it.each(cases)('$file → InputError at line $line', async (c) => {
    const path = join(corpus, c.file);
    const e = await caught(c.kind === 'matrix' ? readMatrixMarket(path) : readDofMap(path, 3));
    expect(e.file).toBe(path);
    expect(e.line).toBe(c.line);
    const msg = oneLineMessage(e);
    expect(msg.startsWith(`${path}:${c.line}: `)).toBe(true);
    expect(msg).not.toMatch(/\n/);
    expect(msg).toContain(c.says);
  });

  it('K and M of different sizes: error names both files, at the size line of M', async () => {
    const k = join(good, 'k3.mtx');
    const m = join(good, 'm2.mtx');
    const e = await caught(readStiffnessAndMass(k, m));
    expect(e.file).toBe(m);
    expect(e.line).toBe(2);
    expect(e.message).toContain(k);
  });

  it('a missing file is an InputError, not a crash', async () => {
    const e = await caught(readMatrixMarket(join(corpus, 'does-not-exist.mtx')));
    expect(e.message).toContain('cannot be read');
  });
});
