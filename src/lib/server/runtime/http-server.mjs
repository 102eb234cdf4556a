/**
 * Armilla's HTTP server. The `armilla-server` integration (./integration.mjs) writes this file beside
 * Astro's own entry as dist/server/armilla.mjs after every build; `node dist/server/armilla.mjs` starts
 * it. Astro's dist/server/entry.mjs stays as Astro wrote it: this file imports its `handler` (the
 * adapter runs in middleware mode).
 *
 * Why our own server instead of @astrojs/node's standalone one: the standalone server looks every
 * request up on disk before rendering it (a synchronous lstat that throws, then an asynchronous stat),
 * which cost 6–9 % of the server's CPU on the API's hot paths. Here the files of dist/client are listed
 * once at start-up; a GET or HEAD for one of them is sent from disk, everything else goes straight to
 * Astro. Environment: HOST (default 127.0.0.1), PORT (default 4321).
 */
import http from 'node:http';
import { readdirSync } from 'node:fs';
import { extname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import compression from 'compression';
import { contentType } from 'mime-types';
import Negotiator from 'negotiator';
import send from 'send';

/**
 * The built server runs React and the other libraries in their production builds: they choose by
 * NODE_ENV when first loaded, and `npm start` (unset) or a test harness ("test") would give the
 * development builds (React's checks and warnings on every server render). Set before the entry loads.
 */
process.env.NODE_ENV = 'production';

/**
 * Astro's request handler, from the entry the build wrote beside this file. Imported by URL so that
 * the source tree (where no entry.mjs exists) has no import it cannot resolve.
 */
const { handler } = await import(new URL('./entry.mjs', import.meta.url).href);

const clientDir = fileURLToPath(new URL('../client/', import.meta.url));

/** Every file under dist/client as a URL path ("/_astro/x.js", "/favicon.svg"). */
function listFiles(dir, prefix, out) {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    if (e.name.startsWith('.')) continue;
    if (e.isDirectory()) listFiles(join(dir, e.name), `${prefix}${e.name}/`, out);
    else if (e.isFile()) out.add(`${prefix}${e.name}`);
  }
  return out;
}
const files = listFiles(clientDir, '/', new Set());

/**
 * Compressed variants made at build time (./precompress.mjs): path → the encodings on disk, best
 * first. The variant is chosen by Accept-Encoding (q-values honoured; br preferred over gzip) and the
 * answer carries `Vary: Accept-Encoding`, so a cache keeps each form apart.
 */
const variants = new Map();
for (const f of files) {
  const enc = [];
  if (files.has(`${f}.br`)) enc.push('br');
  if (files.has(`${f}.gz`)) enc.push('gzip');
  if (enc.length) variants.set(f, enc);
}
const SUFFIX = { br: '.br', gzip: '.gz' };

/**
 * Everything else (pages, API answers) of at least 1 kB is compressed per request when its type is
 * HTML or JSON (brotli quality 4, gzip level 6: compression's defaults, cheap enough per request).
 * Answers that arrive already encoded — the shared-scene read keeps its compressed forms cached beside
 * the answer (src/lib/server/compressed.ts) — and event streams pass through untouched.
 */
const compress = compression({
  threshold: 1024,
  filter: (_req, res) => /^(application\/json|text\/html)\b/.test(String(res.getHeader('Content-Type') ?? '')),
});

export function listener(req, res) {
  let path;
  try {
    path = decodeURI((req.url ?? '/').split(/[?#]/, 1)[0]);
  } catch {
    res.writeHead(400);
    res.end('Bad request.');
    return;
  }
  if ((req.method === 'GET' || req.method === 'HEAD') && files.has(path)) {
    const available = variants.get(path);
    let file = path;
    if (available) {
      res.setHeader('Vary', 'Accept-Encoding');
      const enc = new Negotiator(req).encoding([...available, 'identity'], { preferred: available });
      if (enc && enc !== 'identity') {
        file = path + SUFFIX[enc];
        res.setHeader('Content-Encoding', enc);
        res.setHeader('Content-Type', contentType(extname(path)) || 'application/octet-stream');
      }
    }
    const stream = send(req, file, { root: clientDir, dotfiles: 'deny' });
    stream.on('headers', (r) => {
      r.setHeader('X-Content-Type-Options', 'nosniff');
      if (path.startsWith('/_astro/')) r.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
    });
    stream.on('error', (err) => {
      res.statusCode = err?.status ?? 500;
      res.end();
    });
    stream.pipe(res);
    return;
  }
  // The socket's address goes to Astro as a local, where no header can forge it: Astro's own
  // clientAddress believes the first X-Forwarded-For value (src/lib/server/proxy.ts decides whom to believe).
  const locals = { peerAddress: req.socket.remoteAddress ?? '', peerEncrypted: Boolean(req.socket.encrypted) };
  compress(req, res, () => handler(req, res, undefined, locals));
}

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);
const server = http.createServer(listener);
server.listen(port, host, () => console.log(`[armilla] listening on http://${host}:${port}`));
for (const sig of ['SIGINT', 'SIGTERM']) {
  process.on(sig, () => {
    server.close(() => process.exit(0));
    server.closeAllConnections();
    setTimeout(() => process.exit(0), 2000).unref();
  });
}
