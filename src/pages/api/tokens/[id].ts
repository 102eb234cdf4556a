/** DELETE /api/tokens/:id → 204: the token stops working at once (API contract, fixed). */
import { db } from '../../../lib/server/db';
import { noContent, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';
import { revokeToken } from '../../../lib/server/auth/tokens';

export const DELETE = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  await revokeToken(db, user.id, params.id!);
  return noContent();
});
