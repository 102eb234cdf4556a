import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { positionsResponse } from '../../../../lib/server/exports/responses';

/**
 * One row a target at `?time=` (default: the scene's time): name, ra, dec, azimuth, altitude (apparent,
 * standard refraction), airmass, next rise/transit/set, inside envelope, … RFC 4180. Viewer+.
 */
export const GET = route(async ({ locals, params, url }) => {
  const user = requireUser(locals);
  return positionsResponse(await sceneForMember(db, user, params.id!), url, { key: `user:${user.id}`, who: 'member' });
});
