/** GET /api/scenes/:id/calendar.ics (fixed) — the scene's night, target windows and briefing steps as iCalendar. Viewer+. */
import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { publicOrigin } from '../../../../lib/server/links';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { icsResponse, sceneCalendar } from '../../../../lib/server/calendar/scene-calendar';

export const GET = route(async ({ locals, params, url }) => {
  const user = requireUser(locals);
  const scene = await sceneForMember(db, user, params.id!);
  const body = sceneCalendar(scene, { sceneUrl: `${publicOrigin(url)}/scenes/${scene.id}` });
  return icsResponse(body, `${scene.title}.ics`);
});
