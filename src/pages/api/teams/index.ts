import { db } from '../../../lib/server/db';
import { json, parseJson, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';
import { createTeam, listTeamsOf, teamInput } from '../../../lib/server/teams';

export const GET = route(async (ctx) => json({ teams: await listTeamsOf(db, requireUser(ctx.locals).id) }));

/** Any signed-in user may create a team and becomes its owner. */
export const POST = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  const { name } = await parseJson(teamInput, ctx.request);
  return json({ team: await createTeam(db, user, name) }, 201);
});
