/**
 * The geometry stages inside the per-model pipeline (analyzeModel), on the committed demo models
 * (fixtures/demo, see its README and scenario.json): constraint sets from the config, geometry
 * facts in the report, the geometry rules, mechanism location on rigid-body-modes failures.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { analyzeModel } from '../../src/pipeline/analyze-model.js';
import type { GeometryFacts } from '../../src/model/geometry-facts.js';
import type { ModelReport } from '../../src/pipeline/result-types.js';

const demo = resolve(import.meta.dirname, '../../fixtures/demo');
const scenario = JSON.parse(readFileSync(join(demo, 'scenario.json'), 'utf8')) as {
  mast: { baseNodes: number[]; looseAnchorNode: number };
  models: Record<string, { totalMassKg: number }>;
};
const files = (name: string): string => `stiffness: ${join(demo, `${name}.stiffness.mtx`)}\n    mass: ${join(demo, `${name}.mass.mtx`)}\n    dofs: ${join(demo, `${name}.dofs.csv`)}`;

let work: string;
let reports: Record<string, ModelReport>;

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'modalgate-geometry-'));
  writeFileSync(join(work, 'base.dofs.txt'), '# no DOF numbers needed: the clamp is by node\n');
  const config = `defaults:
  count: 8
models:
  - name: mast
    ${files('mast')}
    rules: { matrix-finite: error }
  - name: mast-free-clamped
    ${files('mast-free')}
    constraints:
      - { name: base clamp, nodes: [${scenario.mast.baseNodes.join(', ')}], components: [all] }
    ruleSets: [supported]
    rules:
      first-elastic-frequency: { minHz: 4.0 }
  - name: mast-free
    ${files('mast-free')}
    ruleSets: [free-free]
    rules:
      rigid-body-energy: error
      total-mass: { expected: ${scenario.models['mast-free'].totalMassKg}, tolerancePercent: 0.01 }
      mass-consistency: error
  - name: loose-anchor
    ${files('mast-guyed-loose-anchor')}
    ruleSets: [supported]
    rules:
      first-elastic-frequency: { minHz: 5.0 }
      rigid-body-energy: error
`;
  writeFileSync(join(work, 'modalgate.yaml'), config);
  const loaded = loadConfig(join(work, 'modalgate.yaml'));
  reports = {};
  for (const job of loaded.models) reports[job.name] = await analyzeModel(job);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('geometry in the pipeline (demo mast)', () => {
  it('mast-free clamped at its base through the config has the frequencies of the exported clamped mast (1e-9 relative)', () => {
    // Reference: the separately exported clamped model fixtures/demo/mast.*.mtx.
    const a = reports['mast-free-clamped'].modes!;
    const b = reports.mast.modes!;
    expect(a.length).toBe(8);
    a.forEach((row, i) => expect(Math.abs(row.frequencyHz - b[i].frequencyHz) / b[i].frequencyHz).toBeLessThan(1e-9));
    const g = reports['mast-free-clamped'].geometry as GeometryFacts;
    expect(g.constraints!.removedDofs).toBe(18);
    expect(g.supported).not.toBeNull();
    // mass properties of the whole model (supports included): scenario.json's total mass
    expect(Math.abs(g.massProperties.totalMass - scenario.models['mast-free'].totalMassKg) / scenario.models['mast-free'].totalMassKg).toBeLessThan(1e-9);
  });

  it('mast-free passes rigid-body-energy, total-mass and mass-consistency', () => {
    const byId = Object.fromEntries(reports['mast-free'].rules.map((r) => [r.ruleId, r]));
    expect(byId['rigid-body-energy'].status, byId['rigid-body-energy'].message).toBe('pass');
    expect(byId['total-mass'].status, byId['total-mass'].message).toBe('pass');
    expect(byId['mass-consistency'].status, byId['mass-consistency'].message).toBe('pass');
    expect(byId['rigid-body-modes'].status).toBe('pass');
  });

  it('the unfastened anchor fails rigid-body-modes and the message names the anchor node first', () => {
    const r = reports['loose-anchor'].rules.find((x) => x.ruleId === 'rigid-body-modes')!;
    expect(r.status).toBe('fail');
    // the anchor swings tangentially, at 210° around the mast: (0.5, −0.866) → 25 % ux, 75 % uy of its kinetic energy (geometry of scenario.json)
    expect(r.message).toContain(`1 independent mechanism: (1) part with node ${scenario.mast.looseAnchorNode} `);
    expect(r.message).toContain(`most motion at node ${scenario.mast.looseAnchorNode} (100 %: 75 % uy, 25 % ux)`);
    const groups = r.details!.mechanismGroups as { nodes: number[]; motions: number }[];
    expect(groups.map((g) => [g.nodes, g.motions])).toEqual([[[scenario.mast.looseAnchorNode], 1]]);
    const nodes = r.details!.mechanismNodes as { node: number }[];
    expect(nodes[0].node).toBe(scenario.mast.looseAnchorNode);
    const g = reports['loose-anchor'].geometry as GeometryFacts;
    expect(g.mechanisms!.nodes[0].node).toBe(scenario.mast.looseAnchorNode);
    // a clamped export: the rigid-body energy check is for free-free models and says why it skips
    const energy = reports['loose-anchor'].rules.find((x) => x.ruleId === 'rigid-body-energy')!;
    expect(energy.status).toBe('skip');
    expect(energy.message).toMatch(/expects no rigid-body modes/);
    // the JSON report carries the facts as plain data
    expect(() => JSON.stringify(reports['loose-anchor'].geometry)).not.toThrow();
  });
});
