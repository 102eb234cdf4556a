/** GET /api/shared/:token/night.svg — the altitude-over-time chart as SVG through a share link (see /api/scenes/:id/night.svg). */
import { db } from '../../../../lib/server/db';
import { clientAddress, parseQuery, route } from '../../../../lib/server/http';
import { rateLimit } from '../../../../lib/server/rate-limit';
import { sceneForToken } from '../../../../lib/server/exports/vo-targets';
import { nightQuerySchema } from '../../../../lib/night/query';
import { nightAnswer } from '../../../../lib/server/night';
import { altitudeChartSvg, svgResponse } from '../../../../lib/server/night-svg';
import { chartCommentsOf } from '../../../../lib/server/comments';

export const GET = route(async (ctx) => {
  const q = parseQuery(nightQuerySchema, ctx.url);
  const scene = await sceneForToken(db, ctx.params.token!);
  await rateLimit(`night:${clientAddress(ctx)}`, 120, 60);
  const data = await nightAnswer(scene, q, { key: `addr:${clientAddress(ctx)}`, who: 'anonymous' });
  return svgResponse(altitudeChartSvg(data, scene.site.timeZone ?? 'UTC', Date.parse(q.at ?? scene.time), await chartCommentsOf(db, scene.id)), 'night.svg');
});
