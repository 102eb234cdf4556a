import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { voTableResponse } from '../../../../lib/server/exports/responses';

/** Share link (viewer or reviewer), no account: the targets as a VOTable (see /api/scenes/:id/targets.vot). 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params }) => {
  const scene = await sceneForToken(db, params.token!);
  return voTableResponse(scene);
});
