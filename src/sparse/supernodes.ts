/**
 * Supernodes of L in a postordered elimination tree: runs of consecutive columns whose lower
 * parts share one row structure, stored together as one dense block.
 *
 * Fundamental supernodes: column j + 1 continues the supernode of j when it is j's parent, j is
 * its only child, and count[j] = count[j+1] + 1 (same structure below the diagonal).
 *
 * Relaxed amalgamation (our rule, thresholds of the kind used by supernodal Cholesky codes):
 * a supernode s is merged into the supernode group that follows it when its tree parent lies in
 * that group (so the merged columns stay contiguous and the merged structure is
 * cols(s) ∪ structure(group)). Merging stores explicit zeros; with c merged columns and z the
 * fraction of stored zeros in the merged block, merge when
 *   c ≤ 4, or c ≤ 16 and z < 0.8, or c ≤ 48 and z < 0.1, or z < 0.05.
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

function shouldMerge(columns: number, zeroFraction: number): boolean {
  if (columns <= 4) return true;
  if (columns <= 16) return zeroFraction < 0.8;
  if (columns <= 48) return zeroFraction < 0.1;
  return zeroFraction < 0.05;
}

/**
 * Relaxed supernodes from fundamental ones (`starts`), `parent`/`counts` of the postordered
 * column tree. Returns the new starts array.
 */
export function relaxSupernodes(starts: Int32Array, parent: Int32Array, counts: Int32Array): Int32Array {
  const ns = starts.length - 1;
  const n = parent.length;
  const superOf = new Int32Array(n);
  // fundamental supernode of each column
  for (let s = 0; s < ns; s++) superOf.fill(s, starts[s], starts[s + 1]);
  const cols = new Float64Array(ns);
  const rows = new Float64Array(ns);
  const zeros = new Float64Array(ns);
  const last = new Int32Array(ns);
  const superParent = new Int32Array(ns);
  // initial groups: one fundamental supernode each
  for (let s = 0; s < ns; s++) {
    cols[s] = starts[s + 1] - starts[s];
    rows[s] = counts[starts[s]];
    last[s] = s;
    const p = parent[starts[s + 1] - 1];
    superParent[s] = p === -1 ? -1 : superOf[p];
  }
  // from the top of the postorder down: try to merge s into the group headed by s + 1
  for (let s = ns - 2; s >= 0; s--) {
    const p = superParent[s];
    const h = s + 1;
    if (p === -1 || p < h || p > last[h]) continue;
    const c = cols[s] + cols[h];
    const r = cols[s] + rows[h];
    const total = blockEntries(c, r);
    const z = total - blockEntries(cols[s], rows[s]) - blockEntries(cols[h], rows[h]) + zeros[s] + zeros[h];
    if (!shouldMerge(c, z / total)) continue;
    cols[s] = c;
    rows[s] = r;
    zeros[s] = z;
    last[s] = last[h];
  }
  const out: number[] = [];
  // group heads, in order
  for (let s = 0; s < ns; s = last[s] + 1) out.push(starts[s]);
  out.push(n);
  return Int32Array.from(out);
}
