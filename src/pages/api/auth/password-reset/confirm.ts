import { confirmPasswordReset, resetConfirmInput } from '../../../../lib/server/accounts';
import { startSession } from '../../../../lib/server/auth';
import { db } from '../../../../lib/server/db';
import { json, parseJson, route } from '../../../../lib/server/http';

/** Every session of the user ends; the browser that confirmed gets a fresh one. */
export const POST = route(async (ctx) => {
  const input = await parseJson(resetConfirmInput, ctx.request);
  const user = await confirmPasswordReset(db, input);
  await startSession(user.id, ctx.cookies);
  return json({ user });
});
