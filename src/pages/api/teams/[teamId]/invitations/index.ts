import { db } from '../../../../../lib/server/db';
import { json, parseJson, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { invitationInput, invite, listInvitations } from '../../../../../lib/server/teams';

export const GET = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  return json({ invitations: await listInvitations(db, user, ctx.params.teamId!) });
});

/** Owner only; mails the accept link. */
export const POST = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  const input = await parseJson(invitationInput, ctx.request);
  return json(await invite(db, user, ctx.params.teamId!, input, ctx.url), 201);
});
