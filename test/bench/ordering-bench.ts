/**
 * Fill-reducing orderings at scale. Models (fixtures/generator): a free-free steel hex box of
 * 39×39×24 hexahedra (40×40×25 nodes, 120 000 DOFs, 27-node coupling) and a rigid-jointed space
 * frame of steel tubes on a 22×22×21-node lattice clamped at its base (≈ 58k DOFs, 6 per node).
 *
 * For each model and each ordering (natural, approximate minimum degree, graph nested
 * dissection, coordinate bisection) prints the ordering time and the exact nnz(L) of the
 * LDLᵀ factor (src/sparse/column-counts.ts), the ratio to natural order, and nnz(L)/n^{4/3}
 * (the growth law of nested dissection on 3D meshes). Then the automatic choice with the DOF
 * map (node labels + coordinates) and with the pattern alone, and the acceptance check:
 * chosen nnz(L) ≤ natural / 5 on the hex solid.
 */
import { buildFrame, type FrameMember, type FrameNode } from '../../fixtures/generator/frame-builder.js';
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { circularHollowSection, STEEL } from '../../fixtures/generator/sections.js';
import { chooseOrdering, type ChooseOrderingOptions } from '../../src/sparse/ordering/choose-ordering.js';
import type { OrderingName } from '../../src/sparse/factor-types.js';

const sec = (ms: number): string => `${(ms / 1000).toFixed(2)} s`;
const ORDERINGS: OrderingName[] = ['natural', 'amd', 'nested-dissection', 'coordinate-bisection'];

function hexSolid(): GeneratedModel {
  return buildHexBox({ sizeM: [3.9, 3.9, 2.4], elements: [39, 39, 24], material: STEEL });
}

function spaceFrame(): GeneratedModel {
  const [nx, ny, nz] = [22, 22, 21];
  const id = (i: number, j: number, k: number) => 1 + i + nx * (j + ny * k);
  const nodes: FrameNode[] = [];
  const members: FrameMember[] = [];
  const section = circularHollowSection(0.1, 0.005);
  const base: number[] = [];
  // nodes on a 1 m lattice, beams along the three axes
  for (let k = 0; k < nz; k++)
    for (let j = 0; j < ny; j++)
      for (let i = 0; i < nx; i++) {
        nodes.push({ id: id(i, j, k), x: i, y: j, z: k });
        if (k === 0) base.push(id(i, j, k));
        const beam = (b: number): void => {
          members.push({ kind: 'beam', nodes: [id(i, j, k), b], section, material: STEEL });
        };
        if (i + 1 < nx) beam(id(i + 1, j, k));
        if (j + 1 < ny) beam(id(i, j + 1, k));
        if (k + 1 < nz) beam(id(i, j, k + 1));
      }
  return buildFrame({ nodes, members, supports: [{ nodes: base, kind: 'clamp' }] });
}

function benchModel(label: string, model: GeneratedModel, checkTarget: boolean): void {
  const { stiffness, mass } = model;
  const n = stiffness.n;
  const withMap: ChooseOrderingOptions = { coordinates: model.coordinates, nodeOfDof: model.dofMap.node };
  console.log(`\n${label}: ${n} DOFs, stored nonzeros K ${stiffness.colPtr[n]}, M ${mass.colPtr[n]}`);
  const nnz: Partial<Record<OrderingName, number>> = {};
  // each ordering alone, with the DOF map
  for (const name of ORDERINGS) {
    const r = chooseOrdering(stiffness, mass, { ...withMap, ordering: name });
    nnz[name] = r.predictedNnzL;
    const ratio = nnz.natural! / r.predictedNnzL;
    console.log(
      `  ${name.padEnd(21)} ordering ${sec(r.candidates[0].ms).padStart(7)}  nnz(L) ${r.predictedNnzL.toExponential(3)}` +
        `  natural/this ${ratio.toFixed(2).padStart(6)}  nnz(L)/n^(4/3) ${(r.predictedNnzL / n ** (4 / 3)).toFixed(1)}` +
        `  (graph + ${r.supervariables} supervariables ${sec(r.graphMs)})`,
    );
  }
  for (const [what, options] of [
    ['with DOF map', withMap],
    ['pattern only', {}],
  ] as const) {
    const t0 = performance.now();
    const auto = chooseOrdering(stiffness, mass, { ...options, ordering: 'auto' });
    const ms = performance.now() - t0;
    const list = auto.candidates.map((c) => `${c.name} ${c.nnzL.toExponential(2)}`).join(', ');
    console.log(`  auto (${what}): chose ${auto.name}, nnz(L) ${auto.predictedNnzL.toExponential(3)}, ${auto.supervariables} supervariables, total ${sec(ms)} incl. predictions [${list}]`);
    if (checkTarget) {
      const ok = auto.predictedNnzL * 5 <= nnz.natural!;
      console.log(`  target nnz(L) ≤ natural/5 (${(nnz.natural! / 5).toExponential(3)}): ${ok ? 'met' : 'NOT met'} (ratio ${(nnz.natural! / auto.predictedNnzL).toFixed(2)})`);
    }
  }
}

export default async function orderingBench(): Promise<void> {
  const only = process.env.ORDERING_BENCH_MODEL;
  if (!only || only === 'hex') benchModel('hex box 39×39×24 elements (free-free)', hexSolid(), true);
  if (!only || only === 'frame') benchModel('space frame 22×22×21 nodes (base clamped)', spaceFrame(), false);
}
