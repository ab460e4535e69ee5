import type { Express } from 'express';

export interface RouteInfo {
  method: string;
  path: string;
}

interface Layer {
  rawPath?: string | string[];
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/**
 * Every route the app answers, read from Express's own router (so a test built on it cannot miss a
 * route someone adds). Paths are joined from the mount points down.
 */
export function listRoutes(app: Express): RouteInfo[] {
  const found: RouteInfo[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          found.push({ method: method.toUpperCase(), path: join(prefix, layer.route.path) });
        }
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
        walk(layer.handle.stack, join(prefix, mount));
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  const seen = new Set<string>();
  return found.filter((r) => {
    const key = `${r.method} ${r.path}`;
    return seen.has(key) ? false : (seen.add(key), true);
  });
}

const join = (a: string, b: string) => `${a}/${b}`.replace(/\/+/g, '/').replace(/(.)\/$/, '$1');
