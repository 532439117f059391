/**
 * Write the models of tet-reference-models.ts as Matrix Market files (and DOF maps) for
 * make_tet_reference.py:
 *   npm run build && node dist/test/reference/write-tet-reference-models.js /tmp/tet-reference
 */
import { mkdirSync } from 'node:fs';
import { writeGeneratedModel } from '../../fixtures/generator/write-model.js';
import { TET_REFERENCE_MODELS } from './tet-reference-models.js';

const dir = process.argv[2] ?? '/tmp/tet-reference';
mkdirSync(dir, { recursive: true });
for (const m of TET_REFERENCE_MODELS) {
  const model = m.build();
  await writeGeneratedModel(model, dir, m.name);
  console.log(`${m.name}: ${model.stiffness.n} DOFs, ${model.stiffness.colPtr[model.stiffness.n]} stored entries of K`);
}
