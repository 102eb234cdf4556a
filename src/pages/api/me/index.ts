import { me, profileInput, updateProfile } from '../../../lib/server/accounts';
import { db } from '../../../lib/server/db';
import { json, parseJson, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';

export const GET = route(async (ctx) => json(await me(db, requireUser(ctx.locals))));

export const PATCH = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  const input = await parseJson(profileInput, ctx.request);
  return json(await me(db, await updateProfile(db, user.id, input)));
});
