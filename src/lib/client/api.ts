/**
 * Fetch helpers for the islands: JSON in, JSON out, the contract's error body turned into an ApiError.
 * Same-origin only; the session cookie travels by itself.
 */
export class ApiError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly field?: string,
    /** The whole parsed error body (e.g. `{ scene }` on a 409). */
    public readonly body?: unknown,
  ) {
    super(message);
  }
}

export interface RequestOptions {
  method?: string;
  body?: unknown;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

export async function request(path: string, opts: RequestOptions = {}): Promise<Response> {
  const headers: Record<string, string> = { accept: 'application/json', ...(opts.headers ?? {}) };
  let body: BodyInit | undefined;
  if (opts.body instanceof Blob || opts.body instanceof FormData || typeof opts.body === 'string') body = opts.body;
  else if (opts.body !== undefined) {
    body = JSON.stringify(opts.body);
    headers['content-type'] = 'application/json';
  }
  return fetch(path, { method: opts.method ?? 'GET', headers, body, signal: opts.signal, credentials: 'same-origin' });
}

export async function readError(r: Response): Promise<ApiError> {
  let data: any = null;
  try {
    data = await r.json();
  } catch {
    /* not JSON */
  }
  const e = data?.error;
  const message = typeof e?.message === 'string' ? e.message : `Request failed (${r.status}).`;
  return new ApiError(r.status, typeof e?.code === 'string' ? e.code : 'http_' + r.status, message, e?.field, data);
}

/** JSON request; throws ApiError on any non-2xx answer. 204 → null. */
export async function api<T = unknown>(path: string, opts: RequestOptions = {}): Promise<T> {
  const r = await request(path, opts);
  if (!r.ok) throw await readError(r);
  if (r.status === 204) return null as T;
  const text = await r.text();
  return (text ? JSON.parse(text) : null) as T;
}

export const apiGet = <T>(path: string, signal?: AbortSignal) => api<T>(path, { signal });
export const apiPost = <T>(path: string, body?: unknown) => api<T>(path, { method: 'POST', body });
export const apiPatch = <T>(path: string, body?: unknown) => api<T>(path, { method: 'PATCH', body });
export const apiPut = <T>(path: string, body?: unknown, headers?: Record<string, string>) => api<T>(path, { method: 'PUT', body, headers });
export const apiDelete = <T>(path: string) => api<T>(path, { method: 'DELETE' });

/** A short human sentence for an error caught in the UI. */
export function errorText(e: unknown): string {
  if (e instanceof ApiError) return e.field && !e.message.includes(e.field) ? `${e.field}: ${e.message}` : e.message;
  if (e instanceof Error) return e.message;
  return String(e);
}

/** Only same-site paths are followed after sign-in (no open redirect). */
export { safeNext } from '../safe-next';
