import type { LocationQueryRaw, RouteLocationNamedRaw } from 'vue-router';
import type { RouteName, RouteParams } from './routes';

/** A route's parameters (optional when it has none), then an optional query. */
type LocationArgs<N extends RouteName> =
  RouteParams[N] extends Record<string, never>
    ? [params?: RouteParams[N], query?: LocationQueryRaw]
    : [params: RouteParams[N], query?: LocationQueryRaw];

/**
 * A location by route name for `:to`, `router.push` and `router.replace`, checked against the
 * route's name and parameters: `routeTo('batch', { cellarId, batchId })`.
 */
export function routeTo<N extends RouteName>(name: N, ...[params, query]: LocationArgs<N>): RouteLocationNamedRaw {
  return { name, ...(params && { params }), ...(query && { query }) };
}
