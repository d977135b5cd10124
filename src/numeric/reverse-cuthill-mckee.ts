/**
 * Reverse Cuthill–McKee ordering of an undirected graph given as adjacency lists: a permutation that keeps
 * neighbours close, so a matrix with that sparsity pattern gets a narrow band (Cuthill & McKee, Proc. 24th ACM
 * National Conference, 1969; George & Liu, *Computer Solution of Large Sparse Positive Definite Systems*).
 *
 * Returns `order`, where `order[k]` is the node placed at position k. Each connected component starts from a node of
 * lowest degree; ties are broken by node number, so the result is deterministic.
 */
export function reverseCuthillMcKee(adjacency: readonly (readonly number[])[]): number[] {
  const n = adjacency.length;
  const degree = adjacency.map((nbrs) => nbrs.length);
  const visited = new Uint8Array(n);
  const order: number[] = [];
  const byDegree = (u: number, v: number): number => degree[u]! - degree[v]! || u - v;
  for (;;) {
    let start = -1;
    for (let v = 0; v < n; v++) {
      if (visited[v] === 0 && (start < 0 || degree[v]! < degree[start]!)) start = v;
    }
    if (start < 0) break;
    visited[start] = 1;
    const queueStart = order.length;
    order.push(start);
    for (let head = queueStart; head < order.length; head++) {
      const u = order[head]!;
      const next = (adjacency[u] ?? []).filter((v) => visited[v] === 0);
      next.sort(byDegree);
      for (const v of next) {
        if (visited[v] === 0) {
          visited[v] = 1;
          order.push(v);
        }
      }
    }
  }
  return order.reverse();
}
