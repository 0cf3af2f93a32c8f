/**
 * Reverse Cuthill–McKee order of the nodes, so that the equilibrium equations of
 * neighbouring nodes sit near each other and the elimination stays inside a narrow band.
 * `adjacency[i]` lists the nodes joined to node i by a member. Returns position → node.
 */
export function reverseCuthillMcKee(adjacency: readonly (readonly number[])[]): Int32Array {
  const n = adjacency.length;
  const order = new Int32Array(n);
  const seen = new Uint8Array(n);
  const degree = adjacency.map((a) => a.length);
  let filled = 0;

  // Nodes by ascending degree, so every component starts from a low-degree (peripheral) node.
  const byDegree = Array.from({ length: n }, (_, i) => i).sort((a, b) => (degree[a] ?? 0) - (degree[b] ?? 0) || a - b);

  const bfsLast = (root: number): number => {
    // One breadth-first sweep; its last node is far from the root (a pseudo-peripheral start).
    const mark = new Uint8Array(n);
    const queue = [root];
    mark[root] = 1;
    let last = root;
    for (let q = 0; q < queue.length; q++) {
      const v = queue[q] ?? 0;
      last = v;
      for (const w of adjacency[v] ?? []) {
        if (!mark[w]) {
          mark[w] = 1;
          queue.push(w);
        }
      }
    }
    return last;
  };

  for (const candidate of byDegree) {
    if (seen[candidate]) continue;
    const root = bfsLast(candidate);
    seen[root] = 1;
    const start = filled;
    order[filled++] = root;
    for (let q = start; q < filled; q++) {
      const v = order[q] ?? 0;
      const next = (adjacency[v] ?? []).filter((w) => !seen[w]).sort((a, b) => (degree[a] ?? 0) - (degree[b] ?? 0) || a - b);
      for (const w of next) {
        seen[w] = 1;
        order[filled++] = w;
      }
    }
  }
  return order.reverse();
}
