// Reverse Cuthill–McKee ordering of the node graph (nodes joined by members), so that the
// dofs numbered node by node give a narrow envelope whatever order the user listed things in.
// Start nodes are pseudo-peripheral (George & Liu's repeated breadth-first search).

/** @returns order[k] = index of the node numbered k-th */
export function reverseCuthillMcKee(adjacency: readonly (readonly number[])[]): Int32Array {
  const n = adjacency.length;
  const degree = new Int32Array(n);
  for (let i = 0; i < n; i++) degree[i] = adjacency[i]!.length;

  const placed = new Uint8Array(n);
  const order = new Int32Array(n);
  let count = 0;

  const level = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  const stamp = new Int32Array(n).fill(-1);
  let search = 0;

  // Breadth-first levels from root over unplaced nodes; returns the last level's nodes.
  const levels = (root: number): { depth: number; last: number[]; reached: number } => {
    search++;
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    stamp[root] = search;
    level[root] = 0;
    let depth = 0;
    while (head < tail) {
      const v = queue[head++]!;
      const lv = level[v]!;
      if (lv > depth) depth = lv;
      for (const w of adjacency[v]!) {
        if (placed[w] || stamp[w] === search) continue;
        stamp[w] = search;
        level[w] = lv + 1;
        queue[tail++] = w;
      }
    }
    const last: number[] = [];
    for (let k = 0; k < tail; k++) {
      const v = queue[k]!;
      if (level[v] === depth) last.push(v);
    }
    return { depth, last, reached: tail };
  };

  for (let seed = 0; seed < n; seed++) {
    if (placed[seed]) continue;
    // Lowest-degree node of this component as the first guess.
    const reached = levels(seed).reached;
    let root = seed;
    for (let k = 0; k < reached; k++) {
      const v = queue[k]!;
      if (degree[v]! < degree[root]!) root = v;
    }
    let current = levels(root);
    for (;;) {
      let best = current.last[0]!;
      for (const v of current.last) if (degree[v]! < degree[best]!) best = v;
      const next = levels(best);
      root = best;
      if (next.depth <= current.depth) break;
      current = next;
    }

    // Cuthill–McKee from root, neighbours by increasing degree.
    let head = count;
    order[count++] = root;
    placed[root] = 1;
    while (head < count) {
      const v = order[head++]!;
      const next: number[] = [];
      for (const w of adjacency[v]!) {
        if (placed[w]) continue;
        placed[w] = 1;
        next.push(w);
      }
      next.sort((p, q) => degree[p]! - degree[q]! || p - q);
      for (const w of next) order[count++] = w;
    }
  }
  order.reverse();
  return order;
}
