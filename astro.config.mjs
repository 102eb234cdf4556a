// @ts-check
import { defineConfig, envField } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';
import { armillaServer } from './src/lib/server/runtime/integration.mjs';
import { computeWorker } from './src/lib/server/compute/build.mjs';
import { createHash } from 'node:crypto';
import { NIGHT_MODE_SCRIPT } from './src/components/ui/night-mode-script.ts';

/**
 * A build is always a production build. `astro build` keeps a NODE_ENV it inherits, and vitest sets it to
 * "test": a build made by the test harness (tests/integration/helpers/global-setup.ts) shipped React's
 * development bundle, 480 kB of JavaScript before a viewer link's first frame instead of 399 kB.
 */
if (process.argv.includes('build')) process.env.NODE_ENV = 'production';

/**
 * Our own `is:inline` scripts, allowed by the CSP through their SHA-256 (Astro hashes the scripts it
 * writes itself: island bootstrap, directives, inlined page scripts). See src/lib/server/README.md, "Content-Security-Policy".
 */
const OWN_INLINE_SCRIPTS = [NIGHT_MODE_SCRIPT];
/** @param {string} text */
const sha256 = (text) => /** @type {`sha256-${string}`} */ (`sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}`);

/**
 * The sky view in the browser computes planets from a lighter cut of the VSOP87B series
 * (src/lib/sky/planets/vsop87b-view.json: within 3″ of the full cut, a quarter of a pixel at the narrowest
 * field of view, 28 kB instead of 95 kB as brotli) so a viewer link's first frame waits for less
 * JavaScript; the server, the API, exports and tests keep the full series (see planets/README.md).
 * @returns {import('vite').Plugin}
 */
function viewSeries() {
  const view = fileURLToPath(new URL('./src/lib/sky/planets/vsop87b-view.json', import.meta.url));
  return {
    name: 'armilla-view-series',
    enforce: 'pre',
    resolveId(source, importer, options) {
      if (options?.ssr || source !== './vsop87b.json' || !importer?.replace(/\\/g, '/').endsWith('/src/lib/sky/planets/series.ts')) return null;
      return view;
    },
  };
}

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'middleware' }),
  integrations: [react(), armillaServer(), computeWorker()],
  // Astro's checkOrigin covers form posts only; src/middleware.ts checks every non-GET itself.
  security: { checkOrigin: false },
  // Astro computes the hashes of the inline scripts our build produces and sets them on each page it
  // renders; src/middleware.ts builds the whole policy from their script part (src/lib/server/README.md, "Content-Security-Policy").
  experimental: { csp: { algorithm: 'SHA-256', scriptDirective: { hashes: OWN_INLINE_SCRIPTS.map(sha256) } } },
  server: { host: process.env.HOST ?? '127.0.0.1', port: Number(process.env.PORT ?? 4321) },
  env: {
    schema: {
      DATABASE_URL: envField.string({ context: 'server', access: 'secret', optional: true }),
      DATABASE_AUTH_TOKEN: envField.string({ context: 'server', access: 'secret', optional: true }),
      SMTP_URL: envField.string({ context: 'server', access: 'secret', optional: true }),
      MAIL_FROM: envField.string({ context: 'server', access: 'public', optional: true }),
      PUBLIC_ORIGIN: envField.string({ context: 'server', access: 'public', optional: true }),
    },
  },
  vite: {
    plugins: [tailwindcss(), viewSeries()],
  },
});
