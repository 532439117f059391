/**
 * Words for where a model moves: node shares with their component split, kinds of rigid motion,
 * independent mechanisms and free rigid-body motions with the supported nodes that leave them
 * free. Used by the rules' messages (rigid-body-modes, first-elastic-frequency): every phrase is
 * a template of `motionMessages`, which those rules spread into their own `messages`; the
 * functions here choose templates and fill them, and their results are placeholder values.
 */
import type { NodeShare } from '../../model/energy-shares.js';
import type { RigidMotionKind } from '../../model/rigid-motion-kind.js';
import type { MechanismGroup } from '../../model/mechanism-groups.js';
import type { FreeMotionFacts, SupportedNodeFreedom } from '../../model/free-motions.js';
import type { Point3 } from '../../model/rigid-body-vectors.js';
import { formatList, formatNumber } from './message.js';
import { ruleMessages } from './outcome.js';

export const motionMessages = {
  percent: '{{value}} %',
  shareNode: 'node {{node}} ({{percent}}{{split}})',
  shareDof: 'DOF {{node}} ({{percent}}{{split}})',
  shareSplit: ': {{components}}',
  componentShare: '{{percent}} {{component}}',
  coordinates: '({{values}})',
  freeOne: '{{count}} free {{word}}',
  freeMany: '{{count}} free {{word}}s',
  wholeBody: 'the whole model moves as a rigid body (six free rigid-body motions)',
  translation: 'translation along {{directions}} ({{free}})',
  axisLine: ', the line of {{nodeWord}} {{nodes}}',
  rotationAboutAxis: 'rotation about the axis along {{direction}} through {{point}}{{line}} (1 free rotation)',
  aboutNode: 'node {{node}}',
  aboutPoint: 'the point {{point}}',
  rotationAboutPoint: 'rotation about {{about}} ({{free}}, axes along {{axes}})',
  otherMotions: '{{count}} free motions: {{parts}}',
  translationAlong: 'translation along {{directions}}',
  rotationAlong: 'rotation about axes along {{directions}}',
  nearZeroOne: '{{count}} near-zero motion',
  nearZeroMany: '{{count}} near-zero motions',
  strainFree: 'moves without straining ({{motions}})',
  strainFreeNotRigid: 'moves without straining ({{motions}}, not as one rigid part)',
  rotatesAboutNode: 'rotates freely about node {{node}} ({{free}})',
  turnsAboutLine: 'turns about the line of {{nodeWord}} {{nodes}} (axis along {{direction}} through {{point}}) (1 free rotation)',
  turnsAboutAxis: 'turns about the axis along {{direction}} through {{point}} (1 free rotation)',
  movesFreely: 'moves freely: {{motion}}',
  members: '{{word}} {{list}}{{region}}',
  moreMembers: '{{shown}} and {{more}} more',
  region: ' (x {{x}}, y {{y}}, z {{z}})',
  span: '{{from}}..{{to}}',
  group: '({{k}}) part with {{members}} {{motion}}; most motion at {{shares}}',
  noSupportedNode: 'no supported node is visible in the data (nodes held in every component are absent from the DOF map)',
  atCentre: 'are at its centre',
  onAxis: 'lie on its axis',
  notMoved: 'are not moved by it',
  nodeNames: '{{nodeWord}} {{nodes}}',
  doNotHold: 'do not hold {{components}}',
  holdAll: 'hold all they can',
  supportedStill: 'supported {{names}} {{onWhat}}{{lacks}}',
  andLacks: ' and {{lacks}}',
  supportedFree: 'supported {{names}} {{lacks}}',
  moreSupported: ' ({{count}} more supported nodes not listed)',
  supportedNodes: '{{parts}}{{more}}',
};
const { text } = ruleMessages(motionMessages);

const percent = (x: number): string => text('percent', { value: String(Math.round(100 * x)) });
const nodeWord = (count: number): string => (count === 1 ? 'node' : 'nodes');

/** "node 902 (98 %: 75 % uy, 25 % ux)", or "DOF 17 (40 %)" without a DOF map. */
export function shareText(s: NodeShare): string {
  const split = s.components.length > 0 ? text('shareSplit', { components: s.components.map((c) => text('componentShare', { percent: percent(c.fraction), component: c.component })).join(', ') }) : '';
  return text(s.kind === 'dof' ? 'shareDof' : 'shareNode', { node: String(s.node), percent: percent(s.energyFraction), split });
}

/** Shares down to 10 % of the first (the first always), at most `cap`. */
export function sharesText(shares: readonly NodeShare[], cap = 3): string {
  const first = shares[0]?.energyFraction ?? 0;
  return formatList(shares.filter((s, k) => k === 0 || s.energyFraction >= 0.1 * first).slice(0, cap).map(shareText), cap);
}

/** "x", "y", "z" for an axis direction, else "(0.707, 0.707, 0)". */
function directionText(d: Point3): string {
  const axis = ['x', 'y', 'z'].find((_, r) => Math.abs(Math.abs(d[r]) - 1) < 1e-6);
  return axis ?? text('coordinates', { values: d.map((v) => formatNumber(Number(v.toFixed(3)))).join(', ') });
}

function pointText(p: Point3): string {
  return text('coordinates', { values: p.map((v) => formatNumber(Math.abs(v) < 1e-12 ? 0 : Number(v.toPrecision(6)))).join(', ') });
}

const free = (k: number, word: string): string => text(k === 1 ? 'freeOne' : 'freeMany', { count: String(k), word });

/** "rotation about the axis along y through (0.3, 0.1, 0.1), the line of nodes 4, 10 and 16 (1 free rotation)". */
export function motionKindText(m: RigidMotionKind): string {
  switch (m.kind) {
    case 'whole-body':
      return text('wholeBody');
    case 'translation':
      return text('translation', { directions: formatList(m.translations.map(directionText), 3), free: free(m.count, 'translation') });
    case 'rotation-about-axis': {
      const a = m.axis!;
      const line = a.nodes.length > 0 ? text('axisLine', { nodeWord: nodeWord(a.nodes.length), nodes: formatList(a.nodes.map(String), 5) }) : '';
      return text('rotationAboutAxis', { direction: directionText(a.direction), point: pointText(a.point), line });
    }
    case 'rotation-about-point': {
      const p = m.pivot!;
      const about = p.node !== null ? text('aboutNode', { node: String(p.node) }) : text('aboutPoint', { point: pointText(p.point) });
      return text('rotationAboutPoint', { about, free: free(m.count, 'rotation'), axes: formatList(m.rotationAxes.map(directionText), 3) });
    }
    default: {
      const parts = [
        m.translations.length ? text('translationAlong', { directions: formatList(m.translations.map(directionText), 3) }) : '',
        m.rotationAxes.length ? text('rotationAlong', { directions: formatList(m.rotationAxes.map(directionText), 3) }) : '',
      ];
      return text('otherMotions', { count: String(m.count), parts: parts.filter(Boolean).join(' and ') });
    }
  }
}

/** What a moving part does: "rotates freely about node 38 (3 free rotations)". */
function partMotionText(g: MechanismGroup): string {
  const m = g.motion;
  const motions = text(g.motions === 1 ? 'nearZeroOne' : 'nearZeroMany', { count: String(g.motions) });
  if (!m) return text(g.region ? 'strainFreeNotRigid' : 'strainFree', { motions });
  if (m.kind === 'rotation-about-point' && m.pivot!.node !== null) return text('rotatesAboutNode', { node: String(m.pivot!.node), free: free(m.count, 'rotation') });
  if (m.kind === 'rotation-about-axis') {
    const a = m.axis!;
    const where = { direction: directionText(a.direction), point: pointText(a.point) };
    if (a.nodes.length > 0) return text('turnsAboutLine', { ...where, nodeWord: nodeWord(a.nodes.length), nodes: formatList(a.nodes.map(String), 5) });
    return text('turnsAboutAxis', where);
  }
  return text('movesFreely', { motion: motionKindText(m) });
}

/** "nodes 37, 43, 44, 61 and 3 more (x 0..0.1, y 0.2..0.3, z 0.1..0.2)" or "DOFs 12 and 13". */
function memberText(g: MechanismGroup): string {
  const dof = g.topNodes[0]?.kind === 'dof';
  const word = dof ? (g.nodeCount === 1 ? 'DOF' : 'DOFs') : nodeWord(g.nodeCount);
  const shown = g.nodes.slice(0, 4).map(String);
  const list = g.nodeCount > shown.length ? text('moreMembers', { shown: shown.join(', '), more: String(g.nodeCount - shown.length) }) : formatList(shown, 4);
  const r = g.region;
  const region = r ? text('region', { x: span(r.min[0], r.max[0]), y: span(r.min[1], r.max[1]), z: span(r.min[2], r.max[2]) }) : '';
  return text('members', { word, list, region });
}

function span(a: number, b: number): string {
  const f = (v: number): string => formatNumber(Number(v.toPrecision(6)));
  return Math.abs(b - a) < 1e-12 ? f(a) : text('span', { from: f(a), to: f(b) });
}

/** "(1) part with nodes 37, 43, 44, 61 and 3 more (x …) rotates freely about node 38 (3 free rotations); most motion at node 67 (22 %: …)". */
export function mechanismGroupText(g: MechanismGroup, k: number): string {
  return text('group', { k: String(k), members: memberText(g), motion: partMotionText(g), shares: sharesText(g.topNodes, g.motion ? 1 : 3) });
}

/** "supported nodes 1 and 9 lie on its axis and do not hold rx; supported node 5 does not hold ux". */
export function supportedNodesText(f: FreeMotionFacts): string {
  if (f.supportedNodes.length === 0) return text('noSupportedNode');
  const bySignature = new Map<string, SupportedNodeFreedom[]>();
  for (const s of f.supportedNodes) {
    const key = `${s.still}|${s.free.join(' ')}`;
    (bySignature.get(key) ?? bySignature.set(key, []).get(key)!).push(s);
  }
  const onWhat = text(f.motion.kind === 'rotation-about-point' ? 'atCentre' : f.motion.kind === 'rotation-about-axis' ? 'onAxis' : 'notMoved');
  const parts = [...bySignature.values()].map((list) => {
    const names = text('nodeNames', { nodeWord: nodeWord(list.length), nodes: formatList(list.map((s) => String(s.node)), 6) });
    const { still, free: components } = list[0];
    const lacks = components.length > 0 ? text('doNotHold', { components: formatList(components, 6) }) : text('holdAll');
    if (still) return text('supportedStill', { names, onWhat, lacks: components.length > 0 ? text('andLacks', { lacks }) : '' });
    return text('supportedFree', { names, lacks });
  });
  const more = f.supportedNodeCount > f.supportedNodes.length ? text('moreSupported', { count: String(f.supportedNodeCount - f.supportedNodes.length) }) : '';
  return text('supportedNodes', { parts: parts.join('; '), more });
}
