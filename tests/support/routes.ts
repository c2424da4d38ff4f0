/** Every route the Express app registered, as "METHOD /path", read from the router stacks (Express 5). */
import type { Express } from 'express';

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
  slash?: boolean;
  match(path: string): boolean;
  path?: string;
}

function walk(stack: Layer[], prefix: string, out: Set<string>) {
  for (const layer of stack) {
    if (layer.route) {
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all') out.add(`${method.toUpperCase()} ${prefix}${layer.route.path}`);
      }
    } else if (layer.handle?.stack) {
      // Only '/api' and '/' mounts exist in this app.
      const mount = !layer.slash && layer.match('/api') ? '/api' : '';
      walk(layer.handle.stack, prefix + mount, out);
    }
  }
}

export function registeredRoutes(app: Express): string[] {
  const out = new Set<string>();
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '', out);
  return [...out].filter((r) => r.includes(' /api/')).sort();
}
