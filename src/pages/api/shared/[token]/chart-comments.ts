/**
 * GET /api/shared/:token/chart-comments — the comments pinned to the altitude chart, for any share link
 * (viewer or reviewer): issue 13 asks that a reviewer's chart comment be shown on the chart for everyone.
 * Only chart-anchored top-level comments, with their text and author's name; the rest of the review stays
 * with reviewer links (`GET /api/shared/:token/comments`).
 */
import { db } from '../../../../lib/server/db';
import { json, route } from '../../../../lib/server/http';
import { resolveToken } from '../../../../lib/server/links';
import { listComments } from '../../../../lib/server/comments';
import { chartPins } from '../../../../lib/contracts/comment';

export const GET = route(async ({ params }) => {
  const { scene } = await resolveToken(db, params.token!, true);
  return json({ comments: chartPins(await listComments(db, scene.id, true)) });
});
