import { db } from '../../../../lib/server/db';
import { forbidden, route } from '../../../../lib/server/http';
import { resolveToken } from '../../../../lib/server/links';

/** A link cannot mint links: 403 for a live one, 404 for a dead one. */
export const POST = route(async ({ params }) => {
  await resolveToken(db, params.token!);
  throw forbidden('Only editors of the team can share a scene.');
});
