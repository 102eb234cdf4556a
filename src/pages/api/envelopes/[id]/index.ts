import { db } from '../../../../lib/server/db';
import { json, noContent, parseJson, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { envelopePatchSchema } from '../../../../lib/contracts/envelope';
import { deleteEnvelope, envelopeFor, envelopeOut, updateEnvelope } from '../../../../lib/server/envelopes';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  return json({ envelope: envelopeOut(await envelopeFor(db, user, params.id!, 'team.read')) });
});

/** Merges the given limits into the envelope (`null` clears one); every scene using it sees the change. */
export const PATCH = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const row = await envelopeFor(db, user, params.id!, 'envelope.write');
  const body = await parseJson(envelopePatchSchema, request);
  const { id: _i, teamId: _t, createdAt: _c, updatedAt: _u, usedBy: _b, ...patch } = body;
  return json({ envelope: await updateEnvelope(db, row, patch, user.id) });
});

/** Scenes that used it keep its last limits inline. */
export const DELETE = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const row = await envelopeFor(db, user, params.id!, 'envelope.write');
  await deleteEnvelope(db, row, user.id);
  return noContent();
});
