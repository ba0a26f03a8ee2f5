/** Lists every route of an Express app from its router stack (method, full path, the action
 *  its `allow(…)` declares, whether it sits behind sign-in), so tests can demand a case for
 *  each route and a new route cannot slip past them. */
import type { Express } from 'express';
import type { Action } from '../../server/auth/permissions.js';

export interface RouteInfo {
  method: string;
  /** Full path with Express parameters, e.g. /api/decks/:deckId/versions/:number. */
  path: string;
  /** The action declared with allow(…) on the route or on its router, or null (public or sign-in only). */
  action: Action | null;
  key: string;
}

interface Layer {
  rawPath?: unknown;
  handle: { stack?: Layer[]; action?: Action; name?: string };
  route?: { path: string; methods: Record<string, boolean>; stack: Layer[] };
}

function join(prefix: string, raw: unknown): string {
  if (typeof raw !== 'string') throw new Error(`route path ${String(raw)} is not a string: extend routeTable.ts`);
  const p = raw === '/' ? '' : raw;
  return `${prefix}${p}`;
}

function walk(stack: Layer[], prefix: string, inherited: Action | null, out: RouteInfo[]) {
  let action = inherited;
  for (const layer of stack) {
    if (layer.route) {
      const own = layer.route.stack.map((l) => l.handle.action).find((a) => a !== undefined) ?? action;
      const path = join(prefix, layer.route.path) || '/';
      for (const [m, on] of Object.entries(layer.route.methods)) {
        if (!on || m === '_all') continue;
        out.push({ method: m.toUpperCase(), path, action: own, key: `${m.toUpperCase()} ${path}` });
      }
    } else if (layer.handle.stack) {
      walk(layer.handle.stack, join(prefix, layer.rawPath), action, out);
    } else if (layer.handle.action !== undefined) {
      // router.use(allow('…')): applies to every route after it in this router
      action = layer.handle.action;
    }
  }
}

export function listRoutes(app: Express): RouteInfo[] {
  const router = (app as unknown as { router: { stack: Layer[] } }).router;
  const out: RouteInfo[] = [];
  walk(router.stack, '', null, out);
  // A path may have several layers (e.g. a rate limit mounted before the router): list it once,
  // with the action its router declares.
  const byKey = new Map<string, RouteInfo>();
  for (const r of out.filter((x) => x.path.startsWith('/api/'))) {
    const seen = byKey.get(r.key);
    if (!seen || (seen.action === null && r.action !== null)) byKey.set(r.key, r);
  }
  return [...byKey.values()];
}
