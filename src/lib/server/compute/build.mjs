// @ts-check
/**
 * Bundles the compute worker (worker.ts and the pure modules it imports) into one ES module beside the
 * server bundle: dist/server/compute-worker.mjs. Used by the `armilla-compute-worker` integration in
 * astro.config.mjs (after every build) and by the pool's unit test (into a temp folder). Packages stay
 * external, as in Astro's own server bundle: they are resolved from node_modules at run time.
 */
import { build } from 'esbuild';
import { writeFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { fileURLToPath } from 'node:url';

export const WORKER_SOURCE = fileURLToPath(new URL('./worker.ts', import.meta.url));

/** @param {string} outFile */
export async function buildComputeWorker(outFile) {
  await build({
    entryPoints: [WORKER_SOURCE],
    outfile: outFile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: false,
    minify: false,
    legalComments: 'none',
    logLevel: 'warning',
    // Worker code runs in the built server only: import.meta.env as Vite defines it for production.
    define: { 'import.meta.env.PROD': 'true', 'import.meta.env.DEV': 'false' },
  });
  await writeFile(commonJsEntryOf(outFile), commonJsEntry(basename(outFile)));
}

/**
 * piscina loads a worker file with require() first and falls back to import(). On Node 20.19+ require()
 * of an ES module takes the require(esm) path, which crashed V8 in a CI run ("v8::Module::IsGraphAsync
 * must be used on an instantiated module", from piscina's worker.js). The pool therefore starts its
 * threads on this CommonJS entry beside the bundle, which loads the ES module with import() only.
 * @param {string} file the bundle (…/compute-worker.mjs)
 */
export function commonJsEntryOf(file) {
  return file.replace(/\.mjs$/, '') + '.cjs';
}

/** @param {string} bundleName */
function commonJsEntry(bundleName) {
  return `'use strict';
// Written by src/lib/server/compute/build.mjs: see commonJsEntryOf there.
let loaded;
module.exports = function run(task) {
  loaded ??= import('./${bundleName}');
  return loaded.then((m) => m.default(task));
};
`;
}

/** @returns {import('astro').AstroIntegration} */
export function computeWorker() {
  /** @type {URL | undefined} */
  let outDir;
  return {
    name: 'armilla-compute-worker',
    hooks: {
      'astro:config:done': ({ config }) => {
        outDir = config.outDir;
      },
      'astro:build:done': async () => {
        if (!outDir) throw new Error('armilla-compute-worker: no outDir');
        await buildComputeWorker(fileURLToPath(new URL('server/compute-worker.mjs', outDir)));
      },
    },
  };
}
