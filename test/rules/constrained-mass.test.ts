/**
 * With constraint sets, the report states both sizes and both masses: DOFs exported and solved
 * (console header, JSON stats), the total mass of the whole export and the mass on the kept DOFs
 * (total-mass, mass-participation), and the note that mass at DOFs removed before export is not
 * counted. Model: the generator's free-free lattice tower (fixtures/generator/mast.ts), clamped
 * at its three base nodes by a constraint set.
 * References: the export's mass is the generator's Σ ρ·A·L + point masses (exact for beam mass
 * matrices that integrate ρ over rigid fields, [CP]); the kept mass is rᵀMr over the kept
 * translational DOFs of each direction, summed here straight from the matrix.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildMast } from '../../fixtures/generator/mast.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { writeGeneratedModel } from '../../fixtures/generator/write-model.js';
import { runCheck } from '../../src/cli/check.js';

let work: string;
let tower: GeneratedModel;
let printed = '';
let code: number;
let report: { models: { stats: { dofs: number; solvedDofs: number }; rules: { ruleId: string; status: string; message: string; details: Record<string, number> }[] }[] };

/** Σ M_ij over kept translational DOFs i, j of direction c (rᵀMr of a unit translation). */
function keptTranslationMass(t: GeneratedModel, kept: (i: number) => boolean, c: number): number {
  const m = t.mass;
  const comp = t.dofMap.component;
  let s = 0;
  for (let j = 0; j < m.n; j++) {
    for (let p = m.colPtr[j]; p < m.colPtr[j + 1]; p++) {
      const i = m.rowIdx[p];
      if (comp[i] === c && comp[j] === c && kept(i) && kept(j)) s += i === j ? m.values[p] : 2 * m.values[p];
    }
  }
  return s;
}

const base = () => tower.nodeSets.base;
const isKept = (i: number) => !base().includes(tower.dofMap.node[i]);
const keptDofs = () => Array.from({ length: tower.dofMap.n }, (_, i) => i).filter(isKept).length;

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'modalgate-kept-mass-'));
  tower = buildMast({ base: 'free', panels: 4 });
  await writeGeneratedModel(tower, work, 'tower');
  const config = join(work, 'modalgate.yaml');
  writeFileSync(
    config,
    `models:
  - name: tower
    stiffness: tower.stiffness.mtx
    mass: tower.mass.mtx
    dofs: tower.dofs.csv
    count: 8
    constraints:
      - { name: base clamp, nodes: [${base().join(', ')}], components: [all] }
    ruleSets: [supported]
    rules:
      first-elastic-frequency: { minHz: 0.1 }
      total-mass: { expected: ${tower.structuralMassKg}, tolerancePercent: 0.01 }
      mass-participation: { minFraction: 0.01 }
`,
  );
  const out = await runCheck({ config, json: join(work, 'r.json'), print: (t) => (printed += t), printError: () => {} });
  code = out.code;
  report = JSON.parse(readFileSync(join(work, 'r.json'), 'utf8'));
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('constraint sets: exported and solved, export mass and kept mass', () => {
  it('passes, and the header states exported and solved DOFs', () => {
    expect(code).toBe(0);
    const n = tower.stiffness.n;
    expect(keptDofs()).toBe(n - 6 * base().length);
    expect(report.models[0].stats).toMatchObject({ dofs: n, solvedDofs: keptDofs() });
    expect(printed).toMatch(new RegExp(`tower\\s+${n} DOFs exported, ${keptDofs()} solved\\s+8 modes`));
  });
  it('total-mass reports the export mass, the kept mass beside it, and the note', () => {
    const r = report.models[0].rules.find((x) => x.ruleId === 'total-mass')!;
    const kept = [0, 1, 2].map((c) => keptTranslationMass(tower, isKept, c)).reduce((a, b) => a + b) / 3;
    expect(r.status).toBe('pass');
    expect(Math.abs(r.details.totalMass - tower.structuralMassKg) / tower.structuralMassKg).toBeLessThan(1e-9);
    expect(Math.abs(r.details.keptMass - kept) / kept).toBeLessThan(1e-9);
    expect(r.details.keptMass).toBeLessThan(r.details.totalMass);
    expect(r.details).toMatchObject({ keptDofs: keptDofs(), exportedDofs: tower.stiffness.n });
    const f = (x: number) => String(Number(x.toPrecision(4)));
    expect(r.message).toMatch(new RegExp(`^total mass ${f(r.details.totalMass)} of the export \\(${f(kept)} on the ${keptDofs()} solved DOFs, which mass participation uses\\) is within 0\\.01 % of the expected .*; mass at DOFs removed before export is not counted\\.$`));
  });
  it('mass-participation says which mass its fractions are of', () => {
    const r = report.models[0].rules.find((x) => x.ruleId === 'mass-participation')!;
    expect(r.status).toBe('pass');
    const f = (x: number) => String(Number(x.toPrecision(4)));
    expect(r.message).toContain(`(fractions of the mass on the ${keptDofs()} solved DOFs, ${f(r.details.keptMass)}; the whole export of ${tower.stiffness.n} DOFs has ${f(r.details.exportMass)})`);
    expect(Math.abs(r.details.exportMass - tower.structuralMassKg) / tower.structuralMassKg).toBeLessThan(1e-9);
  });
});
