/**
 * The HTML report of `check` (`--html <file>`): one self-contained page — inline CSS and inline
 * SVG, no scripts, no external fonts or links — readable on screen and on paper. A header with
 * the run's verdict, date, version and the caution sentence, a summary table, then per model:
 * verdict, key figures, the rule outcomes, and plots of what the report already holds —
 * frequencies per mode, residual per mode against the eigen-residual limit, cumulative effective
 * mass per direction against the mass-participation fraction, and, after a baseline comparison,
 * the MAC matrix and the frequency change per paired mode, and what changed since the baseline
 * (the change map, and a bar chart per changed mode of where its change comes from).
 * Reporters never compute: every number shown comes from the CheckReport; the plots only scale
 * the values to pixels (./svg-plots.ts). Every text from the data is escaped.
 */
import type { RuleResult } from '../rules/engine.js';
import { formatNumber } from '../rules/utils/message.js';
import { inertiaUnit, massIn, unitSuffix, type ReportUnits } from '../rules/utils/units.js';
import type { ComparisonFacts } from '../model/comparison-facts.js';
import type { GeometryFacts } from '../model/geometry-facts.js';
import type { CheckReport, ModelReport } from '../pipeline/result-types.js';
import { ruleCounts } from '../pipeline/result-types.js';
import { firstElasticDetails, flaggedModes, participationDetails, relativeResiduals, rigidBodyModeCount } from '../pipeline/rule-details.js';
import { changesSection } from './html-changes.js';
import { barChart, escapeText as esc, heatMap, linearScale, logScale, stemChart, stepChart, valueScale, type ModeValue, type ReferenceLine } from './svg-plots.js';

const VERDICT_WORD = { pass: 'PASS', fail: 'FAIL', error: 'ERROR' } as const;

export function formatHtml(report: CheckReport): string {
  const title = `modalgate check: ${VERDICT_WORD[report.verdict]}`;
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    `<head><meta charset="utf-8"/><meta name="viewport" content="width=device-width, initial-scale=1"/><title>${esc(title)}</title><style>${CSS}</style></head>`,
    '<body>',
    header(report),
    summary(report),
    ...report.models.map((m, i) => modelSection(m, i)),
    `<footer><p class="caution">${esc(report.caution)}</p><p>Written by modalgate ${esc(report.tool.version)}.</p></footer>`,
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

function header(r: CheckReport): string {
  const facts = [
    ['date', `${r.timestamp.replace('T', ' ')} (local time of ${r.hostname})`],
    ['modalgate', r.tool.version],
    ...(r.configPath ? [['config', r.configPath]] : []),
    ['run time', `${formatNumber(r.timeMs / 1000)} s`],
  ];
  const problem = r.problem ? `<p class="problem"><strong>The check could not run:</strong> ${esc(r.problem.message)}</p>` : '';
  return `<header><h1>modalgate check <span class="verdict ${r.verdict}">${VERDICT_WORD[r.verdict]}</span></h1>${definitionList(facts)}<p class="caution"><strong>Caution.</strong> ${esc(r.caution)}</p>${problem}</header>`;
}

function summary(r: CheckReport): string {
  if (r.models.length === 0) return '<p>No model was checked.</p>';
  const rows = r.models.map((m, i) => {
    const k = ruleCounts(m.rules);
    const counts = [`${k.passed}/${k.total} passed`, k.failed ? `${k.failed} failed` : '', k.errors ? `${k.errors} errors` : '', k.warnings ? `${k.warnings} warnings` : '', k.skipped ? `${k.skipped} skipped` : ''].filter(Boolean).join(', ');
    return `<tr><td><a href="#model-${i + 1}">${esc(m.name)}</a></td><td><span class="verdict ${m.verdict}">${VERDICT_WORD[m.verdict]}</span></td><td class="num">${m.stats ? m.stats.dofs : '—'}</td><td class="num">${m.solve ? m.solve.modesReturned : '—'}</td><td>${esc(counts)}</td></tr>`;
  });
  return `<nav><h2>Models</h2><table class="summary"><thead><tr><th>model</th><th>verdict</th><th>DOFs</th><th>modes</th><th>rules</th></tr></thead><tbody>${rows.join('')}</tbody></table></nav>`;
}

function modelSection(m: ModelReport, i: number): string {
  const out = [`<section class="model" id="model-${i + 1}">`, `<h2>${esc(m.name)} <span class="verdict ${m.verdict}">${VERDICT_WORD[m.verdict]}</span></h2>`];
  if (m.problem) out.push(`<p class="problem"><strong>${m.problem.kind === 'input' ? 'Bad input' : 'Internal error'}:</strong> ${esc(m.problem.message)}</p>`);
  out.push(definitionList(keyFacts(m)));
  if (m.solve && m.solve.warnings.length > 0) out.push(`<ul class="warnings">${m.solve.warnings.map((w) => `<li>${esc(w)}</li>`).join('')}</ul>`);
  out.push('<h3>Rule outcomes</h3>', ruleTable(m.rules));
  const plots = figures(m);
  if (plots.length > 0) out.push('<h3>Plots</h3>', ...plots);
  const g = m.geometry;
  if (g) out.push(geometrySection(g, m.units));
  const c = m.comparison;
  if (c) out.push(comparisonSection(c));
  if (m.changes) out.push(changesSection(m.changes));
  if (m.baselineSaved) out.push(`<p>Baseline saved: ${esc(m.baselineSaved.json)}</p>`);
  out.push('</section>');
  return out.join('\n');
}

function keyFacts(m: ModelReport): string[][] {
  const f: string[][] = [];
  if (m.stats) {
    f.push(['DOFs', m.stats.solvedDofs === undefined || m.stats.solvedDofs === m.stats.dofs ? String(m.stats.dofs) : `${m.stats.dofs} exported, ${m.stats.solvedDofs} solved`]);
    if (m.stats.nodes !== undefined) f.push(['nodes', String(m.stats.nodes)]);
    f.push(['nonzeros', `K ${m.stats.stiffnessNonzeros}, M ${m.stats.massNonzeros}`]);
    f.push(['files', [m.stats.stiffnessFile, m.stats.massFile, m.stats.dofsFile].filter(Boolean).join(', ')]);
  }
  if (m.solve) {
    const s = m.solve;
    const req = [s.requested.count !== undefined ? `${s.requested.count} modes` : '', s.requested.maxHz !== undefined ? `up to ${s.requested.maxHz} Hz` : ''].filter(Boolean).join(', ');
    f.push(['method', `${s.method}, ordering ${s.ordering}, ${s.shifts.length} shift(s), ${s.iterations} iteration(s)`]);
    f.push(['modes', `${s.modesReturned} returned${req ? ` (asked: ${req})` : ''}`]);
    const sturm = `${s.sturm.ok ? 'ok' : 'NOT OK'}: ${s.sturm.countBelow} eigenvalues below σ = ${formatNumber(s.sturm.shift)}, ${s.sturm.modesReturned} modes returned${s.sturm.note ? ` (${s.sturm.note})` : ''}`;
    f.push(['Sturm check', sturm]);
    f.push(['factor', `${s.factorNonzeros} nonzeros, largest diagonal/pivot ratio ${formatNumber(s.maxDiagonalToPivotRatio)}`]);
    f.push(['solve time', `${formatNumber(s.timings.totalMs / 1000)} s`]);
  }
  f.push(['rule sets', m.ruleSets.join(', ') || '—']);
  f.push(['started', m.timestamp.replace('T', ' ')]);
  f.push(['time', `${formatNumber(m.timeMs / 1000)} s`]);
  return f;
}

function definitionList(items: string[][]): string {
  return `<dl>${items.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(v)}</dd>`).join('')}</dl>`;
}

const STATUS_WORD = { pass: 'pass', fail: 'FAIL', skip: 'skip', error: 'ERROR' } as const;

function ruleTable(rules: RuleResult[]): string {
  if (rules.length === 0) return '<p>No rules ran.</p>';
  const rows = rules.map((r) => {
    const warn = r.severity === 'warning' && (r.status === 'fail' || r.status === 'error');
    const cls = warn ? 'warning' : r.status;
    const word = warn ? 'warning' : STATUS_WORD[r.status];
    return `<tr class="${cls}"><td><span class="status ${cls}">${word}</span></td><td><code title="${esc(r.description)}">${esc(r.ruleId)}</code></td><td class="num">${esc(value(r.measured))}</td><td class="num">${esc(value(r.limit))}</td><td>${esc(r.message)}</td></tr>`;
  });
  return `<table class="rules"><thead><tr><th>status</th><th>rule</th><th>measured</th><th>limit</th><th>message</th></tr></thead><tbody>${rows.join('')}</tbody></table>`;
}

function value(v: number | string | null | undefined): string {
  if (v === null || v === undefined) return '—';
  return typeof v === 'number' ? formatNumber(v) : v;
}

function figures(m: ModelReport): string[] {
  const list = [frequencyPlot(m), residualPlot(m), effectiveMassPlot(m), macPlot(m), driftPlot(m)].filter((x): x is { svg: string; caption: string } => x !== null);
  return list.map((x) => `<figure>${x.svg}<figcaption>${esc(x.caption)}</figcaption></figure>`);
}

function geometrySection(g: GeometryFacts, units: ReportUnits | undefined): string {
  const mp = g.massProperties;
  const c = mp.centerOfMass;
  // in the config's units when it names them (shown mass = model mass ÷ massScale), else the model's
  const mass = (x: number) => formatNumber(massIn(units, x));
  const massUnit = unitSuffix(units?.mass);
  const items: string[][] = [
    ['total mass', `${mass(mp.totalMass)}${massUnit} (the whole export; mass at DOFs removed before export is not in the files)`],
    ...(g.keptMass ? [['mass on the kept DOFs', `${mass(g.keptMass.totalMass)}${massUnit} (what mass participation is relative to)`]] : []),
    ['translational mass x, y, z', `${mp.translationalMass.map(mass).join(', ')}${massUnit}`],
    ['centre of mass', `(${c.map(formatNumber).join(', ')})${unitSuffix(units?.length)}`],
    ['principal moments', `${mp.principalMoments.map((x) => formatNumber(massIn(units, x))).join(', ')}${unitSuffix(inertiaUnit(units))}`],
    ['free rigid-body motions', String(g.freeRigidBodyMotions)],
    ['near-zero modes', g.nearZeroModes === null ? '—' : String(g.nearZeroModes)],
  ];
  if (g.supported) items.push(['supported', g.supported.reason]);
  if (g.constraints) items.push(['constraints', `${g.constraints.sets.join(', ')}: ${g.constraints.removedDofs} DOFs held, ${g.constraints.keptDofs} kept`]);
  const out = [`<h3>Mass and rigid-body facts</h3>`, definitionList(items)];
  const mech = g.mechanisms;
  if (mech && mech.mechanisms > 0) {
    const shown = mech.nodes.filter((n, k) => k === 0 || n.energyFraction >= MIN_LISTED_SHARE);
    const rows = shown.map((n) => `<tr><td class="num">${n.node}</td><td>${esc(n.components?.length ? n.components.map((c) => `${c.component} ${Math.round(100 * c.fraction)} %`).join(', ') : n.component)}</td><td class="num">${n.dof}</td><td class="num">${esc(formatNumber(100 * n.energyFraction))} %</td></tr>`);
    out.push(`<h3>Where the mechanism moves</h3><p>${mech.mechanisms} mechanism(s) among ${mech.nearZeroModes} near-zero mode(s); nodes ranked by their share of the mechanisms' kinetic energy${shown.length < mech.nodes.length ? ' (shares under 0.1 % not listed)' : ''}.</p>`);
    out.push(`<table class="mechanism"><thead><tr><th>node</th><th>component</th><th>DOF</th><th>energy share</th></tr></thead><tbody>${rows.join('')}</tbody></table>`);
  }
  return out.join('\n');
}

/** Mechanism nodes with a smaller kinetic-energy share are left out of the table (our choice). */
const MIN_LISTED_SHARE = 1e-3;

function comparisonSection(c: ComparisonFacts): string {
  const items: string[][] = [
    ['baseline', `${c.baseline.file} (saved ${c.baseline.createdAt})`],
    ['compared', `${c.pairs.length} paired modes on ${c.baseline.dofsCompared} DOFs (${c.baseline.numberingCheck}), ${c.settings.weighting === 'mass' ? 'mass-weighted MAC' : 'MAC'}`],
  ];
  if (c.shapesNotCompared) items.push(['shapes not compared', `${c.shapesNotCompared}: modes paired by frequency order`]);
  else if (c.baseline.dofsAdded > 0 || c.baseline.dofsRemoved > 0 || c.baseline.renumbered) items.push(['DOFs', `${c.baseline.dofsAdded} added, ${c.baseline.dofsRemoved} removed${c.baseline.renumbered ? ', renumbered' : ''}`]);
  if (c.baseline.energyShareKept < 1) items.push(['stored DOF subset', `keeps at least ${formatNumber(100 * c.baseline.energyShareKept)} % of every mode's kinetic energy`]);
  const cut = (c.groupMatches ?? []).filter((g) => g.cut);
  if (cut.length > 0) items.push(['groups cut by a solve', cut.map((g) => `baseline ${g.baselineModes.join(', ')} ↔ current ${g.currentModes.join(', ')} (subspace MAC ${formatNumber(g.subspaceMac)})`).join('; ')]);
  if (c.lostModes.length > 0) items.push(['baseline modes without a partner', c.lostModes.map((u) => `${u.mode} (${formatNumber(u.hz)} Hz)`).join(', ')]);
  if (c.newModes.length > 0) items.push(['current modes without a partner', c.newModes.map((u) => `${u.mode} (${formatNumber(u.hz)} Hz)`).join(', ')]);
  if (c.swaps.length > 0) items.push(['swaps', c.swaps.map((s) => `baseline ${s.baselineModes.join(', ')} → current ${s.currentModes.join(', ')}`).join('; ')]);
  return `<h3>Baseline comparison</h3>${definitionList(items)}`;
}

// ---------------------------------------------------------------- figures (values from the report, scaled only)

interface Figure {
  svg: string;
  caption: string;
}

/** Largest MAC matrix side drawn (our choice; the JSON report has the whole matrix). */
const MAX_MAC_SIDE = 150;

function ruleNamed(m: ModelReport, id: string): RuleResult | undefined {
  return m.rules.find((r) => r.ruleId === id);
}

/** The rule was evaluated (its limit applies to what was plotted). */
function evaluated(r: RuleResult | undefined): r is RuleResult {
  return r !== undefined && (r.status === 'pass' || r.status === 'fail');
}

function finite(x: unknown): number | undefined {
  return typeof x === 'number' && Number.isFinite(x) ? x : undefined;
}

/** Leading modes the report counts as rigid-body / near-zero: rigid-body-modes' count, else the geometry facts'. */
function nearZeroCount(m: ModelReport): number {
  const count = rigidBodyModeCount(ruleNamed(m, 'rigid-body-modes'));
  if (count !== undefined) return count;
  return m.geometry?.nearZeroModes ?? 0;
}

function frequencyPlot(m: ModelReport): Figure | null {
  const modes = m.modes;
  if (!modes || modes.length === 0) return null;
  const zero = nearZeroCount(m);
  const values: ModeValue[] = modes.map((row, j) => ({ mode: j + 1, value: row.frequencyHz, floor: j < zero || !(row.frequencyHz > 0) }));
  const rule = ruleNamed(m, 'first-elastic-frequency');
  const lines: ReferenceLine[] = [];
  if (evaluated(rule)) {
    const { minHz, maxHz } = firstElasticDetails(rule);
    if (minHz !== undefined) lines.push({ value: minHz, label: `first elastic ≥ ${formatNumber(minHz)} Hz` });
    if (maxHz !== undefined) lines.push({ value: maxHz, label: `first elastic ≤ ${formatNumber(maxHz)} Hz` });
  }
  const shown = [...values.filter((v) => !v.floor && Number.isFinite(v.value)).map((v) => v.value), ...lines.map((l) => l.value)];
  const y = shown.length > 0 ? valueScale(Math.min(...shown), Math.max(...shown)) : linearScale(0, 1);
  const floors = values.filter((v) => v.floor).length;
  const svg = stemChart({ title: 'Natural frequencies', yLabel: 'frequency (Hz)', modes: modes.length, values, y, lines, floorLabel: '≈ 0 Hz: rigid-body / near-zero' });
  const parts = [`Frequency of each of the ${modes.length} solved modes`];
  if (floors > 0) parts.push(`${floors} rigid-body or near-zero mode(s) (≈ 0 Hz) drawn on the axis as hollow diamonds`);
  if (lines.length > 0) parts.push('dashed: the first-elastic-frequency limit');
  if (y.kind === 'log') parts.push('logarithmic axis');
  return { svg, caption: `${parts.join('; ')}.` };
}

function residualPlot(m: ModelReport): Figure | null {
  const rule = ruleNamed(m, 'eigen-residual');
  const fromRule = relativeResiduals(rule);
  const residuals = fromRule ?? m.modes?.map((r) => r.residual);
  if (!residuals || residuals.length === 0) return null;
  const limit = fromRule && evaluated(rule) ? finite(rule.limit) : undefined;
  const values: ModeValue[] = residuals.map((r, j) => ({ mode: j + 1, value: r, floor: r === 0, flagged: limit !== undefined && r > limit }));
  const positive = [...residuals.filter((r) => r > 0 && Number.isFinite(r)), ...(limit !== undefined ? [limit] : [])];
  const y = positive.length > 0 ? logScale(Math.min(...positive), Math.max(...positive)) : logScale(1e-16, 1e-16);
  const lines = limit !== undefined ? [{ value: limit, label: `limit ${formatNumber(limit)}` }] : [];
  const svg = stemChart({ title: fromRule ? 'Relative residual per mode' : 'Solver residual per mode', yLabel: 'residual', modes: residuals.length, values, y, lines, stems: false, floorLabel: 'exactly 0' });
  const notFinite = residuals.filter((r) => !Number.isFinite(r)).length;
  const what = fromRule ? 'Eigenpair residual ‖Kφ − λMφ‖ / (‖Kφ‖ + |λ|‖Mφ‖) of each mode (rigid-body floor), as eigen-residual read it' : 'Residual of each mode as the solver reported it (eigen-residual did not run)';
  const parts = [what];
  if (limit !== undefined) parts.push(`dashed: its limit ${formatNumber(limit)}`);
  if (notFinite > 0) parts.push(`${notFinite} residual(s) not finite, not drawn`);
  parts.push('logarithmic axis');
  return { svg, caption: `${parts.join('; ')}.` };
}

function effectiveMassPlot(m: ModelReport): Figure | null {
  const p = m.geometry?.participation;
  if (!p || p.modes === 0) return null;
  const series = p.directions.map((d, k) => ({ label: d, slot: k, values: p.cumulativeFraction.map((row) => row[k]) })).filter((s) => s.values.some((v) => v !== null));
  if (series.length === 0) return null;
  const rule = ruleNamed(m, 'mass-participation');
  const limit = evaluated(rule) ? finite(rule.limit) : undefined;
  const lines = limit !== undefined ? [{ value: limit, label: `required ${formatNumber(limit)}` }] : [];
  const svg = stepChart({ title: 'Cumulative effective mass', yLabel: 'fraction of the mass', modes: p.modes, series, y: linearScale(0, 1), lines });
  const parts = ['Effective mass of the solved modes summed up to each mode, as a fraction of the mass (of the inertia, for rotations) in each direction; translations solid, rotations dashed'];
  if (limit !== undefined) {
    const { directions, modesConsidered: considered } = participationDetails(rule);
    const dirs = directions ? ` in ${directions.join(', ')}` : '';
    parts.push(`dashed red: the fraction mass-participation requires${dirs}`);
    if (considered !== undefined && considered < p.modes) parts.push(`the rule counts the first ${considered} modes`);
  }
  return { svg, caption: `${parts.join('; ')}.` };
}

function macPlot(m: ModelReport): Figure | null {
  const c = m.comparison;
  if (!c || c.mac.rows === 0 || c.mac.cols === 0) return null;
  const rows = Math.min(c.mac.rows, MAX_MAC_SIDE), cols = Math.min(c.mac.cols, MAX_MAC_SIDE);
  const values: number[] = [];
  // the leading rows × cols block, row-major
  for (let r = 0; r < rows; r++) values.push(...c.mac.values.slice(r * c.mac.cols, r * c.mac.cols + cols));
  const outlined = c.pairs.filter((p) => p.baselineMode <= rows && p.currentMode <= cols).map((p): [number, number] => [p.baselineMode - 1, p.currentMode - 1]);
  const kind = c.settings.weighting === 'mass' ? 'mass-weighted MAC' : 'MAC';
  const svg = heatMap({ title: `Mode shape correlation (${kind})`, rowLabel: 'baseline mode', colLabel: 'current mode', rows, cols, values, outlined });
  const parts = [`${kind} between the ${c.mac.rows} baseline modes (rows) and the ${c.mac.cols} current modes (columns), white 0 to black 1; outlined in red: the pairs mode tracking chose`];
  if (c.pairs.some((p) => p.repeated)) parts.push('pairs within near-repeated groups (and rigid-body modes) were chosen on their subspace share, so their own MAC can be low');
  if (rows < c.mac.rows || cols < c.mac.cols) parts.push(`only the first ${rows} × ${cols} are drawn (all in the JSON report)`);
  return { svg, caption: `${parts.join('; ')}.` };
}

function driftPlot(m: ModelReport): Figure | null {
  const c = m.comparison;
  if (!c || c.pairs.length === 0) return null;
  const rule = ruleNamed(m, 'frequency-drift');
  const limit = evaluated(rule) ? finite(rule.limit) : undefined;
  const flagged = new Set((rule?.status === 'fail' ? flaggedModes(rule) : []).map((f) => f.baselineMode));
  const bars = c.pairs.map((p) => ({ label: p.baselineMode === p.currentMode ? String(p.baselineMode) : `${p.baselineMode}→${p.currentMode}`, value: p.changePercent, flagged: flagged.has(p.baselineMode) }));
  const shown = [0, ...bars.map((b) => b.value).filter((v): v is number => v !== null && Number.isFinite(v)), ...(limit !== undefined ? [limit, -limit] : [])];
  const y = linearScale(Math.min(...shown), Math.max(...shown));
  const lines = limit !== undefined ? [{ value: limit, label: `+${formatNumber(limit)} %` }, { value: -limit, label: `−${formatNumber(limit)} %` }] : [];
  const svg = barChart({ title: 'Frequency change from the baseline', yLabel: 'change (%)', xLabel: 'baseline mode (→ current mode when it moved)', bars, y, lines, nullLabel: 'rigid-body: not compared' });
  const parts = ['Change 100·(f − f_baseline)/f_baseline of each paired mode'];
  if (limit !== undefined) parts.push(`dashed: ± ${formatNumber(limit)} %, the frequency-drift limit`);
  if (flagged.size > 0) parts.push('red: modes frequency-drift flagged');
  return { svg, caption: `${parts.join('; ')}.` };
}

const CSS = `
body{font-family:sans-serif;color:#222;background:#fff;max-width:1000px;margin:0 auto;padding:1em 1.5em;line-height:1.4}
h1{font-size:1.6em;margin:.2em 0 .4em}h2{font-size:1.3em;border-bottom:2px solid #222;padding-bottom:.2em;margin-top:1.6em}h3{font-size:1.05em;margin:1.2em 0 .4em}
.verdict{display:inline-block;padding:.05em .5em;border:2px solid;border-radius:3px;font-size:.85em;letter-spacing:.05em;vertical-align:middle}
.verdict.pass{color:#1e6b2f;border-color:#1e6b2f}.verdict.fail{color:#b3261e;border-color:#b3261e}.verdict.error{color:#fff;background:#8c1d18;border-color:#8c1d18}
.caution{border-left:4px solid #c0711b;padding:.3em .8em;background:#fbf5ec}
.problem{border-left:4px solid #b3261e;padding:.3em .8em;background:#fbeceb}
dl{display:grid;grid-template-columns:max-content 1fr;gap:.15em 1em;margin:.5em 0}dt{font-weight:bold}dd{margin:0;overflow-wrap:anywhere}
table{border-collapse:collapse;width:100%;margin:.5em 0;font-size:.92em}th,td{border:1px solid #bbb;padding:.25em .45em;text-align:left;vertical-align:top}th{background:#eee}
td.num{text-align:right;white-space:nowrap;font-variant-numeric:tabular-nums}
.status{font-weight:bold}.status.fail,.status.error{color:#b3261e}.status.warning{color:#9a5a00}.status.skip{color:#777}.status.pass{color:#1e6b2f}
tr.fail td,tr.error td{background:#fbeceb}tr.warning td{background:#fbf5ec}
code{font-family:monospace;font-size:1em}
figure{margin:1em 0;break-inside:avoid;page-break-inside:avoid}figcaption{font-size:.88em;color:#444;max-width:640px}
svg.plot{max-width:100%;height:auto;display:block}
ul.warnings{color:#9a5a00}
footer{margin-top:2em;border-top:1px solid #bbb;font-size:.9em}
@media print{body{max-width:none;padding:0;font-size:10pt}nav a{color:inherit;text-decoration:none}section.model{break-before:page}*{-webkit-print-color-adjust:exact;print-color-adjust:exact}}
`.trim();
