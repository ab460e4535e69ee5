import { createServer, request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { Writable } from 'node:stream';
import express from 'express';
import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { createLogger } from '../../server/logger';
import { loggedUrl, requestLog, requestLogLevel } from '../../server/http/request-log';

type Line = {
  level: number;
  msg: string;
  app: string;
  req: { id: number; method: string; url: string; remoteAddress: string };
  res: { statusCode: number };
  responseTime: number;
};

/** An app with the request log in front, its lines kept in memory. */
function loggedApp(level: 'info' | 'warn' = 'info') {
  const lines: Line[] = [];
  const sink = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const text of chunk.toString().split('\n').filter(Boolean)) lines.push(JSON.parse(text) as Line);
      done();
    },
  });
  const logger = createLogger({ LOG_LEVEL: level, NODE_ENV: 'test' }, sink);
  const app = express();
  app.use(requestLog(logger));
  app.post('/api/blocks/:id/measurements', (_req, res) => void res.status(201).json({ ok: true }));
  app.get('/api/invitations/:token', (_req, res) => void res.json({ guild: 'Harbour Lights' }));
  app.get('/api/unsubscribe/info', (_req, res) => void res.json({ category: 'reminders' }));
  app.get('/api/missing', (_req, res) => void res.status(404).json({ error: { code: 'not_found', message: 'No.' } }));
  app.get('/api/broken', (_req, res) => void res.status(500).json({ error: { code: 'internal', message: 'Oops.' } }));
  app.get('/api/slow', () => {
    /* never answers: the client gives up first */
  });
  app.get('/assets/app.js', (_req, res) => void res.type('js').send('/* the client */'));
  return { app, lines };
}

// pino's numeric levels (pino's documentation, "Logger Levels").
const INFO = 30;
const WARN = 40;
const ERROR = 50;

describe('the request log', () => {
  it('writes one line per API request when it ends: id, method, URL, address, status and time', async () => {
    const { app, lines } = loggedApp();
    await supertest(app)
      .post('/api/blocks/12/measurements?from=intake')
      .set('Cookie', 'blockpost.sid=secret-session')
      .send({ width: 9.5 })
      .expect(201);
    await supertest(app).post('/api/blocks/13/measurements').send({}).expect(201);
    await expect.poll(() => lines.length).toBe(2);
    const [first, second] = lines;
    expect(first).toMatchObject({
      level: INFO,
      msg: 'request completed',
      app: 'blockpost',
      req: { method: 'POST', url: '/api/blocks/12/measurements?from=intake' },
      res: { statusCode: 201 },
    });
    expect(first!.req.remoteAddress).toMatch(/127\.0\.0\.1/);
    expect(first!.responseTime).toBeGreaterThanOrEqual(0);
    expect(second!.req.id).toBe(first!.req.id + 1);
    // Only the fields above: no headers, so no cookie, ever.
    expect(Object.keys(first!.req).sort()).toEqual(['id', 'method', 'remoteAddress', 'url']);
    expect(JSON.stringify(lines)).not.toContain('secret-session');
  });

  it('logs a 4xx at warn and a 5xx at error, and nothing for the client’s files', async () => {
    const { app, lines } = loggedApp();
    await supertest(app).get('/api/missing').expect(404);
    await supertest(app).get('/api/broken').expect(500);
    await supertest(app).get('/assets/app.js').expect(200);
    await expect.poll(() => lines.length).toBe(2);
    expect(lines.map((l) => [l.req.url, l.res.statusCode, l.level])).toEqual([
      ['/api/missing', 404, WARN],
      ['/api/broken', 500, ERROR],
    ]);
    expect([200, 201, 302, 404, 409, 500, 503].map(requestLogLevel)).toEqual([
      'info',
      'info',
      'info',
      'warn',
      'warn',
      'error',
      'error',
    ]);
  });

  it('at warn, an answered request writes nothing and a refused one still does', async () => {
    const { app, lines } = loggedApp('warn');
    await supertest(app).post('/api/blocks/12/measurements').send({}).expect(201);
    await supertest(app).get('/api/missing').expect(404);
    await expect.poll(() => lines.length).toBe(1);
    expect(lines[0]).toMatchObject({ level: WARN, req: { url: '/api/missing' }, res: { statusCode: 404 } });
  });

  it('keeps the secret of an invitation link or an unsubscribe link out of the line', async () => {
    const { app, lines } = loggedApp();
    const invitation = 'inv_Zq8sK2mW4xY7pR1tV9bN3cL6';
    const unsubscribe = 'MTIzOnJlbWluZGVyczoxNzAw.sig-Hk3Lw9';
    await supertest(app).get(`/api/invitations/${invitation}`).expect(200);
    await supertest(app).get(`/api/unsubscribe/info?token=${unsubscribe}&from=mail`).expect(200);
    await expect.poll(() => lines.length).toBe(2);
    expect(lines.map((l) => l.req.url)).toEqual([
      '/api/invitations/[redacted]',
      '/api/unsubscribe/info?token=[redacted]&from=mail',
    ]);
    expect(JSON.stringify(lines)).not.toContain(invitation);
    expect(JSON.stringify(lines)).not.toContain(unsubscribe.slice(0, 12));
  });

  it('leaves every other URL as it came, and redacts each token of a URL', () => {
    expect(loggedUrl('/api/blocks/12/measurements?from=intake')).toBe('/api/blocks/12/measurements?from=intake');
    // A guild's own list of invitations is addressed by number, not by token.
    expect(loggedUrl('/api/guilds/3/invitations/41')).toBe('/api/guilds/3/invitations/41');
    expect(loggedUrl('/api/invitations/abcdefghijklmnopqrstuv/accept')).toBe('/api/invitations/[redacted]/accept');
    expect(loggedUrl('/api/unsubscribe?token=a.b&token=c.d')).toBe('/api/unsubscribe?token=[redacted]&token=[redacted]');
    expect(loggedUrl('/api/swaps?mytoken=kept')).toBe('/api/swaps?mytoken=kept');
  });

  it('says so when the client went away before the answer', async () => {
    const { app, lines } = loggedApp();
    const server = createServer(app).listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    try {
      const { port } = server.address() as AddressInfo;
      const client = httpRequest({ host: '127.0.0.1', port, path: '/api/slow' });
      client.on('error', () => {});
      client.end();
      await new Promise((resolve) => setTimeout(resolve, 100));
      client.destroy();
      await expect.poll(() => lines.length).toBe(1);
      expect(lines[0]).toMatchObject({ msg: 'request closed before its answer was sent', req: { url: '/api/slow' } });
    } finally {
      server.closeAllConnections();
      server.close();
    }
  });
});
