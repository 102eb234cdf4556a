import { requestPasswordReset, resetRequestInput } from '../../../lib/server/accounts';
import { db } from '../../../lib/server/db';
import { clientAddress, json, parseJson, route } from '../../../lib/server/http';

/** 202 for every well-formed address, known or not: the answer never says whether an account exists. */
export const POST = route(async (ctx) => {
  const { email } = await parseJson(resetRequestInput, ctx.request);
  await requestPasswordReset(db, email, clientAddress(ctx), ctx.url);
  return json({ ok: true, message: 'If an account uses this address, a reset link is on its way.' }, 202);
});
