/**
 * Compressed forms of cached answers, kept beside them. The shared-scene read (the hot path of a live
 * presentation) answers from a cache of serialised scenes; compressing that same text again for every
 * request would spend the CPU the cache saves. Here each answer's brotli and gzip forms are made once and
 * reused for as long as the answer text is the same (compared in full, so a stale form is never sent).
 * Byte-bounded; the least recently used entries go first.
 */
import Negotiator from 'negotiator';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

export type Encoding = 'br' | 'gzip';

/** Below this an answer goes out as it is (a compressed frame would save next to nothing). */
export const COMPRESS_MIN_BYTES = 1024;
const MAX_BYTES = 8 * 1024 * 1024;

interface Entry {
  text: string;
  br?: Uint8Array<ArrayBuffer>;
  gzip?: Uint8Array<ArrayBuffer>;
  bytes: number;
}
const entries = new Map<string, Entry>();
let total = 0;

/** The encoding to answer with, by the request's Accept-Encoding (q-values honoured, br preferred), or null for none. */
export function pickEncoding(acceptEncoding: string | null): Encoding | null {
  if (!acceptEncoding) return null;
  // negotiator 1.x takes a list of preferred encodings for ties (its @types still describe 0.6).
  const n = new Negotiator({ headers: { 'accept-encoding': acceptEncoding } }) as unknown as { encoding(available: string[], opts: { preferred: string[] }): string | undefined };
  const enc = n.encoding(['br', 'gzip', 'identity'], { preferred: ['br', 'gzip'] });
  return enc === 'br' || enc === 'gzip' ? enc : null;
}

function encode(text: string, enc: Encoding): Uint8Array<ArrayBuffer> {
  const buf = enc === 'br' ? brotliCompressSync(text, { params: { [constants.BROTLI_PARAM_QUALITY]: 9, [constants.BROTLI_PARAM_SIZE_HINT]: text.length } }) : gzipSync(text, { level: 9 });
  return new Uint8Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength));
}

/** `text` compressed with `enc`, from the entry kept under `key` when it holds the same text. */
export function compressedAnswer(key: string, text: string, enc: Encoding): Uint8Array<ArrayBuffer> {
  let e = entries.get(key);
  if (e) {
    entries.delete(key); // re-inserted below: most recently used last
    total -= e.bytes;
    if (e.text !== text) e = undefined;
  }
  e ??= { text, bytes: text.length * 2 };
  let out = e[enc];
  if (!out) {
    out = encode(text, enc);
    e[enc] = out;
    e.bytes += out.byteLength;
  }
  entries.set(key, e);
  total += e.bytes;
  while (total > MAX_BYTES && entries.size > 1) {
    const [k, old] = entries.entries().next().value!;
    entries.delete(k);
    total -= old.bytes;
  }
  return out;
}

/**
 * A JSON answer in the form the request accepts: compressed from the cache beside it when the client
 * takes br or gzip and the text is at least COMPRESS_MIN_BYTES, else the plain text.
 */
export function jsonAnswer(request: Request, key: string, text: string, headers: Record<string, string> = {}): Response {
  const base = { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', vary: 'Accept-Encoding', ...headers };
  const enc = text.length >= COMPRESS_MIN_BYTES ? pickEncoding(request.headers.get('accept-encoding')) : null;
  if (!enc) return new Response(text, { headers: { ...base, 'content-length': String(Buffer.byteLength(text)) } });
  const body = compressedAnswer(key, text, enc);
  return new Response(body, { headers: { ...base, 'content-encoding': enc, 'content-length': String(body.byteLength) } });
}

/** For tests: how many answers and bytes are kept. */
export const compressedStats = () => ({ entries: entries.size, bytes: total });
