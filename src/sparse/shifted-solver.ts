/**
 * Front door of the sparse LDLᵀ layer: ordering and symbolic analysis of the pattern of K + M
 * once, then `factor(σ)` computes P (K − σM) Pᵀ = L D Lᵀ on that fixed structure.
 */
import type { SymmetricCsc } from './csc.js';
import type {
  FactorDiagnostics,
  OrderingName,
  ShiftedFactor,
  ShiftedSolver,
  ShiftedSolverOptions,
} from './factor-types.js';
import { factorStructureCounts } from './column-counts.js';
import { permutePair, type PermutedPair } from './permute.js';
import { PivotMonitor } from './pivot-monitor.js';
import { simplicialLdlt, simplicialSolveInPlace } from './simplicial-ldlt.js';
import { relabelTree } from './postorder.js';

/** Default relative zero-pivot tolerance (our choice, see factor-types). */
export const DEFAULT_ZERO_PIVOT_TOLERANCE = 1e-13;

interface ChosenOrdering {
  perm: Int32Array;
  name: OrderingName;
}

function chooseShiftedOrdering(stiffness: SymmetricCsc, _mass: SymmetricCsc, _options: ShiftedSolverOptions): ChosenOrdering {
  const perm = new Int32Array(stiffness.n);
  // natural order: pivot k is DOF k
  for (let k = 0; k < perm.length; k++) perm[k] = k;
  return { perm, name: 'natural' };
}

function checkPair(stiffness: SymmetricCsc, mass: SymmetricCsc): void {
  if (stiffness.n !== mass.n) {
    throw new RangeError(`stiffness is ${stiffness.n}×${stiffness.n} but mass is ${mass.n}×${mass.n}`);
  }
}

/** Largest |k_jj − σ m_jj| over the diagonal of the permuted pair. */
function maxDiagonal(pair: PermutedPair, shift: number): number {
  let m = 0;
  // the diagonal is the first stored entry of its column
  for (let j = 0; j < pair.n; j++) {
    const p = pair.colPtr[j];
    if (p < pair.colPtr[j + 1] && pair.rowIdx[p] === j) {
      const v = Math.abs(pair.stiffness[p] - shift * pair.mass[p]);
      if (v > m) m = v;
    }
  }
  return m;
}

export function createShiftedSolver(
  stiffness: SymmetricCsc,
  mass: SymmetricCsc,
  options: ShiftedSolverOptions = {},
): ShiftedSolver {
  checkPair(stiffness, mass);
  const n = stiffness.n;
  const tolerance = options.zeroPivotTolerance ?? DEFAULT_ZERO_PIVOT_TOLERANCE;
  const t0 = performance.now();
  const first = chooseShiftedOrdering(stiffness, mass, options);
  const t1 = performance.now();
  // postorder the elimination tree of the pattern of K + M and fold it into the ordering
  const natural = permutePair(stiffness, mass, first.perm);
  const pattern: SymmetricCsc = { n, colPtr: natural.colPtr, rowIdx: natural.rowIdx, values: natural.stiffness };
  const identity = new Int32Array(n);
  for (let k = 0; k < n; k++) identity[k] = k;
  const s = factorStructureCounts(pattern, identity);
  const perm = new Int32Array(n);
  const counts = new Int32Array(n);
  // final pivot order: first ordering followed by the postorder of its elimination tree
  for (let k = 0; k < n; k++) {
    perm[k] = first.perm[s.post[k]];
    counts[k] = s.counts[s.post[k]];
  }
  const parent = relabelTree(s.parent, s.post);
  const pair = permutePair(stiffness, mass, perm);
  let flops = 0;
  // per column: r divisions and r(r+1)/2 multiply-adds (r = off-diagonal count)
  for (let j = 0; j < n; j++) {
    const r = counts[j] - 1;
    flops += r + r * (r + 1);
  }
  const t2 = performance.now();
  const nnzL = s.nnzL;

  function factor(shift: number): ShiftedFactor {
    const t3 = performance.now();
    const monitor = new PivotMonitor(tolerance, maxDiagonal(pair, shift));
    const f = simplicialLdlt(pair, shift, parent, counts, monitor);
    const t4 = performance.now();
    const diagnostics: FactorDiagnostics = {
      ordering: first.name,
      n,
      nnzL,
      flops,
      supernodes: n,
      timings: { orderingMs: t1 - t0, symbolicMs: t2 - t1, numericMs: t4 - t3 },
      factorBytes: f.values.byteLength + f.rowIdx.byteLength + f.colPtr.byteLength + f.d.byteLength,
      maxDiagonalToPivotRatio: monitor.maxRatio,
      maxRatioDof: monitor.maxRatioIndex >= 0 ? perm[monitor.maxRatioIndex] : -1,
      tinyPivots: monitor.tinyPivots(perm),
    };
    const work = new Float64Array(n);
    function solve(b: Float64Array, x: Float64Array = new Float64Array(n)): Float64Array {
      // gather into pivot order, solve, scatter back
      for (let k = 0; k < n; k++) work[k] = b[perm[k]];
      simplicialSolveInPlace(f, work);
      for (let k = 0; k < n; k++) x[perm[k]] = work[k];
      return x;
    }
    function solveBlock(b: Float64Array, k: number, x: Float64Array = new Float64Array(n * k)): Float64Array {
      // one column at a time
      for (let c = 0; c < k; c++) {
        const col = b.subarray(c * n, (c + 1) * n);
        solve(col, x.subarray(c * n, (c + 1) * n));
      }
      return x;
    }
    return { n, shift, inertia: monitor.inertia(), diagnostics, solve, solveBlock };
  }

  return { n, ordering: first.name, predictedNnzL: nnzL, factor };
}
