/**
 * Reading an upload with a hard size cap: refused (413) from the Content-Length header when it is
 * announced, and otherwise while streaming, as soon as the count passes the cap — never buffered whole
 * first. Multipart bodies are then read with the standard Request.formData().
 */
import { HttpError, readBodyCapped } from './http';
import { FileError, MAX_IMPORT_BYTES, type RowError } from '../imports/csv';

/** Multipart framing (boundaries, part headers, small form fields) allowed on top of the file cap. */
const MULTIPART_OVERHEAD = 64 * 1024;

/** The upload's 413: names the field and the limit; closes the connection when refused mid-stream (see readBodyCapped). */
export const tooLarge = (capBytes: number, closeConnection = false) =>
  new HttpError(
    413,
    'too_large',
    `The upload is larger than ${Math.round((capBytes / 1024 / 1024) * 10) / 10} MB.`,
    'file',
    undefined,
    closeConnection ? { connection: 'close' } : undefined,
  );

/** Reads the request body into memory, refusing with 413 once it passes `capBytes`. */
export const readCapped = (request: Request, capBytes: number) => readBodyCapped(request, capBytes, (close) => tooLarge(capBytes, close));

export interface Upload {
  bytes: Uint8Array<ArrayBuffer>;
  filename: string | null;
  /** Other (text) form fields. */
  fields: Map<string, string>;
}

/**
 * The uploaded file from a multipart form (field `file`) or a raw text/csv body.
 * 400 when there is no file, 413 over `capBytes`.
 */
export async function readUpload(request: Request, capBytes = MAX_IMPORT_BYTES, field = 'file'): Promise<Upload> {
  const type = (request.headers.get('content-type') ?? '').toLowerCase();
  if (type.startsWith('multipart/form-data')) {
    const body = await readCapped(request, capBytes + MULTIPART_OVERHEAD);
    let form: FormData;
    try {
      form = await new Response(body, { headers: { 'content-type': request.headers.get('content-type')! } }).formData();
    } catch {
      throw new HttpError(400, 'malformed_form', 'The multipart form could not be read.', field);
    }
    const file = form.get(field);
    if (file === null || typeof file === 'string') {
      throw new HttpError(400, 'invalid', `${field}: attach the CSV file in the form field "${field}".`, field);
    }
    if (file.size > capBytes) throw tooLarge(capBytes);
    const fields = new Map<string, string>();
    for (const [k, v] of form.entries()) if (typeof v === 'string') fields.set(k, v);
    return { bytes: new Uint8Array(await file.arrayBuffer()), filename: file.name || null, fields };
  }
  if (type.startsWith('text/csv') || type.startsWith('text/plain') || type.startsWith('application/octet-stream')) {
    const bytes = await readCapped(request, capBytes);
    return { bytes, filename: null, fields: new Map() };
  }
  throw new HttpError(400, 'invalid', `${field}: send the file as multipart/form-data in the field "${field}".`, field);
}

/** The 422 for a whole-file problem (encoding, binary, missing columns…). */
export function fileErrorResponse(e: FileError): HttpError {
  return new HttpError(422, e.code, e.message, e.field ?? 'file', { rows: [] });
}

/** The 422 for row errors: `{error, rows: [{line, field, message}]}`; nothing was written. */
export function rowErrors(rows: RowError[], what = 'row'): HttpError {
  const n = new Set(rows.map((r) => r.line)).size;
  return new HttpError(
    422,
    'invalid_rows',
    `${n} ${what}${n === 1 ? '' : 's'} did not validate; nothing was imported. First: line ${rows[0]?.line}: ${rows[0]?.message}`,
    'file',
    { rows: rows.map((r) => ({ line: r.line, field: r.field ?? null, message: r.message })) },
  );
}
