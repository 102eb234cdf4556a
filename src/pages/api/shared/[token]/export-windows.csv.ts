import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { sceneForToken } from '../../../../lib/exports/exports.server';
import { windowsResponse } from '../../../../lib/exports/responses';

/** Share link (viewer or reviewer), no account: visibility windows over ?from=&to= (see /api/scenes/:id/windows.csv). 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params, url }) => {
  const scene = await sceneForToken(db, params.token!);
  return windowsResponse(scene, url);
});
