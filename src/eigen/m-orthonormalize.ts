/**
 * M-orthonormalization of a thin block: given X (n×k) and already M-orthonormal blocks L
 * (locked vectors, an earlier Krylov basis), find Q with
 *
 *     QᵀMQ = I,   LᵀMQ = 0,   X = L P + Q R,
 *
 * dropping the directions of X that are (numerically) inside span(L) or in the null space of M.
 *
 * Each pass: project out L (X ← X − L (ML)ᵀX), then "SVQB" (Stathopoulos & Wu 2002): with
 * G = XᵀMX and D = diag(G)^(−1/2), the scaled Gram matrix D G D = U Θ Uᵀ gives
 * Q = X D U Θ^(−1/2) and R = Θ^(1/2) Uᵀ D⁻¹; eigenvalues θ below a tolerance mark dependent
 * directions and are dropped. Two passes ("twice is enough", Kahan–Parlett) bring
 * ‖QᵀMQ − I‖ and ‖LᵀMQ‖ to rounding level.
 *
 * MX is formed by one M product of the projected X in each pass, not by updating M X₀ with
 * −(ML)P: the same number of M products as before (one per pass), two fewer products with the
 * whole of L (each rows·|L|·k multiply-adds, the bulk of this routine's cost when L is a long
 * Krylov basis), and no cancellation in MX — when X lies mostly in span(L), M X₀ − (ML)P loses
 * the digits of the small remainder, a fresh product does not. The M-norms before projection
 * (for the dead-column test) follow from Pythagoras, each block B of L being M-orthonormal:
 * ‖x‖²_M = ‖P(:, j)‖² + ‖x − B P(:, j)‖²_M with P = (MB)ᵀX, block after block.
 *
 * The second pass stays unconditional. A DGKS-style test (skip it when every column keeps at
 * least half its M-norm², ‖x − L P‖²_M ≥ ½‖x‖²_M) never passed in block Lanczos here: on a
 * 28,728-DOF hex solid the first pass leaves 0.3–30 % of the M-norm² (median 12 %) in all 27
 * calls, so the test would cost a branch and save nothing.
 *
 * The small k×k step (Ĝ's eigenproblem, S and R) is src/dense/svqb.ts; M products come from
 * the caller so the cost is counted where it belongs.
 */
import { svqbCoefficients } from '../dense/svqb.js';
import { timesSmall, transposeTimes } from '../dense/block-ops.js';
import { basisAddTimesSmall, basisOperand, basisTransposeTimes } from './shared-block-products.js';
import { IndefiniteMassError } from './modes-types.js';

/**
 * |xᵀMx| ≤ ‖x‖‖Mx‖ (Cauchy–Schwarz) and the rounding of the product is about nε‖x‖‖Mx‖, so
 * xᵀMx below −1e-8·‖x‖‖Mx‖ (ours: far past rounding for any n this tool meets) proves M is not
 * positive semi-definite.
 */
const NEGATIVE_MASS_COSINE = 1e-8;

function refuseNegativeMass(gjj: number, x: Float64Array, mx: Float64Array, j: number, n: number): void {
  let xx = 0;
  let mm = 0;
  // ‖x_j‖², ‖Mx_j‖²
  for (let r = j * n; r < (j + 1) * n; r++) {
    xx += x[r] * x[r];
    mm += mx[r] * mx[r];
  }
  const cosine = gjj / Math.sqrt(xx * mm);
  if (cosine < -NEGATIVE_MASS_COSINE) throw new IndefiniteMassError(cosine);
}

/** An M-orthonormal block and its M-image MQ. */
export interface MassBasis {
  vectors: Float64Array;
  massVectors: Float64Array;
  count: number;
}

export interface MOrthonormalized extends MassBasis {
  /** R (count×k, column-major): the input's coefficients in the new basis. */
  coefficients: Float64Array;
  /** Per `against` block B_i: Pᵢ = B_iᵀ M X (|B_i|×k), so X = Σ B_i P_i + Q R. */
  projections: Float64Array[];
}

export interface MOrthonormalizeOptions {
  /** Blocks to stay M-orthogonal to (each already M-orthonormal). */
  against?: MassBasis[];
  /** Relative eigenvalue of the scaled Gram matrix below which a direction is dropped (default 1e-12, our choice). */
  dropTolerance?: number;
  /** Relative M-norm² left after projecting out `against` below which a column is dead (default 1e-20, our choice). */
  deadTolerance?: number;
}

interface PassResult {
  q: Float64Array;
  mq: Float64Array;
  r: Float64Array;
  count: number;
  projections: Float64Array[];
}

/** Q with QᵀMQ = I spanning the part of X not in span(against), see the module comment. */
export function mOrthonormalize(
  x: Float64Array,
  k: number,
  n: number,
  massTimes: (x: Float64Array, k: number) => Float64Array,
  options: MOrthonormalizeOptions = {},
): MOrthonormalized {
  const against = options.against ?? [];
  // only the last pass's MQ is kept
  const first = onePass(x, k, n, massTimes, against, options, false);
  if (first.count === 0) return finish(first, first, k, against);
  const second = onePass(first.q, first.count, n, massTimes, against, options, true);
  return finish(first, second, k, against);
}

/** Combine two passes: X = B P₁ + Q₁R₁ and Q₁ = B P₂ + Q₂R₂ give R = R₂R₁, P = P₁ + P₂R₁. */
function finish(first: PassResult, second: PassResult, k: number, against: MassBasis[]): MOrthonormalized {
  if (second === first) {
    return { vectors: first.q, massVectors: first.mq, count: first.count, coefficients: first.r, projections: first.projections };
  }
  const r = timesSmall(second.r, second.count, first.count, first.r, k);
  const projections = against.map((b, i) => {
    const p = first.projections[i].slice();
    const p2r1 = timesSmall(second.projections[i], b.count, first.count, first.r, k);
    // P = P₁ + P₂ R₁
    for (let t = 0; t < p.length; t++) p[t] += p2r1[t];
    return p;
  });
  return { vectors: second.q, massVectors: second.mq, count: second.count, coefficients: r, projections };
}

/** One projection + SVQB pass on X (n×k, left as it was); MQ only when `wantMass`. */
function onePass(
  x0: Float64Array,
  k: number,
  n: number,
  massTimes: (x: Float64Array, k: number) => Float64Array,
  against: MassBasis[],
  options: MOrthonormalizeOptions,
  wantMass: boolean,
): PassResult {
  const dropTolerance = options.dropTolerance ?? 1e-12;
  const deadTolerance = options.deadTolerance ?? 1e-20;
  // the working copy, projected in place (in shared memory when helper threads share the products)
  const x = basisOperand(x0, n * k);
  const projections: Float64Array[] = [];
  // M-norm² of each column taken away by the projections: Σ_B ‖P_B(:, j)‖²
  const removed = new Float64Array(k);
  // X ← X − B (MB)ᵀX for every block B to stay orthogonal to
  for (const b of against) {
    const p = basisTransposeTimes(b.massVectors, x, n, b.count, k);
    basisAddTimesSmall(x, b.vectors, n, b.count, p, k, -1);
    for (let j = 0; j < k; j++) {
      let sum = 0;
      // ‖P(:, j)‖²
      for (let i = j * b.count; i < (j + 1) * b.count; i++) sum += p[i] * p[i];
      removed[j] += sum;
    }
    projections.push(p);
  }
  // MX of the projected X (see the module comment), G = XᵀMX
  const mx = massTimes(x, k);
  const g = transposeTimes(x, mx, n, k, k);
  const before = new Float64Array(k);
  let maxBefore = 0;
  // M-norm² of each column before projection: ‖X(:, j)‖²_M + Σ_B ‖P_B(:, j)‖² (Pythagoras)
  for (let j = 0; j < k; j++) {
    before[j] = g[j + j * k] + removed[j];
    maxBefore = Math.max(maxBefore, before[j]);
  }
  const scale = new Float64Array(k);
  // D = diag(G)^(−1/2), zero for dead columns (inside span(B), or M-null)
  for (let j = 0; j < k; j++) {
    const gjj = g[j + j * k];
    if (gjj < 0) refuseNegativeMass(gjj, x, mx, j, n);
    const dead = !(gjj > deadTolerance * before[j]) || !(gjj > deadTolerance * maxBefore) || !(before[j] > 0);
    scale[j] = dead ? 0 : 1 / Math.sqrt(gjj);
  }
  const { transform: s, coefficients, rank: r } = svqbCoefficients(g, k, scale, dropTolerance);
  const mq = wantMass ? timesSmall(mx, n, k, s, r) : new Float64Array(0);
  return { q: timesSmall(x, n, k, s, r), mq, r: coefficients, count: r, projections };
}
