import { db } from '../../../../../lib/server/db';
import { noContent, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { revokeInvitation } from '../../../../../lib/server/teams';

export const DELETE = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  await revokeInvitation(db, user, ctx.params.teamId!, ctx.params.invitationId!);
  return noContent();
});
