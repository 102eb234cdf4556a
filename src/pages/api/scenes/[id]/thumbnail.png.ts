import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { getThumbnail } from '../../../../lib/server/thumbnail';

/** The scene's PNG thumbnail. Viewer+; 404 when there is none. */
export const GET = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  return getThumbnail(db, user, params.id!, request.headers.get('if-none-match'));
});
