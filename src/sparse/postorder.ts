/**
 * Postorder of a forest given by parent pointers: every node is numbered after all of its
 * descendants, and the nodes of each subtree are numbered contiguously. Relabelling the
 * elimination tree this way leaves the fill of L unchanged and makes each chain of the tree
 * (a candidate supernode) a run of consecutive columns.
 *
 * Returns post with post[k] = the node visited k-th. Children are visited in increasing
 * index order; depth-first search uses an explicit stack (no recursion).
 */
export function postorderTree(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n);
  const stack = new Int32Array(n);
  const post = new Int32Array(n);
  // child lists: pushing in reverse order leaves each list in increasing order
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    if (p === -1) continue;
    next[j] = head[p];
    head[p] = j;
  }
  let k = 0;
  // depth-first search from each root, numbering a node when its children are done
  for (let root = 0; root < n; root++) {
    if (parent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const p = stack[top];
      const child = head[p];
      if (child === -1) {
        top--;
        post[k++] = p;
      } else {
        head[p] = next[child];
        stack[++top] = child;
      }
    }
  }
  // every node is pushed once, by its parent, so the stack holds one root-to-node path (≤ n); a
  // parent array with a cycle never reaches the cycle's nodes and would leave post short
  if (k !== n) throw new Error(`postorderTree: ${n - k} of ${n} nodes are not in a tree (the parent pointers form a cycle)`);
  return post;
}

/** Parent pointers relabelled by a postorder: newParent[k] = postInverse[parent[post[k]]]. */
export function relabelTree(parent: Int32Array, post: Int32Array): Int32Array {
  const n = parent.length;
  const inv = new Int32Array(n);
  // inverse of the postorder
  for (let k = 0; k < n; k++) inv[post[k]] = k;
  const out = new Int32Array(n);
  // parent of the k-th node in the new numbering
  for (let k = 0; k < n; k++) {
    const p = parent[post[k]];
    out[k] = p === -1 ? -1 : inv[p];
  }
  return out;
}
