/**
 * `units:` end to end: a kg/m model (the generator's lattice tower, clamped at its base by a
 * constraint set) with `units: { length: m, mass: t, massScale: 1000 }` and a total-mass target in
 * t. The console, JSON, JUnit, Markdown and HTML texts carry "t" and "m"; frequencies stay in Hz.
 * Reference: the generator's structural mass Σ ρ·A·L + point masses (fixtures/generator/mast.ts);
 * 1 t = 1000 kg (SI).
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
const read = (f: string) => readFileSync(join(work, f), 'utf8');
const f4 = (x: number) => String(Number(x.toPrecision(4)));

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'modalgate-units-'));
  tower = buildMast({ base: 'free', panels: 4 });
  await writeGeneratedModel(tower, work, 'tower');
  writeFileSync(
    join(work, 'modalgate.yaml'),
    `units: { length: m, mass: t, massScale: 1000 }
models:
  - name: tower
    stiffness: tower.stiffness.mtx
    mass: tower.mass.mtx
    dofs: tower.dofs.csv
    count: 8
    constraints:
      - { name: base clamp, nodes: [${tower.nodeSets.base.join(', ')}], components: [all] }
    ruleSets: [supported]
    rules:
      first-elastic-frequency: { minHz: 0.1 }
      total-mass: { expected: ${tower.structuralMassKg / 1000}, tolerancePercent: 0.01 }
      center-of-mass: { severity: warning, expected: [0, 0, 0], maxDistance: 0.001 }
      mass-participation: { minFraction: 0.01 }
  - name: tower-budget-2t                 # the same export against a budget it misses (a warning)
    stiffness: tower.stiffness.mtx
    mass: tower.mass.mtx
    dofs: tower.dofs.csv
    count: 8
    ruleSets: [free-free]
    rules:
      total-mass: { severity: warning, expected: 2 }
`,
  );
  const out = await runCheck({ config: join(work, 'modalgate.yaml'), cwd: work, json: join(work, 'r.json'), junit: join(work, 'j.xml'), markdown: join(work, 's.md'), html: join(work, 'r.html'), print: (t) => (printed += t), printError: () => {} });
  code = out.code;
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('units in every report', () => {
  it('the target in t passes; the messages say t and m', () => {
    expect(code, printed).toBe(0);
    const report = JSON.parse(read('r.json')) as { models: { units: unknown; rules: { ruleId: string; status: string; message: string; measured: number }[] }[] };
    expect(report.models[0].units).toEqual({ length: 'm', mass: 't', massScale: 1000 });
    const rule = (id: string) => report.models[0].rules.find((r) => r.ruleId === id)!;
    const tonnes = tower.structuralMassKg / 1000;
    expect(rule('total-mass').status).toBe('pass');
    expect(rule('total-mass').measured).toBeCloseTo(tonnes, 9);
    expect(rule('total-mass').message).toMatch(new RegExp(`^total mass ${f4(tonnes)} t of the export \\([0-9.]+ t on the \\d+ solved DOFs, which mass participation uses\\) is within 0\\.01 % of the expected ${f4(tonnes)} t `));
    expect(rule('center-of-mass').status).toBe('fail');
    expect(rule('center-of-mass').message).toMatch(/^centre of mass \(.*\) m is [0-9.]+ m from the expected \(0, 0, 0\) m; allowed 0\.001 m\.$/);
    expect(rule('mass-participation').message).toMatch(/fractions of the mass on the \d+ solved DOFs, [0-9.]+ t; the whole export of \d+ DOFs has [0-9.]+ t\)/);
    expect(rule('first-elastic-frequency').message).toContain('Hz');
  });

  it('console, JUnit, Markdown and HTML show them', () => {
    expect(printed).toMatch(/centre of mass \(.*\) m is [0-9.]+ m from/); // the warnings are printed
    expect(printed).toMatch(/total mass [0-9.]+ t of the export differs from the expected 2 t/);
    const junit = read('j.xml');
    expect(junit).toMatch(/total mass [0-9.]+ t of the export differs from the expected 2 t by/);
    expect(junit).toContain('limit: 2 t ± 1 %');
    expect(read('s.md')).toMatch(/centre of mass \(.*\) m is [0-9.]+ m from/);
    const html = read('r.html');
    expect(html).toMatch(/total mass [0-9.]+ t of the export/);
    expect(html).toMatch(/<dt>total mass<\/dt><dd>[0-9.]+ t \(the whole export/);
    expect(html).toMatch(/<dt>centre of mass<\/dt><dd>\([^)]*\) m<\/dd>/);
    expect(html).toMatch(/<dt>principal moments<\/dt><dd>[0-9., e-]+ t·m²<\/dd>/);
  });
});
