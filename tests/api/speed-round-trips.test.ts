/**
 * How many SQL round trips the hot requests make. Every statement any pg client sends (Sequelize's
 * pool, the session store's pool, the job queue) is counted while one request runs.
 */
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { myBlocks, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
const sent: string[] = [];
let counting = false;
const originalQuery = pg.Client.prototype.query;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    if (counting) {
      const first = args[0];
      sent.push(typeof first === 'string' ? first : ((first as { text?: string })?.text ?? String(first)));
    }
    return (originalQuery as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof pg.Client.prototype.query;
});

afterAll(async () => {
  pg.Client.prototype.query = originalQuery;
  await app.close();
});

async function counted<T>(run: () => Promise<T>): Promise<{ result: T; statements: string[] }> {
  sent.length = 0;
  counting = true;
  try {
    const result = await run();
    return { result, statements: [...sent] };
  } finally {
    counting = false;
  }
}

describe('SQL round trips per request', () => {
  it('a ruler measurement with a clientId takes at most 8 round trips, commit included', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 2] });
    const [block] = await myBlocks(makers[0]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    const { result, statements } = await counted(() =>
      roles.coordinator.agent
        .post(`/api/blocks/${block!.id}/measurements`)
        .send({ width: '8 1/2', height: '8 1/2', clientId: '0f9d8a0e-5d0c-4d8e-9a55-1d2f3c4b5a6e' }),
    );
    expect(result.status, JSON.stringify(result.body)).toBe(201);
    console.log(statements.map((s) => s.replace(/\s+/g, ' ').slice(0, 120)).join('\n'));
    expect(statements.length).toBeLessThanOrEqual(8);
  });

  it('a roster read takes at most 3 round trips', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 2] });
    const { result, statements } = await counted(() => roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`));
    expect(result.status).toBe(200);
    console.log(statements.map((s) => s.replace(/\s+/g, ' ').slice(0, 120)).join('\n'));
    expect(statements.length).toBeLessThanOrEqual(3);
  });
});
