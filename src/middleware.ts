import type { APIContext } from 'astro';
import { defineMiddleware } from 'astro:middleware';
import { readSession } from './lib/server/auth';
import { authenticateBearer, bearerOf, scopeAllows, tokenReachable } from './lib/server/auth/tokens';
import { clientAddress, errorResponse, HttpError } from './lib/server/http';
import { resolveOriginParts, trustFromEnv } from './lib/server/proxy';
import { buildCsp, devInlineScriptHashes, isEmbed, policyFor } from './lib/server/csp';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request forgery guard for every non-GET (Astro's checkOrigin covers form posts only).
 * A browser always sends Origin on a cross-origin POST, and Sec-Fetch-Site on modern ones; a request
 * with neither comes from a non-browser client and carries no ambient cookie risk.
 */
function crossOriginRefusal(ctx: APIContext): Response | null {
  if (SAFE.has(ctx.request.method)) return null;
  const origin = ctx.request.headers.get('origin');
  const site = ctx.request.headers.get('sec-fetch-site');
  let ok = true;
  if (origin !== null) {
    try {
      ok = origin !== 'null' && new URL(origin).origin === ownOrigin(ctx);
    } catch {
      ok = false;
    }
  } else if (site !== null) {
    ok = site === 'same-origin' || site === 'none';
  }
  return ok ? null : errorResponse(new HttpError(403, 'cross_origin', 'Cross-origin requests are not allowed.'));
}

/**
 * Scheme and host the client used: the socket and Host header, or X-Forwarded-Host/-Proto when the peer
 * is a proxy named by TRUST_PROXY (src/lib/server/proxy.ts). Under `astro dev` (no peer), the request URL.
 */
function ownOrigin(ctx: APIContext): string {
  const peer = ctx.locals.peerAddress;
  if (typeof peer !== 'string') return ctx.url.origin;
  const { host, proto } = resolveOriginParts(ctx.request.headers, peer, ctx.locals.peerEncrypted === true, trustFromEnv());
  return new URL(`${proto}://${host ?? ctx.url.host}`).origin;
}

/**
 * Security headers on every response. The CSP (src/lib/server/csp.ts; why: src/lib/server/README.md) allows scripts
 * from our origin plus the inline scripts our build produced, by the hashes Astro computed at build time
 * and set on the page; nothing is hashed from the HTML, so an injected inline script stays blocked. Pages
 * under /embed/ may be framed by other sites; everything else refuses to be framed.
 */
async function withSecurityHeaders(ctx: APIContext, response: Response): Promise<Response> {
  let res = response;
  let policy = policyFor(ctx.url.pathname, res.headers.get('content-security-policy'));
  if (import.meta.env.DEV && (res.headers.get('content-type') ?? '').includes('text/html') && res.body) {
    // `astro dev` computes no CSP: hash what the page holds (dev only; see devInlineScriptHashes).
    const html = await res.text();
    policy = buildCsp(isEmbed(ctx.url.pathname), devInlineScriptHashes(html));
    res = new Response(html, { status: res.status, statusText: res.statusText, headers: res.headers });
  }
  const embed = isEmbed(ctx.url.pathname);
  const apply = (h: Headers) => {
    h.set('content-security-policy', policy);
    h.set('x-content-type-options', 'nosniff');
    // A page may ask for a stricter policy (the shared-scene page sends no-referrer: its URL is the token).
    if (!h.has('referrer-policy')) h.set('referrer-policy', 'strict-origin-when-cross-origin');
    if (!embed) h.set('x-frame-options', 'DENY');
  };
  try {
    apply(res.headers);
    return res;
  } catch {
    // A response with immutable headers (e.g. one passed through from fetch): copy it first.
    const copy = new Response(res.body, res);
    apply(copy.headers);
    return copy;
  }
}

/**
 * Security headers (on every response, refusals included) around the origin check, then the session
 * (→ locals.user / locals.session). One middleware rather than a sequence of three: each step of an
 * Astro sequence costs a context and a `next` of its own on every request.
 */
/**
 * A request to the API with `Authorization: Bearer …` acts as the token's owner (auth/tokens.ts). No cookie
 * is read and no origin check is needed: a browser never attaches that header to a cross-site request on
 * its own. Returns the refusal, or null once locals are set.
 */
async function tokenRequest(ctx: APIContext, bearer: string): Promise<Response | null> {
  try {
    const { pathname } = ctx.url;
    const auth = await authenticateBearer(bearer, clientAddress(ctx));
    if (!tokenReachable(pathname)) {
      throw new HttpError(403, 'session_required', 'Tokens and passwords are managed from a signed-in browser session, not with a token.');
    }
    if (!scopeAllows(auth.token.scope, ctx.request.method, pathname)) {
      throw new HttpError(403, 'insufficient_scope', 'This token is read-only.', undefined, undefined, {
        'www-authenticate': 'Bearer error="insufficient_scope"',
      });
    }
    ctx.locals.user = auth.user;
    ctx.locals.session = null;
    ctx.locals.token = auth.token;
    return null;
  } catch (e) {
    return errorResponse(e);
  }
}

export const onRequest = defineMiddleware(async (ctx, next) => {
  const bearer = ctx.url.pathname.startsWith('/api/') ? bearerOf(ctx.request) : null;
  if (bearer !== null) {
    const refused = await tokenRequest(ctx, bearer);
    return withSecurityHeaders(ctx, refused ?? (await next()));
  }
  ctx.locals.token = null;
  const refusal = crossOriginRefusal(ctx);
  if (refusal) return withSecurityHeaders(ctx, refusal);
  const { user, session } = await readSession(ctx.cookies);
  ctx.locals.user = user;
  ctx.locals.session = session;
  return withSecurityHeaders(ctx, await next());
});
