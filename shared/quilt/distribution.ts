/**
 * Who receives which blocks after a swap. Every maker receives as many blocks as they had
 * accepted, never their own, from as many different makers as possible; angels give extra blocks
 * and receive none. Solved with network flows; docs/quilt-math.md explains the construction.
 */
import { FlowGraph, INF, maxFlow, minCostMaxFlow } from './flow';
import { QuiltInputError, countArg } from './rational';

export interface Maker {
  id: string;
  accepted: number;
}

export interface Angel {
  id: string;
  blocks: number;
}

export interface Transfer {
  from: string;
  to: string;
  count: number;
}

export interface DistributionPlan {
  transfers: Transfer[];
  /** recipients who cannot be given all their blocks, and how many they miss */
  shortfall: { id: string; missing: number }[];
  /** makers whose own accepted blocks are not all handed on (only when angel blocks are used) */
  unsent: { id: string; count: number }[];
  /** fewest different givers any recipient (accepted > 0) gets */
  minDistinct: number;
  /** number of different (giver, recipient) pairs */
  distinctPairs: number;
  angelBlocksUsed: number;
}

interface Giver {
  id: string;
  own: number;
  angel: number;
}

interface Recipient {
  id: string;
  demand: number;
}

function makersArg(makers: unknown, angels: unknown): { givers: Giver[]; recipients: Recipient[] } {
  if (!Array.isArray(makers)) throw new QuiltInputError('makers', 'Makers must be a list.');
  const givers = new Map<string, Giver>();
  const recipients: Recipient[] = [];
  makers.forEach((m: Maker, i) => {
    if (typeof m?.id !== 'string' || m.id === '') throw new QuiltInputError(`makers[${i}].id`, 'Every maker needs an id.');
    if (givers.has(m.id)) throw new QuiltInputError(`makers[${i}].id`, `Maker ${m.id} is listed twice.`);
    const accepted = countArg(`makers[${i}].accepted`, m.accepted, 0);
    givers.set(m.id, { id: m.id, own: accepted, angel: 0 });
    recipients.push({ id: m.id, demand: accepted });
  });
  if (angels !== undefined && !Array.isArray(angels)) throw new QuiltInputError('angels', 'Angels must be a list.');
  const seen = new Set<string>();
  (angels ?? []).forEach((a: Angel, i: number) => {
    if (typeof a?.id !== 'string' || a.id === '') throw new QuiltInputError(`angels[${i}].id`, 'Every angel needs an id.');
    if (seen.has(a.id)) throw new QuiltInputError(`angels[${i}].id`, `Angel ${a.id} is listed twice.`);
    seen.add(a.id);
    const blocks = countArg(`angels[${i}].blocks`, a.blocks, 0);
    const g = givers.get(a.id) ?? { id: a.id, own: 0, angel: 0 };
    g.angel += blocks;
    givers.set(a.id, g);
  });
  return { givers: [...givers.values()].filter((g) => g.own + g.angel > 0), recipients: recipients.filter((r) => r.demand > 0) };
}

/** x[j][i]: blocks giver j sends recipient i. */
type Matrix = number[][];

/**
 * Fast path: one block per (giver, recipient) pair using makers' own blocks only. If such a flow
 * delivers everything, every block comes from a different maker, which no plan can beat. A sparse
 * ring of candidate pairs is tried before the complete graph.
 */
function allDistinct(givers: Giver[], recipients: Recipient[], sparse: boolean): Matrix | null {
  const G = givers.length;
  const R = recipients.length;
  const demand = recipients.reduce((s, r) => s + r.demand, 0);
  const rIndex = new Map(recipients.map((r, i) => [r.id, i]));
  const g = new FlowGraph(2 + G + R);
  const maxDemand = Math.max(...recipients.map((r) => r.demand));
  const reach = sparse ? Math.min(G - 1, Math.max(8, 3 * maxDemand)) : G - 1;
  const pairs: [number, number, number][] = [];
  givers.forEach((giver, j) => {
    g.addEdge(0, 2 + j, giver.own);
    for (let k = 1; k <= reach; k += 1) {
      const to = givers[(j + k) % G] as Giver;
      const i = rIndex.get(to.id);
      if (i !== undefined) pairs.push([j, i, g.addEdge(2 + j, 2 + G + i, 1)]);
    }
  });
  recipients.forEach((r, i) => g.addEdge(2 + G + i, 1, r.demand));
  if (maxFlow(g, 0, 1) !== demand) return null;
  const x: Matrix = givers.map(() => new Array<number>(R).fill(0));
  for (const [j, i, e] of pairs) (x[j] as number[])[i] = g.flow(e);
  return x;
}

/**
 * The general network. Each (giver, recipient) pair has a first-block arc into D(i), which must
 * pass `floor` units to the sink (the least number of different givers per recipient), and arcs
 * for further blocks into R(i). With `withCosts`, the k-th block of a pair (k ≥ 2) costs
 * repeat + (k − 2) and an angel block costs `angelCost`, weighted so that fewer repeated pairs
 * always win, then fewer angel blocks, then an even spread over the pairs.
 */
function network(givers: Giver[], recipients: Recipient[], floor: number, withCosts: boolean) {
  const G = givers.length;
  const R = recipients.length;
  const demand = recipients.reduce((s, r) => s + r.demand, 0);
  const angelTotal = givers.reduce((s, g) => s + g.angel, 0);
  const spreadBound = demand * demand + 1;
  const angelCost = withCosts ? spreadBound : 0;
  const repeatCost = (angelTotal + 1) * spreadBound;
  const D = (i: number) => 2 + G + i;
  const Rn = (i: number) => 2 + G + R + i;
  const g = new FlowGraph(2 + G + 2 * R);
  const own: number[] = [];
  const angel: number[] = [];
  const pairs: [number, number, number[]][] = [];
  givers.forEach((giver, j) => {
    own.push(g.addEdge(0, 2 + j, giver.own, 0));
    angel.push(g.addEdge(0, 2 + j, giver.angel, angelCost));
    recipients.forEach((r, i) => {
      if (r.id === giver.id) return;
      const arcs = [g.addEdge(2 + j, D(i), 1, 0)];
      if (!withCosts) arcs.push(g.addEdge(2 + j, Rn(i), INF, 0));
      else
        for (let k = 2; k <= Math.min(giver.own + giver.angel, r.demand); k += 1)
          arcs.push(g.addEdge(2 + j, Rn(i), 1, repeatCost + k - 2));
      pairs.push([j, i, arcs]);
    });
  });
  recipients.forEach((r, i) => {
    g.addEdge(D(i), 1, floor, 0);
    g.addEdge(D(i), Rn(i), INF, 0);
    g.addEdge(Rn(i), 1, r.demand - floor, 0);
  });
  const matrix = (): Matrix => {
    const x: Matrix = givers.map(() => new Array<number>(R).fill(0));
    for (const [j, i, arcs] of pairs) (x[j] as number[])[i] = arcs.reduce((s, e) => s + g.flow(e), 0);
    return x;
  };
  const ownSent = () => own.map((e) => g.flow(e));
  const angelSent = () => angel.map((e) => g.flow(e));
  return { g, matrix, ownSent, angelSent };
}

function generalPlan(
  givers: Giver[],
  recipients: Recipient[],
): { x: Matrix; delivered: number[]; ownSent: number[]; angelSent: number[] } {
  // 1. The most blocks that can be delivered at all (only one recipient can ever be short).
  const base = network(givers, recipients, 0, false);
  maxFlow(base.g, 0, 1);
  const baseX = base.matrix();
  const received = recipients.map((_, i) => baseX.reduce((s, row) => s + (row[i] as number), 0));
  const served = recipients.map((r, i) => ({ ...r, demand: received[i] as number }));
  const active = served.filter((r) => r.demand > 0);
  const total = active.reduce((s, r) => s + r.demand, 0);
  // 2. Binary search the largest floor m every recipient can reach.
  const upper = Math.min(...active.map((r) => Math.min(r.demand, givers.length - (givers.some((g) => g.id === r.id) ? 1 : 0))));
  let lo = 0;
  let hi = Number.isFinite(upper) ? upper : 0;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    const test = network(givers, active, mid, false);
    if (maxFlow(test.g, 0, 1) === total) lo = mid;
    else hi = mid - 1;
  }
  // 3. With that floor, the most different pairs, then the fewest angel blocks.
  const best = network(givers, active, lo, true);
  minCostMaxFlow(best.g, 0, 1);
  const xa = best.matrix();
  const x: Matrix = givers.map((_, j) =>
    served.map((r) => {
      const i = active.findIndex((a) => a.id === r.id);
      return i < 0 ? 0 : ((xa[j] as number[])[i] as number);
    }),
  );
  return { x, delivered: received, ownSent: best.ownSent(), angelSent: best.angelSent() };
}

/**
 * Plans the return of blocks: maximises the fewest different makers any recipient gets, then the
 * number of different (from, to) pairs, then uses as few angel blocks as possible. Reports a
 * shortfall only when no plan can deliver every block (e.g. a single maker).
 */
export function planDistribution(makers: Maker[], opts: { angels?: Angel[] } = {}): DistributionPlan {
  const { givers, recipients } = makersArg(makers, opts.angels);
  const empty: DistributionPlan = {
    transfers: [],
    shortfall: [],
    unsent: [],
    minDistinct: 0,
    distinctPairs: 0,
    angelBlocksUsed: 0,
  };
  if (recipients.length === 0) return empty;
  const makersGiving = givers.filter((g) => g.own > 0).length;
  // A recipient's own id is among the givers whenever it has a demand (its own accepted blocks).
  const fastOk = recipients.every((r) => r.demand <= makersGiving - 1);
  const fast = fastOk ? (allDistinct(givers, recipients, true) ?? allDistinct(givers, recipients, false)) : null;
  const plan = fast
    ? { x: fast, delivered: recipients.map((r) => r.demand), ownSent: givers.map((g) => g.own), angelSent: givers.map(() => 0) }
    : generalPlan(givers, recipients);

  const transfers: Transfer[] = [];
  const distinct = recipients.map(() => 0);
  plan.x.forEach((row, j) =>
    row.forEach((count, i) => {
      if (count <= 0) return;
      transfers.push({ from: (givers[j] as Giver).id, to: (recipients[i] as Recipient).id, count });
      distinct[i] = (distinct[i] as number) + 1;
    }),
  );
  return {
    transfers,
    shortfall: recipients.flatMap((r, i) =>
      (plan.delivered[i] as number) < r.demand ? [{ id: r.id, missing: r.demand - (plan.delivered[i] as number) }] : [],
    ),
    unsent: givers.flatMap((g, j) =>
      (plan.ownSent[j] as number) < g.own ? [{ id: g.id, count: g.own - (plan.ownSent[j] as number) }] : [],
    ),
    minDistinct: Math.min(...distinct),
    distinctPairs: transfers.length,
    angelBlocksUsed: plan.angelSent.reduce((s, a) => s + a, 0),
  };
}
