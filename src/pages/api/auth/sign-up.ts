import { signUp, signUpInput } from '../../../lib/server/accounts';
import { startSession } from '../../../lib/server/auth';
import { db } from '../../../lib/server/db';
import { clientAddress, json, parseJson, route } from '../../../lib/server/http';

export const POST = route(async (ctx) => {
  const input = await parseJson(signUpInput, ctx.request);
  const result = await signUp(db, input, clientAddress(ctx), ctx.url);
  await startSession(result.user.id, ctx.cookies);
  return json(result, 201);
});
