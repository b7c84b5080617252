import type { Express } from 'express';
import type { RuleHandler } from './access';

export type RouteInfo = { method: string; path: string; rule: RuleHandler['accessRule'] | undefined };

type Layer = {
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: Partial<RuleHandler> }[] };
  handle: { stack?: Layer[] } & Partial<RuleHandler>;
  rawPath?: string;
  slash?: boolean;
};

/** Every route registered on the Express app, with the access rule its handlers declare. */
export function listRoutes(app: Express): RouteInfo[] {
  const out: RouteInfo[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const rule = layer.route.stack.find((l) => l.handle.accessRule)?.handle.accessRule;
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          out.push({ method: method.toUpperCase(), path: prefix + layer.route.path, rule });
        }
      } else if (layer.handle.stack) {
        const mount = layer.slash || typeof layer.rawPath !== 'string' ? '' : layer.rawPath;
        walk(layer.handle.stack, prefix + mount);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return out;
}
