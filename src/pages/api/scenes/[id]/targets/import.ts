import { db } from '../../../../../lib/server/db';
import { json, route } from '../../../../../lib/server/http';
import { requireUser } from '../../../../../lib/server/policy';
import { importTargets } from '../../../../../lib/server/imports/targets';
import { readUpload } from '../../../../../lib/server/upload';
import { sceneFor } from '../../../../../lib/server/scene-service';

/**
 * Target-list CSV (multipart, field `file`; UTF-8, RFC 4180; columns name, ra, dec, epoch?, pmra?, pmdec?, notes?).
 * Editor+. 200 `{added}`; 422 `{error, rows: [{line, field, message}]}` and nothing written; 413 over 5 MB.
 */
export const POST = route(async ({ locals, params, request }) => {
  const user = requireUser(locals);
  // Who may write is settled before a byte of the upload is read.
  await sceneFor(db, user, params.id!, 'scene.write');
  const upload = await readUpload(request);
  const r = await importTargets(db, user, params.id!, upload.bytes);
  return json(r);
});
