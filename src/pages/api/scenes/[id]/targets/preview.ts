import { db } from '../../../../../lib/server/db';
import { json, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { previewTargets } from '../../../../../lib/server/imports/targets';
import { readUpload } from '../../../../../lib/server/upload';
import { sceneFor } from '../../../../../lib/server/scene-service';

/** Same parsing as the import; writes nothing. 200 `{rows: [{line, name, ra, dec, errors}], valid}`. */
export const POST = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  // Who may write is settled before a byte of the upload is read.
  await sceneFor(db, user, params.id!, 'scene.write');
  const upload = await readUpload(request);
  return json(await previewTargets(db, user, params.id!, upload.bytes));
});
