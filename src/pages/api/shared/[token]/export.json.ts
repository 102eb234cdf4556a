import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { sceneJsonResponse } from '../../../../lib/server/exports/responses';

/** Share link (viewer or reviewer), no account: the armilla-scene file (see /api/scenes/:id/export.json). 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params }) => {
  const scene = await sceneForToken(db, params.token!);
  return sceneJsonResponse(scene);
});
