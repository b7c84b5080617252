export { listRoutes, type RouteInfo } from '../../server/http/routes';

/** A concrete URL for a route pattern (parameters filled with a plausible id). */
export const concretePath = (path: string) => path.replace(/:(\w+)/g, '1');
