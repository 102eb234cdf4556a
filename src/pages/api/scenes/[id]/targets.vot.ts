import { db } from '../../../../lib/server/db';
import { route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { sceneForMember } from '../../../../lib/server/exports/vo-targets';
import { voTableResponse } from '../../../../lib/server/exports/responses';

/** The scene's targets as an IVOA VOTable 1.4 (COOSYS ICRS, epoch J2000). Viewer+. */
export const GET = route(async ({ locals, params }) => {
  const user = requireUser(locals);
  return voTableResponse(await sceneForMember(db, user, params.id!));
});
