/** GET /api/calendars/:token.ics — a team's calendar subscription (no account: the secret URL is the credential). */
import { db } from '../../../lib/server/db';
import { clientAddress, route } from '../../../lib/server/http';
import { rateLimit } from '../../../lib/server/rate-limit';
import { publicOrigin } from '../../../lib/server/links';
import { feedCalendar } from '../../../lib/server/calendar/feeds';
import { icsResponse } from '../../../lib/server/calendar/scene-calendar';

export const GET = route(async (ctx) => {
  await rateLimit(`calendar:${clientAddress(ctx)}`, 120, 60);
  const origin = publicOrigin(ctx.url);
  const body = await feedCalendar(db, ctx.params.token!, (id) => `${origin}/scenes/${id}`);
  return icsResponse(body, 'armilla-scenes.ics', 'private, max-age=300');
});
