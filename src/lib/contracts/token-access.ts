/**
 * Where a personal API token may go and what its scope allows: the one definition that the middleware
 * (src/middleware.ts, which refuses the rest), the API description (src/lib/server/openapi/) and the test
 * that every reachable route is described (tests/integration/openapi.test.ts) all read. Pure.
 */
import type { TokenScope } from './tokens';

/** Routes that only a signed-in browser session may use: minting tokens with a token, password and session changes. */
export function sessionOnly(pathname: string): boolean {
  return pathname === '/api/tokens' || pathname.startsWith('/api/tokens/') || pathname.startsWith('/api/auth/');
}

/**
 * A request with `Authorization: Bearer …` is read as a token request under `/api/` only (pages ignore
 * the header), and is refused with 403 on the session-only routes: everything else under `/api/` is
 * token-reachable. Works on concrete paths and on templates (`/api/scenes/{id}`).
 */
export function tokenReachable(pathname: string): boolean {
  return pathname.startsWith('/api/') && !sessionOnly(pathname);
}

/** The compute API's POST that changes nothing: a read token may ask it. */
const READ_POSTS = new Set(['/api/sky/windows']);

/** What a read token may do: read, and ask the compute API (a POST that changes nothing). */
export function scopeAllows(scope: TokenScope, method: string, pathname: string): boolean {
  if (scope === 'write') return true;
  const m = method.toUpperCase();
  if (m === 'GET' || m === 'HEAD' || m === 'OPTIONS') return true;
  return m === 'POST' && READ_POSTS.has(pathname);
}

/** The scope a token needs for a method on a path. */
export const scopeNeeded = (method: string, pathname: string): TokenScope => (scopeAllows('read', method, pathname) ? 'read' : 'write');
