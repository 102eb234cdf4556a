import { db } from '../../../../lib/server/db';
import { json, parseJson, route } from '../../../../lib/server/http';
import { authorize, requireUser } from '../../../../lib/server/policy';
import { envelopeCreateSchema } from '../../../../lib/contracts/envelope';
import { createEnvelope, listEnvelopes } from '../../../../lib/server/envelopes';

/** `{envelopes: [{id, teamId, name, minAltitude, …, usedBy}]}`: the contract's envelope JSON, flat. */
export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'team.read', 'Team');
  return json({ envelopes: await listEnvelopes(db, params.teamId!) });
});

/** Editor+: the envelope JSON of the contract (`name` required, every limit optional). */
export const POST = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'envelope.write', 'Team');
  const body = await parseJson(envelopeCreateSchema, request);
  return json({ envelope: await createEnvelope(db, params.teamId!, body, user.id) }, 201);
});
