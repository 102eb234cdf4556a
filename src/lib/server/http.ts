import type { APIContext, APIRoute } from 'astro';
import { ZodError, type ZodType, type ZodTypeDef } from 'zod';
import { nanoid } from 'nanoid';
import { resolveClientAddress, trustFromEnv } from './proxy';

/** The one error type of the server. `status` follows the API contract. */
export class HttpError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly field?: string,
    /** Extra top-level members of the error body, e.g. `{ scene }` on a 409 or `{ rows }` on a 422. */
    public readonly extra?: Record<string, unknown>,
    public readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, field?: string, code = 'invalid') => new HttpError(400, code, message, field);
export const unauthorized = () => new HttpError(401, 'unauthorized', 'Sign in first.');
export const forbidden = (message = 'You are not allowed to do that.') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'Resource') => new HttpError(404, 'not_found', `${what} not found.`);

export function json(data: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return jsonText(status === 204 ? null : JSON.stringify(data), status, headers);
}

/**
 * `json()` for a body serialised already (e.g. from a cache). The length is stated, so the server's
 * compression can leave answers under 1 kB alone (it cannot tell the size of a streamed body).
 */
export function jsonText(text: string | null, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(text, {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...(text === null ? {} : { 'content-length': String(Buffer.byteLength(text)) }), ...headers },
  });
}

export const noContent = () => new Response(null, { status: 204, headers: { 'cache-control': 'no-store' } });

function errorBody(e: HttpError) {
  return { error: { code: e.code, message: e.message, ...(e.field ? { field: e.field } : {}) }, ...(e.extra ?? {}) };
}

export function fieldOf(err: ZodError): string | undefined {
  const path = err.issues[0]?.path ?? [];
  return path.length ? path.join('.') : undefined;
}

export function fromZod(err: ZodError, status = 400): HttpError {
  const issue = err.issues[0];
  const field = fieldOf(err);
  const message = issue ? (field ? `${field}: ${issue.message}` : issue.message) : 'Invalid input.';
  return new HttpError(status, 'invalid', message, field);
}

/** Maps any thrown error to the contract's error body. Unknown errors are logged with a request id → 500. */
export function errorResponse(e: unknown): Response {
  if (e instanceof HttpError) return json(errorBody(e), e.status, e.headers);
  if (e instanceof ZodError) return json(errorBody(fromZod(e)), 400);
  const requestId = nanoid(10);
  console.error(`[${requestId}] unhandled error`, e);
  return json({ error: { code: 'internal', message: `Internal error (request ${requestId}).` } }, 500);
}

/** Wraps an endpoint: thrown HttpError / ZodError become error responses. */
export function route(handler: (ctx: APIContext) => Promise<Response> | Response): APIRoute {
  return async (ctx) => {
    try {
      return await handler(ctx);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

/** Query string → object; repeated keys keep the last value. */
export function parseQuery<T>(schema: ZodType<T, ZodTypeDef, unknown>, url: URL): T {
  const raw = Object.fromEntries(url.searchParams.entries());
  const r = schema.safeParse(raw);
  if (!r.success) throw fromZod(r.error);
  return r.data;
}

export const MAX_JSON_BYTES = 1_000_000;

/** `application/json` or a `+json` type; anything else (a form, `text/plain`) is not read as JSON. */
const JSON_TYPE = /^application\/(?:[\w.-]+\+)?json\s*(?:;|$)/i;

/**
 * Reads at most `capBytes` of a body: refused from Content-Length when it is announced, otherwise as soon
 * as the streamed count passes the cap (a chunked body is never buffered whole first). Refused from the
 * header, the body is never read (Node discards what the client still sends, so the connection stays
 * usable); refused mid-stream, the stream is cancelled and the answer closes the connection (RFC 9112 §9.6).
 * `tooLarge` makes the 413 (an upload names its own field and limit).
 */
export async function readBodyCapped(
  request: Request,
  capBytes: number,
  tooLarge: (closeConnection: boolean) => HttpError = (close) => new HttpError(413, 'too_large', 'Request body too large.', undefined, undefined, close ? { connection: 'close' } : undefined),
): Promise<Uint8Array<ArrayBuffer>> {
  const declared = request.headers.get('content-length');
  if (declared !== null && Number(declared) > capBytes) throw tooLarge(false);
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array<ArrayBuffer>[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > capBytes) {
      await reader.cancel().catch(() => {});
      throw tooLarge(true);
    }
    chunks.push(value);
  }
  if (chunks.length === 1) return chunks[0]!;
  const out = new Uint8Array(total);
  let off = 0;
  for (const c of chunks) {
    out.set(c, off);
    off += c.byteLength;
  }
  return out;
}

/**
 * Reads a JSON body: 413 past `capBytes` (checked before anything is parsed), 415 when it is not sent as
 * JSON (a `text/plain` body is what a cross-site form can send without a preflight), 400 `malformed_json`
 * when it does not parse, 400 naming the field when it does not validate.
 */
export async function parseJson<T>(schema: ZodType<T, ZodTypeDef, unknown>, request: Request, capBytes = MAX_JSON_BYTES): Promise<T> {
  const bytes = await readBodyCapped(request, capBytes);
  const type = request.headers.get('content-type');
  if (bytes.byteLength > 0 && !(type && JSON_TYPE.test(type))) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the body as JSON (Content-Type: application/json).');
  }
  let raw: unknown;
  try {
    raw = bytes.byteLength ? JSON.parse(new TextDecoder().decode(bytes)) : {};
  } catch {
    throw new HttpError(400, 'malformed_json', 'The request body is not valid JSON.');
  }
  const r = schema.safeParse(raw);
  if (!r.success) throw fromZod(r.error);
  return r.data;
}

/** Strict ISO 8601 UTC instant (`Z` or `+00:00`); a time without a zone is ambiguous and refused. */
export const ISO_UTC_RE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]00:?00)$/;

/**
 * The client's address for rate limits: the TCP peer (set by our server as `locals.peerAddress`), or
 * what the proxies named by `TRUST_PROXY` vouch for (src/lib/server/proxy.ts). Never a header the client
 * chose. Under `astro dev` (no peer) Astro's own value.
 */
export function clientAddress(ctx: Pick<APIContext, 'request' | 'clientAddress' | 'locals'>): string {
  const peer = ctx.locals?.peerAddress;
  if (typeof peer === 'string') return resolveClientAddress(peer, ctx.request.headers.get('x-forwarded-for'), trustFromEnv()) || 'unknown';
  try {
    return ctx.clientAddress;
  } catch {
    return 'unknown';
  }
}
