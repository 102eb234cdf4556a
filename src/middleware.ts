import { createHash } from 'node:crypto';
import type { APIContext } from 'astro';
import { defineMiddleware } from 'astro:middleware';
import { readSession } from './lib/server/auth';
import { authenticateBearer, bearerOf, scopeAllows, tokenReachable } from './lib/server/auth/tokens';
import { clientAddress, errorResponse, HttpError } from './lib/server/http';
import { resolveOriginParts, trustFromEnv } from './lib/server/proxy';

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
 * Security headers on every response. The CSP allows scripts from our origin only: instead of
 * 'unsafe-inline', each inline script that Astro writes into a page (island bootstrap, small hoisted
 * modules) is allowed by its SHA-256, computed here from the HTML actually sent. Pages under /embed/
 * may be framed by other sites; everything else refuses to be framed.
 */
const INLINE_SCRIPT_RE = /<script\b([^>]*)>([\s\S]*?)<\/script>/gi;

function inlineScriptHashes(html: string): string[] {
  const out = new Set<string>();
  for (const m of html.matchAll(INLINE_SCRIPT_RE)) {
    const attrs = m[1] ?? '';
    const body = m[2] ?? '';
    if (/\ssrc\s*=/i.test(attrs) || body.length === 0) continue;
    if (/type\s*=\s*["']?application\/(ld\+)?json/i.test(attrs)) continue;
    out.add(`'sha256-${createHash('sha256').update(body, 'utf8').digest('base64')}'`);
  }
  return [...out];
}

const isEmbed = (pathname: string) => pathname === '/embed' || pathname.startsWith('/embed/');

function contentSecurityPolicy(pathname: string, scriptHashes: string[]): string {
  const embed = isEmbed(pathname);
  if (!scriptHashes.length) return embed ? CSP_EMBED_NO_SCRIPTS : CSP_NO_SCRIPTS;
  return buildCsp(embed, scriptHashes);
}

function buildCsp(embed: boolean, scriptHashes: string[]): string {
  return [
    "default-src 'self'",
    `script-src 'self'${scriptHashes.length ? ' ' + scriptHashes.join(' ') : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    embed ? 'frame-ancestors *' : "frame-ancestors 'none'",
  ].join('; ');
}

/** The policies of responses without inline scripts (every API answer), built once. */
const CSP_NO_SCRIPTS = buildCsp(false, []);
const CSP_EMBED_NO_SCRIPTS = buildCsp(true, []);

async function withSecurityHeaders(ctx: APIContext, response: Response): Promise<Response> {
  let res = response;
  let hashes: string[] = [];
  if ((res.headers.get('content-type') ?? '').includes('text/html') && res.body) {
    const html = await res.text();
    hashes = inlineScriptHashes(html);
    res = new Response(html, { status: res.status, statusText: res.statusText, headers: res.headers });
  }
  const embed = isEmbed(ctx.url.pathname);
  const apply = (h: Headers) => {
    h.set('content-security-policy', contentSecurityPolicy(ctx.url.pathname, hashes));
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
