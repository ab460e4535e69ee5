import express, { type RequestHandler, type Router } from 'express';

interface RouterLayer {
  rawPath?: unknown;
}

/** The first segment of a route's path when it is plain text (`/blocks/:id` → `blocks`), else null. */
function literalFirstSegment(path: unknown): string | null {
  if (typeof path !== 'string' || !path.startsWith('/')) return null;
  const segment = path.slice(1).split('/')[0]!;
  // A parameter, wildcard or optional part could match any text there.
  return /[:*{}()?+\\]/.test(segment) ? null : segment.toLowerCase();
}

/**
 * The first segments of every path a router's routes and middleware can match; null when one of
 * them can match any first segment (middleware mounted on `/`, a parameter, a pattern).
 */
function firstSegmentsOf(router: Router): Set<string> | null {
  const segments = new Set<string>();
  for (const layer of router.stack as RouterLayer[]) {
    for (const path of [layer.rawPath].flat()) {
      const segment = path === '/' ? null : literalFirstSegment(path);
      if (segment === null) return null;
      segments.add(segment);
    }
  }
  return segments;
}

/**
 * Mounts routers (each without a path of its own, in the order given) so that a request enters only
 * those whose routes can match the first segment of its path. Express enters every router mounted
 * without a path and tries each of its routes in turn, about fifty for an API call here before this;
 * a request now tries the few routers of its segment, in the same order as before, so the route that
 * answers is the one that answered before. Matching ignores case, as Express's routes do by default.
 */
export function firstSegmentRouters(routers: Router[]): RequestHandler & { stack: { rawPath: string; handle: Router }[] } {
  const served = routers.map((router) => ({ router, segments: firstSegmentsOf(router) }));
  const routerFor = (segment: string | null) => {
    const group = served.filter(({ segments }) => segments === null || (segment !== null && segments.has(segment)));
    const router = express.Router();
    for (const { router: member } of group) router.use(member);
    return group.length > 0 ? router : null;
  };
  const bySegment = new Map<string, Router | null>();
  for (const { segments } of served) for (const segment of segments ?? []) bySegment.set(segment, routerFor(segment));
  const anyOther = routerFor(null);

  const dispatch: RequestHandler = (req, res, next) => {
    const path = req.path;
    const end = path.indexOf('/', 1);
    const segment = (end === -1 ? path.slice(1) : path.slice(1, end)).toLowerCase();
    const router = bySegment.has(segment) ? bySegment.get(segment)! : anyOther;
    if (router) router(req, res, next);
    else next();
  };
  // The routers as Express's own stack lists them, for what reads the app's routes (list-routes.ts).
  return Object.assign(dispatch, { stack: routers.map((handle) => ({ rawPath: '/', handle })) });
}
