import { db } from '../../../../lib/server/db';
import { clientAddress, route } from '../../../../lib/server/http';
import { rateLimit } from '../../../../lib/server/rate-limit';
import { LINK_EXPORTS_PER_MINUTE } from '../../../../lib/server/compute/budget';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { positionsResponse } from '../../../../lib/server/exports/responses';

/** Share link (viewer or reviewer), no account: one row a target at ?time= (see /api/scenes/:id/export.csv). 404 for unknown, revoked or expired tokens. */
export const GET = route(async (ctx) => {
  const addr = clientAddress(ctx);
  await rateLimit(`link-export:${addr}`, LINK_EXPORTS_PER_MINUTE, 60);
  const scene = await sceneForToken(db, ctx.params.token!);
  return positionsResponse(scene, ctx.url, { key: `addr:${addr}`, who: 'anonymous' });
});
