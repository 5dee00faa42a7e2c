/**
 * Every API route the server has now, read from the Express app itself (so a route added tomorrow is
 * fuzzed and access-checked without anyone listing it here). The app is built with the real factory and
 * stand-in collaborators; it never serves a request.
 */
import { createApp, type AppDeps } from '../../../server/app';
import { loadConfig } from '../../../server/config';
import { createKnex } from '../../../server/db';
import { createLogger } from '../../../server/logger';
import { createTokenService } from '../../../server/auth/tokens';
import { createPasswordHasher } from '../../../server/auth/passwords';

export interface ApiRoute {
  method: string;
  /** e.g. `/api/rooms/:id/members/:userId` */
  path: string;
  params: string[];
}

interface Layer {
  rawPath?: string;
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

function join(prefix: string, p: string): string {
  const a = prefix === '/' ? '' : prefix;
  const b = p === '/' ? '' : p;
  return (a + b).replace(/\/{2,}/g, '/') || '/';
}

function walk(stack: Layer[], prefix: string, out: ApiRoute[]): void {
  for (const layer of stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      for (const p of paths) {
        const path = join(prefix, p);
        for (const [m, on] of Object.entries(layer.route.methods)) {
          if (!on || m === '_all') continue;
          out.push({ method: m.toUpperCase(), path, params: [...path.matchAll(/:(\w+)/g)].map((x) => x[1]) });
        }
      }
    } else if (layer.handle?.stack) {
      walk(layer.handle.stack, join(prefix, typeof layer.rawPath === 'string' ? layer.rawPath : ''), out);
    }
  }
}

export async function listApiRoutes(): Promise<ApiRoute[]> {
  const config = loadConfig({ NODE_ENV: 'test', DATABASE_FILE: ':memory:', LOG_LEVEL: 'silent', JWT_SECRET: 'route-listing-secret-of-32-chars-or-more' });
  const knex = createKnex(':memory:');
  try {
    const known = {
      config,
      knex,
      tokens: createTokenService(config.jwtSecret),
      logger: createLogger(config),
      passwords: createPasswordHasher(4),
      events: { roleChanged() {}, roomDeleted() {}, emit() {} },
      isReady: () => true,
      demoAccounts: () => false,
      clientDir: null,
    };
    // Collaborators added to AppDeps later (mailer, document sinks, ...) are never called while the
    // routes are only listed: a stand-in that answers anything with itself will do.
    const standIn: unknown = new Proxy(() => standIn, { get: () => standIn });
    const deps = new Proxy(known, { get: (target, prop) => (prop in target ? target[prop as keyof typeof target] : standIn) });
    const app = createApp(deps as unknown as AppDeps) as unknown as { router: { stack: Layer[] } };
    const out: ApiRoute[] = [];
    walk(app.router.stack, '', out);
    const seen = new Set<string>();
    return out.filter((r) => r.path.startsWith('/api/') && !seen.has(`${r.method} ${r.path}`) && seen.add(`${r.method} ${r.path}`));
  } finally {
    await knex.destroy();
  }
}

/** encodeURIComponent for any string (a lone surrogate, which it refuses, becomes U+FFFD first). */
export function encodeAny(s: string): string {
  return encodeURIComponent(Buffer.from(s, 'utf8').toString('utf8'));
}

/** Fill `:params` in a route path (each value percent-encoded). */
export function fillPath(path: string, values: Record<string, string>): string {
  return path.replace(/:(\w+)/g, (_m, name: string) => encodeAny(values[name] ?? 'missing-param'));
}
