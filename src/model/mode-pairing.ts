/**
 * Mode tracking: pair baseline modes with current modes one to one so that the summed
 * correlation is largest — an assignment over the MAC matrix, not a greedy pick (docs/sources.md §2,
 * mode-tracking practice 2, [CP]). A reordering of close modes then shows up as a crossing of
 * pairs (a swap) instead of two large frequency changes.
 *
 * A pair (i, j) is allowed when its correlation E(i, j) ≥ minCorrelation and, when a window is
 * given, |f_j − f_i| / |f_i| ≤ windowPercent / 100. Maximum-weight matching over allowed pairs is
 * solved as a square assignment of size m = max(mb, mc) with weight E on allowed pairs and 0
 * elsewhere (a zero-weight pair is dropped afterwards, so this is exactly the best partial
 * matching). Among equal totals the order-keeping assignment wins: each weight is reduced by
 * 1e-9·|i − j| (our choice).
 *
 * The assignment itself is the Hungarian method in its shortest-augmenting-path form with row
 * and column potentials (Kuhn 1955; Jonker & Volgenant 1987 for the augmenting-path view):
 * O(m³) on the small m × m problem.
 */

export interface PairingOptions {
  /** Pairs below this correlation are not allowed (default 0.5, our choice). */
  minCorrelation?: number;
  /** Largest |Δf|/f in percent for a pair (default: no window). */
  windowPercent?: number;
}

export interface ModePairing {
  /** partnerOfBaseline[i] = current mode (0-based) paired with baseline mode i, or −1. */
  partnerOfBaseline: Int32Array;
  /** partnerOfCurrent[j] = baseline mode paired with current mode j, or −1. */
  partnerOfCurrent: Int32Array;
}

export const DEFAULT_MIN_PAIR_CORRELATION = 0.5;
const ORDER_BIAS = 1e-9;

/**
 * Pair modes from the correlation matrix `correlation` (row-major mb × mc, row = baseline mode)
 * and the two frequency lists.
 */
export function pairModes(
  correlation: Float64Array,
  baselineHz: ArrayLike<number>,
  currentHz: ArrayLike<number>,
  options: PairingOptions = {},
): ModePairing {
  const mb = baselineHz.length, mc = currentHz.length;
  const minCorrelation = options.minCorrelation ?? DEFAULT_MIN_PAIR_CORRELATION;
  const m = Math.max(mb, mc);
  const cost = new Float64Array(m * m);
  const allowed = new Uint8Array(m * m);
  // cost(i, j) = −(E(i, j) − bias·|i − j|) on allowed pairs, 0 on the rest and on padding
  for (let i = 0; i < mb; i++) {
    for (let j = 0; j < mc; j++) {
      const e = correlation[i * mc + j];
      if (!(e >= minCorrelation) || !inWindow(baselineHz[i], currentHz[j], options.windowPercent)) continue;
      allowed[i * m + j] = 1;
      cost[i * m + j] = -(e - ORDER_BIAS * Math.abs(i - j));
    }
  }
  const columnOfRow = assignMinimumCost(cost, m);
  const partnerOfBaseline = new Int32Array(mb).fill(-1);
  const partnerOfCurrent = new Int32Array(mc).fill(-1);
  // keep the assigned pairs that are real and allowed
  for (let i = 0; i < mb; i++) {
    const j = columnOfRow[i];
    if (j < mc && allowed[i * m + j]) {
      partnerOfBaseline[i] = j;
      partnerOfCurrent[j] = i;
    }
  }
  return { partnerOfBaseline, partnerOfCurrent };
}

function inWindow(fBase: number, fCur: number, windowPercent: number | undefined): boolean {
  if (windowPercent === undefined) return true;
  const scale = Math.abs(fBase);
  if (scale === 0) return fCur === 0;
  return (100 * Math.abs(fCur - fBase)) / scale <= windowPercent;
}

/**
 * Minimum-cost perfect assignment of an m × m cost matrix (row-major): columnOfRow[i].
 * Rows are added one at a time; each addition grows a shortest-path tree over reduced costs
 * c(i, j) − u(i) − v(j) ≥ 0 until it reaches a free column, then flips the path.
 */
export function assignMinimumCost(cost: Float64Array, m: number): Int32Array {
  // 1-based arrays with a virtual column 0, as in the textbook statement of the method
  const u = new Float64Array(m + 1);
  const v = new Float64Array(m + 1);
  const rowOfColumn = new Int32Array(m + 1); // 0 = free
  const way = new Int32Array(m + 1);
  const minReduced = new Float64Array(m + 1);
  const used = new Uint8Array(m + 1);
  // insert row r, augmenting along a shortest alternating path
  for (let r = 1; r <= m; r++) {
    rowOfColumn[0] = r;
    let j0 = 0;
    minReduced.fill(Infinity);
    used.fill(0);
    // grow the tree until a free column is reached
    do {
      used[j0] = 1;
      const i0 = rowOfColumn[j0];
      let delta = Infinity;
      let j1 = 0;
      // relax reduced costs from row i0 to every column outside the tree
      for (let j = 1; j <= m; j++) {
        if (used[j]) continue;
        const reduced = cost[(i0 - 1) * m + (j - 1)] - u[i0] - v[j];
        if (reduced < minReduced[j]) {
          minReduced[j] = reduced;
          way[j] = j0;
        }
        if (minReduced[j] < delta) {
          delta = minReduced[j];
          j1 = j;
        }
      }
      // shift potentials by delta: tree columns keep zero reduced cost
      for (let j = 0; j <= m; j++) {
        if (used[j]) {
          u[rowOfColumn[j]] += delta;
          v[j] -= delta;
        } else minReduced[j] -= delta;
      }
      j0 = j1;
    } while (rowOfColumn[j0] !== 0);
    // flip the alternating path back to the virtual column
    do {
      const j1 = way[j0];
      rowOfColumn[j0] = rowOfColumn[j1];
      j0 = j1;
    } while (j0 !== 0);
  }
  const columnOfRow = new Int32Array(m);
  // invert the column → row map to 0-based row → column
  for (let j = 1; j <= m; j++) columnOfRow[rowOfColumn[j] - 1] = j - 1;
  return columnOfRow;
}

/**
 * Pairs that cross in order: baseline modes a < b paired with current modes p(a) > p(b).
 * `sameGroup` tells which crossings are inside a group of near-repeated modes (ignored: their
 * order carries no meaning).
 */
export function crossingPairs(pairing: ModePairing, sameGroup: (a: number, b: number, pa: number, pb: number) => boolean): [number, number][] {
  const p = pairing.partnerOfBaseline;
  const out: [number, number][] = [];
  // every ordered pair of paired baseline modes
  for (let a = 0; a < p.length; a++) {
    if (p[a] < 0) continue;
    for (let b = a + 1; b < p.length; b++) {
      if (p[b] < 0 || p[b] > p[a]) continue;
      if (!sameGroup(a, b, p[a], p[b])) out.push([a, b]);
    }
  }
  return out;
}
