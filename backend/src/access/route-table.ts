import type { Express, Router } from 'express';
import { isAccessPolicy, policyDescription } from './access-policy';

/** One route of the Express route table and the access policy it declares first, if any. */
export interface RouteEntry {
  readonly method: string;
  readonly path: string;
  readonly policy: string | null;
}

interface Layer {
  readonly rawPath?: unknown;
  readonly handle: unknown;
  readonly route?: { readonly path: unknown; readonly stack: ReadonlyArray<{ readonly method?: string; readonly handle: unknown }> };
}

const pathText = (value: unknown) => (Array.isArray(value) ? value.join('|') : String(value ?? ''));

function walk(stack: readonly Layer[], prefix: string): RouteEntry[] {
  return stack.flatMap((layer) => {
    if (layer.route) {
      const path = prefix + pathText(layer.route.path);
      const first = layer.route.stack[0]?.handle;
      const methods = [...new Set(layer.route.stack.map((item) => (item.method ?? 'all').toUpperCase()))];
      return methods.map((method) => ({ method, path, policy: isAccessPolicy(first) ? policyDescription(first) : null }));
    }
    const nested = (layer.handle as Partial<Router>).stack as Layer[] | undefined;
    if (!Array.isArray(nested)) return [];
    const mount = layer.rawPath && layer.rawPath !== '/' ? pathText(layer.rawPath) : '';
    return walk(nested, prefix + mount);
  });
}

/** Every route of the app, including those of mounted routers, with its declared policy. */
export function listRoutes(app: Express): RouteEntry[] {
  return walk((app.router as unknown as { stack: Layer[] }).stack, '');
}

/** Stops the server from starting when any route forgot to declare who may use it. */
export function assertEveryRouteDeclaresAPolicy(app: Express): void {
  const missing = listRoutes(app).filter((route) => route.policy === null);
  if (missing.length > 0) {
    throw new Error(`Routes without an access policy: ${missing.map((route) => `${route.method} ${route.path}`).join(', ')}`);
  }
}
