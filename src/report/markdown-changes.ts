/**
 * The Markdown part about what changed since the baseline: the change map in one line per region,
 * then, per changed mode, a table of where its first-order frequency change comes from (regions
 * by share, each split into stiffness and mass when the baseline stored M₀φ). Formatting only:
 * every number is in the report's `changes` (src/model/change-facts.ts).
 */
import type { ExplainedChanges, ModeAttribution, ShareOfChange } from '../model/change-facts.js';
import { inline } from './markdown.js';
import { modeChangeText, percentText } from './change-text.js';

/** Regions listed per mode and modes given a table (the JSON report has all; our choice). */
const REGIONS_SHOWN = 5;
const MODES_SHOWN = 8;

export function changesMarkdown(changes: ExplainedChanges | undefined): string[] {
  if (!changes) return [];
  const out: string[] = [];
  const map = changes.changeMap;
  if (map) {
    if (map.nodes.length === 0) out.push('Change map: no node\'s rows of K or M changed since the baseline.', '');
    else {
      out.push(`Change map: ${map.changedNodes} changed, ${map.addedNodes} added and ${map.removedNodes} removed nodes; ${map.regions.length} connected region(s):`, '');
      for (const r of map.regions.slice(0, REGIONS_SHOWN)) out.push(`- R${r.region + 1}: ${inline(r.label)} (${r.nodeCount} nodes: ${r.stiffnessChanged} stiffness, ${r.massChanged} mass, ${r.added} added)`);
      if (map.regions.length > REGIONS_SHOWN) out.push(`- and ${map.regions.length - REGIONS_SHOWN} more regions`);
      if (map.removed) out.push(`- removed: ${inline(map.removed.label)}`);
      out.push('');
    }
  } else if (changes.changeMapMissing) out.push(`No change map: ${inline(changes.changeMapMissing)}.`, '');
  const a = changes.attribution;
  if (!a) {
    if (changes.attributionMissing) out.push(`Frequency changes not attributed: ${inline(changes.attributionMissing)}.`, '');
    return out;
  }
  const modes = a.modes.filter((m) => m.notable);
  if (modes.length === 0) return out;
  out.push('#### Where the frequency changes come from (first order)', '');
  for (const note of a.missing) out.push(`- ${inline(note)}`);
  if (a.missing.length > 0) out.push('');
  for (const m of modes.slice(0, MODES_SHOWN)) out.push(...modeTable(m, a.regions.map((r) => r.label), a.split));
  if (modes.length > MODES_SHOWN) out.push(`${modes.length - MODES_SHOWN} more changed modes in the JSON report.`, '');
  return out;
}

function modeTable(m: ModeAttribution, labels: string[], split: boolean): string[] {
  const head = modeChangeText(m);
  const rows = m.regions.slice(0, REGIONS_SHOWN).map((r) => row(`R${r.region + 1} ${inline(labels[r.region])}`, r, split));
  rows.push(row('unchanged nodes (round-off, the baseline\'s residual)', m.elsewhere, split));
  const more = m.regions.length > REGIONS_SHOWN ? [`${m.regions.length - REGIONS_SHOWN} smaller regions in the JSON report.`, ''] : [];
  return [head, '', `| region | share % |${split ? ' stiffness % | mass % |' : ''}`, `|---|---:|${split ? '---:|---:|' : ''}`, ...rows, '', ...more];
}

function row(name: string, s: ShareOfChange, split: boolean): string {
  return `| ${name} | ${percentText(s.share)} |${split ? ` ${percentText(s.stiffnessShare)} | ${percentText(s.massShare)} |` : ''}`;
}


