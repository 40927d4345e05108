import type { Router } from 'express';
import type { AppDeps } from '../deps';
import { API_ROUTERS } from './index';

/** One API route: the HTTP method (upper case, `ALL` for `router.all`) and its path pattern under /api. */
export interface ApiRoute {
  method: string;
  path: string;
}

interface RouteShape {
  path: unknown;
  methods?: Record<string, boolean | undefined>;
}

/**
 * The routes one router declares, read from its Express 5 layer stack. A layer without a route
 * (router-level middleware or a nested router) hides routes this walk cannot see, so it throws
 * instead of returning an incomplete list; so does a path that is not a plain string pattern.
 */
export function routesOf(router: Router): ApiRoute[] {
  const out: ApiRoute[] = [];
  router.stack.forEach((layer, i) => {
    const route = layer.route as RouteShape | undefined;
    if (!route) throw new Error(`Layer ${i} (${layer.name}) is middleware or a nested router: its routes cannot be listed`);
    if (typeof route.path !== 'string') throw new Error(`Layer ${i} has a route path that is not a string: ${String(route.path)}`);
    for (const [method, on] of Object.entries(route.methods ?? {})) {
      if (!on) continue;
      out.push({ method: method === '_all' ? 'ALL' : method.toUpperCase(), path: route.path });
    }
  });
  return out;
}

/** Every route of every router in `API_ROUTERS` (or the routers given), in mounting order. */
export function listApiRoutes(deps: AppDeps, routers: ((deps: AppDeps) => Router)[] = API_ROUTERS): ApiRoute[] {
  return routers.flatMap((make) => routesOf(make(deps)));
}
