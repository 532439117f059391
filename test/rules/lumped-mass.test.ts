/**
 * diagonal-sanity on a lumped-mass model: a lumped (diagonal) mass matrix without rotary inertia
 * leaves every rotational DOF massless. That is normal and passes the built-in rule sets by
 * default (allowMasslessRotations: true); a massless translation fails, and every message names
 * the option that would allow what it reports. Without a DOF map the message says what was assumed.
 *
 * The model: the generator's clamped lattice tower (fixtures/generator/mast.ts), its consistent
 * mass lumped here by row sums over the translational DOFs of the same direction, rotations
 * zeroed. Row-sum lumping keeps the mass moving with each rigid translation, rᵀMr ([CP]); the
 * check below compares it with the consistent matrix's rᵀMr.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildMast } from '../../fixtures/generator/mast.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import { writeSymmetricMatrixMarket } from '../../src/io/matrix-market-writer.js';
import { writeDofMap } from '../../src/io/dof-map-writer.js';
import { runCheck } from '../../src/cli/check.js';

/** Row-sum lumping: m_ii = Σ_j M_ij over translational j of i's direction; rotations get 0. */
function lumpTranslations(mass: SymmetricCsc, component: Uint8Array): SymmetricCsc {
  const sums = new Float64Array(mass.n);
  // every stored entry (i, j), i ≥ j, counts in row i and, off the diagonal, in row j
  for (let j = 0; j < mass.n; j++) {
    for (let p = mass.colPtr[j]; p < mass.colPtr[j + 1]; p++) {
      const i = mass.rowIdx[p];
      if (component[i] >= 3 || component[i] !== component[j]) continue;
      sums[i] += mass.values[p];
      if (i !== j) sums[j] += mass.values[p];
    }
  }
  const t = new TripletList();
  for (let i = 0; i < mass.n; i++) if (component[i] < 3 && sums[i] !== 0) t.push(i, i, sums[i]);
  return assembleSymmetric(mass.n, t).matrix;
}

/** Σ_ij M_ij over the DOFs of one translational direction: rᵀMr for a unit rigid translation. */
function translationMass(mass: SymmetricCsc, component: Uint8Array, c: number): number {
  let s = 0;
  for (let j = 0; j < mass.n; j++) {
    for (let p = mass.colPtr[j]; p < mass.colPtr[j + 1]; p++) {
      const i = mass.rowIdx[p];
      if (component[i] === c && component[j] === c) s += i === j ? mass.values[p] : 2 * mass.values[p];
    }
  }
  return s;
}

let work: string;
let tower: GeneratedModel;
let lumped: SymmetricCsc;
const rotations = () => tower.dofMap.component.filter((c) => c >= 3).length;

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'modalgate-lumped-'));
  tower = buildMast({ base: 'clamped', panels: 4 });
  lumped = lumpTranslations(tower.mass, tower.dofMap.component);
  await writeSymmetricMatrixMarket(join(work, 'tower.stiffness.mtx'), tower.stiffness);
  await writeSymmetricMatrixMarket(join(work, 'tower.mass.mtx'), lumped);
  await writeDofMap(join(work, 'tower.dofs.csv'), tower.dofMap);
  // one node's ux left without mass: a real omission
  const ux = tower.dofMap.component.findIndex((c) => c === 0);
  const t = new TripletList();
  for (let j = 0; j < lumped.n; j++) if (j !== ux && lumped.colPtr[j] < lumped.colPtr[j + 1]) t.push(j, j, lumped.values[lumped.colPtr[j]]);
  await writeSymmetricMatrixMarket(join(work, 'tower-missing.mass.mtx'), assembleSymmetric(lumped.n, t).matrix);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function check(name: string, model: string) {
  const config = join(work, `${name}.yaml`);
  writeFileSync(config, `defaults: { count: 6, ruleSets: [supported] }\nmodels:\n${model}`);
  const json = join(work, `${name}.json`);
  const out = await runCheck({ config, json, junit: join(work, `${name}.xml`), print: () => {}, printError: () => {} });
  const report = JSON.parse(readFileSync(json, 'utf8'));
  const rule = report.models[0].rules.find((r: { ruleId: string }) => r.ruleId === 'diagonal-sanity');
  return { code: out.code, report, rule };
}

const entry = (mass: string, extra = '', dofs = '\n    dofs: tower.dofs.csv') => `  - name: tower\n    stiffness: tower.stiffness.mtx\n    mass: ${mass}${dofs}\n    rules:\n      first-elastic-frequency: { minHz: 0.1 }\n${extra}`;

describe('diagonal-sanity on a lumped-mass tower', () => {
  it('lumping keeps the rigid translational mass and leaves every rotation massless', () => {
    for (const c of [0, 1, 2]) {
      const consistent = translationMass(tower.mass, tower.dofMap.component, c);
      expect(Math.abs(translationMass(lumped, tower.dofMap.component, c) - consistent) / consistent).toBeLessThan(1e-12);
    }
    expect(rotations()).toBeGreaterThan(0);
  });
  it('passes the supported rule set by default, saying how many massless rotations were allowed and by which option', async () => {
    const r = await check('default', entry('tower.mass.mtx'));
    expect(r.code).toBe(0);
    expect(r.report.verdict).toBe('pass');
    expect(r.rule.status).toBe('pass');
    expect(r.rule.message).toBe(`every stiffness diagonal is positive and no mass diagonal is negative; ${rotations()} massless rotational DOF(s) allowed by allowMasslessRotations: true (a lumped mass matrix without rotary inertia).`);
    expect(r.rule.details).toMatchObject({ componentsFrom: 'dof map', counts: { masslessRotations: rotations(), masslessTranslations: 0, unconnected: 0 }, allowed: { masslessRotations: true } });
  });
  it('fails when massless rotations are not allowed, naming the option that allows them and the full count', async () => {
    const r = await check('strict', entry('tower.mass.mtx', '      diagonal-sanity: { allowMasslessRotations: false }\n'));
    expect(r.code).toBe(1);
    expect(r.rule.status).toBe('fail');
    expect(r.rule.measured).toBe(rotations());
    expect(r.rule.message).toMatch(new RegExp(`^${rotations()} massless rotational DOF\\(s\\): node \\d+ r[xyz] \\(dof \\d+\\), .* and ${rotations() - 5} more \\(usual for a lumped mass matrix without rotary inertia; allowMasslessRotations: true allows it\\)\\.$`));
  });
  it('fails a massless translation, naming the option that would allow it', async () => {
    const r = await check('missing', entry('tower-missing.mass.mtx'));
    expect(r.code).toBe(1);
    const ux = tower.dofMap.component.findIndex((c) => c === 0);
    expect(r.rule.message).toBe(`1 massless translational DOF(s): node ${tower.dofMap.node[ux]} ux (dof ${ux + 1}) (a translation needs mass; allowMasslessTranslations: true allows it).`);
    expect(r.rule.details.counts).toMatchObject({ masslessTranslations: 1, masslessRotations: rotations() });
  });
  it('without a DOF map, says it assumed 6 DOFs per node', async () => {
    const r = await check('nomap', entry('tower.mass.mtx', '', ''));
    expect(r.code).toBe(0);
    expect(r.rule.message).toBe(`every stiffness diagonal is positive and no mass diagonal is negative; ${rotations()} massless rotational DOF(s) allowed by allowMasslessRotations: true (a lumped mass matrix without rotary inertia) (no DOF map: assumed 6 DOFs per node in the order ux uy uz rx ry rz).`);
    expect(r.rule.details.componentsFrom).toBe('assumed 6 per node');
  });
});
