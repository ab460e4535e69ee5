import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { insertConfirmedAccount, PASSWORD } from '../helpers/factories';

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp();
});
afterAll(() => app.close());

it('sends helmet’s headers and a strict Content-Security-Policy, and no X-Powered-By', async () => {
  const res = await app.agent().get('/api/health').expect(200);
  expect(res.headers['x-powered-by']).toBeUndefined();
  expect(res.headers['x-content-type-options']).toBe('nosniff');
  expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
  expect(res.headers['referrer-policy']).toBe('no-referrer');
  expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
  const csp = Object.fromEntries(
    String(res.headers['content-security-policy'])
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .map(([k, ...v]) => [k, v.join(' ')]),
  );
  expect(csp).toMatchObject({
    'default-src': "'self'",
    'script-src': "'self'",
    'style-src': "'self'",
    'object-src': "'none'",
    'frame-ancestors': "'none'",
    'base-uri': "'self'",
  });
  expect(csp['script-src']).not.toMatch(/unsafe/);
  // Plain http on loopback: no HSTS and no upgrade, which would break local use.
  expect(res.headers['strict-transport-security']).toBeUndefined();
});

it('marks the session cookie Secure when the app is served over https', async () => {
  const secure = await createTestApp({ PUBLIC_URL: 'https://guild.example.test', TRUST_PROXY: 'true' });
  try {
    await insertConfirmedAccount(secure.deps.pool, { email: 'secure-cookie@example.test', displayName: 'Sigrid Holm' });
    const res = await secure
      .agent()
      .set('X-Forwarded-Proto', 'https')
      .post('/api/auth/login')
      .send({ email: 'secure-cookie@example.test', password: PASSWORD })
      .expect(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('blockpost.sid='))!;
    expect(cookie).toMatch(/; Secure/i);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(res.headers['strict-transport-security']).toMatch(/max-age=/);
  } finally {
    await secure.close();
  }
});
