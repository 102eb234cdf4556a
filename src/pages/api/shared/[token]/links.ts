import { db } from '../../../../lib/server/db';
import { forbidden, route } from '../../../../lib/server/http';
import { resolveLink } from '../../../../lib/server/links';

/** A link cannot mint links: 403 for a live one, 404 for a dead one. */
export const POST = route(async ({ params }) => {
  await resolveLink(db, params.token!);
  throw forbidden('Only editors of the team can share a scene.');
});
