/**
 * Independent exhaustive solver for tiny distribution instances: enumerates every transfer matrix
 * (no flows, no LP) and keeps the lexicographically best by (blocks delivered, fewest different
 * givers of any recipient, different pairs, fewest angel blocks).
 */
export interface BruteForceBest {
  delivered: number;
  minDistinct: number;
  distinctPairs: number;
  angelBlocksUsed: number;
}

export function bruteForceDistribution(
  makers: { id: string; accepted: number }[],
  angels: { id: string; blocks: number }[] = [],
): BruteForceBest {
  const givers = [
    ...makers.map((m) => ({ id: m.id, supply: m.accepted, angel: false })),
    ...angels.map((a) => ({ id: a.id, supply: a.blocks, angel: true })),
  ];
  const recipients = makers.filter((m) => m.accepted > 0);
  const left = givers.map((g) => g.supply);
  let best: BruteForceBest | null = null;
  const better = (a: BruteForceBest, b: BruteForceBest | null) =>
    b === null ||
    a.delivered > b.delivered ||
    (a.delivered === b.delivered &&
      (a.minDistinct > b.minDistinct ||
        (a.minDistinct === b.minDistinct &&
          (a.distinctPairs > b.distinctPairs ||
            (a.distinctPairs === b.distinctPairs && a.angelBlocksUsed < b.angelBlocksUsed)))));

  const received: number[] = [];
  const distinct: number[] = [];
  let angelUsed = 0;
  const visitRecipient = (i: number): void => {
    if (i === recipients.length) {
      const candidate = {
        delivered: received.reduce((s, x) => s + x, 0),
        minDistinct: distinct.length ? Math.min(...distinct) : 0,
        distinctPairs: distinct.reduce((s, x) => s + x, 0),
        angelBlocksUsed: angelUsed,
      };
      if (better(candidate, best)) best = candidate;
      return;
    }
    const r = recipients[i]!;
    const visitGiver = (j: number, got: number, pairs: number): void => {
      if (j === givers.length) {
        received[i] = got;
        distinct[i] = pairs;
        visitRecipient(i + 1);
        return;
      }
      const g = givers[j]!;
      const most = g.id === r.id ? 0 : Math.min(left[j]!, r.accepted - got);
      for (let k = 0; k <= most; k += 1) {
        left[j]! -= k;
        if (g.angel) angelUsed += k;
        visitGiver(j + 1, got + k, pairs + (k > 0 ? 1 : 0));
        left[j]! += k;
        if (g.angel) angelUsed -= k;
      }
    };
    visitGiver(0, 0, 0);
  };
  visitRecipient(0);
  return best ?? { delivered: 0, minDistinct: 0, distinctPairs: 0, angelBlocksUsed: 0 };
}
