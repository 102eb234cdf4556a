import { db } from '../../../../lib/server/db';
import { HttpError, json, route } from '../../../../lib/server/http';
import { requireUser } from '../../../../lib/server/policy';
import { envelopeFor, updateEnvelope } from '../../../../lib/server/envelopes';
import { FileError } from '../../../../lib/imports/csv';
import { HORIZON_CONVENTIONS, parseHorizonCsv, type HorizonConvention } from '../../../../lib/imports/horizon-csv';
import { fileErrorResponse, readUpload, rowErrors } from '../../../../lib/server/upload';

const MAX_HORIZON_BYTES = 1024 * 1024;

/**
 * Horizon mask CSV `azimuth,elevation` (multipart field `file`) with a `convention` form field (or query
 * parameter): `north-east` (default), `south` (from south through west) or `signed` (−180..180, east +).
 * Replaces the envelope's mask in one write, sorted by azimuth. Editor+. 422 with row errors.
 */
export const POST = route(async ({ locals, params, request, url }) => {
  const user = requireUser(locals);
  const row = await envelopeFor(db, user, params.id!, 'envelope.write');
  const upload = await readUpload(request, MAX_HORIZON_BYTES);
  const convention = upload.fields.get('convention') ?? url.searchParams.get('convention') ?? 'north-east';
  if (!(HORIZON_CONVENTIONS as readonly string[]).includes(convention)) {
    throw new HttpError(400, 'invalid', `convention: must be one of ${HORIZON_CONVENTIONS.join(', ')}`, 'convention');
  }
  let parsed;
  try {
    parsed = parseHorizonCsv(upload.bytes, convention as HorizonConvention);
  } catch (e) {
    if (e instanceof FileError) throw fileErrorResponse(e);
    throw e;
  }
  if (parsed.errors.length) throw rowErrors(parsed.errors);
  const envelope = await updateEnvelope(db, row, { horizonMask: parsed.mask }, user.id, 'envelope.horizon-import');
  return json({ envelope, points: parsed.mask.length, convention });
});
