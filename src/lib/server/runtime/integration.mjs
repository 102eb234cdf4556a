// @ts-check
/**
 * The `armilla-server` Astro integration: after every build it writes our HTTP server
 * (./http-server.mjs) beside Astro's own entry as dist/server/armilla.mjs, and precompresses the
 * client assets (./precompress.mjs). Astro's dist/server/entry.mjs is left as Astro wrote it; ours
 * imports its `handler` (the adapter runs in middleware mode). `npm start`, the test helpers and the
 * benches run `node dist/server/armilla.mjs`.
 */
import { copyFileSync, existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { precompressDir } from './precompress.mjs';

/** The file the build writes, relative to the build's output folder. */
export const SERVER_FILE = 'server/armilla.mjs';

/** @returns {import('astro').AstroIntegration} */
export function armillaServer() {
  /** @type {URL | undefined} */
  let outDir;
  return {
    name: 'armilla-server',
    hooks: {
      'astro:config:done': ({ config }) => {
        outDir = config.outDir;
      },
      'astro:build:done': () => {
        if (!outDir) throw new Error('armilla-server: no outDir');
        const astroEntry = fileURLToPath(new URL('server/entry.mjs', outDir));
        if (!existsSync(astroEntry)) throw new Error(`armilla-server: no ${astroEntry}`);
        copyFileSync(fileURLToPath(new URL('./http-server.mjs', import.meta.url)), fileURLToPath(new URL(SERVER_FILE, outDir)));
        const made = precompressDir(fileURLToPath(new URL('client/', outDir)));
        /** @param {'raw' | 'br' | 'gz'} k */
        const sum = (k) => made.reduce((a, f) => a + f[k], 0);
        console.log(`armilla-server: wrote ${SERVER_FILE}; precompressed ${made.length} files, ${sum('raw')} B → br ${sum('br')} B, gzip ${sum('gz')} B`);
      },
    },
  };
}
