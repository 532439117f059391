/**
 * Words for where a model moves: node shares with their component split, kinds of rigid motion,
 * independent mechanisms and free rigid-body motions with the supported nodes that leave them
 * free. Used by the rules' messages (rigid-body-modes, first-elastic-frequency).
 */
import type { NodeShare } from '../../model/energy-shares.js';
import type { RigidMotionKind } from '../../model/rigid-motion-kind.js';
import type { MechanismGroup } from '../../model/mechanism-groups.js';
import type { FreeMotionFacts, SupportedNodeFreedom } from '../../model/free-motions.js';
import type { Point3 } from '../../model/rigid-body-vectors.js';
import { formatList, formatNumber } from './message.js';

const percent = (x: number): string => `${Math.round(100 * x)} %`;

/** "node 902 (98 %: 75 % uy, 25 % ux)", or "DOF 17 (40 %)" without a DOF map. */
export function shareText(s: NodeShare): string {
  const name = s.kind === 'dof' ? `DOF ${s.node}` : `node ${s.node}`;
  const split = s.components.length > 0 ? `: ${s.components.map((c) => `${percent(c.fraction)} ${c.component}`).join(', ')}` : '';
  return `${name} (${percent(s.energyFraction)}${split})`;
}

/** Shares down to 10 % of the first (the first always), at most `cap`. */
export function sharesText(shares: readonly NodeShare[], cap = 3): string {
  const first = shares[0]?.energyFraction ?? 0;
  return formatList(shares.filter((s, k) => k === 0 || s.energyFraction >= 0.1 * first).slice(0, cap).map(shareText), cap);
}

/** "x", "y", "z" for an axis direction, else "(0.707, 0.707, 0)". */
export function directionText(d: Point3): string {
  const axis = ['x', 'y', 'z'].find((_, r) => Math.abs(Math.abs(d[r]) - 1) < 1e-6);
  return axis ?? `(${d.map((v) => formatNumber(Number(v.toFixed(3)))).join(', ')})`;
}

export function pointText(p: Point3): string {
  return `(${p.map((v) => formatNumber(Math.abs(v) < 1e-12 ? 0 : Number(v.toPrecision(6)))).join(', ')})`;
}

const plural = (k: number, word: string): string => `${k} free ${word}${k === 1 ? '' : 's'}`;

/** "rotation about the axis along y through (0.3, 0.1, 0.1), the line of nodes 4, 10 and 16 (1 free rotation)". */
export function motionKindText(m: RigidMotionKind): string {
  switch (m.kind) {
    case 'whole-body':
      return 'the whole model moves as a rigid body (six free rigid-body motions)';
    case 'translation':
      return `translation along ${formatList(m.translations.map(directionText), 3)} (${plural(m.count, 'translation')})`;
    case 'rotation-about-axis': {
      const a = m.axis!;
      const line = a.nodes.length > 0 ? `, the line of ${a.nodes.length === 1 ? 'node' : 'nodes'} ${formatList(a.nodes.map(String), 5)}` : '';
      return `rotation about the axis along ${directionText(a.direction)} through ${pointText(a.point)}${line} (1 free rotation)`;
    }
    case 'rotation-about-point': {
      const p = m.pivot!;
      const about = p.node !== null ? `node ${p.node}` : `the point ${pointText(p.point)}`;
      return `rotation about ${about} (${plural(m.count, 'rotation')}, axes along ${formatList(m.rotationAxes.map(directionText), 3)})`;
    }
    default:
      return `${m.count} free motions: ${[
        m.translations.length ? `translation along ${formatList(m.translations.map(directionText), 3)}` : '',
        m.rotationAxes.length ? `rotation about axes along ${formatList(m.rotationAxes.map(directionText), 3)}` : '',
      ]
        .filter(Boolean)
        .join(' and ')}`;
  }
}

/** What a moving part does: "rotates freely about node 38 (3 free rotations)". */
function partMotionText(g: MechanismGroup): string {
  const m = g.motion;
  const motions = `${g.motions} near-zero motion${g.motions === 1 ? '' : 's'}`;
  if (!m) return g.region ? `moves without straining (${motions}, not as one rigid part)` : `moves without straining (${motions})`;
  if (m.kind === 'rotation-about-point' && m.pivot!.node !== null) return `rotates freely about node ${m.pivot!.node} (${plural(m.count, 'rotation')})`;
  if (m.kind === 'rotation-about-axis') {
    const a = m.axis!;
    const line = a.nodes.length > 0 ? `the line of ${a.nodes.length === 1 ? 'node' : 'nodes'} ${formatList(a.nodes.map(String), 5)} (axis along ${directionText(a.direction)} through ${pointText(a.point)})` : `the axis along ${directionText(a.direction)} through ${pointText(a.point)}`;
    return `turns about ${line} (1 free rotation)`;
  }
  return `moves freely: ${motionKindText(m)}`;
}

/** "nodes 37, 43, 44, 61 and 3 more (x 0..0.1, y 0.2..0.3, z 0.1..0.2)" or "DOFs 12 and 13". */
function memberText(g: MechanismGroup): string {
  const dof = g.topNodes[0]?.kind === 'dof';
  const word = dof ? (g.nodeCount === 1 ? 'DOF' : 'DOFs') : g.nodeCount === 1 ? 'node' : 'nodes';
  const shown = g.nodes.slice(0, 4).map(String);
  const list = g.nodeCount > shown.length ? `${shown.join(', ')} and ${g.nodeCount - shown.length} more` : formatList(shown, 4);
  const region = g.region ? ` (x ${span(g.region.min[0], g.region.max[0])}, y ${span(g.region.min[1], g.region.max[1])}, z ${span(g.region.min[2], g.region.max[2])})` : '';
  return `${word} ${list}${region}`;
}

function span(a: number, b: number): string {
  const f = (v: number): string => formatNumber(Number(v.toPrecision(6)));
  return Math.abs(b - a) < 1e-12 ? f(a) : `${f(a)}..${f(b)}`;
}

/** "(1) part with nodes 37, 43, 44, 61 and 3 more (x …) rotates freely about node 38 (3 free rotations); most motion at node 67 (22 %: …)". */
export function mechanismGroupText(g: MechanismGroup, k: number): string {
  return `(${k}) part with ${memberText(g)} ${partMotionText(g)}; most motion at ${sharesText(g.topNodes, g.motion ? 1 : 3)}`;
}

/** "supported nodes 1 and 9 lie on its axis and do not hold rx; supported node 5 does not hold ux". */
export function supportedNodesText(f: FreeMotionFacts): string {
  if (f.supportedNodes.length === 0) return 'no supported node is visible in the data (nodes held in every component are absent from the DOF map)';
  const bySignature = new Map<string, SupportedNodeFreedom[]>();
  for (const s of f.supportedNodes) {
    const key = `${s.still}|${s.free.join(' ')}`;
    (bySignature.get(key) ?? bySignature.set(key, []).get(key)!).push(s);
  }
  const onWhat = f.motion.kind === 'rotation-about-point' ? 'are at its centre' : f.motion.kind === 'rotation-about-axis' ? 'lie on its axis' : 'are not moved by it';
  const parts = [...bySignature.values()].map((list) => {
    const names = `${list.length === 1 ? 'node' : 'nodes'} ${formatList(list.map((s) => String(s.node)), 6)}`;
    const { still, free } = list[0];
    const lacks = free.length > 0 ? `do not hold ${formatList(free, 6)}` : 'hold all they can';
    return still ? `supported ${names} ${onWhat}${free.length > 0 ? ` and ${lacks}` : ''}` : `supported ${names} ${lacks}`;
  });
  const more = f.supportedNodeCount > f.supportedNodes.length ? ` (${f.supportedNodeCount - f.supportedNodes.length} more supported nodes not listed)` : '';
  return `${parts.join('; ')}${more}`;
}
