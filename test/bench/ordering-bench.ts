/**
 * Fill-reducing orderings at scale. Models (fixtures/generator): a near-cube steel hex solid of
 * 40×32×30 hexahedra clamped on its xMin face (122 760 DOFs), a free-free hex box of 39×39×24
 * hexahedra (40×40×25 nodes, 120 000 DOFs, 27-node coupling) and a rigid-jointed space frame of
 * steel tubes on a 22×22×21-node lattice clamped at its base (≈ 58k DOFs, 6 per node).
 *
 * For each model and each ordering (natural, approximate minimum degree, graph nested
 * dissection — multilevel, plus the former single-level level-structure dissection for
 * comparison — and coordinate bisection) prints the ordering time (wall and this process's
 * CPU: the machine is shared) and the exact nnz(L) of the LDLᵀ factor
 * (src/sparse/column-counts.ts), the ratio to natural order, nnz(L)/n^{4/3} (the growth law of
 * nested dissection on 3D meshes) and the flop measure Σ colcount². Then the automatic choice
 * with the DOF map (node labels + coordinates) and with the pattern alone, and the acceptance
 * check: chosen nnz(L) ≤ natural / 5 on the hex solids. On the hex solids the orderings also
 * include the ideal plane dissection of their structured grid (every cut an exact node plane at
 * the median of the longest extent, recursed to single nodes): what plane dissection reaches on
 * that shape, a reference beside the check.
 * ORDERING_BENCH_MODEL = cube | hex | frame runs one model only.
 *
 * ORDERING_BENCH_MODEL = uncoupled runs only the cheap check of orderings on uncoupled and
 * block-diagonal patterns (no FE model is built): a diagonal K with M = I at 10k, 20k, 30k and
 * 40k DOFs (target: every ordering under 1 s at 30k; the ordering used to cost quadratic time
 * there, 14 s at 10k), then a block-diagonal pattern of many small cliques of 1–30 DOFs, a path
 * and a star (one DOF coupled to all others), 30k DOFs each. Prints each candidate's time, the automatic choice and
 * its nnz(L) (n on a diagonal: no fill).
 */
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { clampedHexSolid, freeHexBox, latticeFrame } from './bench-models.js';
import { chooseOrdering, patternOfGraph, type ChooseOrderingOptions } from '../../src/sparse/ordering/choose-ordering.js';
import type { OrderingName } from '../../src/sparse/factor-types.js';
import { adjacencyOfPencil } from '../../src/sparse/ordering/adjacency-graph.js';
import { expandOrdering, findSupervariables } from '../../src/sparse/ordering/supervariables.js';
import { graphNestedDissection } from '../../src/sparse/ordering/nested-dissection.js';
import { factorStructureCounts } from '../../src/sparse/column-counts.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';

const sec = (ms: number): string => `${(ms / 1000).toFixed(2)} s`;
const ORDERINGS: OrderingName[] = ['natural', 'amd', 'nested-dissection', 'coordinate-bisection'];

/** Σ colcount² of the factor (the factorization's flop count up to a constant) and nnz(L). */
function factorCost(model: GeneratedModel, perm: Int32Array): { nnzL: number; flops: number } {
  const pattern = patternOfGraph(adjacencyOfPencil(model.stiffness, model.mass));
  const { counts, nnzL } = factorStructureCounts(pattern, perm);
  let flops = 0;
  for (const c of counts) flops += c * c;
  return { nnzL, flops };
}

/** The former single-level dissection (breadth-first levels + greedy moves, leaves of 200). */
function levelStructureDissection(model: GeneratedModel): { perm: Int32Array; ms: number } {
  const graph = adjacencyOfPencil(model.stiffness, model.mass);
  const sv = findSupervariables(graph, { nodeOfVertex: model.dofMap.node, coordinates: model.coordinates });
  const t = performance.now();
  const perm = expandOrdering(sv, graphNestedDissection(sv.graph, { weights: sv.weight, leafSize: 200 }));
  return { perm, ms: performance.now() - t };
}

/**
 * The ideal plane dissection of a structured grid: each node's layer index along each
 * axis comes from the sorted distinct coordinates; a box of layers is split at the median layer
 * of its longest extent (A below, B above, the node plane last), down to single nodes. Only a
 * reference for the bench: real meshes are not boxes of layers.
 */
function idealPlaneDissection(model: GeneratedModel): { perm: Int32Array; ms: number } {
  const t = performance.now();
  const graph = adjacencyOfPencil(model.stiffness, model.mass);
  const sv = findSupervariables(graph, { nodeOfVertex: model.dofMap.node, coordinates: model.coordinates });
  const layer: Int32Array[] = [];
  const extent = [0, 0, 0];
  // layer index of every supervariable along each axis
  for (let axis = 0; axis < 3; axis++) {
    const values = new Float64Array(sv.count);
    for (let s = 0; s < sv.count; s++) values[s] = model.coordinates[3 * sv.members[sv.memberPtr[s]] + axis];
    const distinct = [...new Set(values)].sort((a, b) => a - b);
    const index = new Map(distinct.map((v, k) => [v, k]));
    layer.push(Int32Array.from(values, (v) => index.get(v)!));
    extent[axis] = distinct.length;
  }
  const grid = new Int32Array(extent[0] * extent[1] * extent[2]).fill(-1);
  for (let s = 0; s < sv.count; s++) grid[layer[0][s] + extent[0] * (layer[1][s] + extent[1] * layer[2][s])] = s;
  const order = new Int32Array(sv.count);
  let out = 0;
  const emit = (lo: number[], hi: number[]): void => {
    for (let k = lo[2]; k <= hi[2]; k++)
      for (let j = lo[1]; j <= hi[1]; j++)
        for (let i = lo[0]; i <= hi[0]; i++) {
          const s = grid[i + extent[0] * (j + extent[1] * k)];
          if (s >= 0) order[out++] = s;
        }
  };
  const dissect = (lo: number[], hi: number[]): void => {
    const size = [0, 1, 2].map((a) => hi[a] - lo[a] + 1);
    if (size.some((d) => d <= 0)) return;
    if (size.every((d) => d === 1)) return emit(lo, hi);
    const axis = size.indexOf(Math.max(...size));
    const cut = lo[axis] + Math.floor((size[axis] - 1) / 2);
    dissect(lo, hi.map((v, a) => (a === axis ? cut - 1 : v)));
    dissect(lo.map((v, a) => (a === axis ? cut + 1 : v)), hi);
    emit(lo.map((v, a) => (a === axis ? cut : v)), hi.map((v, a) => (a === axis ? cut : v)));
  };
  dissect([0, 0, 0], extent.map((e) => e - 1));
  return { perm: expandOrdering(sv, order), ms: performance.now() - t };
}

function benchModel(label: string, model: GeneratedModel, checkTarget: boolean): void {
  const { stiffness, mass } = model;
  const n = stiffness.n;
  const withMap: ChooseOrderingOptions = { coordinates: model.coordinates, nodeOfDof: model.dofMap.node };
  console.log(`\n${label}: ${n} DOFs, stored nonzeros K ${stiffness.colPtr[n]}, M ${mass.colPtr[n]}`);
  const nnz: Partial<Record<OrderingName, number>> = {};
  const line = (name: string, ms: number, cpuMs: number, perm: Int32Array, extra = ''): void => {
    const { nnzL, flops } = factorCost(model, perm);
    const ratio = nnz.natural ? nnz.natural / nnzL : 1;
    console.log(
      `  ${name.padEnd(24)} ordering ${sec(ms).padStart(7)} (cpu ${sec(cpuMs)})  nnz(L) ${nnzL.toExponential(3)}` +
        `  natural/this ${ratio.toFixed(2).padStart(6)}  nnz(L)/n^(4/3) ${(nnzL / n ** (4 / 3)).toFixed(1)}` +
        `  Σcolcount² ${flops.toExponential(3)}${extra}`,
    );
  };
  // each ordering alone, with the DOF map
  for (const name of ORDERINGS) {
    const cpu0 = process.cpuUsage();
    const r = chooseOrdering(stiffness, mass, { ...withMap, ordering: name });
    const cpu = process.cpuUsage(cpu0);
    nnz[name] = r.predictedNnzL;
    // cpu covers graph, compression, ordering and one prediction; wall is the ordering alone
    line(name, r.candidates[0].ms, (cpu.user + cpu.system) / 1000, r.perm, `  (graph + ${r.supervariables} supervariables ${sec(r.graphMs)})`);
  }
  const cpu0 = process.cpuUsage();
  const old = levelStructureDissection(model);
  const cpu = process.cpuUsage(cpu0);
  line('nested-dissection (levels)', old.ms, (cpu.user + cpu.system) / 1000, old.perm, '  (former single-level dissection)');
  // the former leaf size with coordinate bisection (its median cuts are unchanged on these models)
  const c0 = process.cpuUsage();
  const cb200 = chooseOrdering(stiffness, mass, { ...withMap, ordering: 'coordinate-bisection', leafSize: 200 });
  const c1 = process.cpuUsage(c0);
  line('coord.-bisection leaf 200', cb200.candidates[0].ms, (c1.user + c1.system) / 1000, cb200.perm, '  (former leaf size)');
  if (checkTarget) {
    const c2 = process.cpuUsage();
    const ideal = idealPlaneDissection(model);
    const c3 = process.cpuUsage(c2);
    line('ideal plane dissection', ideal.ms, (c3.user + c3.system) / 1000, ideal.perm, '  (reference: median node planes of the grid, graph included)');
  }
  for (const [what, options] of [
    ['with DOF map', withMap],
    ['pattern only', {}],
  ] as const) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    const auto = chooseOrdering(stiffness, mass, { ...options, ordering: 'auto' });
    const ms = performance.now() - t0;
    const c1 = process.cpuUsage(c0);
    const list = auto.candidates.map((c) => `${c.name} ${c.nnzL.toExponential(2)} in ${sec(c.ms)}`).join(', ');
    console.log(
      `  auto (${what}): chose ${auto.name}, nnz(L) ${auto.predictedNnzL.toExponential(3)}, ${auto.supervariables} supervariables,` +
        ` total ${sec(ms)} (cpu ${sec((c1.user + c1.system) / 1000)}) incl. predictions [${list}]`,
    );
    if (checkTarget) {
      const ok = auto.predictedNnzL * 5 <= nnz.natural!;
      console.log(`  target nnz(L) ≤ natural/5 (${(nnz.natural! / 5).toExponential(3)}): ${ok ? 'met' : 'NOT met'} (ratio ${(nnz.natural! / auto.predictedNnzL).toFixed(2)})`);
    }
  }
}

/** Lower-storage pattern (unit values) from each column's rows below the diagonal. */
function patternFromColumns(n: number, below: (j: number) => number[]): SymmetricCsc {
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  // the diagonal, then the rows below it, ascending
  for (let j = 0; j < n; j++) {
    rows.push(j, ...below(j));
    colPtr[j + 1] = rows.length;
  }
  const rowIdx = Int32Array.from(rows);
  return { n, colPtr, rowIdx, values: new Float64Array(rowIdx.length).fill(1) };
}

/** Each ordering of one pattern (K, with M = I) alone, then the automatic choice. */
function benchPattern(label: string, stiffness: SymmetricCsc): void {
  const mass = patternFromColumns(stiffness.n, () => []);
  const times: string[] = [];
  for (const name of ['amd', 'nested-dissection'] as const) {
    const c0 = process.cpuUsage();
    const r = chooseOrdering(stiffness, mass, { ordering: name });
    const c1 = process.cpuUsage(c0);
    // wall time of the ordering alone; cpu of this process for graph, ordering and one fill count
    times.push(`${name} ${sec(r.candidates[0].ms)} (cpu ${sec((c1.user + c1.system) / 1000)})`);
  }
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const auto = chooseOrdering(stiffness, mass, { ordering: 'auto' });
  const ms = performance.now() - t0;
  const c1 = process.cpuUsage(c0);
  console.log(
    `  ${label.padEnd(44)} ${String(stiffness.n).padStart(6)} DOFs  ${times.join(', ')};  auto ${sec(ms)} total (cpu ${sec((c1.user + c1.system) / 1000)})` +
      ` (chose ${auto.name}, nnz(L) ${auto.predictedNnzL}, ${auto.supervariables} supervariables)`,
  );
}

/** Orderings of uncoupled DOFs, many small blocks and a star: all must stay near-linear. */
function benchUncoupled(): void {
  console.log('\nuncoupled and block-diagonal patterns (M = I); target < 1 s at 30k uncoupled DOFs');
  for (const n of [10_000, 20_000, 30_000, 40_000]) benchPattern('diagonal K (uncoupled DOFs)', patternFromColumns(n, () => []));
  // cliques of 1..30 DOFs, sizes cycling deterministically
  const blockOf: number[] = [];
  for (let b = 0, start = 0; start < 30_000; b++) {
    const size = 1 + ((b * 7) % 30);
    for (let k = 0; k < size && start + k < 30_000; k++) blockOf.push(start);
    start += size;
  }
  const blockEnd = (j: number): number => {
    let e = j;
    while (e + 1 < blockOf.length && blockOf[e + 1] === blockOf[j]) e++;
    return e;
  };
  benchPattern('block-diagonal K (cliques of 1–30 DOFs)', patternFromColumns(blockOf.length, (j) => {
    const rows: number[] = [];
    for (let i = j + 1; i <= blockEnd(j); i++) rows.push(i);
    return rows;
  }));
  benchPattern('path K (DOF j coupled to j + 1)', patternFromColumns(30_000, (j) => (j + 1 < 30_000 ? [j + 1] : [])));
  benchPattern('star K (DOF 0 coupled to all others)', patternFromColumns(30_000, (j) => (j === 0 ? Array.from({ length: 29_999 }, (_, k) => k + 1) : [])));
}

export default async function orderingBench(): Promise<void> {
  const only = process.env.ORDERING_BENCH_MODEL;
  if (only === 'uncoupled') return benchUncoupled();
  if (!only || only === 'cube') benchModel('hex solid 40×32×30 elements (xMin clamped)', clampedHexSolid(), true);
  if (!only || only === 'hex') benchModel('hex box 39×39×24 elements (free-free)', freeHexBox(), true);
  if (!only || only === 'frame') benchModel('space frame 22×22×21 nodes (base clamped)', latticeFrame(), false);
}
