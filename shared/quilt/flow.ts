/**
 * Network flow on small integer graphs: Dinic's maximum flow and successive-shortest-path minimum
 * cost flow (Dijkstra with potentials; every cost must be ≥ 0). Used by the block distribution.
 */

export const INF = 1e12;

export class FlowGraph {
  readonly size: number;
  readonly head: Int32Array;
  readonly next: number[] = [];
  readonly to: number[] = [];
  readonly cap: number[] = [];
  readonly cost: number[] = [];

  constructor(size: number) {
    this.size = size;
    this.head = new Int32Array(size).fill(-1);
  }

  /** Adds u → v and its residual twin; returns the forward edge's index. */
  addEdge(u: number, v: number, capacity: number, cost = 0): number {
    const e = this.to.length;
    this.to.push(v, u);
    this.cap.push(capacity, 0);
    this.cost.push(cost, -cost);
    this.next.push(this.head[u] as number, this.head[v] as number);
    this.head[u] = e;
    this.head[v] = e + 1;
    return e;
  }

  /** Flow carried by a forward edge. */
  flow(edge: number): number {
    return this.cap[edge ^ 1] as number;
  }
}

/** Dinic's algorithm: pushes the maximum flow from s to t and returns its value. */
export function maxFlow(g: FlowGraph, s: number, t: number): number {
  const level = new Int32Array(g.size);
  const iter = new Int32Array(g.size);
  const queue = new Int32Array(g.size);
  let total = 0;

  const bfs = (): boolean => {
    level.fill(-1);
    level[s] = 0;
    let qh = 0;
    let qt = 0;
    queue[qt++] = s;
    while (qh < qt) {
      const u = queue[qh++] as number;
      for (let e = g.head[u] as number; e !== -1; e = g.next[e] as number) {
        const v = g.to[e] as number;
        if ((g.cap[e] as number) > 0 && level[v] === -1) {
          level[v] = (level[u] as number) + 1;
          queue[qt++] = v;
        }
      }
    }
    return level[t] !== -1;
  };

  const dfs = (u: number, pushed: number): number => {
    if (u === t) return pushed;
    for (let e = iter[u] as number; e !== -1; e = g.next[e] as number, iter[u] = e) {
      const v = g.to[e] as number;
      const c = g.cap[e] as number;
      if (c > 0 && level[v] === (level[u] as number) + 1) {
        const d = dfs(v, Math.min(pushed, c));
        if (d > 0) {
          g.cap[e] = c - d;
          g.cap[e ^ 1] = (g.cap[e ^ 1] as number) + d;
          return d;
        }
      }
    }
    iter[u] = -1;
    return 0;
  };

  while (bfs()) {
    iter.set(g.head);
    for (let f = dfs(s, INF); f > 0; f = dfs(s, INF)) total += f;
  }
  return total;
}

/** Binary min-heap of [key, node] for Dijkstra. */
class Heap {
  private keys: number[] = [];
  private nodes: number[] = [];
  get length(): number {
    return this.keys.length;
  }
  push(key: number, node: number): void {
    const { keys, nodes } = this;
    let i = keys.length;
    keys.push(key);
    nodes.push(node);
    while (i > 0) {
      const p = (i - 1) >> 1;
      if ((keys[p] as number) <= key) break;
      keys[i] = keys[p] as number;
      nodes[i] = nodes[p] as number;
      i = p;
    }
    keys[i] = key;
    nodes[i] = node;
  }
  pop(): [number, number] {
    const { keys, nodes } = this;
    const top: [number, number] = [keys[0] as number, nodes[0] as number];
    const key = keys.pop() as number;
    const node = nodes.pop() as number;
    const n = keys.length;
    if (n > 0) {
      let i = 0;
      for (;;) {
        let c = 2 * i + 1;
        if (c >= n) break;
        if (c + 1 < n && (keys[c + 1] as number) < (keys[c] as number)) c += 1;
        if ((keys[c] as number) >= key) break;
        keys[i] = keys[c] as number;
        nodes[i] = nodes[c] as number;
        i = c;
      }
      keys[i] = key;
      nodes[i] = node;
    }
    return top;
  }
}

/**
 * Minimum-cost maximum flow from s to t by successive shortest paths. Returns the flow value and
 * its cost; costs on forward edges must be non-negative.
 */
export function minCostMaxFlow(g: FlowGraph, s: number, t: number): { flow: number; cost: number } {
  const potential = new Float64Array(g.size);
  const dist = new Float64Array(g.size);
  const via = new Int32Array(g.size);
  let flow = 0;
  let cost = 0;
  for (;;) {
    dist.fill(Infinity);
    via.fill(-1);
    dist[s] = 0;
    const heap = new Heap();
    heap.push(0, s);
    while (heap.length > 0) {
      const [d, u] = heap.pop();
      if (d > (dist[u] as number)) continue;
      for (let e = g.head[u] as number; e !== -1; e = g.next[e] as number) {
        if ((g.cap[e] as number) <= 0) continue;
        const v = g.to[e] as number;
        const nd = d + (g.cost[e] as number) + (potential[u] as number) - (potential[v] as number);
        if (nd < (dist[v] as number)) {
          dist[v] = nd;
          via[v] = e;
          heap.push(nd, v);
        }
      }
    }
    if (dist[t] === Infinity) break;
    for (let v = 0; v < g.size; v += 1) if (dist[v] !== Infinity) potential[v] = (potential[v] as number) + (dist[v] as number);
    let push = INF;
    for (let v = t; v !== s; v = g.to[(via[v] as number) ^ 1] as number) push = Math.min(push, g.cap[via[v] as number] as number);
    for (let v = t; v !== s; v = g.to[(via[v] as number) ^ 1] as number) {
      const e = via[v] as number;
      g.cap[e] = (g.cap[e] as number) - push;
      g.cap[e ^ 1] = (g.cap[e ^ 1] as number) + push;
      cost += push * (g.cost[e] as number);
    }
    flow += push;
  }
  return { flow, cost };
}
