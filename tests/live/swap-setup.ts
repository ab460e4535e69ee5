/** A swap in `collecting` with pledges, built through the REST API as the people themselves would. */
import { expect } from 'vitest';
import type { Person } from './live-helpers';

const DAY = 86_400_000;

/** A 3 × 3 grid of 3½″ cut squares: 9½″ unfinished. */
export function swapBody(title = 'Harvest Stripes') {
  return {
    title,
    block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
    quota: { min: 1, max: 6 },
    signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
    dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
  };
}

async function ok<T>(call: Promise<{ status: number; body: T }>, status = 200): Promise<T> {
  const res = await call;
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body;
}

export async function moveSwap(coordinator: Person, swapId: number, to: string) {
  return ok(coordinator.api('POST', `/swaps/${swapId}/transitions`, { to }));
}

/** Each maker pledges `blocks`; the swap ends up in `collecting`. Returns each maker's block ids. */
export async function collectingSwap(coordinator: Person, guildId: number, makers: Person[], blocks = 2) {
  const swap = await ok<{ id: number }>(coordinator.api('POST', `/guilds/${guildId}/swaps`, swapBody()), 201);
  await moveSwap(coordinator, swap.id, 'signup');
  for (const maker of makers) await ok(maker.api('POST', `/swaps/${swap.id}/signups`, { blocks }));
  await moveSwap(coordinator, swap.id, 'sewing');
  await moveSwap(coordinator, swap.id, 'collecting');
  const blockIds = new Map<number, number[]>();
  for (const maker of makers) {
    const mine = await ok<{ id: number }[]>(maker.api('GET', `/swaps/${swap.id}/blocks?maker=me`));
    blockIds.set(
      maker.id,
      mine.map((b) => b.id),
    );
  }
  return { swapId: swap.id, blockIds };
}

/** The coordinator receives a block and measures it at the given size (inches, any accepted format). */
export async function receiveAndMeasure(coordinator: Person, blockId: number, width = '9 1/2', height = '9 1/2') {
  await ok(coordinator.api('POST', `/blocks/${blockId}/received`, {}));
  return ok<{ verdict: string }>(coordinator.api('POST', `/blocks/${blockId}/measurements`, { width, height }), 201);
}
