/**
 * change-outside-region: since the baseline, the model's K and M rows changed only at nodes of an
 * allowed region ("this change was only supposed to touch the bracket"). The change map
 * (src/model/change-map.ts: fingerprints of each node's rows of K and M, renumbering-proof)
 * lists the changed, added and removed nodes; each must lie in one of the `allowed` selectors —
 * node ids, a node id range, or a place (plane, box or cylinder surface, the same selectors as
 * constraint sets, src/model/constraints.ts). Removed nodes are placed by the baseline's DOF map.
 * `ignore` leaves kinds of change out (e.g. `[mass]` when mass trimming is allowed anywhere).
 * No default region: the project names it. Needs a baseline saved with node fingerprints.
 */
import type { RuleDefinition } from './rule-types.js';
import type { NodeRegion } from '../io/config-types.js';
import type { ChangedNode } from '../model/change-facts.js';
import { centroid, nodeRanges, regionLabel } from '../model/node-regions.js';
import { regionPointTest } from '../model/constraints.js';
import { configSchemaDefinition } from '../io/schema-files.js';
import { ruleMessages } from './utils/outcome.js';
import { formatList } from './utils/message.js';

export interface AllowedNodes {
  name?: string;
  nodes?: number[];
  nodeRange?: [number, number];
  region?: NodeRegion;
}

type ChangeKind = 'stiffness' | 'mass' | 'added' | 'removed';

export interface ChangeOutsideRegionOptions {
  allowed: AllowedNodes[];
  ignore: ChangeKind[];
}

const messages = {
  pass: '{{changed}} changed, {{added}} added and {{removed}} removed nodes since the baseline, all inside the allowed region ({{names}}).',
  none: 'nothing changed since the baseline: no node\'s rows of K or M differ.',
  fail: 'changes outside the allowed region ({{names}}) at {{count}} of {{total}} changed nodes: {{list}}.',
  group: '{{kind}} at {{where}}',
  noMap: 'not evaluated: {{reason}}.',
  noBaseline: 'not evaluated: no baseline was compared for this model.',
  needsPlace: 'not evaluated: a region by coordinates needs the DOF map of the model (and of the baseline for removed nodes).',
};
const { outcome, text } = ruleMessages(messages);

/** The place selectors of constraint sets (config.schema.json `$defs.nodeRegion`), one definition for both. */
const regionSchema = configSchemaDefinition('nodeRegion');

export const changeOutsideRegion: RuleDefinition<ChangeOutsideRegionOptions, 'allowed'> = {
  id: 'change-outside-region',
  description: 'Since the baseline, K and M changed only at nodes inside the allowed region (node ids, a range, or a place).',
  optionsSchema: {
    type: 'object',
    properties: {
      allowed: {
        type: 'array',
        minItems: 1,
        items: {
          type: 'object',
          properties: {
            name: { type: 'string', minLength: 1 },
            nodes: { type: 'array', items: { type: 'integer', minimum: 1 }, minItems: 1 },
            nodeRange: { type: 'array', items: { type: 'integer', minimum: 1 }, minItems: 2, maxItems: 2 },
            region: regionSchema,
          },
          anyOf: [{ required: ['nodes'] }, { required: ['nodeRange'] }, { required: ['region'] }],
          additionalProperties: false,
        },
      },
      ignore: { type: 'array', items: { enum: ['stiffness', 'mass', 'added', 'removed'] }, uniqueItems: true },
    },
    required: ['allowed'],
    additionalProperties: false,
  },
  defaults: { ignore: [] },
  messages,
  needs: [],
  evaluate(context, o) {
    const changes = context.changes;
    if (!changes) return outcome('skip', 'noBaseline');
    const map = changes.changeMap;
    if (!map) return outcome('skip', 'noMap', { reason: changes.changeMapMissing ?? 'no change map' });
    const names = o.allowed.map((a, k) => a.name ?? `allowed[${k}]`).join(', ');
    const counted = map.nodes.filter((n) => !ignored(n, o.ignore));
    if (counted.length === 0 && map.nodes.length === 0) return outcome('pass', 'none', {}, 0, 0);
    const byPlace = o.allowed.some((a) => a.region);
    if (byPlace && (!context.dofMap || counted.some((n) => n.at === null))) return outcome('skip', 'needsPlace');
    const tests = o.allowed.map((a) => allowedTest(a, context.dofMap));
    const outside = counted.filter((n) => !tests.some((t) => t(n)));
    const details = { outside: outside.map((n) => ({ node: n.node, change: n.change, region: n.region, at: n.at })), regions: map.regions.length };
    const kinds = (k: ChangedNode['change'][]): number => counted.filter((n) => k.includes(n.change)).length;
    const counts = { changed: kinds(['stiffness', 'mass', 'stiffness and mass']), added: kinds(['added']), removed: kinds(['removed']), names };
    if (outside.length === 0) return outcome('pass', 'pass', counts, 0, 0, details);
    return outcome('fail', 'fail', { count: outside.length, total: counted.length, names, list: formatList(groups(outside, context.units?.length)) }, outside.length, 0, details);
  },
};

function ignored(n: ChangedNode, ignore: ChangeKind[]): boolean {
  if (n.change === 'stiffness and mass') return ignore.includes('stiffness') && ignore.includes('mass');
  return ignore.includes(n.change);
}

function allowedTest(a: AllowedNodes, dofMap: Parameters<typeof regionPointTest>[1] | undefined): (n: ChangedNode) => boolean {
  const ids = new Set(a.nodes ?? []);
  const [lo, hi] = a.nodeRange ?? [1, 0];
  const inside = a.region && dofMap ? regionPointTest(a.region, dofMap) : null;
  return (n) => ids.has(n.node) || (n.node >= lo && n.node <= hi) || (inside !== null && n.at !== null && inside(...n.at));
}

/** "stiffness at nodes 12–14 near (0.5, 0, 1.5)", one phrase per kind of change and region. */
function groups(outside: ChangedNode[], lengthUnit: string | undefined): string[] {
  const by = new Map<string, ChangedNode[]>();
  for (const n of outside) {
    const key = `${n.change}|${n.region ?? 'removed'}`;
    by.set(key, [...(by.get(key) ?? []), n]);
  }
  return [...by.values()].map((list) => {
    return text('group', { kind: list[0].change, where: regionLabel(nodeRanges(list.map((n) => n.node)), centroid(list), lengthUnit) });
  });
}
