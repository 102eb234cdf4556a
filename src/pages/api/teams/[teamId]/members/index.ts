import { db } from '../../../../../lib/server/db';
import { json, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { listMembers } from '../../../../../lib/server/teams';

export const GET = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  return json({ members: await listMembers(db, user, ctx.params.teamId!) });
});
