/**
 * The HTML part about what changed since the baseline: the change map (connected regions of nodes
 * whose rows of K or M changed, with counts and centroids) and, per changed mode, a bar chart of
 * each region's share of the first-order frequency change with a table splitting it into
 * stiffness and mass. Formatting only: every number is in the report's `changes`
 * (src/model/change-facts.ts); the chart only scales shares to pixels.
 */
import type { AttributionFacts, ExplainedChanges, ModeAttribution, ShareOfChange } from '../model/change-facts.js';
import { barChart, escapeText as esc, linearScale } from './svg-plots.js';
import { modeChangeText, percentText } from './change-text.js';

/** Regions drawn per mode and modes drawn (the JSON report has all; our choice). */
const REGIONS_SHOWN = 8;
const MODES_SHOWN = 6;
const MAP_REGIONS_SHOWN = 20;
const TOP_NODES_SHOWN = 5;

export function changesSection(changes: ExplainedChanges | undefined): string {
  if (!changes) return '';
  const out = ['<h3>What changed since the baseline</h3>', changeMap(changes)];
  const a = changes.attribution;
  if (!a) {
    if (changes.attributionMissing) out.push(`<p>Frequency changes not attributed: ${esc(changes.attributionMissing)}.</p>`);
    return out.join('\n');
  }
  const modes = a.modes.filter((m) => m.notable);
  if (modes.length === 0) return out.join('\n');
  out.push('<h4>Where the frequency changes come from</h4>');
  if (a.missing.length > 0) out.push(`<ul class="warnings">${a.missing.map((n) => `<li>${esc(n)}</li>`).join('')}</ul>`);
  for (const m of modes.slice(0, MODES_SHOWN)) out.push(modeFigure(m, a));
  if (modes.length > MODES_SHOWN) out.push(`<p>${modes.length - MODES_SHOWN} more changed modes in the JSON report.</p>`);
  return out.join('\n');
}

function changeMap(changes: ExplainedChanges): string {
  const map = changes.changeMap;
  if (!map) return `<p>No change map: ${esc(changes.changeMapMissing ?? 'not made')}.</p>`;
  if (map.nodes.length === 0) return `<p class="change-map">Change map: no node's rows of K or M changed (nodes matched by ${esc(map.matchedBy)}, ${map.nodesCompared} compared).</p>`;
  const rows = map.regions.slice(0, MAP_REGIONS_SHOWN).map((r) => `<tr><td>R${r.region + 1}</td><td>${esc(r.label)}</td><td class="num">${r.nodeCount}</td><td class="num">${r.stiffnessChanged}</td><td class="num">${r.massChanged}</td><td class="num">${r.added}</td></tr>`);
  if (map.regions.length > MAP_REGIONS_SHOWN) rows.push(`<tr><td colspan="6">${map.regions.length - MAP_REGIONS_SHOWN} smaller regions in the JSON report</td></tr>`);
  if (map.removed) rows.push(`<tr><td>removed</td><td>${esc(map.removed.label)}</td><td class="num">${map.removed.nodeCount}</td><td class="num">—</td><td class="num">—</td><td class="num">—</td></tr>`);
  const head = `<p class="change-map">Change map: ${map.changedNodes} changed, ${map.addedNodes} added and ${map.removedNodes} removed nodes in ${map.regions.length} connected region(s) (nodes matched by ${esc(map.matchedBy)}).</p>`;
  return `${head}<table class="change-map"><thead><tr><th>region</th><th>nodes</th><th>count</th><th>stiffness changed</th><th>mass changed</th><th>added</th></tr></thead><tbody>${rows.join('')}</tbody></table>`;
}

function modeFigure(m: ModeAttribution, a: AttributionFacts): string {
  const shown = m.regions.slice(0, REGIONS_SHOWN);
  const bars = [...shown.map((r, k) => ({ label: `R${r.region + 1}`, value: 100 * r.share, flagged: k === 0 })), { label: 'rest', value: 100 * m.elsewhere.share }];
  const values = [0, ...bars.map((b) => b.value)];
  const svg = barChart({ title: `Mode ${m.baselineMode}: share of the first-order change per region`, yLabel: 'share (%)', xLabel: 'region (rest: unchanged nodes)', bars, y: linearScale(Math.min(...values), Math.max(...values)) });
  const rows = [...shown.map((r) => tableRow(`R${r.region + 1}`, a.regions[r.region].label, r, a.split)), tableRow('rest', 'unchanged nodes (round-off, the baseline\'s residual)', m.elsewhere, a.split)];
  const caption = `${modeChangeText(m)} Red: the region with the largest share.`;
  const split = a.split ? '<th>stiffness %</th><th>mass %</th>' : '';
  const nodes = m.topNodes.slice(0, TOP_NODES_SHOWN).map((t) => `node ${t.node} ${percentText(t.share)} %${a.split ? ` (stiffness ${percentText(t.stiffnessShare)}, mass ${percentText(t.massShare)})` : ''}`);
  const top = nodes.length > 0 ? `<p class="top-nodes">Largest node shares: ${esc(nodes.join('; '))}.</p>` : '';
  return `<figure class="attribution">${svg}<figcaption>${esc(caption)}</figcaption><table class="attribution"><thead><tr><th>region</th><th>nodes</th><th>share %</th>${split}</tr></thead><tbody>${rows.join('')}</tbody></table>${top}</figure>`;
}

function tableRow(name: string, label: string, s: ShareOfChange, split: boolean): string {
  const cells = split ? `<td class="num">${percentText(s.stiffnessShare)}</td><td class="num">${percentText(s.massShare)}</td>` : '';
  return `<tr><td>${esc(name)}</td><td>${esc(label)}</td><td class="num">${percentText(s.share)}</td>${cells}</tr>`;
}


