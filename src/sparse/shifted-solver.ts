/**
 * Front door of the sparse LDLᵀ layer: ordering and symbolic analysis of the pattern of K + M
 * once, then `factor(σ)` computes P (K − σM) Pᵀ = L D Lᵀ (supernodal, no pivoting) on that
 * fixed structure. Each factor owns its values, so earlier factors stay valid after a refactor.
 */
import type { SymmetricCsc } from './csc.js';
import type { FactorDiagnostics, KernelKind, ShiftedFactor, ShiftedSolver, ShiftedSolverOptions } from './factor-types.js';
import { chooseOrdering } from './ordering/choose-ordering.js';
import { supernodalLdlt, type RecycledValues, type SupernodalFactor } from './numeric-ldlt.js';
import { PivotMonitor } from './pivot-monitor.js';
import { analyzeShiftedPair, type SupernodalStructure } from './symbolic.js';
import { supernodalSolveInPlace } from './triangular-solve.js';
import { availableThreads, sharedInt32, sharedScratch } from './helper-thread.js';
import { parallelSupernodalLdlt, shareStructure } from './split-factor.js';
import { prepareSplitSolve, splitSolveInPlace, type SplitSolve } from './split-solve.js';
import { splitSubtrees, type SubtreeSplit } from './subtree-split.js';
import { MemoryLimitError, predictedFactorBytes } from './memory-limit.js';
import { simdTileKernelInUse } from './dense-block-kernels.js';
import { tileKernelsAvailable } from './wasm-tile-kernel.js';
import { shiftedEntry } from './permute.js';
import { sharedMatrix } from './block-product-jobs.js';

/**
 * Factorizations of fewer flops stay on one thread (our choice: about a tenth of a second of
 * work, where handing out the halves stops paying).
 */
const PARALLEL_MIN_FLOPS = 2e8;
/** A split whose estimated time is above this share of the serial time is not worth a thread. */
const PARALLEL_MAX_TIME_RATIO = 0.85;

/** Default relative zero-pivot tolerance (our choice, see factor-types). */
const DEFAULT_ZERO_PIVOT_TOLERANCE = 1e-13;

function checkPair(stiffness: SymmetricCsc, mass: SymmetricCsc): void {
  if (stiffness.n !== mass.n) {
    throw new RangeError(`stiffness is ${stiffness.n}×${stiffness.n} but mass is ${mass.n}×${mass.n}`);
  }
}

/** Largest |k_jj − σ m_jj| (scale for pivots whose own diagonal is zero). */
function maxShiftedDiagonal(s: SupernodalStructure, shift: number): number {
  const { pair } = s;
  let m = 0;
  // the diagonal is the first stored entry of its column
  for (let j = 0; j < s.n; j++) {
    const p = pair.colPtr[j];
    if (p < pair.colPtr[j + 1] && pair.rowIdx[p] === j) m = Math.max(m, Math.abs(shiftedEntry(pair, p, shift)));
  }
  return m;
}

/**
 * The structure with its pair reading K's and M's values from their shared copies
 * (block-product-jobs.ts, sharedMatrix: made once per matrix and used by the products too),
 * when there are helper threads; else unchanged.
 */
function withSharedValues(s: SupernodalStructure, stiffness: SymmetricCsc, mass: SymmetricCsc): SupernodalStructure {
  // sharedMatrix's copy holds the same entries in the same order, in shared memory
  const shared = (a: SymmetricCsc): Float64Array | null => sharedMatrix(a)?.values ?? null;
  const k = shared(stiffness);
  const m = shared(mass);
  if (!k || !m) return s;
  return { ...s, pair: { ...s.pair, stiffnessValues: k, massValues: m } };
}

/**
 * The split of the tree over the most threads (up to `threads`) whose modelled time is within
 * PARALLEL_MAX_TIME_RATIO of the serial one; null when none is (the factorization stays serial).
 */
function chooseSplit(s: SupernodalStructure, threads: number): SubtreeSplit | null {
  // the most threads first: fewer only when the tree does not split that many ways
  for (let t = threads; t >= 2; t--) {
    const split = splitSubtrees(s, t);
    if (split !== null && split.timeRatio <= PARALLEL_MAX_TIME_RATIO) return split;
  }
  return null;
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
  const threads = Math.min(options.threads ?? Infinity, availableThreads());
  const order = chooseOrdering(stiffness, mass, { ordering: options.ordering ?? 'auto', coordinates: options.coordinates, threads });
  const t1 = performance.now();
  // with helper threads at hand the pair is made in shared memory: a split factorization then needs no copy of it
  const analyzed = analyzeShiftedPair(stiffness, mass, order.perm, order.tree, threads >= 2 ? sharedInt32 : undefined);
  const split = analyzed.flops >= PARALLEL_MIN_FLOPS ? chooseSplit(analyzed, threads) : null;
  if (options.memoryLimitBytes !== undefined) {
    // scratch for the threads that will factor: as many as the tree was split into
    const predicted = predictedFactorBytes(analyzed, split ? split.parts.length : 1) + (options.extraBytes ?? 0);
    if (predicted > options.memoryLimitBytes) throw new MemoryLimitError(predicted, options.memoryLimitBytes, analyzed.nnzL);
  }
  // shared memory lets the helper threads read the structure without a copy; K's and M's values
  // are read from the shared copies the block products use (one copy per matrix, not two)
  const structure = split ? shareStructure(withSharedValues(analyzed, stiffness, mass)) : analyzed;
  const solvePlan = split ? prepareSplitSolve(structure, split) : null;
  const t2 = performance.now();
  const { perm } = structure;
  /** The values of the last released factor, for the next factorization. */
  let spare: RecycledValues | undefined;

  function factor(shift: number): ShiftedFactor {
    const t3 = performance.now();
    const monitor = new PivotMonitor(tolerance, maxShiftedDiagonal(structure, shift));
    const recycled = spare;
    spare = undefined;
    const parallel = split ? parallelSupernodalLdlt(structure, shift, monitor, split, recycled) : null;
    const f = parallel ?? supernodalLdlt(structure, shift, monitor, recycled);
    const t4 = performance.now();
    const diagnostics: FactorDiagnostics = {
      ordering: order.name,
      n,
      nnzL: structure.nnzL,
      flops: structure.flops,
      supernodes: structure.supernodes,
      timings: { orderingMs: t1 - t0, symbolicMs: t2 - t1, numericMs: t4 - t3 },
      factorBytes: factorBytes(f),
      maxDiagonalToPivotRatio: monitor.maxRatio,
      maxRatioDof: monitor.maxRatioIndex >= 0 ? perm[monitor.maxRatioIndex] : -1,
      tinyPivots: monitor.tinyPivots(perm),
      threads: parallel && split ? split.parts.length : 1,
      kernels: kernelKinds(f),
    };
    return makeFactor(f, shift, monitor, diagnostics, parallel ? solvePlan : null, (values) => {
      spare = values;
    });
  }

  return { n, ordering: order.name, predictedNnzL: structure.nnzL, orderingCandidates: order.candidates, factor };
}

/**
 * The kernels a factor's products run in: with its values in a WebAssembly memory, the in-place
 * strip kernels (factorization) and the SIMD sweeps read them there; otherwise the updates run
 * on packed copies, in the SIMD tile kernel when it is on, and the sweeps in TypeScript.
 */
function kernelKinds(f: SupernodalFactor): { factor: KernelKind; sweeps: KernelKind } {
  if (f.storage) return { factor: tileKernelsAvailable() ? 'simd' : 'plain', sweeps: 'simd' };
  return { factor: simdTileKernelInUse() ? 'simd' : 'plain', sweeps: 'plain' };
}

/** Bytes of the arrays a factor holds (values, D, and the structure's index arrays). */
function factorBytes(f: SupernodalFactor): number {
  const s = f.structure;
  return (
    f.values.byteLength + f.d.byteLength + s.rows.byteLength + s.rowPtr.byteLength + s.superStart.byteLength + s.valuePtr.byteLength
  );
}

function makeFactor(
  f: SupernodalFactor,
  shift: number,
  monitor: PivotMonitor,
  diagnostics: FactorDiagnostics,
  plan: SplitSolve | null,
  giveBack: (values: RecycledValues) => void,
): ShiftedFactor {
  const s = f.structure;
  const { n, perm } = s;
  const inertia = monitor.inertia();
  // one shared right-hand-side block per factor, reused
  const sharedWork = plan ? sharedScratch() : null;
  let released = false;

  function solveBlock(b: Float64Array, k: number, x: Float64Array = new Float64Array(n * k)): Float64Array {
    if (released) throw new Error(`the factor at shift ${shift} was released; factor again to solve`);
    if (b.length < n * k || x.length < n * k) throw new RangeError(`block of ${k} columns needs ${n * k} entries`);
    const work = sharedWork ? sharedWork(n * k) : new Float64Array(n * k);
    // gather into pivot order: work(q, c) = b(perm[q], c)
    for (let c = 0; c < k; c++) {
      const o = c * n;
      for (let q = 0; q < n; q++) work[o + q] = b[o + perm[q]];
    }
    if (!(plan && splitSolveInPlace(f, work, k, plan))) supernodalSolveInPlace(f, work, k);
    // scatter back to DOF order
    for (let c = 0; c < k; c++) {
      const o = c * n;
      for (let q = 0; q < n; q++) x[o + perm[q]] = work[o + q];
    }
    return x;
  }

  return {
    n,
    shift,
    inertia,
    diagnostics,
    solve: (b, x) => solveBlock(b, 1, x),
    solveBlock,
    release() {
      if (released) return;
      released = true;
      giveBack({ values: f.values, ...(f.storage ? { storage: f.storage } : {}) });
    },
  };
}
