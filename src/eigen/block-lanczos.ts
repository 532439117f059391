/**
 * Shift-inverted block Lanczos in the M-inner product (Ericsson & Ruhe 1980; Grimes, Lewis &
 * Simon 1994) with full reorthogonalization and thick restarts.
 *
 * With C = (K − σM)⁻¹M (self-adjoint in ⟨x, y⟩_M) and an M-orthonormal basis V = [Q₁ … Q_j],
 *
 *     C V = V T + Q_{j+1} R_j E_jᵀ,     T = Vᵀ M C V  (block tridiagonal in exact arithmetic),
 *
 * each step solves one block (b right-hand sides, one pass over the factor), projects the
 * result against the whole basis and the locked vectors twice (m-orthonormalize.ts), and
 * stores the projections as the new block column of T. A Ritz pair (θ, V s) of T has the
 * residual estimate ‖C y − θ y‖_M = ‖R_j s_last‖ (Templates §5.5), and λ = σ + 1/θ.
 *
 * At the end of a cycle (basis full, or all wanted pairs' estimates small enough to lock) the Ritz vectors
 * nearest σ get a Rayleigh–Ritz pass with K itself (rayleigh-ritz.ts) — true residuals, and
 * eigenvalues free of the 1/θ conditioning — and those that meet the tolerance are locked.
 * The rest are kept: V ← V S_keep, T ← S_keepᵀ T S_keep, coupling R_j (S_keep)_last, and the
 * iteration continues from Q_{j+1} (thick restart). The block size b ≥ 6 catches the six-fold
 * rigid-body eigenvalue of a free-free model and repeated pairs in one block; the basis is
 * capped by rank(M) because the M-inner-product Krylov space cannot be larger.
 */
import { symmetricEigen } from '../dense/symmetric-eigen.js';
import { mOrthonormalize, type MassBasis } from './m-orthonormalize.js';
import { rayleighRitz } from './rayleigh-ritz.js';
import type { EigenSearch, EigenSearchResult } from './search-types.js';
import { LockedSet } from './locked-set.js';
import { currentEstimates, fixedBlocks, nearestFirst, relativeResiduals } from './subspace-iteration.js';
import { timesSmall, transposeTimes } from '../dense/block-ops.js';
import { thinQr } from '../dense/householder-qr.js';
import { basisBlock, basisTimesSmall, basisTimesSmallInPlace } from './shared-block-products.js';
import { columns, randomBlock } from './thin-block.js';

/** Default block size: six rigid-body modes of a free-free model share one eigenvalue. */
export const DEFAULT_BLOCK_SIZE = 6;
/**
 * Basis size per cycle: 5 vectors per wanted pair (our choice: on BCSSTK08's clustered spectrum it
 * needed 26 % fewer solves than 3). 7 was tried for the bench and dropped (DEVELOPERS.md, Known
 * limits): one cycle instead of two for 20 modes of the hex bars, but the unfastened-anchor mast
 * (test/eigen/near-mechanism.test.ts) then stalls at 5 of 6 modes.
 */
const BASIS_PER_WANTED = 5;
/**
 * A thick restart keeps the unconverged wanted Ritz vectors plus this many blocks more (the
 * Ritz vectors next nearest σ; our choice). 4 rather than 2 (2026-12-05, 20 modes): 6 fewer
 * solves on the bench's hex10k free and clamped, hex31k free and tet26k clamped, the same on
 * tet26k free; 6 and 8 saved nothing more (DEVELOPERS.md, Known limits).
 */
const KEPT_EXTRA_BLOCKS = 4;
/**
 * A pair whose Krylov estimate ‖Cy − θy‖_M/|θ| is at rounding level (≤ 1e-13) no longer improves
 * with more vectors; it is locked if its true residual is at most 1e-9 (ill-conditioned pencils
 * stall above the requested tolerance; both figures our choice).
 */
const STALLED_ESTIMATE = 1e-13;
/**
 * After this many cycles without a newly locked pair the search starts once more from its best
 * p vectors with nothing locked: a locked vector that is slightly off (a near-mechanism mode,
 * whose residual is measured against the rigid-body floor) keeps the modes it is mixed with from
 * converging while they are held M-orthogonal to it; one Krylov space over all of them sorts
 * the mixture out (our choice; seen on the unfastened-anchor mast).
 */
const REBUILD_AFTER_STALLED = 4;
const STALLED_RESIDUAL = 1e-9;

/** Vectors of one cycle's basis for p wanted pairs with blocks of b (before the rank(M) cap). */
export function basisVectors(p: number, b = DEFAULT_BLOCK_SIZE): number {
  return Math.min(Math.max(BASIS_PER_WANTED * p, p + 4 * b, 6 * b), p + 20 * b);
}

interface Cycle {
  /** Basis V (n×size) and MV, with room for `capacity` columns. */
  v: Float64Array;
  mv: Float64Array;
  size: number;
  capacity: number;
  /** T = VᵀMCV, capacity×capacity column-major (only [0,size) is meaningful). */
  t: Float64Array;
  /** Current block Q_j (not yet in V) and its M-image, with its coupling to V. */
  q: Float64Array;
  mq: Float64Array;
  qCount: number;
  /** Coupling rows T[Q, V] = R (S_last), qCount×size. */
  coupling: Float64Array;
}

export function blockLanczos(search: EigenSearch): EigenSearchResult {
  const op = search.operator;
  const n = op.n;
  const sigma = op.shift;
  const p = Math.min(search.count, search.maxBasis);
  const b = Math.max(1, Math.min(search.blockSize ?? DEFAULT_BLOCK_SIZE, search.maxBasis));
  const maxCycles = search.maxIterations ?? 60;
  let locked = new LockedSet(n);
  const warnings: string[] = [];
  let rebuilt = false;
  const capacityFor = () => Math.min(basisVectors(p, b), search.maxBasis - locked.count);
  let cycle = newCycle(n, capacityFor(), op.massTimes, startVectors(search, b), op.apply, fixedBlocks(search, locked));
  let cycles = 0;
  let stagnated = 0;
  let abandoned = false;
  let extraValues: number[] = [];
  let extraVectors: Float64Array<ArrayBufferLike> = new Float64Array(0);
  while (locked.count < p && cycles < maxCycles) {
    cycles++;
    let lastBlock: LastBlock | undefined;
    if (cycles === 1 && search.checkpoint) {
      const early = probe(cycle, locked, search, p, b);
      if (early.refused) {
        extraValues = early.refused.values;
        extraVectors = early.refused.vectors;
        abandoned = true;
        break;
      }
      lastBlock = early.ended;
    }
    lastBlock ??= extend(cycle, locked, search, p - locked.count);
    const wanted = p - locked.count;
    const { theta, s } = ritzOfT(cycle);
    const order = orderByMagnitude(theta);
    const candidates = order.slice(0, Math.min(order.length, wanted + b));
    const sc = pickColumns(s, cycle.size, candidates);
    // K-based Rayleigh–Ritz on the candidate Ritz vectors Y = V S_c
    const y = basisTimesSmall(cycle.v, n, cycle.size, sc, candidates.length);
    const my = basisTimesSmall(cycle.mv, n, cycle.size, sc, candidates.length);
    const ritz = rayleighRitz({ vectors: y, massVectors: my, count: candidates.length }, n, op.stiffnessTimes);
    const residuals = relativeResiduals(ritz, search.stiffnessNorm, n);
    const g = ritzRotation(y, ritz.vectors, my, candidates.length, n);
    const sz = timesSmall(sc, cycle.size, candidates.length, g, candidates.length);
    const estimates = residualEstimates(cycle, lastBlock, sz, candidates.length);
    const zOrder = nearestFirst(ritz.values, sigma);
    const lockedNow: number[] = [];
    // lock, nearest σ first, every leading pair that converged (or stalled at rounding level)
    for (const i of zOrder.slice(0, wanted)) {
      const theta = 1 / (ritz.values[i] - sigma);
      const estimate = estimates[i] / Math.abs(theta);
      const ok = residuals[i] <= search.tolerance || (residuals[i] <= STALLED_RESIDUAL && estimate <= STALLED_ESTIMATE);
      if (!ok) break;
      lockedNow.push(i);
    }
    if (lockedNow.length === 0) stagnated++;
    else stagnated = 0;
    for (const i of lockedNow) locked.add(ritz, i, residuals[i]);
    const unlocked = zOrder.filter((i) => !lockedNow.includes(i));
    extraValues = unlocked.map((i) => ritz.values[i]);
    extraVectors = new Float64Array(n * unlocked.length);
    unlocked.forEach((i, t) => extraVectors.set(ritz.vectors.subarray(i * n, (i + 1) * n), t * n));
    if (search.checkpoint && !search.checkpoint(currentEstimates(locked, extraValues))) {
      abandoned = true;
      break;
    }
    search.onProgress?.(`block Lanczos cycle ${cycles}: ${locked.count} of ${p} modes converged`);
    if (locked.count >= p) break;
    if (stagnated >= REBUILD_AFTER_STALLED && !rebuilt) {
      // once: unlock everything and start again from the best p vectors (see REBUILD_AFTER_STALLED)
      const picture = locked.estimates(extraValues, extraVectors, extraValues.length);
      const width = Math.min(picture.estimateCount, Math.max(p, b));
      const nearest = nearestFirst(picture.estimates, sigma).slice(0, width);
      const start = pickColumns(picture.estimateVectors, n, nearest);
      locked = new LockedSet(n);
      cycle = newCycle(n, capacityFor(), op.massTimes, start, op.apply, fixedBlocks(search, locked));
      rebuilt = true;
      stagnated = 0;
      continue;
    }
    const keepZ = zOrder.filter((i) => !lockedNow.includes(i));
    const others = order.slice(candidates.length);
    const restartCapacity = capacityFor();
    const keepCount = Math.max(0, Math.min(keepZ.length + others.length, restartCapacity - 2 * b, wanted + KEPT_EXTRA_BLOCKS * b));
    // the kept span must stay (nearly) invariant under T: all unlocked Z, or else whole eigenvectors of T
    const kept = keepCount >= keepZ.length ? keepColumns(sz, keepZ, s, others, cycle.size, keepCount) : invariantColumns(s, order, sz, lockedNow, cycle.size, keepCount);
    const sKeep = orthonormalColumns(kept, cycle.size, keepCount);
    cycle = restart(cycle, { sKeep, keep: keepCount, last: lastBlock, capacity: restartCapacity }, { search, locked, cycles });
    if (cycle.size === 0 && cycle.qCount === 0) break;
  }
  const converged = locked.count >= p;
  if (!converged) warnings.push(`block Lanczos stopped after ${cycles} cycles with ${locked.count} of ${p} modes converged`);
  if (stagnated > 0 && !converged) warnings.push('block Lanczos made no progress in its last cycles');
  return { ...locked.result(p), iterations: cycles, converged, warnings, abandoned, ...locked.estimates(extraValues, extraVectors, extraValues.length) };
}

function startVectors(search: EigenSearch, b: number): Float64Array {
  const n = search.operator.n;
  const x = randomBlock(n, b, 0x1a2c5);
  if (search.start && search.startCount) {
    const k = Math.min(search.startCount, b);
    x.set(columns(search.start, n, 0, k), 0);
  }
  return x;
}

/** A cycle whose first block is the M-orthonormal basis of C X (so it lies in range(C)). */
function newCycle(
  n: number,
  capacity: number,
  massTimes: (x: Float64Array, k: number) => Float64Array,
  x: Float64Array,
  apply: (x: Float64Array, k: number) => Float64Array,
  against: MassBasis[],
): Cycle {
  const k = x.length / n;
  const first = mOrthonormalize(apply(x, k), k, n, massTimes, { against });
  const cap = Math.max(capacity, 1);
  return {
    v: basisBlock(n * cap),
    mv: basisBlock(n * cap),
    size: 0,
    capacity: cap,
    t: new Float64Array(cap * cap),
    q: first.vectors,
    mq: first.massVectors,
    qCount: Math.min(first.count, cap),
    coupling: new Float64Array(0),
  };
}

interface LastBlock {
  /** R (r×bLast) coupling the next block to the last block of V, and where that block sits. */
  r: Float64Array;
  rows: number;
  from: number;
  width: number;
}

/** Blocks in the basis when the first cycle's shift is judged (probe). */
const PROBE_BLOCKS = 4;

/**
 * The shift judged early: once the first cycle's basis holds PROBE_BLOCKS blocks, the Ritz values
 * of T give rough estimates λ = σ + 1/θ (upper bounds of the eigenvalues nearest σ, by
 * interlacing), enough to tell a shift far outside the window of shift-placement.ts. When the
 * checkpoint rejects it, the search stops there with the b Ritz vectors nearest σ as estimates
 * (the next shift's start) — a few blocks spent instead of a whole cycle. Otherwise the cycle
 * goes on from where it stands (and is judged again at its end); when it already ended inside
 * the probe (its estimates small, or the Krylov space closed), `ended` is its last block.
 */
function probe(cycle: Cycle, locked: LockedSet, search: EigenSearch, p: number, b: number): { refused?: { values: number[]; vectors: Float64Array<ArrayBufferLike> }; ended?: LastBlock } {
  const size = PROBE_BLOCKS * b;
  if (size + b > cycle.capacity) return {};
  const last = extend(cycle, locked, search, p, size);
  if (cycle.size < size || cycle.qCount === 0) return { ended: last };
  const n = search.operator.n;
  const sigma = search.operator.shift;
  const { theta, s } = ritzOfT(cycle);
  const lambda = Array.from(theta, (t) => sigma + 1 / t);
  if (search.checkpoint!(currentEstimates(locked, lambda))) return {};
  const nearest = orderByMagnitude(theta).slice(0, b);
  const vectors = basisTimesSmall(cycle.v, n, cycle.size, pickColumns(s, cycle.size, nearest), nearest.length);
  return { refused: { values: nearest.map((i) => lambda[i]), vectors } };
}

/**
 * Grow V block by block until full, until the wanted Ritz estimates are small, or (probe) once
 * it holds `stopAt` vectors.
 */
function extend(cycle: Cycle, locked: LockedSet, search: EigenSearch, wanted: number, stopAt = Infinity): LastBlock {
  const op = search.operator;
  const tolerance = search.tolerance;
  const n = op.n;
  let last: LastBlock = { r: cycle.coupling, rows: cycle.qCount, from: 0, width: 0 };
  while (cycle.qCount > 0 && cycle.size + cycle.qCount <= cycle.capacity) {
    const from = cycle.size;
    const width = cycle.qCount;
    appendBlock(cycle, n);
    // W = C Q_j = (K − σM)⁻¹ (M Q_j) with M Q_j from the orthonormalization, then its projections onto [locked, V] and the next block
    const w = op.solve(cycle.mq, width);
    const basis: MassBasis = { vectors: cycle.v.subarray(0, cycle.size * n), massVectors: cycle.mv.subarray(0, cycle.size * n), count: cycle.size };
    const against = [...fixedBlocks(search, locked), basis];
    const next = mOrthonormalize(w, width, n, op.massTimes, { against });
    const h = next.projections[against.length - 1];
    // T[0:size, from:from+width] = H and its mirror
    setBlock(cycle, h, 0, cycle.size, from, width);
    cycle.q = next.vectors;
    cycle.mq = next.massVectors;
    cycle.qCount = next.count;
    last = { r: next.coefficients, rows: next.count, from, width };
    if (estimatesSmall(cycle, last, wanted, tolerance) || cycle.size >= stopAt) break;
  }
  return last;
}

/** Move the current block Q into V; its coupling rows become T entries. */
function appendBlock(cycle: Cycle, n: number): void {
  const from = cycle.size;
  const k = cycle.qCount;
  cycle.v.set(cycle.q.subarray(0, k * n), from * n);
  cycle.mv.set(cycle.mq.subarray(0, k * n), from * n);
  if (cycle.coupling.length > 0 && from > 0) {
    // T[from:from+k, 0:from] = coupling, mirrored
    const c = cycle.capacity;
    for (let j = 0; j < from; j++) {
      for (let i = 0; i < k; i++) {
        const v = cycle.coupling[i + j * k];
        cycle.t[from + i + j * c] = v;
        cycle.t[j + (from + i) * c] = v;
      }
    }
  }
  cycle.size += k;
  cycle.coupling = new Float64Array(0);
}

/** Write H (rows×width) into T at (row0, col0) and its transpose at (col0, row0). */
function setBlock(cycle: Cycle, h: Float64Array, row0: number, rows: number, col0: number, width: number): void {
  const c = cycle.capacity;
  // T[row0+i, col0+j] = T[col0+j, row0+i] = h_ij
  for (let j = 0; j < width; j++) {
    for (let i = 0; i < rows; i++) {
      const v = h[i + j * rows];
      cycle.t[row0 + i + (col0 + j) * c] = v;
      cycle.t[col0 + j + (row0 + i) * c] = v;
    }
  }
}

function packedT(cycle: Cycle): Float64Array {
  const m = cycle.size;
  const c = cycle.capacity;
  const t = new Float64Array(m * m);
  // leading m×m of T, symmetrized
  for (let j = 0; j < m; j++) {
    for (let i = 0; i < m; i++) t[i + j * m] = 0.5 * (cycle.t[i + j * c] + cycle.t[j + i * c]);
  }
  return t;
}

function ritzOfT(cycle: Cycle): { theta: Float64Array; s: Float64Array } {
  const { values, vectors } = symmetricEigen(packedT(cycle), cycle.size);
  return { theta: values, s: vectors };
}

/** Indices by descending |θ| (nearest σ first). */
function orderByMagnitude(theta: Float64Array): number[] {
  return Array.from(theta, (_v, i) => i).sort((a, b) => Math.abs(theta[b]) - Math.abs(theta[a]));
}

/** ‖R s_last‖ for each column s of S (size×k): the M-norm of C y − θ y. */
function residualEstimates(cycle: Cycle, last: LastBlock, s: Float64Array, k: number): Float64Array {
  const m = cycle.size;
  const out = new Float64Array(k);
  if (last.rows === 0 || last.width === 0) return out;
  // e_i = ‖R · S[from:from+width, i]‖₂
  for (let col = 0; col < k; col++) {
    let sum = 0;
    for (let r = 0; r < last.rows; r++) {
      let v = 0;
      for (let t = 0; t < last.width; t++) v += last.r[r + t * last.rows] * s[last.from + t + col * m];
      sum += v * v;
    }
    out[col] = Math.sqrt(sum);
  }
  return out;
}

/**
 * Whether the cycle can stop: every wanted pair's ‖Cy − θy‖_M / |θ| at tolerance·1e-2, or at
 * STALLED_ESTIMATE if that is larger — the level at which the lock test takes a pair whose true
 * residual is within STALLED_RESIDUAL. With the default tolerance (1e-12) the bar would be 1e-14,
 * below the estimates' rounding floor of 1e-14–2e-14 on the hex bars, so a cycle whose pairs had
 * all reached 1e-13 still ran until its basis was full: 3–4 blocks (18–24 solves) for nothing.
 */
function estimatesSmall(cycle: Cycle, last: LastBlock, wanted: number, tolerance: number): boolean {
  if (cycle.size < wanted) return false;
  const { theta, s } = ritzOfT(cycle);
  const order = orderByMagnitude(theta).slice(0, wanted);
  const sw = pickColumns(s, cycle.size, order);
  const est = residualEstimates(cycle, last, sw, order.length);
  const bar = Math.max(tolerance * 1e-2, STALLED_ESTIMATE);
  // every wanted pair's ‖Cy − θy‖_M / |θ| at the bar
  return order.every((i, t) => est[t] <= bar * Math.abs(theta[i]));
}

function pickColumns(s: Float64Array, m: number, which: number[]): Float64Array {
  const out = new Float64Array(m * which.length);
  which.forEach((j, t) => out.set(s.subarray(j * m, (j + 1) * m), t * m));
  return out;
}

/** G with Z = Y G: both M-orthonormal, so G = Yᵀ M Z = (MY)ᵀ Z. */
function ritzRotation(_y: Float64Array, z: Float64Array, my: Float64Array, k: number, n: number): Float64Array {
  return transposeTimes(my, z, n, k, k);
}

/** [S_z(keepZ), S(others)] truncated to keepCount columns (orthonormal coefficient vectors). */
function keepColumns(sz: Float64Array, keepZ: number[], s: Float64Array, others: number[], m: number, keepCount: number): Float64Array {
  const out = new Float64Array(m * keepCount);
  let t = 0;
  for (const i of keepZ) if (t < keepCount) out.set(sz.subarray(i * m, (i + 1) * m), m * t++);
  for (const i of others) if (t < keepCount) out.set(s.subarray(i * m, (i + 1) * m), m * t++);
  return out;
}

/**
 * keepCount eigenvectors of T for a restart that cannot keep every unlocked K-rotated Ritz vector
 * (a basis capped below wanted + 3 blocks). A subset of the Z = S_c G is not an invariant
 * subspace of T (G mixes the candidates), and after V ← V S_keep the Krylov relation would not
 * hold: the estimates of the next cycles read converged while the true residuals stay put (seen
 * as a stall on a fixed–free chain, 8 wanted, basis 24, block 6). Eigenvectors of T are
 * invariant; the one nearest each newly locked vector (its converged twin) is left out, the next
 * nearest σ are taken, and the locked vectors' coefficient columns are projected out (they are
 * converged, so this moves the span by their residual only).
 */
function invariantColumns(s: Float64Array, order: number[], sz: Float64Array, lockedNow: number[], m: number, keepCount: number): Float64Array {
  const excluded = new Set<number>();
  // the eigenvector of T closest to each locked coefficient vector z
  for (const l of lockedNow) {
    let best = -1;
    let bestDot = -1;
    for (const j of order) {
      if (excluded.has(j)) continue;
      let dot = 0;
      for (let r = 0; r < m; r++) dot += s[r + j * m] * sz[r + l * m];
      if (Math.abs(dot) > bestDot) {
        bestDot = Math.abs(dot);
        best = j;
      }
    }
    if (best >= 0) excluded.add(best);
  }
  const picked = order.filter((j) => !excluded.has(j)).slice(0, keepCount);
  const out = pickColumns(s, m, picked);
  // out ← (I − Z_l Z_lᵀ) out, against each locked coefficient vector in turn
  for (const l of lockedNow) {
    for (let c = 0; c < picked.length; c++) {
      let dot = 0;
      for (let r = 0; r < m; r++) dot += sz[r + l * m] * out[r + c * m];
      for (let r = 0; r < m; r++) out[r + c * m] -= dot * sz[r + l * m];
    }
  }
  return out;
}

/**
 * The columns of S (m×k) made orthonormal (the Q of its Householder QR: same leading spans). The
 * Ritz rotation G behind S_z is only as orthogonal as the basis is M-orthonormal, and V ← V S_keep
 * would carry that error forward, roughly tripled at each restart (it grew from 1e-15 to 1e-5 in
 * 19 cycles on the unfastened-anchor mast); with S_keep orthonormal the basis keeps its own level.
 */
function orthonormalColumns(s: Float64Array, m: number, k: number): Float64Array {
  return k === 0 ? s : thinQr(s, m, k).q;
}

/** Thick restart: V ← V S_keep, T ← S_keepᵀ T S_keep, coupling R (S_keep)_last; continue from Q. */
/** What a thick restart keeps: V S_keep (keep columns) in a basis of `capacity` columns. */
interface RestartPlan {
  sKeep: Float64Array;
  keep: number;
  last: LastBlock;
  capacity: number;
}

/** The search a cycle belongs to, with the pairs locked so far and the cycle number (a seed). */
interface SearchState {
  search: EigenSearch;
  locked: LockedSet;
  cycles: number;
}

function restart(cycle: Cycle, plan: RestartPlan, state: SearchState): Cycle {
  const { sKeep, keep, last, capacity } = plan;
  const { operator: op } = state.search;
  const n = op.n;
  const m = cycle.size;
  const cap = Math.max(capacity, keep + 1);
  // V' = V S_keep, MV' = MV S_keep in place (row by row), in the same buffers when they are large enough
  basisTimesSmallInPlace(cycle.v, n, m, sKeep, keep);
  basisTimesSmallInPlace(cycle.mv, n, m, sKeep, keep);
  const inPlace = cycle.v.length >= n * cap;
  const v = inPlace ? cycle.v.subarray(0, n * cap) : basisBlock(n * cap);
  const mv = inPlace ? cycle.mv.subarray(0, n * cap) : basisBlock(n * cap);
  if (!inPlace) {
    v.set(cycle.v.subarray(0, n * keep));
    mv.set(cycle.mv.subarray(0, n * keep));
  }
  v.fill(0, n * keep);
  mv.fill(0, n * keep);
  const tm = packedT(cycle);
  const tk = transposeTimes(sKeep, timesSmall(tm, m, m, sKeep, keep), m, keep, keep);
  const t = new Float64Array(cap * cap);
  // T' = S_keepᵀ T S_keep in the leading keep×keep corner
  for (let j = 0; j < keep; j++) for (let i = 0; i < keep; i++) t[i + j * cap] = tk[i + j * keep];
  const next: Cycle = { v, mv, size: keep, capacity: cap, t, q: cycle.q, mq: cycle.mq, qCount: cycle.qCount, coupling: new Float64Array(0) };
  if (cycle.qCount > 0 && last.width > 0) {
    // coupling of the next block: R · S_keep[from:from+width, :]
    const c = new Float64Array(cycle.qCount * keep);
    for (let j = 0; j < keep; j++) {
      for (let r = 0; r < cycle.qCount; r++) {
        let sum = 0;
        for (let s = 0; s < last.width; s++) sum += last.r[r + s * last.rows] * sKeep[last.from + s + j * m];
        c[r + j * cycle.qCount] = sum;
      }
    }
    next.coupling = c;
  }
  if (next.qCount === 0) refill(next, state);
  return next;
}

/** The Krylov space closed (invariant subspace): continue with fresh vectors M-orthogonal to all. */
function refill(cycle: Cycle, { search, locked, cycles: seed }: SearchState): void {
  const op = search.operator;
  const n = op.n;
  const b = Math.max(1, Math.min(search.blockSize ?? DEFAULT_BLOCK_SIZE, cycle.capacity - cycle.size));
  if (cycle.capacity - cycle.size <= 0) return;
  const basis: MassBasis = { vectors: cycle.v.subarray(0, cycle.size * n), massVectors: cycle.mv.subarray(0, cycle.size * n), count: cycle.size };
  const against = [...fixedBlocks(search, locked), ...(cycle.size > 0 ? [basis] : [])];
  const fresh = mOrthonormalize(op.apply(randomBlock(n, b, 0x77 + seed), b), b, n, op.massTimes, { against });
  cycle.q = fresh.vectors;
  cycle.mq = fresh.massVectors;
  cycle.qCount = fresh.count;
  cycle.coupling = new Float64Array(0);
}
