/** Small builders for the swap API tests: a valid body, and a swap moved to a given state. */
import { expect } from 'vitest';
import type { TestApp } from '../helpers/test-app';
import type { guildWithRoles } from '../helpers/factories';
import { joinGuild } from '../helpers/factories';

export type Roles = Awaited<ReturnType<typeof guildWithRoles>>;
type Agent = ReturnType<TestApp['agent']>;

const DAY = 86_400_000;

/** A 3 × 3 grid of 3½″ cut squares: 9½″ unfinished, 9″ finished (3 × 3″ finished patches). */
export function swapBody(overrides: Record<string, unknown> = {}) {
  return {
    title: 'Harvest Stripes',
    description: 'Two-colour strip blocks for the spring raffle quilt',
    block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
    tolerance: '1/8',
    squareness: '1/4',
    colourRules: [
      { role: 'light', note: 'cream to pale gold' },
      { role: 'dark', note: 'indigo' },
    ],
    quota: { min: 1, max: 6 },
    signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
    dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
    mode: 'return',
    ...overrides,
  };
}

export async function createSwap(agent: Agent, guildId: number, overrides: Record<string, unknown> = {}) {
  const res = await agent.post(`/api/guilds/${guildId}/swaps`).send(swapBody(overrides));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; state: string; unfinished: { width: number; height: number } };
}

export async function move(agent: Agent, swapId: number, to: string) {
  const res = await agent.post(`/api/swaps/${swapId}/transitions`).send({ to });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

export async function myBlocks(agent: Agent, swapId: number) {
  const res = await agent.get(`/api/swaps/${swapId}/blocks?maker=me`).expect(200);
  return res.body as { id: number; sequence: number; state: string; verdict: string | null }[];
}

/**
 * A swap in `sewing` where each maker pledged the given number of blocks. Makers are the guild's
 * member and coordinator plus `extra` new members.
 */
export async function sewingSwap(app: TestApp, roles: Roles, opts: { pledges?: number[]; body?: Record<string, unknown> } = {}) {
  const pledges = opts.pledges ?? [2, 2, 2];
  const makers = [roles.member, roles.coordinator];
  while (makers.length < pledges.length) makers.push(await joinGuild(app, roles.guildId, 'member'));
  const swap = await createSwap(roles.coordinator.agent, roles.guildId, opts.body);
  await move(roles.coordinator.agent, swap.id, 'signup');
  for (const [i, count] of pledges.entries()) {
    await makers[i]!.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: count }).expect(200);
  }
  await move(roles.coordinator.agent, swap.id, 'sewing');
  return { swap, makers: makers.slice(0, pledges.length) };
}

/** Receives and measures a block with the coordinator's agent. */
export async function receiveAndMeasure(agent: Agent, blockId: number, size: Record<string, unknown>) {
  await agent.post(`/api/blocks/${blockId}/received`).send({}).expect(200);
  const res = await agent.post(`/api/blocks/${blockId}/measurements`).send(size);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { verdict: string; deviations: Record<string, number>; block: { state: string } };
}
