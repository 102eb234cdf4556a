import { signIn, signInInput } from '../../../lib/server/accounts';
import { endSession, startSession } from '../../../lib/server/auth';
import { db } from '../../../lib/server/db';
import { clientAddress, json, parseJson, route } from '../../../lib/server/http';

export const POST = route(async (ctx) => {
  const input = await parseJson(signInInput, ctx.request);
  const user = await signIn(db, input, clientAddress(ctx));
  // A new session id on every sign-in (no fixation); a session this browser held before ends.
  if (ctx.locals.session) await endSession(ctx.locals.session.id, ctx.cookies);
  await startSession(user.id, ctx.cookies);
  return json({ user });
});
