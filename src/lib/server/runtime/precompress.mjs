/**
 * Build step (run by the armilla-server integration, ./integration.mjs, after `astro build`): next to every compressible
 * file of dist/client of at least 1 kB it writes `<file>.br` (brotli, quality 11) and `<file>.gz` (gzip,
 * level 9), each kept only when it saves at least 5 %. The HTTP server picks one of them by the request's
 * Accept-Encoding (see http-server.mjs), so assets are compressed once, at the highest setting, and never
 * per request. Fonts (woff/woff2) and images are compressed formats already and are left alone.
 */
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { extname, join } from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

export const COMPRESSIBLE = new Set(['.js', '.mjs', '.css', '.html', '.svg', '.json', '.txt', '.xml', '.map', '.webmanifest', '.ico']);
export const MIN_BYTES = 1024;

function* walk(dir) {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) yield* walk(p);
    else if (e.isFile()) yield p;
  }
}

/** Writes the .br and .gz variants under `dir`; returns [{ file, raw, br, gz }] (bytes; 0 = not kept). */
export function precompressDir(dir) {
  const out = [];
  for (const file of walk(dir)) {
    if (!COMPRESSIBLE.has(extname(file))) continue;
    const size = statSync(file).size;
    if (size < MIN_BYTES) continue;
    const raw = readFileSync(file);
    const br = brotliCompressSync(raw, { params: { [constants.BROTLI_PARAM_QUALITY]: 11, [constants.BROTLI_PARAM_SIZE_HINT]: raw.length } });
    const gz = gzipSync(raw, { level: 9 });
    const keep = (b) => b.length <= raw.length * 0.95;
    if (keep(br)) writeFileSync(`${file}.br`, br);
    if (keep(gz)) writeFileSync(`${file}.gz`, gz);
    out.push({ file, raw: raw.length, br: keep(br) ? br.length : 0, gz: keep(gz) ? gz.length : 0 });
  }
  return out;
}
