/** GET /api/shared/:token/calendar.ics (fixed) — the calendar file through a share link, no account. */
import { db } from '../../../../lib/server/db';
import { clientAddress, route } from '../../../../lib/server/http';
import { rateLimit } from '../../../../lib/server/rate-limit';
import { publicOrigin } from '../../../../lib/server/links';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { icsResponse, sceneCalendar } from '../../../../lib/server/calendar/scene-calendar';

export const GET = route(async (ctx) => {
  const scene = await sceneForToken(db, ctx.params.token!);
  await rateLimit(`calendar:${clientAddress(ctx)}`, 120, 60);
  const body = sceneCalendar(scene, { sceneUrl: `${publicOrigin(ctx.url)}/s/${ctx.params.token}` });
  return icsResponse(body, `${scene.title}.ics`);
});
