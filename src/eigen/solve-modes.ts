/**
 * Front door of the eigen layer: the lowest N modes of K φ = λ M φ, or every mode below a
 * frequency cutoff, with the verification of verification.ts attached.
 *
 *   1. count (cutoff mode): N = negative pivots of LDLᵀ(K − σ_c M), σ_c = (2π f_max)²;
 *   2. shift: σ₁ from the diagonal (shift-placement.ts); when the first pass's estimates show σ₁
 *      badly placed (judged after four blocks of Lanczos, or after an iteration of subspace
 *      iteration) it is abandoned and the solve restarts at σ₂ = −0.01 λ_e from its Ritz vectors;
 *   3. solve with block Lanczos or subspace iteration on (K − σM)⁻¹M;
 *   4. polish: one more step Φ ← (K − σM)⁻¹MΦ when M has massless DOFs (purifies the null(M)
 *      components, docs/sources.md §8) or a residual is above 1e-10 (PURIFY_ABOVE_RESIDUAL: it sharpens them); then
 *      M-orthonormalize and a final Rayleigh–Ritz with K;
 *   5. whole clusters: when λ_N is repeated (verification.ts, sameEigenvalue) and the count
 *      ends inside its cluster, the rest of the cluster is solved for and returned too, and
 *      `clusterExtension` says so — a count cannot prove "the lowest N" when λ_N = λ_{N+1};
 *   6. verify: Sturm count in the gap after the last returned mode (or at the cutoff),
 *      residuals, orthogonality.
 *
 * Whenever a shift meets a tiny pivot (it sits on an eigenvalue, or K − σM is singular) it is
 * moved and a warning says so.
 */
import { createShiftedSolver } from '../sparse/shifted-solver.js';
import { withThreadsForDofs } from '../sparse/helper-thread.js';
import { symOneNorm, type SymmetricCsc } from '../sparse/csc.js';
import type { FactorDiagnostics, ShiftedFactor, ShiftedSolver } from '../sparse/factor-types.js';
import {
  frequencyHzFromEigenvalue,
  eigenvalueFromFrequencyHz,
  type ClusterExtension,
  type ModesRequest,
  type ModesResult,
  type SturmCheck,
} from './modes-types.js';
import { createShiftInvertOperator, massRankBound, type ShiftInvertOperator } from './shift-invert-operator.js';
import { basisVectors, blockLanczos } from './block-lanczos.js';
import { subspaceIteration } from './subspace-iteration.js';
import { mOrthonormalize } from './m-orthonormalize.js';
import { rayleighRitz } from './rayleigh-ritz.js';
import { EIGENPAIR_RESIDUAL_LIMIT } from './residual-measure.js';
import { checkShapes, CLUSTER_RELATIVE_TOLERANCE, placeSturmShift } from './verification.js';
import { diagonalScale, firstShiftGuess, judgeShift, rigidBodyZero, type DiagonalScale } from './shift-placement.js';
import type { EigenSearch, EigenSearchResult } from './search-types.js';

/** The method used when the request names none (block Lanczos: fewer solves in test/bench/modes-bench.ts). */
const DEFAULT_METHOD: 'lanczos' | 'subspace' = 'lanczos';
const DEFAULT_TOLERANCE = 1e-12;
/**
 * Without massless DOFs the extra purification solve is spent only when a residual exceeds this
 * (our choice). A converged rigid-body mode sits at the residual measure's rounding floor
 * ε/τ ≈ 2e-11 (residual-measure.ts), which another solve cannot lower, so the trigger is set
 * above it: at 1e-10, the residual the modes must meet.
 */
const PURIFY_ABOVE_RESIDUAL = 1e-10;
/** Modes solved per shift; larger counts are found slice by slice (spectrum slicing). */
const SLICE_SIZE = 40;

interface Clock {
  factorMs: number;
  iterateMs: number;
  verifyMs: number;
}

/** What every stage of one modes solve shares: the pencil, its factorizations and the bookkeeping. */
interface SolveState {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  request: ModesRequest;
  method: 'lanczos' | 'subspace';
  scale: DiagonalScale;
  stiffnessNorm: number;
  /** n minus the massless DOFs: an upper bound of rank(M), so of the finite eigenvalues. */
  rankM: number;
  /** |λ| at or below this is a rigid-body (zero) eigenvalue for cluster purposes. */
  zero: number;
  /** Factor K − σM (moved off an eigenvalue when σ sits on one), recording shift and time. */
  factorAt(sigma: number): ShiftedFactor;
  warnings: string[];
  diagnostics: string[];
  clock: Clock;
}

export function solveModes(stiffness: SymmetricCsc, mass: SymmetricCsc, request: ModesRequest): ModesResult {
  // a model below ONE_THREAD_BELOW_DOFS on this thread alone, whoever asks (commands, pipeline, library)
  return withThreadsForDofs(stiffness.n, () => solveWithThreads(stiffness, mass, request));
}

function solveWithThreads(stiffness: SymmetricCsc, mass: SymmetricCsc, request: ModesRequest): ModesResult {
  const start = performance.now();
  const n = stiffness.n;
  if (mass.n !== n) throw new RangeError(`stiffness is ${n}×${n} but mass is ${mass.n}×${mass.n}`);
  if (request.count === undefined && request.maxHz === undefined) throw new RangeError('ask for a mode count or a cutoff frequency');
  const method = request.method ?? DEFAULT_METHOD;
  const warnings: string[] = [];
  const diagnostics: string[] = [];
  const clock: Clock = { factorMs: 0, iterateMs: 0, verifyMs: 0 };
  const shifts: number[] = [];
  const solver = createShiftedSolver(stiffness, mass, { coordinates: request.coordinates, memoryLimitBytes: request.memoryLimitBytes, extraBytes: besideFactorBytes(stiffness, mass, request) });
  const scale = diagonalScale(stiffness, mass);
  const rankM = massRankBound(mass);
  const factorAt = (sigma: number) => factorWithMove(solver, sigma, scale, warnings, shifts, clock);
  const state: SolveState = {
    stiffness,
    mass,
    request,
    method,
    scale,
    stiffnessNorm: symOneNorm(stiffness),
    rankM,
    zero: rigidBodyZero(scale),
    factorAt,
    warnings,
    diagnostics,
    clock,
  };

  let cutoff: { factor: ShiftedFactor; count: number } | undefined;
  let wanted = request.count ?? 0;
  if (request.maxHz !== undefined) {
    const f = factorAt(eigenvalueFromFrequencyHz(request.maxHz));
    // only its count and shift are needed from here on
    f.release();
    cutoff = { factor: f, count: f.inertia.negative };
    wanted = f.inertia.negative;
  }
  if (wanted > rankM) {
    warnings.push(`asked for ${wanted} modes but M has rank at most ${rankM} (massless DOFs): only ${rankM} finite eigenvalues exist`);
    wanted = rankM;
  }
  if (wanted === 0) {
    return emptyResult(n, method, cutoff, shifts, warnings, diagnostics, clock, start, solver);
  }
  const firstChunk = Math.min(wanted, SLICE_SIZE);
  const solveAll = (): Solved => {
    const lowest = solveAtGoodShift(state, firstChunk);
    return wanted > firstChunk ? slice(lowest, wanted) : lowest;
  };
  const slice = (from: Solved, upTo: number): Solved => sliceOnward(state, from, upTo);
  let whole = solveAll();
  let clusterExtension: ClusterExtension | undefined;
  if (!cutoff) {
    const extended = wholeCluster(whole, wanted, rankM, state.zero, slice);
    whole = extended.solved;
    clusterExtension = extended.extension;
  }
  // the iteration's factor is let go here, before the Sturm check allocates another one
  const { found: solved, diagnostics: factorDiagnostics } = withoutFactor(whole);
  const t0 = performance.now();
  const factorBefore = clock.factorMs;
  const checks = checkShapes(stiffness, mass, solved.values, solved.vectors, state.stiffnessNorm);
  const sturm = cutoff
    ? cutoffSturm(cutoff.factor, solved.values, warnings)
    : gapSturm(solved, factorAt, state.zero, clusterExtension, warnings);
  clock.verifyMs += performance.now() - t0 - (clock.factorMs - factorBefore);
  const shortfall = incompleteness(solved.values, wanted, sturm.shift);
  if (shortfall) {
    // fewer modes than exist, or numbers that are not numbers, are never "complete"
    sturm.ok = false;
    sturm.note = sturm.note ? `${sturm.note}; ${shortfall}` : shortfall;
    warnings.push(shortfall);
  }
  if (!solved.converged) warnings.push(...solved.warnings);
  else warnings.push(...solved.warnings.filter((w) => !w.includes('stopped')));
  const worst = Math.max(0, ...Array.from(checks.residuals));
  if (!(worst <= EIGENPAIR_RESIDUAL_LIMIT)) warnings.push(`largest eigenpair residual ${worst.toExponential(2)} is above ${EIGENPAIR_RESIDUAL_LIMIT}`);
  return {
    n,
    eigenvalues: solved.values,
    frequenciesHz: Float64Array.from(solved.values, frequencyHzFromEigenvalue),
    shapes: solved.vectors,
    residuals: checks.residuals,
    projections: checks.projections,
    ...(clusterExtension ? { clusterExtension } : {}),
    sturm,
    orthogonality: checks.orthogonality,
    method,
    shifts,
    iterations: solved.iterations,
    timings: { totalMs: performance.now() - start, factorMs: clock.factorMs, iterateMs: clock.iterateMs, verifyMs: Math.max(0, clock.verifyMs) },
    factor: factorDiagnostics,
    warnings,
    diagnostics,
    solves: solved.solves,
    rankMassBound: rankM,
  };
}

interface Solved {
  values: Float64Array;
  vectors: Float64Array;
  beyond: number[];
  iterations: number;
  converged: boolean;
  warnings: string[];
  factor: ShiftedFactor;
  solves: number;
}

function solveAtGoodShift(state: SolveState, wanted: number): Solved {
  const { stiffness, mass, factorAt, scale, stiffnessNorm, rankM, method, request, warnings, diagnostics, clock } = state;
  let sigma = firstShiftGuess(scale);
  let factor = belowEverything(factorAt, sigma, warnings);
  sigma = factor.shift;
  let op = createShiftInvertOperator(stiffness, mass, factor);
  const maxBasis = Math.min(rankM, stiffness.n);
  const base = (o: ShiftInvertOperator): EigenSearch => ({
    operator: o,
    count: wanted,
    tolerance: request.tolerance ?? DEFAULT_TOLERANCE,
    maxBasis,
    stiffnessNorm,
    onProgress: request.onProgress,
  });
  let better = sigma;
  const first = run(method, {
    ...base(op),
    checkpoint: (estimates) => {
      const verdict = judgeShift(op.shift, estimates, wanted, scale);
      better = verdict.better;
      return verdict.acceptable;
    },
  }, clock);
  let result = first;
  let solves = op.counts.solves;
  if (first.abandoned) {
    // the solve's own course, not a problem of the model: kept out of the warnings
    diagnostics.push(`shift ${sigma.toPrecision(3)} was badly placed for this spectrum; solved again at ${better.toPrecision(3)}`);
    factor.release();
    factor = belowEverything(factorAt, better, warnings);
    op = createShiftInvertOperator(stiffness, mass, factor);
    result = run(method, { ...base(op), start: first.estimateVectors, startCount: first.estimateCount }, clock);
    solves += op.counts.solves;
  }
  const t0 = performance.now();
  const worstResidual = Math.max(0, ...Array.from(result.residuals));
  const polished = polish(op, result, rankM < stiffness.n || worstResidual > PURIFY_ABOVE_RESIDUAL);
  clock.iterateMs += performance.now() - t0;
  solves += polished.solves;
  const beyond = Array.from(result.estimates).slice(polished.values.length);
  return { ...polished, beyond, iterations: first.iterations + (first.abandoned ? result.iterations : 0), converged: result.converged, warnings: result.warnings, factor, solves };
}

/**
 * Spectrum slicing: after the lowest slice, place the next shift in the gap above the highest
 * found eigenvalue (as for a Sturm check), confirm there that the count below equals the modes
 * found so far, and solve the next slice nearest that shift, M-orthogonal to everything found
 * (deflation). Each slice's factorization both proves the previous slice complete and drives
 * the next solve.
 */
function sliceOnward(state: SolveState, first: Solved, wanted: number): Solved {
  const { stiffness, mass, factorAt, stiffnessNorm, rankM, zero, method, request, warnings, clock } = state;
  const n = stiffness.n;
  let values = Array.from(first.values);
  let vectors = first.vectors;
  let beyond = first.beyond;
  let iterations = first.iterations;
  let solves = first.solves;
  let converged = first.converged;
  let factor = first.factor;
  const notes: string[] = [...first.warnings];
  // one slice per pass until every wanted mode is found
  while (values.length < wanted) {
    const placement = placeSturmShift(Float64Array.from(values), beyond, zero);
    factor.release();
    factor = factorAt(placement.shift);
    // the shift lies past a cluster that straddles the slice's end: its rest is expected below
    if (factor.inertia.negative !== placement.expectedBelow) {
      warnings.push(`slice check: ${factor.inertia.negative} eigenvalues below ${factor.shift.toPrecision(8)} but ${placement.expectedBelow} expected`);
    }
    const op = createShiftInvertOperator(stiffness, mass, factor);
    const count = Math.min(SLICE_SIZE, wanted - values.length);
    const deflation = { vectors, massVectors: op.massTimes(vectors, values.length), count: values.length };
    const r = run(method, {
      operator: op,
      count,
      tolerance: request.tolerance ?? DEFAULT_TOLERANCE,
      maxBasis: Math.min(rankM, n) - values.length,
      stiffnessNorm,
      deflation,
      onProgress: request.onProgress,
    }, clock);
    if (r.count === 0) break;
    const merged = mergeSorted(values, vectors, r, n);
    values = merged.values;
    vectors = merged.vectors;
    beyond = Array.from(r.estimates).filter((v) => v > values[values.length - 1]);
    iterations += r.iterations;
    solves += op.counts.solves;
    converged &&= r.converged;
    notes.push(...r.warnings);
  }
  return { values: Float64Array.from(values), vectors, beyond, iterations, converged, warnings: notes, factor, solves };
}

/**
 * When the estimates beyond λ_N coincide with it (the count ends inside a cluster), solve for
 * the rest of the cluster with one more slice past it and return those modes too (at most three
 * rounds, for a cluster larger than the estimates first showed).
 */
function wholeCluster(
  solved: Solved,
  requested: number,
  rankM: number,
  zero: number,
  slice: (from: Solved, upTo: number) => Solved,
): { solved: Solved; extension?: ClusterExtension } {
  const eigenvalue = solved.values[requested - 1];
  // add the cluster's rest until the estimates past the last mode no longer coincide with it
  for (let round = 0; round < 3; round++) {
    const rest = placeSturmShift(solved.values, solved.beyond, zero).clusterRest;
    const target = Math.min(rankM, solved.values.length + rest);
    if (rest === 0 || target <= solved.values.length) break;
    const before = solved.values.length;
    solved = slice(solved, target);
    if (solved.values.length === before) break;
  }
  if (solved.values.length <= requested || eigenvalue === undefined) return { solved };
  const rigidBody = Math.abs(eigenvalue) <= zero;
  return { solved, extension: { requested, returned: solved.values.length, eigenvalue, relativeTolerance: CLUSTER_RELATIVE_TOLERANCE, rigidBody } };
}

/** Found pairs plus a new slice's pairs, ascending. */
function mergeSorted(values: number[], vectors: Float64Array, r: EigenSearchResult, n: number): { values: number[]; vectors: Float64Array } {
  const all = [...values.map((v, i) => ({ v, from: vectors, i })), ...Array.from(r.values, (v, i) => ({ v, from: r.vectors, i }))];
  all.sort((a, b) => a.v - b.v);
  const out = new Float64Array(n * all.length);
  // column t of the merged block
  all.forEach((e, t) => out.set(e.from.subarray(e.i * n, (e.i + 1) * n), t * n));
  return { values: all.map((e) => e.v), vectors: out };
}

function run(method: 'lanczos' | 'subspace', search: EigenSearch, clock: Clock): EigenSearchResult {
  const t0 = performance.now();
  const r = method === 'lanczos' ? blockLanczos(search) : subspaceIteration(search);
  clock.iterateMs += performance.now() - t0;
  return r;
}

/** Move σ down until no eigenvalue lies below it (a non-zero count means K is indefinite). */
function belowEverything(factorAt: (sigma: number) => ShiftedFactor, sigma: number, warnings: string[]): ShiftedFactor {
  let f = factorAt(sigma);
  let tries = 0;
  // σ ← 100 σ while eigenvalues remain below it
  while (f.inertia.negative > 0 && tries < 6) {
    if (tries === 0) warnings.push(`${f.inertia.negative} eigenvalue(s) below ${sigma.toPrecision(3)}: K is not positive semidefinite`);
    sigma = sigma * 100 - 1e-300;
    f.release();
    f = factorAt(sigma);
    tries++;
  }
  return f;
}

/** Optional purification, then M-orthonormalization and Rayleigh–Ritz with K on the found vectors. */
function polish(op: ShiftInvertOperator, r: EigenSearchResult, purify: boolean): { values: Float64Array; vectors: Float64Array; solves: number } {
  const n = op.n;
  if (r.count === 0) return { values: new Float64Array(0), vectors: new Float64Array(0), solves: 0 };
  const before = op.counts.solves;
  const x = purify ? op.apply(r.vectors, r.count) : r.vectors;
  const basis = mOrthonormalize(x, r.count, n, op.massTimes);
  const ritz = rayleighRitz(basis, n, op.stiffnessTimes);
  const vectors = ritz.vectors;
  // sign convention: the largest component of each shape is positive
  for (let j = 0; j < ritz.count; j++) {
    let big = 0;
    for (let i = j * n; i < (j + 1) * n; i++) if (Math.abs(vectors[i]) > Math.abs(big)) big = vectors[i];
    if (big < 0) for (let i = j * n; i < (j + 1) * n; i++) vectors[i] = -vectors[i];
  }
  return { values: ritz.values, vectors, solves: op.counts.solves - before };
}

/** Factor at σ; on tiny pivots move σ down by 1e-3 of its scale (at most 3 times) and warn. */
function factorWithMove(
  solver: ShiftedSolver,
  sigma: number,
  scale: DiagonalScale,
  warnings: string[],
  shifts: number[],
  clock: Clock,
): ShiftedFactor {
  const t0 = performance.now();
  let f = solver.factor(sigma);
  for (let tries = 0; f.diagnostics.tinyPivots.length > 0 && tries < 3; tries++) {
    const moved = sigma - 1e-3 * Math.max(Math.abs(sigma), 1e-12 * scale.minRatio) * (tries + 1);
    warnings.push(`shift ${sigma.toPrecision(6)} met ${f.diagnostics.tinyPivots.length} tiny pivot(s); moved to ${moved.toPrecision(6)}`);
    sigma = moved;
    f.release();
    f = solver.factor(sigma);
  }
  shifts.push(f.shift);
  const ms = performance.now() - t0;
  clock.factorMs += ms;
  return f;
}

/** The solution without its factorization (only the factor's diagnostics are kept). */
function withoutFactor(s: Solved): { found: Omit<Solved, 'factor'>; diagnostics: FactorDiagnostics } {
  const { factor, ...found } = s;
  factor.release();
  return { found, diagnostics: factor.diagnostics };
}

/** Sturm count in the gap after λ_N; if it comes out high, once more closer to λ_N. */
function gapSturm(
  solved: Omit<Solved, 'factor'>,
  factorAt: (sigma: number) => ShiftedFactor,
  zero: number,
  extension: ClusterExtension | undefined,
  warnings: string[],
): SturmCheck {
  const count = solved.values.length;
  if (count === 0) return { shift: NaN, countBelow: 0, modesReturned: 0, ok: false };
  const placement = placeSturmShift(solved.values, solved.beyond, zero);
  let f = factorAt(placement.shift);
  f.release();
  const last = solved.values[count - 1];
  if (f.inertia.negative > placement.expectedBelow) {
    const closer = last + 0.01 * (placement.shift - last);
    if (closer > last) {
      f = factorAt(closer);
      f.release();
    }
  }
  // complete means: the count equals the modes returned (the same test as the modes-complete rule)
  const ok = f.inertia.negative === count;
  const notes: string[] = [];
  if (extension) notes.push(clusterNote(extension));
  if (placement.clusterRest > 0) {
    notes.push(`the cluster at mode ${count} continues past the modes returned: ${placement.clusterRest} more estimate(s) equal to λ_${count} could not be returned`);
  }
  if (!ok) {
    warnings.push(
      f.inertia.negative > count
        ? `Sturm count ${f.inertia.negative} at ${f.shift.toPrecision(8)} exceeds the ${count} modes returned below it: ${f.inertia.negative - count} mode(s) were missed`
        : `Sturm count ${f.inertia.negative} at ${f.shift.toPrecision(8)} is below the ${count} modes returned below it`,
    );
  }
  return { shift: f.shift, countBelow: f.inertia.negative, modesReturned: count, ok, ...(notes.length ? { note: notes.join('; ') } : {}) };
}

/** One sentence for a cluster extension (shown by `modes` and in the reports' Sturm note). */
function clusterNote(e: ClusterExtension): string {
  const extra = e.returned - e.requested;
  const hz = frequencyHzFromEigenvalue(e.eigenvalue);
  const what = e.rigidBody
    ? `mode ${e.requested} is a rigid-body (zero) mode, so ${extra} more rigid-body mode(s) were returned`
    : `mode ${e.requested} (${Number(hz.toPrecision(6))} Hz) is repeated, so ${extra} more mode(s) equal to it (relative ${e.relativeTolerance}) were returned`;
  return `${e.requested} mode(s) requested; ${what} to complete the cluster: ${e.returned} modes`;
}

/**
 * Why a solution cannot be complete whatever the Sturm count says: fewer modes than asked (the
 * request was already capped at the finite eigenvalues M allows), a non-finite eigenvalue, or
 * a non-finite Sturm shift. Null when none applies.
 */
export function incompleteness(values: Float64Array, wanted: number, shift: number): string | null {
  if (values.length < wanted) return `only ${values.length} of ${wanted} modes were found`;
  if (values.some((v) => !Number.isFinite(v))) return 'the solve produced non-finite eigenvalues';
  if (!Number.isFinite(shift)) return 'the Sturm check shift is not a finite number';
  return null;
}

/** Cutoff mode: the count at the cutoff must equal the modes returned, all of them below it. */
function cutoffSturm(f: ShiftedFactor, values: Float64Array, warnings: string[]): SturmCheck {
  const below = Array.from(values).filter((v) => v < f.shift).length;
  const ok = below === values.length && f.inertia.negative === values.length;
  if (!ok) warnings.push(`Sturm count ${f.inertia.negative} below the cutoff but ${below} of ${values.length} returned modes lie below it`);
  return { shift: f.shift, countBelow: f.inertia.negative, modesReturned: values.length, ok };
}

function emptyResult(
  n: number,
  method: 'lanczos' | 'subspace',
  cutoff: { factor: ShiftedFactor; count: number } | undefined,
  shifts: number[],
  warnings: string[],
  diagnostics: string[],
  clock: Clock,
  start: number,
  solver: ShiftedSolver,
): ModesResult {
  const factor = cutoff?.factor ?? solver.factor(0);
  return {
    n,
    eigenvalues: new Float64Array(0),
    frequenciesHz: new Float64Array(0),
    shapes: new Float64Array(0),
    residuals: new Float64Array(0),
    sturm: { shift: factor.shift, countBelow: factor.inertia.negative, modesReturned: 0, ok: factor.inertia.negative === 0 },
    orthogonality: { massMaxDeviation: 0, stiffnessMaxDeviation: 0 },
    method,
    shifts,
    iterations: 0,
    timings: { totalMs: performance.now() - start, factorMs: clock.factorMs, iterateMs: 0, verifyMs: 0 },
    factor: factor.diagnostics,
    warnings,
    diagnostics,
    solves: 0,
    rankMassBound: 0,
  };
}

/**
 * Bytes a solve keeps beside its factor, for the memory limit: K and M as read and their permuted
 * copy (12 bytes a stored entry each), and the iteration's blocks: the block Lanczos basis V and
 * MV (basisVectors each), the locked vectors and their M-images, and the returned shapes.
 */
function besideFactorBytes(stiffness: SymmetricCsc, mass: SymmetricCsc, request: ModesRequest): number {
  const stored = stiffness.rowIdx.length + mass.rowIdx.length;
  const wanted = request.count ?? SLICE_SIZE;
  const slice = Math.min(wanted, SLICE_SIZE);
  return 2 * 12 * stored + 8 * stiffness.n * (2 * basisVectors(slice) + 2 * slice + wanted);
}
