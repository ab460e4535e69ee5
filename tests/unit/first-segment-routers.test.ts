import express, { type Router } from 'express';
import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { firstSegmentRouters } from '../../server/http/first-segment-routers';

/** A router that answers its routes with its own name, and counts the requests that entered it. */
function namedRouter(name: string, build: (router: Router, answer: express.RequestHandler) => void) {
  const entered = { count: 0 };
  const routes = express.Router();
  build(routes, (_req, res) => void res.json({ by: name }));
  const counted = Object.assign(
    (req: express.Request, res: express.Response, next: express.NextFunction) => {
      entered.count++;
      routes(req, res, next);
    },
    { stack: routes.stack },
  ) as unknown as Router;
  return { router: counted, entered };
}

function appWith(routers: Router[]) {
  const app = express();
  app.use(firstSegmentRouters(routers));
  app.use((_req, res) => void res.status(404).json({ by: 'not found' }));
  return app;
}

describe('routers entered by the first segment of the path', () => {
  it('enters only the routers whose routes can match the segment', async () => {
    const blocks = namedRouter('blocks', (r, answer) => r.post('/blocks/:id/measurements', answer));
    const swaps = namedRouter('swaps', (r, answer) => r.get('/swaps/:id', answer));
    const chat = namedRouter('chat', (r, answer) => r.get('/chat/rooms', answer));
    const app = appWith([swaps.router, chat.router, blocks.router]);

    const answer = await supertest(app).post('/blocks/7/measurements');

    expect(answer.body).toEqual({ by: 'blocks' });
    expect([swaps.entered.count, chat.entered.count, blocks.entered.count]).toEqual([0, 0, 1]);
  });

  it('keeps the order the routers were given when two serve the same segment', async () => {
    const first = namedRouter('first', (r, answer) => r.get('/swaps/:id/roster', answer));
    const second = namedRouter('second', (r, answer) => {
      r.get('/swaps/:id/roster', answer);
      r.get('/swaps/:id/export', answer);
    });
    const app = appWith([first.router, second.router]);

    expect((await supertest(app).get('/swaps/3/roster')).body).toEqual({ by: 'first' });
    expect((await supertest(app).get('/swaps/3/export')).body).toEqual({ by: 'second' });
  });

  it('tries a router with middleware on every path in its place, for every segment', async () => {
    const early = namedRouter('early', (r, answer) => r.get('/swaps/:id', answer));
    const everywhere = express.Router();
    everywhere.use((req, res, next) => (req.get('x-stop') ? void res.json({ by: 'everywhere' }) : next()));
    const late = namedRouter('late', (r, answer) => r.get('/me', answer));
    const app = appWith([early.router, everywhere, late.router]);

    expect((await supertest(app).get('/swaps/1').set('x-stop', '1')).body).toEqual({ by: 'early' });
    expect((await supertest(app).get('/me').set('x-stop', '1')).body).toEqual({ by: 'everywhere' });
    expect((await supertest(app).get('/me')).body).toEqual({ by: 'late' });
    expect((await supertest(app).get('/elsewhere').set('x-stop', '1')).body).toEqual({ by: 'everywhere' });
  });

  it('treats a parameter as the first segment as matching any segment', async () => {
    const byParam = namedRouter('param', (r, answer) => r.get('/:anything/info', answer));
    const app = appWith([byParam.router]);

    expect((await supertest(app).get('/whatever/info')).body).toEqual({ by: 'param' });
  });

  it('matches segments regardless of case, as Express routes do', async () => {
    const blocks = namedRouter('blocks', (r, answer) => r.get('/blocks/:id', answer));
    const app = appWith([blocks.router]);

    expect((await supertest(app).get('/Blocks/2')).body).toEqual({ by: 'blocks' });
  });

  it('passes a path no router serves on to what follows', async () => {
    const blocks = namedRouter('blocks', (r, answer) => r.get('/blocks/:id', answer));
    const app = appWith([blocks.router]);

    const answer = await supertest(app).get('/nothing/here');

    expect(answer.status).toBe(404);
    expect(answer.body).toEqual({ by: 'not found' });
    expect(blocks.entered.count).toBe(0);
  });
});
