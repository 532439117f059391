/**
 * The HTML report: a well-formed self-contained page (checked with fast-xml-parser's XMLValidator,
 * a general-purpose XML 1.0 well-formedness checker — the page is written XHTML-compatible, so the
 * whole document must pass, and so must every inline <svg> on its own), text escaped as the HTML
 * spec's character references require (WHATWG HTML §13.1.4: `&lt;`, `&amp;`, `&quot;`), the
 * caution sentence present, log axes ticked on whole decades, and, end to end, `modalgate demo`
 * writing modalgate-report/report.html naming every demo model.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLValidator } from 'fast-xml-parser';
import { formatHtml } from '../../src/report/html-reporter.js';
import { linearScale, logScale, tickLabel, toPixel, valueScale, greyOf } from '../../src/report/svg-plots.js';
import { CAUTION, type CheckReport, type ModelReport } from '../../src/pipeline/result-types.js';
import type { RuleResult } from '../../src/rules/engine.js';
import { sampleReport } from './sample-report.js';
import { ensureBuilt, repoRoot, runCli, type CliRun } from '../cli/built-cli.js';
import type { GeometryFacts } from '../../src/model/geometry-facts.js';
import type { ComparisonFacts } from '../../src/model/comparison-facts.js';
import { loadConfig } from '../../src/pipeline/load-config.js';
import { runCheck } from '../../src/cli/check.js';

const EVIL = '<script>&"';

function rule(ruleId: string, status: RuleResult['status'], extra: Partial<RuleResult> = {}): RuleResult {
  return { ruleId, description: `${ruleId} <description>`, severity: 'error', options: {}, status, message: `${ruleId} said ${EVIL}`, timeMs: 1, ...extra };
}

/** A free-free model with every kind of plotted data: 6 rigid modes, residuals, participation, a baseline comparison. */
function richModel(): ModelReport {
  const hz = [1e-6, 2e-6, 3e-6, 4e-6, 5e-6, 6e-6, 2.5, 7.9, 31, 120, 480, 1900];
  const residuals = [1e-14, 3e-15, 0, 2e-13, 1e-12, 5e-16, 2e-15, 8e-15, 1e-14, 3e-10, 2e-11, 1e-15];
  const cumulative = hz.map((_, j) => [Math.min(1, (j + 1) / 8), Math.min(1, (j + 1) / 9), null, 0.1 * j, 0.05 * j, 0.02 * j]);
  const n = 4;
  const mac = [0.98, 0.01, 0, 0, 0.02, 0.2, 0.75, 0, 0, 0.7, 0.25, 0, 0, 0, 0, 0.99];
  return {
    name: EVIL,
    verdict: 'fail',
    timestamp: '2026-12-02T07:00:00',
    timeMs: 1500,
    ruleSets: ['free-free'],
    stats: { dofs: 900, stiffnessNonzeros: 20000, massNonzeros: 900, stiffnessFile: '/m/<k>.mtx', massFile: '/m/m.mtx', nodes: 150 },
    solve: {
      method: 'lanczos', ordering: 'amd', requested: { count: 12 }, modesReturned: 12, shifts: [-1], iterations: 3,
      sturm: { shift: 2e8, countBelow: 12, modesReturned: 12, ok: true }, factorNonzeros: 40000, maxDiagonalToPivotRatio: 12,
      timings: { totalMs: 900, factorMs: 100, iterateMs: 700, verifyMs: 100 }, massOrthogonality: 1e-15, stiffnessOrthogonality: 1e-15, warnings: [`shift moved ${EVIL}`],
    },
    modes: hz.map((f, j) => ({ mode: j + 1, eigenvalue: (2 * Math.PI * f) ** 2, frequencyHz: f, residual: residuals[j] })),
    rules: [
      rule('rigid-body-modes', 'pass', { measured: 6, limit: 6, details: { count: 6 } }),
      rule('eigen-residual', 'fail', { measured: 3e-10, limit: 1e-10, details: { mode: 10, relativeResiduals: residuals } }),
      rule('mass-participation', 'fail', { measured: 0.8, limit: 0.9, options: { directions: ['ux', 'uy'] }, details: { modesConsidered: 12 } }),
      rule('frequency-drift', 'fail', { measured: 12, limit: 5, details: { flagged: [{ baselineMode: 3, currentMode: 3 }] } }),
      rule('conditioning', 'fail', { severity: 'warning', measured: 3e8, limit: 1e7 }),
    ],
    // partial facts: only the fields the HTML reporter reads (the full types are GeometryFacts / ComparisonFacts)
    geometry: {
      massProperties: { translationalMass: [10, 10, 10], totalMass: 10, centerOfMass: [0, 1, 2], principalMoments: [1, 2, 3] },
      freeRigidBodyMotions: 6, nearZeroModes: 6, supported: null, constraints: null,
      participation: { modes: 12, cumulativeFraction: cumulative, directions: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] },
      mechanisms: { nearZeroModes: 7, freeRigidBodyMotions: 6, mechanisms: 1, nodes: [{ node: 902, energyFraction: 0.99, component: 'uy', dof: 218 }, { node: 3, energyFraction: 1e-9, component: 'ux', dof: 7 }] },
    } as unknown as GeometryFacts,
    comparison: {
      baseline: { file: '/b/<evil>.baseline.json', createdAt: '2026-12-01', modes: n, dofCount: 900, selection: 'all', dofsCompared: 900, numberingCheck: 'dof-map hash' },
      settings: { weighting: 'mass', minPairCorrelation: 0.5, windowPercent: null, repeatedTolerancePercent: 0.1 },
      mac: { rows: n, cols: n, values: mac },
      pairs: [
        { baselineMode: 1, currentMode: 1, baselineHz: 0, currentHz: 0, changePercent: null, mac: 0.98, correlation: 0.98, repeated: true, rigidBody: true },
        { baselineMode: 2, currentMode: 3, baselineHz: 7, currentHz: 7.9, changePercent: 12, mac: 0.75, correlation: 0.75, repeated: false, rigidBody: false },
        { baselineMode: 3, currentMode: 2, baselineHz: 8, currentHz: 7.6, changePercent: -5, mac: 0.7, correlation: 0.7, repeated: false, rigidBody: false },
        { baselineMode: 4, currentMode: 4, baselineHz: 30, currentHz: 31, changePercent: 3.3, mac: 0.99, correlation: 0.99, repeated: false, rigidBody: false },
      ],
      lostModes: [], newModes: [], swaps: [{ baselineModes: [2, 3], currentModes: [3, 2], correlations: [0.75, 0.7] }],
    } as unknown as ComparisonFacts,
  };
}

function richReport(): CheckReport {
  const base = sampleReport();
  return { ...base, verdict: 'fail', models: [richModel(), ...base.models] };
}

function svgsOf(html: string): string[] {
  return html.match(/<svg[\s\S]*?<\/svg>/g) ?? [];
}

/** The <section> of model i (1-based). */
function sectionOf(html: string, i: number): string {
  const start = html.indexOf(`<section class="model" id="model-${i}">`);
  return html.slice(start, html.indexOf('</section>', start));
}

describe('log and linear axes', () => {
  it('1e-14..1e-6 is ticked on every decade', () => {
    // powers of ten as the ticks of a log axis: common practice
    const s = logScale(1e-14, 1e-6);
    expect(s.ticks).toEqual([1e-14, 1e-13, 1e-12, 1e-11, 1e-10, 1e-9, 1e-8, 1e-7, 1e-6]);
    expect([s.lo, s.hi]).toEqual([1e-14, 1e-6]);
    expect(s.ticks.map((t) => tickLabel(s, t))).toEqual(['10⁻¹⁴', '10⁻¹³', '10⁻¹²', '10⁻¹¹', '10⁻¹⁰', '10⁻⁹', '10⁻⁸', '10⁻⁷', '10⁻⁶']);
  });

  it('widens to whole decades and thins ticks over a wide range', () => {
    const s = logScale(3e-15, 2e-7);
    expect([s.lo, s.hi]).toEqual([1e-15, 1e-6]);
    const wide = logScale(1e-18, 1e6); // 25 decades: every third
    expect(wide.ticks.length).toBeLessThanOrEqual(10);
    expect(wide.ticks[0]).toBe(1e-18);
    expect(wide.ticks[wide.ticks.length - 1]).toBe(wide.hi);
    for (const t of wide.ticks) expect(Number.isInteger(Math.log10(t))).toBe(true);
    expect(logScale(5, 5).ticks).toEqual([1, 10]);
  });

  it('maps log positions by the exponent and linear ones proportionally', () => {
    // log10 maps 1e-10 to the middle of 1e-14..1e-6: definition of a logarithmic axis
    expect(toPixel(logScale(1e-14, 1e-6), 1e-10, 0, 800)).toBeCloseTo(400, 9);
    const lin = linearScale(0, 46);
    expect(lin.ticks).toEqual([0, 10, 20, 30, 40, 50]);
    expect(toPixel(lin, 25, 100, 0)).toBeCloseTo(50, 9);
    expect(linearScale(-12, 5).ticks).toEqual([-15, -10, -5, 0, 5]);
  });

  it('switches to log when the values span two decades', () => {
    expect(valueScale(2.5, 46).kind).toBe('linear');
    expect(valueScale(2.5, 1900).kind).toBe('log');
    expect([greyOf(0), greyOf(1), greyOf(0.5)]).toEqual(['#ffffff', '#000000', '#808080']);
  });
});

describe('formatHtml', () => {
  const html = formatHtml(richReport());

  it('is one well-formed page with every model section', () => {
    expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
    expect(html.match(/<html[\s>]/g)).toHaveLength(1);
    expect(html.match(/<\/html>/g)).toHaveLength(1);
    expect(XMLValidator.validate(html)).toBe(true);
    for (let i = 1; i <= 4; i++) expect(html).toContain(`<section class="model" id="model-${i}">`);
    for (const name of ['mast', 'mast-guyed-loose-anchor', 'bracket']) expect(html).toContain(`>${name} <span class="verdict`);
  });

  it('is self-contained: no script, no external resource', () => {
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|url\(/i);
    expect(html).not.toMatch(/(src|href)="(?!#)/);
    expect(html.match(/https?:\/\/[^"]+/g)).toEqual(Array(svgsOf(html).length).fill('http://www.w3.org/2000/svg'));
  });

  it('escapes model names, messages and paths', () => {
    expect(html).toContain('&lt;script&gt;&amp;&quot;');
    expect(html).not.toContain(EVIL);
    expect(html).toContain('/b/&lt;evil&gt;.baseline.json');
    expect(html).toContain('title="eigen-residual &lt;description&gt;"');
    // characters XML 1.0 forbids (the sample's message has U+0000, U+0001, U+0007) are dropped
    expect(html).not.toMatch(/[\u0000\u0001\u0007]/);
  });

  it('carries the verdict, version, date and the caution sentence', () => {
    expect(html).toContain('<h1>modalgate check <span class="verdict fail">FAIL</span></h1>');
    expect(html).toContain('<dt>modalgate</dt><dd>0.1.0</dd>');
    expect(html).toContain('2026-12-02 06:00:00 (local time of ci-runner-1)');
    expect(html).toContain(CAUTION);
    expect(html.split(CAUTION).length - 1).toBe(2); // header and footer
  });

  it('draws five well-formed plots for the rich model and none for a model that could not be read', () => {
    const rich = sectionOf(html, 1);
    const svgs = svgsOf(rich);
    expect(svgs).toHaveLength(5);
    for (const svg of svgs) expect(XMLValidator.validate(svg)).toBe(true);
    expect(svgs.map((s) => /<title>([^<]*)<\/title>/.exec(s)![1])).toEqual([
      'Natural frequencies', 'Relative residual per mode', 'Cumulative effective mass', 'Mode shape correlation (mass-weighted MAC)', 'Frequency change from the baseline',
    ]);
    expect(svgsOf(sectionOf(html, 4))).toHaveLength(0);
    expect(sectionOf(html, 4)).toContain('Bad input');
  });

  it('plots frequencies on a log axis with the six rigid-body modes on the floor', () => {
    const [freq] = svgsOf(sectionOf(html, 1));
    expect(freq).toContain('>1<'); // 2.5..1900 Hz spans decades: 1 .. 10⁴
    expect(freq).toContain('>10⁴<');
    expect(freq.match(/rotate\(45 /g)).toHaveLength(6 + 1); // six hollow markers and the legend's
    expect(freq.match(/<circle /g)).toHaveLength(6);
  });

  it('draws the residual limit, flags residuals above it and puts an exact zero on the floor', () => {
    const residual = svgsOf(sectionOf(html, 1))[1];
    expect(residual).toContain('limit 1.00e-10');
    expect(residual.match(/<circle [^>]*fill="#b3261e"\/>/g)).toHaveLength(1); // only 3e-10 is above 1e-10
    expect(residual.match(/<circle /g)).toHaveLength(11); // the exact zero is a floor marker instead
  });

  it('shows the required mass fraction, the MAC values, the pairs and the drift limits', () => {
    const [, , mass, mac, drift] = svgsOf(sectionOf(html, 1));
    expect(mass).toContain('required 0.9');
    expect(mass).not.toContain('>uz<'); // uz has no mass: no series
    expect(mac).toContain('>0.98<');
    expect(mac).toContain('>0.75<');
    expect(mac.match(/stroke="#b3261e" stroke-width="2"/g)).toHaveLength(4);
    expect(drift).toContain('+5 %');
    expect(drift).toContain('−5 %');
    expect(drift).toContain('>2→3<');
  });

  it('lists rule outcomes with status words and the mechanism nodes', () => {
    const rich = sectionOf(html, 1);
    expect(rich).toContain('<span class="status warning">warning</span>');
    expect(rich).toContain('<span class="status fail">FAIL</span></td><td><code title="eigen-residual &lt;description&gt;">eigen-residual</code></td><td class="num">3.00e-10</td><td class="num">1.00e-10</td>');
    expect(rich).toContain('<td class="num">902</td><td>uy</td>');
    expect(rich).not.toContain('<td class="num">3</td><td>ux</td>'); // share 1e-9: not listed
    expect(rich).toContain('Sturm check</dt><dd>ok: 12 eigenvalues below');
  });

  it('renders a run that could not start', () => {
    const page = formatHtml({ ...sampleReport(), models: [], problem: { kind: 'input', message: `bad ${EVIL}` } });
    expect(XMLValidator.validate(page)).toBe(true);
    expect(page).toContain('The check could not run:</strong> bad &lt;script&gt;&amp;&quot;');
  });
});

const demoDir = join(repoRoot, 'fixtures/demo');

describe('check --html and reports.html', () => {
  let dir: string;
  let config: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'modalgate-html-check-'));
    config = join(dir, 'modalgate.yaml');
    const m = (f: string) => JSON.stringify(join(demoDir, f));
    writeFileSync(config, [
      'reports: { html: out/from-config.html }',
      'defaults: { count: 8, ruleSets: [supported] }',
      'models:',
      `  - { name: mast, stiffness: ${m('mast.stiffness.mtx')}, mass: ${m('mast.mass.mtx')}, dofs: ${m('mast.dofs.csv')}, rules: { first-elastic-frequency: { minHz: 4 } } }`,
      '',
    ].join('\n'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('resolves reports.html against the config folder', () => {
    expect(loadConfig(config).reports.html).toBe(join(dir, 'out/from-config.html'));
  });

  it('writes the page where --html says, overriding the config', async () => {
    const out = await runCheck({ config, html: 'cli.html', cwd: dir, quiet: true, print: () => {} });
    expect(out.code).toBe(0);
    expect(out.written.html).toBe(join(dir, 'cli.html'));
    expect(existsSync(join(dir, 'out/from-config.html'))).toBe(false);
    const html = readFileSync(join(dir, 'cli.html'), 'utf8');
    expect(XMLValidator.validate(html)).toBe(true);
    expect(html).toContain('<h2>mast <span class="verdict pass">PASS</span></h2>');
  });
});

describe('modalgate demo writes report.html', () => {
  let cwd: string;
  let run: CliRun;
  beforeAll(async () => {
    ensureBuilt();
    cwd = mkdtempSync(join(tmpdir(), 'modalgate-html-'));
    run = await runCli(['demo', '--quiet'], cwd);
  }, 120_000);
  afterAll(() => rmSync(cwd, { recursive: true, force: true }));

  it('names every demo model, with plots, in a well-formed page', () => {
    expect(run.code, run.stdout + run.stderr).toBe(0);
    const html = readFileSync(join(cwd, 'modalgate-report/report.html'), 'utf8');
    expect(XMLValidator.validate(html)).toBe(true);
    const names = ['mast', 'mast-free', 'mast-guyed', 'mast-guyed-loose-anchor', 'mast-thin-brace', 'bracket'];
    names.forEach((name, i) => expect(sectionOf(html, i + 1)).toContain(`<h2>${name} <span class="verdict`));
    expect(sectionOf(html, 4)).toContain('<span class="verdict fail">FAIL</span>');
    expect(sectionOf(html, 4)).toContain('Where the mechanism moves');
    expect(svgsOf(html).length).toBeGreaterThanOrEqual(2 * names.length);
    expect(html).toContain(CAUTION);
  });
});
