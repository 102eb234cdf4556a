import { db } from '../../../../../lib/server/db';
import { json, parseJson, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { holdInvitation, invitationInput, invite, listInvitations } from '../../../../../lib/server/teams';

export const GET = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  return json({ invitations: await listInvitations(db, user, ctx.params.teamId!) });
});

/** Owner only; mails the accept link. Limited per sender and per team before the body is read (429). */
export const POST = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  const teamId = ctx.params.teamId!;
  const held = await holdInvitation(db, user, teamId);
  try {
    const input = await parseJson(invitationInput, ctx.request);
    return json(await invite(db, user, teamId, input, ctx.url), 201);
  } catch (e) {
    // No invitation made, no mail sent: the attempt does not count.
    await held.release();
    throw e;
  }
});
