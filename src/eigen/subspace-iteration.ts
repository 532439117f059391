/**
 * Generalized subspace iteration with shift-invert (Bathe & Wilson 1972; Bathe, Finite Element
 * Procedures §11.6), on the operator C = (K − σM)⁻¹M:
 *
 *     W = C X,   V = M-orthonormal basis of W (against the locked vectors),
 *     Rayleigh–Ritz  VᵀKV = S Λ Sᵀ,   X ← V S,
 *
 * with q = max(2p, p + 8) vectors for p wanted pairs (capped by rank(M) and n; the
 * Templates book §4.3.4 quotes min(2p, p + 8) — we take the larger for a safer margin).
 * Ritz vector i converges like ((λ_i − σ)/(λ_{q+1} − σ))^k. A pair is converged when its
 * relative residual meets the tolerance and its eigenvalue stopped moving; converged pairs
 * nearest σ are locked (kept fixed, the rest iterates M-orthogonal to them).
 */
import { mOrthonormalize, type MassBasis } from './m-orthonormalize.js';
import { rayleighRitz, type RitzPairs } from './rayleigh-ritz.js';
import { relativeResidual } from './residual-measure.js';
import type { EigenSearch, EigenSearchResult } from './search-types.js';
import { columns, randomBlock } from './thin-block.js';
import { LockedSet } from './locked-set.js';

/** q = max(2p, p + 8), capped by the basis limit. */
export function subspaceSize(count: number, maxBasis: number): number {
  return Math.min(Math.max(2 * count, count + 8), maxBasis);
}

export function subspaceIteration(search: EigenSearch): EigenSearchResult {
  const op = search.operator;
  const n = op.n;
  const sigma = op.shift;
  const p = Math.min(search.count, search.maxBasis);
  const q = subspaceSize(p, search.maxBasis);
  const maxIterations = search.maxIterations ?? 200;
  const locked = new LockedSet(n);
  let x = startBlock(search, q);
  let active = q;
  let previous = new Float64Array(0);
  let previousResiduals = new Float64Array(0);
  const warnings: string[] = [];
  let iterations = 0;
  let abandoned = false;
  while (locked.count < p && iterations < maxIterations) {
    iterations++;
    const w = op.apply(x, active);
    const basis = mOrthonormalize(w, active, n, op.massTimes, { against: fixedBlocks(search, locked) });
    if (basis.count === 0) break;
    const ritz = rayleighRitz(basis, n, op.stiffnessTimes);
    const order = nearestFirst(ritz.values, sigma);
    const residuals = relativeResiduals(ritz, search.stiffnessNorm, n);
    const wanted = p - locked.count;
    let newlyLocked = 0;
    // lock, nearest σ first, every leading pair that has converged
    for (let t = 0; t < Math.min(wanted, order.length); t++) {
      const i = order[t];
      if (!pairConverged(ritz.values[i], residuals[i], previous, previousResiduals, t, search.tolerance, sigma)) break;
      locked.add(ritz, i, residuals[i]);
      newlyLocked++;
    }
    const rest = order.slice(newlyLocked);
    x = gatherColumns(ritz.vectors, n, rest);
    active = rest.length;
    previous = Float64Array.from(rest, (i) => ritz.values[i]);
    previousResiduals = Float64Array.from(rest, (i) => residuals[i]);
    if (search.checkpoint && iterations >= 2 && !search.checkpoint(currentEstimates(locked, previous))) {
      abandoned = true;
      break;
    }
    search.onProgress?.(`subspace iteration ${iterations}: ${locked.count} of ${p} modes converged`);
    if (active === 0) break;
  }
  const converged = locked.count >= p;
  if (!converged) {
    warnings.push(`subspace iteration stopped after ${iterations} iterations with ${locked.count} of ${p} modes converged`);
  }
  return { ...locked.result(p), iterations, converged, warnings, abandoned, ...locked.estimates(previous, x, previous.length) };
}

/** The blocks every new basis must stay M-orthogonal to: earlier slices, then locked pairs. */
export function fixedBlocks(search: EigenSearch, locked: LockedSet): MassBasis[] {
  const out: MassBasis[] = [];
  if (search.deflation && search.deflation.count > 0) out.push(search.deflation);
  if (locked.count > 0) out.push(locked.basis());
  return out;
}

/** Locked values and the current Ritz values, ascending. */
export function currentEstimates(locked: LockedSet, values: ArrayLike<number>): Float64Array {
  return Float64Array.from([...locked.valuesView(), ...Array.from(values)]).sort();
}

function startBlock(search: EigenSearch, q: number): Float64Array {
  const n = search.operator.n;
  const x = randomBlock(n, q, 0x5eed);
  if (search.start && search.startCount) {
    const k = Math.min(search.startCount, q);
    x.set(columns(search.start, n, 0, k), 0);
  }
  return x;
}

/** Indices of the Ritz values ordered by |λ − σ| (nearest the shift first). */
export function nearestFirst(values: Float64Array, sigma: number): number[] {
  const idx = Array.from(values, (_v, i) => i);
  idx.sort((a, b) => Math.abs(values[a] - sigma) - Math.abs(values[b] - sigma) || values[a] - values[b]);
  return idx;
}

export function relativeResiduals(ritz: RitzPairs, stiffnessNorm: number, _n: number): Float64Array {
  const out = new Float64Array(ritz.count);
  // ρ_i per residual-measure.ts
  for (let i = 0; i < ritz.count; i++) {
    out[i] = relativeResidual(ritz.residualNorms[i], ritz.stiffnessNorms[i], ritz.inertiaNorms[i], ritz.vectorNorms[i], stiffnessNorm);
  }
  return out;
}

/**
 * Converged: residual at tolerance and eigenvalue settled (relative change ≤ √tolerance), or
 * the residual has stagnated at rounding level (no longer halving, ≤ 1e-8) with the
 * eigenvalue settled to 1e-11 — what ill-conditioned pencils allow (the eigenvalue error is
 * of the order of the residual squared).
 */
function pairConverged(
  lambda: number,
  residual: number,
  previous: Float64Array,
  previousResiduals: Float64Array,
  t: number,
  tolerance: number,
  sigma: number,
): boolean {
  if (t >= previous.length) return false;
  const scale = Math.max(Math.abs(lambda), Math.abs(sigma), Number.MIN_VALUE);
  const change = Math.abs(lambda - previous[t]) / scale;
  if (residual <= tolerance && change <= Math.sqrt(tolerance)) return true;
  return residual <= 1e-8 && change <= 1e-11 && residual > 0.5 * previousResiduals[t];
}

function gatherColumns(x: Float64Array, n: number, which: number[]): Float64Array {
  const out = new Float64Array(n * which.length);
  // column t of the result is column which[t] of x
  which.forEach((j, t) => out.set(x.subarray(j * n, (j + 1) * n), t * n));
  return out;
}

export type { MassBasis };
