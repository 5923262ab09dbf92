/**
 * Lists the routes of an Express 5 app by walking its router: `app.router.stack` holds layers;
 * a layer with `route` is an endpoint (`route.path`, `route.methods`), a layer whose `handle`
 * has a `stack` is a mounted Router. Express 5's router (pillarjs/router 2.x) keeps the path a
 * layer was registered with in `layer.rawPath` (its matcher is a compiled function, not a RegExp
 * as in Express 4), so mount paths are read from there. A mount with a RegExp or an array path
 * cannot be turned back into one path: the walk throws, so such a mount is noticed, not skipped.
 */
import type { Express } from 'express';

export type ListedRoute = { method: string; path: string };

type Layer = {
  rawPath?: unknown;
  slash?: boolean;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
};

function join(prefix: string, p: string): string {
  const joined = `${prefix}/${p}`.replace(/\/+/g, '/');
  return joined.length > 1 ? joined.replace(/\/$/, '') : joined;
}

function pathOf(raw: unknown, where: string): string {
  if (typeof raw === 'string') return raw;
  throw new Error(`route enumeration: a layer under "${where}" has a non-string path (${String(raw)}); register routes with string paths so the route table can list them`);
}

function walk(stack: Layer[], prefix: string, out: ListedRoute[]) {
  for (const layer of stack) {
    if (layer.route) {
      const p = join(prefix, pathOf(layer.route.path, prefix));
      const methods = Object.entries(layer.route.methods).filter(([, on]) => on).map(([m]) => m);
      // app.all() registers the route for every method Node knows (or as `_all`): list it once.
      if (methods.includes('_all') || methods.length >= 20) out.push({ method: 'ALL', path: p });
      else for (const m of methods) out.push({ method: m.toUpperCase(), path: p });
    } else if (layer.handle?.stack) {
      const mount = layer.slash || layer.rawPath === undefined ? '' : pathOf(layer.rawPath, prefix);
      walk(layer.handle.stack, join(prefix, mount), out);
    }
  }
}

/** Every route of the app as "METHOD /path" (Express path syntax, e.g. /api/jobs/:id). */
export function listRoutes(app: Express): ListedRoute[] {
  const router = (app as unknown as { router?: { stack: Layer[] } }).router;
  if (!router?.stack) throw new Error('route enumeration: app.router.stack not found (not Express 5?)');
  const out: ListedRoute[] = [];
  walk(router.stack, '', out);
  // HEAD is answered by GET routes implicitly; list each route once per method.
  const seen = new Set<string>();
  return out.filter((r) => {
    const key = `${r.method} ${r.path}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

export const routeKey = (r: ListedRoute) => `${r.method} ${r.path}`;
