/** Every route the app answers is listed in docs/api.md, read from the router itself. */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { listRoutes } from '../../server/http/list-routes';

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp();
});
afterAll(() => app.close());

it('documents every API route in docs/api.md', () => {
  const doc = readFileSync(new URL('../../docs/api.md', import.meta.url), 'utf8');
  const routes = listRoutes(app.app).filter((r) => r.path.startsWith('/api'));
  expect(routes.length).toBeGreaterThan(20);
  const missing = routes.filter((r) => !doc.includes(`${r.method} ${r.path}`)).map((r) => `${r.method} ${r.path}`);
  expect(missing).toEqual([]);
});
