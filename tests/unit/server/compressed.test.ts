/** The compressed forms kept beside cached answers (src/lib/server/compressed.ts). */
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { compressedAnswer, jsonAnswer, pickEncoding } from '../../../src/lib/server/compressed';

const text = JSON.stringify({ scene: { title: 'x'.repeat(50), steps: Array.from({ length: 40 }, (_, i) => ({ id: i, caption: `step ${i} of the demo` })) } });

describe('pickEncoding (RFC 9110 §12.5.3)', () => {
  it('prefers br, honours q-values and q=0, and gives null for none', () => {
    expect(pickEncoding('gzip, deflate, br')).toBe('br');
    expect(pickEncoding('gzip')).toBe('gzip');
    expect(pickEncoding('br;q=0, gzip')).toBe('gzip');
    expect(pickEncoding('br;q=0.1, gzip;q=0.9')).toBe('gzip');
    expect(pickEncoding('identity')).toBeNull();
    expect(pickEncoding('*')).toBe('br');
    expect(pickEncoding(null)).toBeNull();
  });
});

describe('compressedAnswer', () => {
  it('compresses once per text and decodes to it', () => {
    const a = compressedAnswer('k1', text, 'br');
    expect(compressedAnswer('k1', text, 'br')).toBe(a);
    expect(brotliDecompressSync(a).toString()).toBe(text);
    expect(gunzipSync(compressedAnswer('k1', text, 'gzip')).toString()).toBe(text);
    const changed = text.replace('step 3', 'step three');
    const b = compressedAnswer('k1', changed, 'br');
    expect(b).not.toBe(a);
    expect(brotliDecompressSync(b).toString()).toBe(changed);
  });
  it('jsonAnswer: headers name the encoding and Vary; short or unaccepted answers go plain', async () => {
    const req = (ae?: string) => new Request('http://x/', { headers: ae ? { 'accept-encoding': ae } : {} });
    const r = jsonAnswer(req('gzip'), 'k2', text);
    expect(r.headers.get('content-encoding')).toBe('gzip');
    expect(r.headers.get('vary')).toBe('Accept-Encoding');
    expect(gunzipSync(Buffer.from(await r.arrayBuffer())).toString()).toBe(text);
    expect(jsonAnswer(req(), 'k2', text).headers.get('content-encoding')).toBeNull();
    const short = jsonAnswer(req('br'), 'k3', '{"a":1}');
    expect(short.headers.get('content-encoding')).toBeNull();
    expect(await short.text()).toBe('{"a":1}');
  });
});
