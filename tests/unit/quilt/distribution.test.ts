import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type DistributionPlan, planDistribution } from '@shared/quilt';
import { bruteForceDistribution } from './support/brute-force-distribution';

type Maker = { id: string; accepted: number };
type Angel = { id: string; blocks: number };

const summary = (makers: Maker[], plan: DistributionPlan) => ({
  delivered: makers.reduce((s, m) => s + m.accepted, 0) - plan.shortfall.reduce((s, x) => s + x.missing, 0),
  minDistinct: plan.minDistinct,
  distinctPairs: plan.distinctPairs,
  angelBlocksUsed: plan.angelBlocksUsed,
});

/** Every invariant a plan must keep, whatever the instance. */
function expectSound(makers: Maker[], angels: Angel[], plan: DistributionPlan): void {
  const supply = new Map<string, number>();
  for (const m of makers) supply.set(m.id, (supply.get(m.id) ?? 0) + m.accepted);
  for (const a of angels) supply.set(a.id, (supply.get(a.id) ?? 0) + a.blocks);
  const sent = new Map<string, number>();
  const got = new Map<string, number>();
  const givers = new Map<string, Set<string>>();
  for (const t of plan.transfers) {
    expect(t.from).not.toBe(t.to);
    expect(t.count).toBeGreaterThan(0);
    expect(Number.isInteger(t.count)).toBe(true);
    sent.set(t.from, (sent.get(t.from) ?? 0) + t.count);
    got.set(t.to, (got.get(t.to) ?? 0) + t.count);
    givers.set(t.to, (givers.get(t.to) ?? new Set()).add(t.from));
    expect(angels.some((a) => a.id === t.to && !makers.some((m) => m.id === a.id))).toBe(false);
  }
  for (const [id, n] of sent) expect(n).toBeLessThanOrEqual(supply.get(id) ?? 0);
  const missing = new Map(plan.shortfall.map((s) => [s.id, s.missing]));
  for (const m of makers) expect(got.get(m.id) ?? 0).toBe(m.accepted - (missing.get(m.id) ?? 0));
  const total = [...supply.values()].reduce((s, x) => s + x, 0);
  // A shortfall only for a maker who wants more blocks than everyone else together has.
  const impossible = makers.filter((m) => m.accepted > total - (supply.get(m.id) ?? 0));
  expect(plan.shortfall.map((s) => s.id)).toEqual(impossible.map((m) => m.id));
  for (const s of plan.shortfall) {
    const m = makers.find((x) => x.id === s.id)!;
    expect(s.missing).toBe(m.accepted - (total - (supply.get(m.id) ?? 0)));
  }
  const recipients = makers.filter((m) => m.accepted > 0);
  const distinct = recipients.map((m) => givers.get(m.id)?.size ?? 0);
  expect(plan.minDistinct).toBe(recipients.length ? Math.min(...distinct) : 0);
  expect(plan.distinctPairs).toBe(plan.transfers.length);
}

describe('planDistribution is optimal on every small instance (checked by exhaustive enumeration)', () => {
  const counts = (n: number, max: number): number[][] =>
    n === 0 ? [[]] : counts(n - 1, max).flatMap((rest) => Array.from({ length: max + 1 }, (_, k) => [...rest, k]));

  it('four makers with 0–3 blocks each (256 instances)', () => {
    for (const accepted of counts(4, 3)) {
      const makers = accepted.map((a, i) => ({ id: `m${i}`, accepted: a }));
      const plan = planDistribution(makers);
      expectSound(makers, [], plan);
      expect(summary(makers, plan)).toEqual(bruteForceDistribution(makers));
    }
  });

  it('three makers with 0–3 blocks and one angel with 0–3 (256 instances)', () => {
    for (const [a, b, c, z] of counts(4, 3) as [number, number, number, number][]) {
      const makers = [a, b, c].map((x, i) => ({ id: `m${i}`, accepted: x }));
      const angels = [{ id: 'angel', blocks: z }];
      const plan = planDistribution(makers, { angels });
      expectSound(makers, angels, plan);
      expect(summary(makers, plan)).toEqual(bruteForceDistribution(makers, angels));
    }
  });

  it('five makers, four with 0–2 blocks and one with 0–4 (405 instances)', () => {
    for (const accepted of counts(4, 2)) {
      for (let e = 0; e <= 4; e += 1) {
        const makers = [...accepted, e].map((a, i) => ({ id: `m${i}`, accepted: a }));
        const plan = planDistribution(makers);
        expectSound(makers, [], plan);
        expect(summary(makers, plan)).toEqual(bruteForceDistribution(makers));
      }
    }
  });

  it('random small instances with two angels', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 1, maxLength: 3 }),
        fc.integer({ min: 0, max: 2 }),
        fc.integer({ min: 0, max: 2 }),
        (accepted, x, y) => {
          const makers = accepted.map((a, i) => ({ id: `m${i}`, accepted: a }));
          const angels = [
            { id: 'x', blocks: x },
            { id: 'y', blocks: y },
          ];
          const plan = planDistribution(makers, { angels });
          expectSound(makers, angels, plan);
          expect(summary(makers, plan)).toEqual(bruteForceDistribution(makers, angels));
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('planDistribution properties on larger swaps', () => {
  const instance = fc.record({
    accepted: fc.array(fc.integer({ min: 0, max: 8 }), { minLength: 1, maxLength: 40 }),
    angels: fc.array(fc.integer({ min: 0, max: 6 }), { maxLength: 3 }),
  });

  it('never gives anyone their own block, conserves blocks and reports shortfall only when impossible', () => {
    fc.assert(
      fc.property(instance, ({ accepted, angels: a }) => {
        const makers = accepted.map((x, i) => ({ id: `m${i}`, accepted: x }));
        const angels = a.map((b, i) => ({ id: `a${i}`, blocks: b }));
        const plan = planDistribution(makers, { angels });
        expectSound(makers, angels, plan);
        expect(plan.minDistinct).toBeLessThanOrEqual(
          Math.min(...makers.filter((m) => m.accepted > 0).map((m) => m.accepted), Infinity),
        );
      }),
      { numRuns: 150 },
    );
  });

  it('gives every block from a different maker in an even swap', () => {
    const makers = Array.from({ length: 60 }, (_, i) => ({ id: `m${i}`, accepted: 4 }));
    const plan = planDistribution(makers);
    expectSound(makers, [], plan);
    expect(plan).toMatchObject({ minDistinct: 4, distinctPairs: 240, shortfall: [], unsent: [], angelBlocksUsed: 0 });
    const big = Array.from({ length: 500 }, (_, i) => ({ id: `m${i}`, accepted: 6 }));
    expect(planDistribution(big)).toMatchObject({ minDistinct: 6, distinctPairs: 3000, shortfall: [] });
  });

  it('spreads repeated pairs evenly and is deterministic', () => {
    const makers = [
      { id: 'a', accepted: 4 },
      { id: 'b', accepted: 4 },
      { id: 'c', accepted: 4 },
    ];
    const plan = planDistribution(makers);
    expect(plan.transfers.map((t) => t.count)).toEqual([2, 2, 2, 2, 2, 2]);
    expect(planDistribution(makers)).toEqual(plan);
  });

  it('lets an angel who is also a maker give extra blocks, never to themselves', () => {
    const makers = [
      { id: 'a', accepted: 3 },
      { id: 'b', accepted: 1 },
    ];
    const angels = [{ id: 'b', blocks: 2 }];
    const plan = planDistribution(makers, { angels });
    expectSound(makers, angels, plan);
    expect(plan.shortfall).toEqual([]);
    expect(plan.transfers).toEqual([
      { from: 'a', to: 'b', count: 1 },
      { from: 'b', to: 'a', count: 3 },
    ]);
  });

  it('reports the shortfall of a lone maker', () => {
    expect(planDistribution([{ id: 'solo', accepted: 3 }])).toMatchObject({
      transfers: [],
      shortfall: [{ id: 'solo', missing: 3 }],
    });
    expect(
      planDistribution([
        { id: 'a', accepted: 5 },
        { id: 'b', accepted: 1 },
      ]).shortfall,
    ).toEqual([{ id: 'a', missing: 4 }]);
    expect(planDistribution([])).toMatchObject({ transfers: [], shortfall: [] });
  });

  it('explains bad input', () => {
    expect(() =>
      planDistribution([
        { id: 'a', accepted: 1 },
        { id: 'a', accepted: 2 },
      ]),
    ).toThrow(/listed twice/);
    expect(() => planDistribution([{ id: '', accepted: 1 }])).toThrow(/needs an id/);
    expect(() => planDistribution([{ id: 'a', accepted: -1 }])).toThrow(/whole number of at least 0/);
    expect(() => planDistribution([{ id: 'a', accepted: 1.5 }])).toThrow(/whole number/);
    expect(() => planDistribution([{ id: 'a', accepted: 1 }], { angels: [{ id: 'z', blocks: Number.NaN }] })).toThrow(
      /Angels 1 blocks/,
    );
  });
});
