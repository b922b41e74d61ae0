/**
 * Depth-first postorder of the subtree rooted at `root`, children given as linked lists
 * (head[parent] -> first child, next[child] -> sibling). Writes into post from position k and
 * returns the next free position. `head` is consumed. Non-recursive (deep trees are common).
 * After cs_tdfs in T. A. Davis, Direct Methods for Sparse Linear Systems (SIAM 2006), from memory.
 */
export function visitPostorder(
  root: number,
  k: number,
  head: Int32Array,
  next: Int32Array,
  post: Int32Array,
  stack: Int32Array,
): number {
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
  return k;
}

/** Postorder of a forest given by parent pointers (-1 for roots); children visited in ascending index. */
export function postorderForest(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n);
  const post = new Int32Array(n);
  const stack = new Int32Array(n);
  // Insert in reverse so each child list ends up ascending.
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    if (p === -1) continue;
    next[j] = head[p];
    head[p] = j;
  }
  let k = 0;
  for (let j = 0; j < n; j++) {
    if (parent[j] === -1) k = visitPostorder(j, k, head, next, post, stack);
  }
  return post;
}
