/** GET /api/shared/:token/night (fixed) — the night answer through a share link (viewer or reviewer), no account. See /api/scenes/:id/night. */
import { db } from '../../../../lib/server/db';
import { clientAddress, parseQuery, route } from '../../../../lib/server/http';
import { rateLimit } from '../../../../lib/server/rate-limit';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { nightQuerySchema } from '../../../../lib/night/query';
import { nightResponse } from '../../../../lib/server/night';

export const GET = route(async (ctx) => {
  const q = parseQuery(nightQuerySchema, ctx.url);
  const scene = await sceneForToken(db, ctx.params.token!);
  await rateLimit(`night:${clientAddress(ctx)}`, 120, 60);
  return nightResponse(ctx.request, scene, q, { key: `addr:${clientAddress(ctx)}`, who: 'anonymous' });
});
