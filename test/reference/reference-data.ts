/**
 * Reference data committed with the project (see test/reference/README.md for sources and licences):
 * the Harwell–Boeing BCSSTRUC stiffness/mass pairs (public domain, NIST Matrix Market) with their
 * SciPy reference eigenvalues, and the public JUnit XML schemas.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gunzipSync } from 'node:zlib';

export const referenceDir = path.resolve(import.meta.dirname);
export const structuralDir = path.join(referenceDir, 'structural');
export const junitSchemaDir = path.join(referenceDir, 'junit');

export interface StructuralPair {
  name: string;
  K_file: string;
  M_file: string;
  n: number;
  eigenvalues: number[];
  [key: string]: unknown;
}

/** The gzipped Matrix Market file of a matrix named in reference-eigenvalues.json (`bcsstk01.mtx`). */
export function structuralFile(name: string): string {
  return path.join(structuralDir, name.endsWith('.gz') ? name : `${name}.gz`);
}

/** reference-eigenvalues.json: lowest 20 eigenvalues per pair (SciPy ARPACK eigsh, shift-invert). */
export function structuralPairs(): StructuralPair[] {
  const text = gunzipSync(readFileSync(path.join(structuralDir, 'reference-eigenvalues.json.gz'))).toString('utf8');
  return (JSON.parse(text) as { pairs: StructuralPair[] }).pairs;
}
