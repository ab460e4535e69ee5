import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { move, myBlocks, receiveAndMeasure, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
afterAll(() => app.close());

type Transfer = { from: number; to: number | null; count: number };
type Agent = ReturnType<TestApp['agent']>;

/** Measures every block of each maker with the sizes given (9½″ is true to size; 10″ trim; 9″ short). */
async function measureAll(swapId: number, makers: { agent: Agent }[], sizes: number[][]) {
  for (const [i, maker] of makers.entries()) {
    const blocks = await myBlocks(maker.agent, swapId);
    for (const [j, size] of (sizes[i] ?? []).entries()) {
      if (blocks[j]) await receiveAndMeasure(roles.coordinator.agent, blocks[j]!.id, { width: size, height: size });
    }
  }
}

function sums(transfers: Transfer[]) {
  const sent = new Map<number, number>();
  const got = new Map<number | null, number>();
  for (const t of transfers) {
    sent.set(t.from, (sent.get(t.from) ?? 0) + t.count);
    got.set(t.to, (got.get(t.to) ?? 0) + t.count);
  }
  return { sent, got };
}

describe('planning and confirming the return', () => {
  it('plans over accepted blocks only, conserves counts, and returns concrete blocks', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [3, 2, 2, 2] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    // member: true, true, short · coordinator: true, trim left untrimmed · third: true, true · fourth: trim (then trimmed), true
    await measureAll(swap.id, makers, [
      [9.5, 9.5, 9],
      [9.5, 10],
      [9.5, 9.5],
      [10, 9.5],
    ]);
    const fourthBlocks = await myBlocks(makers[3]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${fourthBlocks[0]!.id}/trimmed`).expect(200);
    await move(roles.coordinator.agent, swap.id, 'sorting');

    const plan = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/plan`).expect(200);
    expect(plan.body.acceptedTotal).toBe(7);
    expect(plan.body.leftOut).toEqual({ pending: 0, rejected: 1, untrimmed: 1 });
    expect(plan.body.shortfall).toEqual([]);
    const transfers = plan.body.transfers as (Transfer & { fromName: string; toName: string })[];
    const accepted = new Map([
      [makers[0]!.id, 2],
      [makers[1]!.id, 1],
      [makers[2]!.id, 2],
      [makers[3]!.id, 2],
    ]);
    const { sent, got } = sums(transfers);
    for (const [id, n] of accepted) {
      expect(sent.get(id)).toBe(n);
      expect(got.get(id)).toBe(n);
    }
    expect(transfers.every((t) => t.from !== t.to && t.fromName && t.toName)).toBe(true);

    const confirmed = await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/distribution/confirm`)
      .send({ transfers: transfers.map(({ from, to, count }) => ({ from, to, count })) })
      .expect(200);
    expect(confirmed.body.blocksReturned).toBe(7);

    const incoming = await makers[0]!.agent.get(`/api/swaps/${swap.id}/blocks?recipient=me`).expect(200);
    expect(incoming.body).toHaveLength(2);
    expect(
      incoming.body.every(
        (b: { maker: { id: number }; state: string }) => b.maker.id !== makers[0]!.id && b.state === 'returned',
      ),
    ).toBe(true);
    const roster = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`).expect(200);
    expect(roster.body.totals).toMatchObject({
      pledged: 9,
      measured: 9,
      returned: 7,
      accepted: 7,
      verdicts: { true: 6, trim: 2, short: 1, skewed: 0 },
    });

    await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/distribution/confirm`)
      .send({ transfers: [{ from: makers[0]!.id, to: makers[1]!.id, count: 1 }] })
      .expect(409);
    const csv = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/export/distribution.csv`).expect(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.headers['content-disposition']).toBe(`attachment; filename="harvest-stripes-swap-${swap.id}-distribution.csv"`);
    const lines = csv.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    expect(lines[0]).toBe('From (maker),To (recipient),Blocks,Block numbers');
    expect(lines.slice(1).reduce((s, l) => s + Number(l.split(',')[2]), 0)).toBe(7);

    await move(roles.coordinator.agent, swap.id, 'complete');
  });

  it('refuses hand-edited transfers that do not add up, and changes nothing', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [1, 1, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    await measureAll(swap.id, makers, [[9.5], [9.5], [9.5]]);
    await move(roles.coordinator.agent, swap.id, 'sorting');
    const [a, b, c] = makers.map((m) => m.id) as [number, number, number];
    const attempts: [Transfer[], RegExp][] = [
      [
        [
          { from: a, to: b, count: 1 },
          { from: b, to: c, count: 1 },
        ],
        /has 1 accepted block but the transfers send 0/,
      ],
      [
        [
          { from: a, to: a, count: 1 },
          { from: b, to: c, count: 1 },
          { from: c, to: b, count: 1 },
        ],
        /cannot receive their own/,
      ],
      [
        [
          { from: a, to: b, count: 1 },
          { from: b, to: a, count: 1 },
          { from: c, to: b, count: 1 },
        ],
        /should receive 1 block but the transfers give 2/,
      ],
      [
        [
          { from: a, to: b, count: 2 },
          { from: b, to: c, count: 1 },
          { from: c, to: a, count: 1 },
        ],
        /has 1 accepted block but the transfers send 2/,
      ],
      [[{ from: roles.admin.id, to: b, count: 1 }], /no accepted blocks to send/],
      [
        [
          { from: a, to: b, count: 1 },
          { from: a, to: b, count: 1 },
        ],
        /listed twice/,
      ],
    ];
    for (const [transfers, message] of attempts) {
      const res = await roles.coordinator.agent
        .post(`/api/swaps/${swap.id}/distribution/confirm`)
        .send({ transfers })
        .expect(409);
      expect(res.body.error.message).toMatch(message);
    }
    const bad = await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/distribution/confirm`)
      .send({ transfers: [{ from: a, to: b, count: 0 }] })
      .expect(400);
    expect(bad.body.error.fields['transfers.0.count']).toMatch(/at least 1/);
    const blocks = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/blocks`).expect(200);
    expect(blocks.body.every((x: { state: string }) => x.state === 'measured')).toBe(true);
    // A valid cycle goes through.
    await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/distribution/confirm`)
      .send({
        transfers: [
          { from: a, to: b, count: 1 },
          { from: b, to: c, count: 1 },
          { from: c, to: a, count: 1 },
        ],
      })
      .expect(200);
  });

  it('reports a shortfall when one maker alone has accepted blocks', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    await measureAll(swap.id, makers, [[9.5, 9.5], [9]]);
    await move(roles.coordinator.agent, swap.id, 'sorting');
    const plan = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/plan`).expect(200);
    expect(plan.body.transfers).toEqual([]);
    expect(plan.body.shortfall).toEqual([{ id: makers[0]!.id, displayName: expect.any(String), missing: 2 }]);
  });

  it('sends every accepted block to the gift recipient', async () => {
    const { swap, makers } = await sewingSwap(app, roles, {
      pledges: [2, 1],
      body: { mode: 'gift', giftRecipientName: 'Riverside Hospice comfort quilts' },
    });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    await measureAll(swap.id, makers, [[9.5, 9.5], [9.5]]);
    await move(roles.coordinator.agent, swap.id, 'sorting');
    const plan = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/plan`).expect(200);
    expect(plan.body.transfers).toHaveLength(2);
    expect(plan.body.transfers).toEqual(
      expect.arrayContaining([
        { from: makers[0]!.id, to: null, count: 2, fromName: expect.any(String), toName: 'Riverside Hospice comfort quilts' },
        { from: makers[1]!.id, to: null, count: 1, fromName: expect.any(String), toName: 'Riverside Hospice comfort quilts' },
      ]),
    );
    const stray = await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/distribution/confirm`)
      .send({
        transfers: [
          { from: makers[0]!.id, to: makers[1]!.id, count: 2 },
          { from: makers[1]!.id, to: null, count: 1 },
        ],
      })
      .expect(409);
    expect(stray.body.error.message).toMatch(/gift swap/);
    await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/distribution/confirm`)
      .send({ transfers: plan.body.transfers.map(({ from, to, count }: Transfer) => ({ from, to, count })) })
      .expect(200);
    const blocks = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/blocks`).expect(200);
    expect(blocks.body.map((b: { recipient: { displayName: string } }) => b.recipient.displayName)).toEqual(
      Array(3).fill('Riverside Hospice comfort quilts'),
    );
  });
});

describe('roster export', () => {
  it('downloads every member’s counts as CSV, neutralising formula-like names', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 1] });
    await roles.member.agent.patch('/api/me').send({ displayName: '=HYPERLINK("x")' }).expect(200);
    const res = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/export/roster.csv`).expect(200);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="harvest-stripes-swap-${swap.id}-roster.csv"`);
    const text = res.text.replace(/^\uFEFF/, '');
    expect(text.split('\r\n')[0]).toMatch(/^Member,E-mail,Pledged,Sewn,Handed in,Received,Measured,Still owed/);
    expect(text).toContain(`"'=HYPERLINK(""x"")"`);
    expect(text).toContain(roles.member.email);
  });
});
