/** GET /api/shared/:token/night (fixed) — the night answer through a share link (viewer or reviewer), no account. See /api/scenes/:id/night. */
import { db } from '../../../../lib/server/db';
import { clientAddress, json, parseQuery, route } from '../../../../lib/server/http';
import { rateLimit } from '../../../../lib/server/rate-limit';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { nightQuerySchema } from '../../../../lib/night/query';
import { nightAnswer } from '../../../../lib/server/night';

export const GET = route(async (ctx) => {
  const q = parseQuery(nightQuerySchema, ctx.url);
  const scene = await sceneForToken(db, ctx.params.token!);
  await rateLimit(`night:${clientAddress(ctx)}`, 120, 60);
  return json(await nightAnswer(scene, q, { key: `addr:${clientAddress(ctx)}`, who: 'anonymous' }));
});
