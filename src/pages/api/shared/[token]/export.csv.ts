import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { positionsResponse } from '../../../../lib/server/exports/responses';

/** Share link (viewer or reviewer), no account: one row a target at ?time= (see /api/scenes/:id/export.csv). 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params, url }) => {
  const scene = await sceneForToken(db, params.token!);
  return positionsResponse(scene, url);
});
