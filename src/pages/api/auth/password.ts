import { changePassword, changePasswordInput } from '../../../lib/server/accounts';
import { db } from '../../../lib/server/db';
import { json, parseJson, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';

/** Signed-in password change; the caller's other sessions end. */
export const POST = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  const input = await parseJson(changePasswordInput, ctx.request);
  await changePassword(db, user.id, ctx.locals.session!.id, input);
  return json({ ok: true });
});
