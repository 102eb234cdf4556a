import { db } from '../../../../lib/server/db';
import { json, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { acceptInvitation } from '../../../../lib/server/teams';

export const POST = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  return json({ team: await acceptInvitation(db, user, ctx.params.token!) });
});
