/**
 * Supernodes of L in a postordered elimination tree: runs of consecutive columns whose lower
 * parts share one row structure, stored together as one dense block.
 *
 * Fundamental supernodes: column j + 1 continues the supernode of j when it is j's parent, j is
 * its only child, and count[j] = count[j+1] + 1 (same structure below the diagonal).
 *
 * Relaxed amalgamation (our rule, thresholds of the kind used by supernodal Cholesky codes):
 * a supernode s is merged into the supernode group that follows it (so the merged columns stay
 * contiguous; the merged structure is the exact union of both row sets). Merging stores explicit
 * zeros; with c merged columns and z the fraction of stored zeros in the merged block, merge a
 * child into the group holding its tree parent when
 *   c ≤ 4, or c ≤ 16 and z < 0.8, or c ≤ 48 and z < 0.1, or z < 0.05,
 * and a sibling subtree (parent beyond the group) only when c ≤ 6 and z < 0.7.
 * Small supernodes (a node's 3 or 6 DOFs) thus become blocks big enough for the dense kernels,
 * while large ones only absorb children that add almost no zeros.
 */

/** starts[s] = first column of fundamental supernode s; starts[ns] = n. */
export function fundamentalSupernodes(parent: Int32Array, counts: Int32Array): Int32Array {
  const n = parent.length;
  const children = new Int32Array(n);
  // number of children of each column
  for (let j = 0; j < n; j++) if (parent[j] !== -1) children[parent[j]]++;
  const starts: number[] = [0];
  // a new supernode begins wherever the chain condition fails
  for (let j = 1; j < n; j++) {
    const continues = parent[j - 1] === j && children[j] === 1 && counts[j - 1] === counts[j] + 1;
    if (!continues) starts.push(j);
  }
  if (n > 0) starts.push(n);
  return Int32Array.from(starts);
}

/** Stored entries of a trapezoidal supernode block: c columns, r rows in its first column. */
function blockEntries(c: number, r: number): number {
  return c * r - (c * (c - 1)) / 2;
}

/** Sibling merges (s's parent lies beyond the next group): at most this many columns... */
const SIBLING_MAX_COLUMNS = 6;
/** ...and this zero fraction (a beam node's separate DOFs, not whole unrelated subtrees). */
const SIBLING_MAX_ZEROS = 0.7;

function shouldMerge(columns: number, zeroFraction: number): boolean {
  if (columns <= 4) return true;
  if (columns <= 16) return zeroFraction < 0.8;
  if (columns <= 48) return zeroFraction < 0.1;
  return zeroFraction < 0.05;
}

function shouldMergeSibling(columns: number, zeroFraction: number): boolean {
  return columns <= SIBLING_MAX_COLUMNS && zeroFraction < SIBLING_MAX_ZEROS;
}

/**
 * Relaxed supernodes from fundamental ones (`starts`, with their row structures rowPtr/rows,
 * own columns first, ascending). Returns the new starts array.
 *
 * Any supernode may join the group that follows it, not only a child joining its parent: in a
 * postorder the parent of a group's last column is an ancestor of (or equal to) the next column,
 * so the rows of the joined group stay on that ancestor path and the structure stays a tree.
 * Siblings matter on beam models, where a node's 6 DOFs couple mostly to other nodes and so
 * start six separate fundamental supernodes. The merged structure is the exact union of row sets.
 */
export function relaxSupernodes(starts: Int32Array, parent: Int32Array, rowPtr: Int32Array, rows: Int32Array): Int32Array {
  const ns = starts.length - 1;
  const n = ns > 0 ? starts[ns] : 0;
  const cols = new Float64Array(ns);
  const zeros = new Float64Array(ns);
  const last = new Int32Array(ns);
  const groupRows: (Int32Array | null)[] = new Array(ns).fill(null);
  let scratch = new Int32Array(16);
  // from the top of the postorder down: try to merge s into the group headed by s + 1
  for (let s = ns - 1; s >= 0; s--) {
    const nc = starts[s + 1] - starts[s];
    const own = rows.subarray(rowPtr[s], rowPtr[s + 1]);
    cols[s] = nc;
    last[s] = s;
    groupRows[s] = own;
    const h = s + 1;
    if (h >= ns) continue;
    const gh = groupRows[h] as Int32Array;
    if (scratch.length < nc + own.length + gh.length) scratch = new Int32Array(2 * (nc + own.length + gh.length));
    const r = unionRows(own, nc, gh, scratch);
    const c = nc + cols[h];
    const total = blockEntries(c, r);
    const z = total - blockEntries(nc, own.length) - (blockEntries(cols[h], gh.length) - zeros[h]);
    const p = parent[starts[s + 1] - 1];
    const child = p !== -1 && p < starts[last[h] + 1];
    if (!(child ? shouldMerge(c, z / total) : shouldMergeSibling(c, z / total))) continue;
    cols[s] = c;
    zeros[s] = z;
    last[s] = last[h];
    groupRows[s] = scratch.slice(0, r);
    groupRows[h] = null;
  }
  const out: number[] = [];
  // group heads, in order
  for (let s = 0; s < ns; s = last[s] + 1) out.push(starts[s]);
  out.push(n);
  return Int32Array.from(out);
}

/** Sorted union of own (its first nc entries are the supernode's own columns) and group rows gh. */
function unionRows(own: Int32Array, nc: number, gh: Int32Array, out: Int32Array): number {
  let k = 0;
  // own columns first, then the merge of both sorted tails
  for (let i = 0; i < nc; i++) out[k++] = own[i];
  let a = nc;
  let b = 0;
  while (a < own.length && b < gh.length) {
    const x = own[a];
    const y = gh[b];
    if (x < y) { out[k++] = x; a++; }
    else if (y < x) { out[k++] = y; b++; }
    else { out[k++] = x; a++; b++; }
  }
  while (a < own.length) out[k++] = own[a++];
  while (b < gh.length) out[k++] = gh[b++];
  return k;
}
