/** GET /api/scenes/:id/night.svg — the altitude-over-time chart as a standalone SVG (paper inks), same query as /night. Viewer+. */
import { db } from '../../../../lib/server/db';
import { parseQuery, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { nightQuerySchema } from '../../../../lib/night/query';
import { nightAnswer } from '../../../../lib/server/night';
import { altitudeChartSvg, svgResponse } from '../../../../lib/server/night-svg';
import { chartCommentsOf } from '../../../../lib/server/comments';

export const GET = route(async ({ locals, params, url }) => {
  const user = requireUser(locals);
  const q = parseQuery(nightQuerySchema, url);
  const scene = await sceneForMember(db, user, params.id!);
  const data = await nightAnswer(scene, q, { key: `user:${user.id}`, who: 'member' });
  return svgResponse(altitudeChartSvg(data, scene.site.timeZone ?? 'UTC', Date.parse(q.at ?? scene.time), await chartCommentsOf(db, scene.id)), 'night.svg');
});
