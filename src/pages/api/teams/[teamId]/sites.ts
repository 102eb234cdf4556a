import { db } from '../../../../lib/server/db';
import { json, parseJson, route } from '../../../../lib/server/http';
import { authorize, requireUser } from '../../../../lib/server/policy';
import { siteCreateSchema } from '../../../../lib/contracts/site';
import { createSite, listSites } from '../../../../lib/server/sites';

export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'team.read', 'Team');
  return json({ sites: await listSites(db, params.teamId!) });
});

/** Editor+: `{name, lat, lon, height, timeZone}`. */
export const POST = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  await authorize(db, user, params.teamId!, 'site.write', 'Team');
  const body = await parseJson(siteCreateSchema, request);
  return json({ site: await createSite(db, params.teamId!, body, user.id) }, 201);
});
