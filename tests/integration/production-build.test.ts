/**
 * The build the tests run is the build users get: React's production bundle in the browser. A build
 * inherits NODE_ENV, and vitest sets it to "test"; a build made from inside the test harness
 * (helpers/global-setup.ts) once shipped React's development bundle. astro.config.mjs now makes every
 * build a production build. Markers (from react-dom 19's own files, node_modules/react-dom/cjs):
 * "Minified React error" is only in react-dom-client.production.js; the "In HTML, %s cannot be a
 * child of" nesting warnings only in react-dom-client.development.js.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';

const dir = 'dist/client/_astro';
const chunks = readdirSync(dir)
  .filter((f) => f.endsWith('.js'))
  .map((f) => ({ f, text: readFileSync(join(dir, f), 'utf8') }));

describe('the built client', () => {
  test("carries React's production build, not its development one", () => {
    const prod = chunks.filter((c) => c.text.includes('Minified React error')).map((c) => c.f);
    const dev = chunks.filter((c) => c.text.includes('In HTML, ')).map((c) => c.f);
    expect(prod.length, 'chunks with react-dom production').toBeGreaterThan(0);
    expect(dev, 'chunks with react-dom development warnings').toEqual([]);
  });
});
