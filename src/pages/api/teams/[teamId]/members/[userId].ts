import { db } from '../../../../../lib/server/db';
import { json, noContent, parseJson, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { changeRole, removeMember, roleInput } from '../../../../../lib/server/teams';

/** Owner only; 409 `last_owner` when it would leave the team without an owner. */
export const PATCH = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  const { role } = await parseJson(roleInput, ctx.request);
  return json({ member: await changeRole(db, user, ctx.params.teamId!, ctx.params.userId!, role) });
});

/** Owners remove members; a member may remove themselves (leave). 409 `last_owner` for the only owner. */
export const DELETE = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  await removeMember(db, user, ctx.params.teamId!, ctx.params.userId!);
  return noContent();
});
