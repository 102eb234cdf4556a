import { defineMiddleware, sequence } from 'astro:middleware';
import { readSession } from './lib/server/auth';
import { errorResponse, HttpError } from './lib/server/http';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request forgery guard for every non-GET (Astro's checkOrigin covers form posts only).
 * A browser always sends Origin on a cross-origin POST, and Sec-Fetch-Site on modern ones; a request
 * with neither comes from a non-browser client and carries no ambient cookie risk.
 */
const originCheck = defineMiddleware((ctx, next) => {
  if (SAFE.has(ctx.request.method)) return next();
  const origin = ctx.request.headers.get('origin');
  const site = ctx.request.headers.get('sec-fetch-site');
  const host = ctx.request.headers.get('x-forwarded-host') ?? ctx.request.headers.get('host') ?? ctx.url.host;
  let ok = true;
  if (origin !== null) {
    try {
      ok = origin !== 'null' && new URL(origin).host === host;
    } catch {
      ok = false;
    }
  } else if (site !== null) {
    ok = site === 'same-origin' || site === 'none';
  }
  if (!ok) return errorResponse(new HttpError(403, 'cross_origin', 'Cross-origin requests are not allowed.'));
  return next();
});

const session = defineMiddleware(async (ctx, next) => {
  const { user, session } = await readSession(ctx.cookies);
  ctx.locals.user = user;
  ctx.locals.session = session;
  return next();
});

export const onRequest = sequence(originCheck, session);
