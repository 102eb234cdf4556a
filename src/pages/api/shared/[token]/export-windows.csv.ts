import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { windowsResponse } from '../../../../lib/server/exports/responses';

/** Share link (viewer or reviewer), no account: visibility windows over ?from=&to= (see /api/scenes/:id/windows.csv). 404 for unknown, revoked or expired tokens. */
export const GET = route(async ({ params, url }) => {
  const scene = await sceneForToken(db, params.token!);
  return windowsResponse(scene, url);
});
