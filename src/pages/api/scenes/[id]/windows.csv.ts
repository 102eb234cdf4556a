import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { windowsResponse } from '../../../../lib/server/exports/responses';

/** Visibility windows of each target inside the scene's envelope over `?from=&to=` (default: 24 h from the scene time). Viewer+. */
export const GET = route(async ({ locals, params, url }) => {
  const user = requireUser(locals);
  return windowsResponse(await sceneForMember(db, user, params.id!), url, { key: `user:${user.id}`, who: 'member' });
});
