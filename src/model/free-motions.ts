/**
 * The free rigid-body motions of a model, described: which motion is free (translation along a
 * direction, rotation about an axis through a point, rotations about a pivot, or all six), and
 * which supported nodes leave it free.
 *
 * The free directions W (6 × f, from ./mechanism-localization.ts) are rigid motions (t, ω) about
 * the reference point p; ./rigid-motion-kind.ts classifies them. Supported nodes, as far as the
 * data tells:
 *  - 'constraint-set': DOFs removed by the config's constraint sets (held exactly);
 *  - 'missing-components': nodes of the DOF map lacking components their kind carries (a
 *    frame node with only rx ry rz was pinned in the export; fully clamped nodes are absent);
 *  - 'stiffness-residual': when neither shows anything, the nodes where K resists the rigid
 *    motions (|K r̂| at least 1 % of the largest: ground springs, or nodes next to removed supports).
 * At a supported node x the motion moves u = t + ω × (x − p) and turns by ω; the components it
 * moves there (over 1e-3 of the largest translation in the model, or of |ω|) are the ones the node
 * does not hold. A node the motion does not translate lies on its axis (or is its pivot).
 */
import { COMPONENTS, type DofMap } from '../io/dof-map.js';
import type { Point3 } from './rigid-body-vectors.js';
import { classifyRigidMotions, nodePoints, type RigidMotionKind } from './rigid-motion-kind.js';
import type { ResidualAtNode } from './rigid-body-energy.js';

export interface HeldDof {
  node: number;
  component: number;
  x: number;
  y: number;
  z: number;
}

export interface SupportedNodeFreedom {
  node: number;
  source: 'constraint-set' | 'missing-components' | 'stiffness-residual';
  /** Components held (or resisted) at the node. */
  held: string[];
  /** Components the free motions move at the node (it does not hold them). */
  free: string[];
  /** The free motions do not translate the node (it lies on the axis or is the pivot). */
  still: boolean;
}

export interface FreeMotionFacts {
  motion: RigidMotionKind;
  /** Supported nodes (at most 20) and what they leave free. */
  supportedNodes: SupportedNodeFreedom[];
  /** Supported nodes found in all. */
  supportedNodeCount: number;
}

/** Components a motion moves by less than this times its largest translation (or |ω|) count as still (our choice). */
const STILL_RATIO = 1e-3;

export function describeFreeMotions(
  w: Float64Array,
  f: number,
  referencePoint: Point3,
  dofMap: DofMap,
  held: readonly HeldDof[],
  residuals: readonly ResidualAtNode[],
): FreeMotionFacts | null {
  if (f === 0) return null;
  const points = nodePoints(dofMap.node, dofMap.x, dofMap.y, dofMap.z);
  const heldPoints = nodePoints(Int32Array.from(held, (h) => h.node), Float64Array.from(held, (h) => h.x), Float64Array.from(held, (h) => h.y), Float64Array.from(held, (h) => h.z));
  const all = { ids: [...points.ids, ...heldPoints.ids], xyz: Float64Array.from([...points.xyz, ...heldPoints.xyz]) };
  const size = modelSize(all.xyz, referencePoint);
  const motion = classifyRigidMotions(w, f, referencePoint, size, all);
  const supported = supportedNodes(dofMap, held, residuals);
  const amplitude = new Float64Array(f);
  // largest translation of each motion over the model's nodes
  for (let k = 0; k < f; k++) {
    for (let a = 0; a < all.ids.length; a++) {
      const u = pointMotion(w, k, referencePoint, all.xyz[3 * a], all.xyz[3 * a + 1], all.xyz[3 * a + 2]);
      amplitude[k] = Math.max(amplitude[k], Math.hypot(u[0], u[1], u[2]));
    }
  }
  const freedoms = supported.map((s) => {
    const moved = new Set<number>();
    let still = true;
    for (let k = 0; k < f; k++) {
      const u = pointMotion(w, k, referencePoint, s.x, s.y, s.z);
      const omega = Math.hypot(u[3], u[4], u[5]);
      for (let c = 0; c < 3; c++) if (Math.abs(u[c]) > STILL_RATIO * amplitude[k]) (moved.add(c), (still = false));
      if (s.rotations) for (let c = 3; c < 6; c++) if (Math.abs(u[c]) > STILL_RATIO * omega && omega > 0) moved.add(c);
    }
    const free = [...moved].filter((c) => !s.held.has(c)).sort().map((c) => COMPONENTS[c]);
    return { node: s.node, source: s.source, held: [...s.held].sort().map((c) => COMPONENTS[c]), free, still };
  });
  return { motion, supportedNodes: freedoms.slice(0, 20), supportedNodeCount: freedoms.length };
}

/** u = t + ω × (x − p) and ω of motion k (6 × f column-major). */
function pointMotion(w: Float64Array, k: number, p: Point3, x: number, y: number, z: number): number[] {
  const t = [w[k * 6], w[k * 6 + 1], w[k * 6 + 2]];
  const o = [w[k * 6 + 3], w[k * 6 + 4], w[k * 6 + 5]];
  const d = [x - p[0], y - p[1], z - p[2]];
  return [t[0] + o[1] * d[2] - o[2] * d[1], t[1] + o[2] * d[0] - o[0] * d[2], t[2] + o[0] * d[1] - o[1] * d[0], o[0], o[1], o[2]];
}

function modelSize(xyz: Float64Array, p: Point3): number {
  let r = 0;
  for (let a = 0; a < xyz.length; a += 3) r = Math.max(r, Math.hypot(xyz[a] - p[0], xyz[a + 1] - p[1], xyz[a + 2] - p[2]));
  return r;
}

interface Supported {
  node: number;
  source: SupportedNodeFreedom['source'];
  held: Set<number>;
  rotations: boolean;
  x: number;
  y: number;
  z: number;
}

/** Supported nodes from the constraint sets, then from missing components, else from K's residuals. */
function supportedNodes(dofMap: DofMap, held: readonly HeldDof[], residuals: readonly ResidualAtNode[]): Supported[] {
  const present = new Map<number, { comps: Set<number>; i: number }>();
  for (let i = 0; i < dofMap.n; i++) {
    const e = present.get(dofMap.node[i]) ?? present.set(dofMap.node[i], { comps: new Set(), i }).get(dofMap.node[i])!;
    e.comps.add(dofMap.component[i]);
  }
  const out = new Map<number, Supported>();
  for (const h of held) {
    const s = out.get(h.node) ?? out.set(h.node, { node: h.node, source: 'constraint-set', held: new Set(), rotations: false, x: h.x, y: h.y, z: h.z }).get(h.node)!;
    s.held.add(h.component);
    if (h.component >= 3) s.rotations = true;
  }
  for (const s of out.values()) if ([...(present.get(s.node)?.comps ?? [])].some((c) => c >= 3)) s.rotations = true;
  // a node kind's components: those present on any node of that kind (with / without rotations)
  const kindComps = [new Set<number>(), new Set<number>()];
  for (const e of present.values()) {
    const rot = [...e.comps].some((c) => c >= 3) ? 1 : 0;
    for (const c of e.comps) if (rot || c < 3) kindComps[rot].add(c);
  }
  for (const [node, e] of present) {
    if (out.has(node)) continue;
    const rot = [...e.comps].some((c) => c >= 3) ? 1 : 0;
    const missing = [...kindComps[rot]].filter((c) => !e.comps.has(c));
    if (missing.length === 0) continue;
    out.set(node, { node, source: 'missing-components', held: new Set(missing), rotations: rot === 1, x: dofMap.x[e.i], y: dofMap.y[e.i], z: dofMap.z[e.i] });
  }
  if (out.size === 0 && residuals.length > 0) {
    const cut = 0.01 * residuals[0].normalizedResidual;
    for (const r of residuals) {
      if (r.normalizedResidual < cut) continue;
      const e = present.get(r.node);
      if (!e) continue;
      const rot = [...e.comps].some((c) => c >= 3);
      out.set(r.node, { node: r.node, source: 'stiffness-residual', held: new Set([COMPONENTS.indexOf(r.component as (typeof COMPONENTS)[number])]), rotations: rot, x: dofMap.x[e.i], y: dofMap.y[e.i], z: dofMap.z[e.i] });
    }
  }
  return [...out.values()];
}
