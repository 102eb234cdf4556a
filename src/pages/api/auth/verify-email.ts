/** POST /api/auth/verify-email — mails a new address-confirmation link to the signed-in user (5 an hour). */
import { isEmailVerified, sendEmailVerification } from '../../../lib/server/accounts';
import { db } from '../../../lib/server/db';
import { HttpError, json, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';

export const POST = route(async (ctx) => {
  const user = requireUser(ctx.locals);
  if (await isEmailVerified(db, user.id)) throw new HttpError(409, 'already_verified', 'This address is confirmed already.');
  await sendEmailVerification(db, { id: user.id, email: user.email, name: user.name }, ctx.url);
  return json({ ok: true, message: `A confirmation link is on its way to ${user.email}.` }, 202);
});
