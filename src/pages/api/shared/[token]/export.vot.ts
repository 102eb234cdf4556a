import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { sceneForToken } from '../../../../lib/exports/exports.server';
import { voTableResponse } from '../../../../lib/exports/responses';

/** Share link (viewer or reviewer), no account: the targets as a VOTable (see /api/scenes/:id/targets.vot). 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params }) => {
  const scene = await sceneForToken(db, params.token!);
  return voTableResponse(scene);
});
