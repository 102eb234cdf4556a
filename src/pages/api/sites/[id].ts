import { db } from '../../../lib/server/db';
import { json, noContent, parseJson, route } from '../../../lib/server/http';
import { requireUser } from '../../../lib/server/policy';
import { sitePatchSchema } from '../../../lib/contracts/site';
import { deleteSite, siteFor, siteOut, updateSite } from '../../../lib/server/sites';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  return json({ site: siteOut(await siteFor(db, user, params.id!, 'team.read')) });
});

export const PATCH = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  const row = await siteFor(db, user, params.id!, 'site.write');
  const body = await parseJson(sitePatchSchema, request);
  return json({ site: await updateSite(db, row, body, user.id) });
});

export const DELETE = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  const row = await siteFor(db, user, params.id!, 'site.write');
  await deleteSite(db, row, user.id);
  return noContent();
});
