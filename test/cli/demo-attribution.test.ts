/**
 * The demo's thin-brace case: `mast-thin-brace` checked against its committed baseline (the mast
 * before the brace was thinned, fixtures/demo/baselines/) locates the thinner brace. The brace
 * runs from leg node 1 (clamped) to leg node 5 with its midpoint node 1052 (fixtures/demo/README.md,
 * scenario.json: changedMemberEndNodes [1, 5]); the change map and the attribution must name
 * nodes 5 and 1052, in the reports the demo writes (HTML, Markdown, console).
 *
 * Screenshot: the demo's HTML page opened in a headless browser from the distribution's packages
 * (chromium, chromium-browser, google-chrome or firefox on PATH). Without one the test is skipped
 * and its name says why; nothing is downloaded.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { delimiter, join } from 'node:path';
import { parse } from 'yaml';
import { checkModels } from '../../src/pipeline/check-models.js';
import { formatHtml } from '../../src/report/html-reporter.js';
import { formatMarkdown } from '../../src/report/markdown.js';
import { formatConsole } from '../../src/report/console-reporter.js';
import type { RawConfig } from '../../src/io/config-types.js';
import { repoRoot } from './built-cli.js';

const demoDir = join(repoRoot, 'fixtures/demo');
const config = parse(readFileSync(join(demoDir, 'modalgate.yaml'), 'utf8')) as RawConfig;
const scenario = JSON.parse(readFileSync(join(demoDir, 'scenario.json'), 'utf8'));
const report = await checkModels({ ...config, models: config.models.filter((m) => m.name === 'mast-thin-brace') }, demoDir);
const model = report.models[0];
const html = formatHtml(report);

/** The first of the browsers a distribution packages that is on PATH, or null. */
function findBrowser(): string | null {
  for (const name of ['chromium', 'chromium-browser', 'google-chrome', 'firefox']) {
    for (const dir of (process.env.PATH ?? '').split(delimiter)) if (dir && existsSync(join(dir, name))) return join(dir, name);
  }
  return null;
}
const browser = findBrowser();

describe('demo: the thinner brace of the mast is located', () => {
  it('passes every rule, change-outside-region included, against the committed baseline', () => {
    expect(model.verdict, JSON.stringify(model.problem ?? model.rules.filter((r) => r.status !== 'pass'))).toBe('pass');
    expect(scenario.models['mast-thin-brace'].changedMemberEndNodes).toEqual([1, 5]);
    expect(model.rules.find((r) => r.ruleId === 'change-outside-region')?.status).toBe('pass');
  });

  it('the change map holds one region: the brace nodes 5 and 1052, stiffness and mass changed', () => {
    const map = model.changes!.changeMap!;
    expect(map.regions).toHaveLength(1);
    expect(map.regions[0].nodeRanges).toEqual([[5, 5], [1052, 1052]]);
    expect([map.addedNodes, map.removedNodes]).toEqual([0, 0]);
  });

  it('every changed mode is put on the brace, almost all through stiffness', () => {
    const a = model.changes!.attribution!;
    expect(a.split).toBe(true);
    const changed = a.modes.filter((m) => m.notable);
    expect(changed.length).toBeGreaterThan(3);
    for (const m of changed) {
      expect(m.regions[0].region).toBe(0);
      expect(m.regions[0].share).toBeGreaterThan(0.999);
      expect(m.regions[0].stiffnessShare!).toBeGreaterThan(0.9);
    }
  });

  it('the HTML report names the brace region, with a bar chart per changed mode and the change map', () => {
    expect(html).toContain('What changed since the baseline');
    expect(html).toMatch(/<table class="change-map">.*nodes 5, 1052 near \(-0\.375, -0\.0722, 1\.13\)/s);
    expect(html).toContain('share of the first-order change per region');
    expect((html.match(/<figure class="attribution">/g) ?? []).length).toBeGreaterThan(3);
    expect(html).toMatch(/Largest node shares: node (5|1052) [\d.]+ % \(stiffness/);
  });

  it('the Markdown summary has a table per changed mode and the console a change line', () => {
    const md = formatMarkdown(report);
    expect(md).toContain('Where the frequency changes come from');
    expect(md).toMatch(/\| R1 nodes 5, 1052 near \(-0\.375, -0\.0722, 1\.13\) \| 100\.0 \|/);
    expect(formatConsole(report, { colorLevel: 0 })).toContain('changed since the baseline: 2 nodes in 1 region(s), largest nodes 5, 1052');
  });

  const shot = browser ? `a headless ${browser} screenshot of the HTML report shows the page` : 'headless screenshot of the HTML report: skipped, no browser from the distribution (chromium, chromium-browser, google-chrome, firefox) is on PATH';
  it.skipIf(!browser)(shot, () => {
    const dir = mkdtempSync(join(tmpdir(), 'modalgate-shot-'));
    try {
      const page = join(dir, 'report.html'), png = join(dir, 'report.png');
      writeFileSync(page, html);
      const args = browser!.endsWith('firefox')
        ? ['--headless', '--screenshot', png, '--window-size=1000,3000', `file://${page}`]
        : ['--headless', '--no-sandbox', '--disable-gpu', `--screenshot=${png}`, '--window-size=1000,3000', `file://${page}`];
      const r = spawnSync(browser!, args, { encoding: 'utf8', timeout: 60_000 });
      expect(existsSync(png), r.stderr).toBe(true);
      const bytes = readFileSync(png);
      expect(bytes.subarray(1, 4).toString('latin1')).toBe('PNG');
      expect(statSync(png).size).toBeGreaterThan(20_000); // a rendered page, not a blank one
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 90_000);
});
