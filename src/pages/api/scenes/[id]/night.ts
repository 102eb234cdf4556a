/**
 * GET /api/scenes/:id/night (fixed) — the numbers behind the night charts: Sun events, Moon, and per
 * target samples on the step grid, windows inside the scene's envelope and the best moment. Viewer+.
 * `from`, `to` (ISO UTC; default the scene's night), `step` (minutes 1–30, default 5), `bodies`.
 */
import { db } from '../../../../lib/server/db';
import { parseQuery, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { nightQuerySchema } from '../../../../lib/night/query';
import { nightResponse } from '../../../../lib/server/night';

export const GET = route(async ({ locals, params, url, request }) => {
  const user = requireUser(locals);
  const q = parseQuery(nightQuerySchema, url);
  return nightResponse(request, await sceneForMember(db, user, params.id!), q, { key: `user:${user.id}`, who: 'member' });
});
